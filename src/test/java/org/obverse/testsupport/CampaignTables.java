package org.obverse.testsupport;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.apache.commons.rng.UniformRandomProvider;

/**
 * An invented campaign folder with known success rates, laid out as a campaign run leaves it:
 * {@code results.csv} (the columns of spec/results.md plus chain_coupling, anneal_us, pause_s,
 * pause_us — empty for the no-pause baseline —, gauged, energy_frame and the schedule's name) and
 * {@code ground.csv}.
 * Pause grid × chain couplings × gauged, one row per (instance, setting, gauge) outcome with a
 * count. Success rates are invented: a pause near s = 0.45 helps, a longer pause more, a chain
 * coupling of −1.6 is best, gauging helps a little; each instance has its own hardness.
 */
public final class CampaignTables {
    /** What to lay out. */
    public record Plan(int instances, double[] couplings, double[] pauseS, double[] pauseUs, int gauges, int reads,
            double annealUs) {
        /** The grid the report tests use: 12 instances, 3 couplings, 4 × 2 pauses and the baseline, 4 gauges × 50 reads. */
        public static Plan standard() {
            return new Plan(12, new double[] {-1.2, -1.6, -2.0}, new double[] {0.3, 0.4, 0.5, 0.6},
                    new double[] {1, 10}, 4, 50, 2);
        }
    }

    /** One cell as written: instance, setting label, its columns and the rate used. */
    public record Cell(String instance, String setting, double coupling, double pauseS, double pauseUs,
            boolean gauged, double rate, double runUs, long[] successes, long readsPerGauge) {
    }

    private CampaignTables() {
    }

    /** The invented success rate of instance i (hardness h in (0, 1]) under a setting; NaN pause = none. */
    public static double rate(double hardness, double coupling, double pauseS, double pauseUs, boolean gauged) {
        double base = 0.12 * hardness * Math.exp(-Math.pow((coupling + 1.6) / 0.5, 2));
        double pause = Double.isNaN(pauseS) ? 1 : 1 + (0.8 + 0.25 * Math.log10(pauseUs)) * Math.exp(-Math.pow((pauseS - 0.45) / 0.1, 2));
        return Math.min(0.95, base * pause * (gauged ? 1.25 : 1.0) + 0.002);
    }

    /** Writes results.csv and ground.csv into dir (created) and returns the cells. */
    public static List<Cell> write(Path dir, Plan plan, UniformRandomProvider rng) throws IOException {
        Files.createDirectories(dir);
        StringBuilder r = new StringBuilder("instance,setting,gauge,energy,count,broken,run_us,chain_coupling,anneal_us,"
                + "pause_s,pause_us,gauged,energy_frame,schedule\n");
        StringBuilder g = new StringBuilder("instance,ground_energy,ground_source\n");
        List<Cell> cells = new ArrayList<>();
        for (int i = 0; i < plan.instances(); i++) {
            String inst = "inst-" + i;
            double ground = -20 - i;
            g.append(inst).append(',').append(num(ground)).append(",exact\n");
            double hardness = 0.3 + 0.7 * rng.nextDouble();
            for (double cc : plan.couplings()) {
                List<double[]> pauses = new ArrayList<>();
                pauses.add(new double[] {Double.NaN, Double.NaN});
                for (double ps : plan.pauseS()) {
                    for (double pu : plan.pauseUs()) {
                        pauses.add(new double[] {ps, pu});
                    }
                }
                for (double[] pause : pauses) {
                    for (boolean gauged : new boolean[] {true, false}) {
                        String label = "cc=" + num(cc) + (Double.isNaN(pause[0]) ? " no-pause"
                                : " sp=" + num(pause[0]) + " tp=" + num(pause[1])) + (gauged ? " gauged" : " plain");
                        double rate = rate(hardness, cc, pause[0], pause[1], gauged);
                        double run = plan.annealUs() + (Double.isNaN(pause[1]) ? 0 : pause[1]);
                        // The schedule's name, a setting column that only says which treatment it is.
                        String schedule = "a" + num(plan.annealUs()) + (Double.isNaN(pause[0]) ? ""
                                : "-p" + num(pause[0]) + "x" + num(pause[1]));
                        int slots = gauged ? plan.gauges() : 1;
                        long per = gauged ? plan.reads() : (long) plan.reads() * plan.gauges();
                        long[] succ = new long[slots];
                        for (int k = 0; k < slots; k++) {
                            double pk = gauged ? Math.min(1, rate * (0.6 + 0.8 * rng.nextDouble())) : rate;
                            for (long x = 0; x < per; x++) {
                                succ[k] += rng.nextDouble() < pk ? 1 : 0;
                            }
                            String gauge = gauged ? String.valueOf(k) : "";
                            long broken = Math.round(Math.abs(cc + 2.2) * 3);
                            String tail = "," + num(run) + "," + num(cc) + "," + num(plan.annealUs()) + ","
                                    + (Double.isNaN(pause[0]) ? "" : num(pause[0])) + ","
                                    + (Double.isNaN(pause[1]) ? "" : num(pause[1])) + "," + (gauged ? "yes" : "no")
                                    + ",logical," + schedule + "\n";
                            if (succ[k] > 0) {
                                r.append(inst).append(',').append(label).append(',').append(gauge).append(',')
                                        .append(num(ground)).append(',').append(succ[k]).append(",0").append(tail);
                            }
                            if (per - succ[k] > 0) {
                                r.append(inst).append(',').append(label).append(',').append(gauge).append(',')
                                        .append(num(ground + 2 + (k % 3))).append(',').append(per - succ[k])
                                        .append(',').append(broken).append(tail);
                            }
                        }
                        cells.add(new Cell(inst, label, cc, pause[0], pause[1], gauged, rate, run, succ, per));
                    }
                }
            }
        }
        Files.writeString(dir.resolve("results.csv"), r);
        Files.writeString(dir.resolve("ground.csv"), g);
        return cells;
    }

    private static String num(double v) {
        return v == Math.rint(v) ? String.format(Locale.ROOT, "%d", (long) v) : Double.toString(v);
    }
}
