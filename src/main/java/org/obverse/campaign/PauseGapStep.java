package org.obverse.campaign;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import org.obverse.anneal.EnergyScales;
import org.obverse.io.codec.CampaignPlan;
import org.obverse.io.table.EnergyScalesTable;
import org.obverse.io.table.CsvReader;
import org.obverse.io.table.GroundTable;
import org.obverse.io.table.PauseGapTable;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.model.IsingProblem;
import org.obverse.report.Figure;
import org.obverse.report.PauseGapPlot;
import org.obverse.spectrum.AnnealSpectrum;
import org.obverse.spectrum.GapDip;
import org.obverse.spectrum.ScanSettings;
import org.obverse.spectrum.SpectrumAnalysis;
import org.obverse.spectrum.SpectrumCheck;
import org.obverse.spectrum.SpectrumSettings;
import org.obverse.stats.SuccessRule;

/**
 * Closes the loop between the sampler and the spectrum for a campaign run on the path-integral
 * sampler: per instance and chain coupling whose embedded problem the exact solvers take, the
 * success probability of the gauged reads against the pause location (one line per pause
 * duration, the no-pause baseline beside it) and the relevant gap of that embedded problem
 * under the plan's own energy scales, with every dip of the gap. The table gives, per pause,
 * the gap at the pause location and the nearest dip before it, so one can read whether the
 * best pause sits just after a dip.
 */
public final class PauseGapStep {
    /** Points of the gap scan along s. */
    static final int GAP_POINTS = 101;

    private PauseGapStep() {
    }

    /** maxFigures bounds the figures drawn (one per instance and chain coupling, in plan order). */
    public record Request(Path folder, int maxFigures) {
    }

    /**
     * What was found.
     *
     * @param table   CSV text, one row per (instance, chain coupling, pause), empty header-only where nothing applied
     * @param figures one per instance and chain coupling, up to the request's bound
     * @param skipped why nothing was computed (not the path-integral sampler, or every embedded problem too large), or null
     */
    public record Result(String table, List<Figure> figures, String skipped) {
    }

    static final String HEADER = PauseGapTable.HEADER;

    public static Result run(Request r) throws IOException {
        CampaignFolder folder = CampaignFolder.open(r.folder());
        CampaignPlan plan = folder.plan();
        if (!plan.sampler().kind().equals("sqa")) {
            return new Result(HEADER, List.of(), "the plan's sampler is " + plan.sampler().kind()
                    + ", not the path-integral sampler (sqa): its pauses have no gap to compare with");
        }
        EnergyScales scales = plan.sampler().energyScales() == null ? EnergyScales.illustrative()
                : EnergyScalesTable.read(plan.sampler().energyScales(), plan.sampler().energyUnits());
        Map<String, Double> ground = ground(folder);
        Map<String, Cell> cells = cells(folder, ground);
        double anneal = Double.POSITIVE_INFINITY;
        for (Cell c : cells.values()) {
            anneal = Math.min(anneal, c.annealUs);
        }
        StringBuilder table = new StringBuilder(HEADER);
        List<Figure> figures = new ArrayList<>();
        int solved = 0;
        for (CampaignPlan.Instance inst : plan.instances()) {
            for (double v : plan.chainCouplings()) {
                IsingProblem p = ProblemCodec.read(folder.resolve(CampaignFolder.embeddedFile(inst.name(), v))).spin();
                SpectrumSettings settings = SpectrumSettings.defaults();
                if (!SpectrumCheck.fits(p, settings)) {
                    continue;
                }
                solved++;
                AnnealSpectrum spectrum = AnnealSpectrum.of(p, scales, settings);
                SpectrumAnalysis a = spectrum.analyse(ScanSettings.defaults().withPoints(GAP_POINTS));
                double[] s = a.scan().s();
                double[] gap = a.scan().gaps();
                List<GapDip> dips = a.dips();
                double[] dipS = dips.stream().mapToDouble(GapDip::s).toArray();
                TreeMap<Double, TreeMap<Double, Cell>> byDuration = new TreeMap<>();
                double baseline = Double.NaN;
                for (Cell c : cells.values()) {
                    if (!c.instance.equals(inst.name()) || c.chainCoupling != v || c.annealUs != anneal) {
                        continue;
                    }
                    if (Double.isNaN(c.pauseS)) {
                        baseline = c.p();
                    } else {
                        byDuration.computeIfAbsent(c.pauseUs, k -> new TreeMap<>()).put(c.pauseS, c);
                    }
                    table.append(row(c, s, gap, dips));
                }
                List<PauseGapPlot.PauseLine> lines = new ArrayList<>();
                for (Map.Entry<Double, TreeMap<Double, Cell>> d : byDuration.entrySet()) {
                    double[] at = d.getValue().keySet().stream().mapToDouble(Double::doubleValue).toArray();
                    double[] ps = d.getValue().values().stream().mapToDouble(Cell::p).toArray();
                    lines.add(new PauseGapPlot.PauseLine(d.getKey(), at, ps));
                }
                if (figures.size() < r.maxFigures() && !lines.isEmpty()) {
                    String name = ("pause-gap-" + inst.name() + "-V" + v).replaceAll("[^A-Za-z0-9.-]", "-");
                    figures.add(PauseGapPlot.of(name, inst.name() + ", chain coupling " + v,
                            String.format(Locale.ROOT, "%s at chain coupling %s, path-integral sampler (%s): success "
                                    + "probability of the gauged reads against the pause location, one line per pause "
                                    + "duration, the no-pause anneal dashed (left axis); the relevant gap of the embedded "
                                    + "problem under the same energy scales, its dips as diamonds (right axis).",
                                    inst.name(), v, plan.sampler().slices() + " slices, T = " + plan.sampler()
                                    .temperature()), lines, baseline, s, gap, dipS, scales.units()));
                }
            }
        }
        return new Result(table.toString(), figures, solved == 0
                ? "every embedded problem has more spins than the exact solvers take" : null);
    }

    /** Reads and successes of the gauged reads of one (instance, chain coupling, anneal, pause). */
    private static final class Cell {
        final String instance;
        final double chainCoupling;
        final double annealUs;
        final double pauseS;
        final double pauseUs;
        long reads;
        long successes;

        Cell(String instance, double chainCoupling, double annealUs, double pauseS, double pauseUs) {
            this.instance = instance;
            this.chainCoupling = chainCoupling;
            this.annealUs = annealUs;
            this.pauseS = pauseS;
            this.pauseUs = pauseUs;
        }

        double p() {
            return reads == 0 ? 0 : (double) successes / reads;
        }
    }

    private static Map<String, Double> ground(CampaignFolder folder) throws IOException {
        Map<String, Double> out = new LinkedHashMap<>();
        for (GroundTable.Row r : GroundTable.read(folder.resolve(CampaignFolder.GROUND))) {
            if (!Double.isNaN(r.energy())) {
                out.put(r.instance(), r.energy());
            }
        }
        return out;
    }

    private static Map<String, Cell> cells(CampaignFolder folder, Map<String, Double> ground) throws IOException {
        Map<String, Cell> out = new LinkedHashMap<>();
        try (CsvReader csv = CsvReader.open(folder.resolve(CampaignFolder.RESULTS))) {
            int[] c = csv.require("a campaign's results table", "instance", "energy", "count", "chain_coupling",
                    "anneal_us", "pause_s", "pause_us", "gauged");
            String[] r;
            while ((r = csv.record()) != null) {
                if (!r[c[7]].equals("yes") || r[c[4]].isEmpty()) {
                    continue;
                }
                String key = r[c[0]] + "|" + r[c[3]] + "|" + r[c[4]] + "|" + r[c[5]] + "|" + r[c[6]];
                Cell cell = out.get(key);
                if (cell == null) {
                    cell = new Cell(r[c[0]], Double.parseDouble(r[c[3]]), Double.parseDouble(r[c[4]]),
                            r[c[5]].isEmpty() ? Double.NaN : Double.parseDouble(r[c[5]]),
                            r[c[6]].isEmpty() ? Double.NaN : Double.parseDouble(r[c[6]]));
                    out.put(key, cell);
                }
                long n = Long.parseLong(r[c[2]]);
                cell.reads += n;
                Double g = ground.get(r[c[0]]);
                if (g != null && !r[c[1]].isEmpty() && SuccessRule.DEFAULT.isSuccess(Double.parseDouble(r[c[1]]), g)) {
                    cell.successes += n;
                }
            }
        }
        return out;
    }

    private static String row(Cell c, double[] s, double[] gap, List<GapDip> dips) {
        double gapAt = Double.NaN;
        double dipS = Double.NaN;
        double dipGap = Double.NaN;
        if (!Double.isNaN(c.pauseS)) {
            gapAt = at(s, gap, c.pauseS);
            GapDip before = null;
            for (GapDip d : dips) {
                if (d.s() <= c.pauseS && (before == null || d.s() > before.s())) {
                    before = d;
                }
            }
            if (before != null) {
                dipS = before.s();
                dipGap = before.gap();
            }
        }
        return PauseGapTable.line(new PauseGapTable.Row(c.instance, c.chainCoupling, c.annealUs, c.pauseS, c.pauseUs,
                c.reads, c.successes, c.p(), gapAt, dipS, dipGap));
    }

    /** The gap at s by linear interpolation between scan points. */
    private static double at(double[] s, double[] gap, double x) {
        for (int k = 1; k < s.length; k++) {
            if (x <= s[k]) {
                double t = (x - s[k - 1]) / (s[k] - s[k - 1]);
                return gap[k - 1] + t * (gap[k] - gap[k - 1]);
            }
        }
        return gap[gap.length - 1];
    }
}
