package org.obverse.cli;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class ScoreCommandTest extends QuietTest {
    @TempDir
    Path dir;

    record Run(int code, String out, String err) {
    }

    static Run run(String... args) {
        StringWriter o = new StringWriter();
        StringWriter e = new StringWriter();
        int code = Main.run(args, new PrintWriter(o, true), new PrintWriter(e, true));
        return new Run(code, o.toString(), e.toString());
    }

    /** Invented campaign: 12 instances, two anneal times, 4 gauges of 50 reads. */
    static void campaign(Path results, Path ground, long seed) throws IOException {
        UniformRandomProvider rng = Seeds.rng(seed);
        StringBuilder r = new StringBuilder("instance,setting,gauge,energy,count,broken,run_us,anneal_us\n");
        StringBuilder g = new StringBuilder("instance,ground_energy\n");
        for (int i = 0; i < 12; i++) {
            g.append("p").append(i).append(",-7\n");
            double base = 0.05 + 0.3 * rng.nextDouble();
            for (int a : new int[] {10, 40}) {
                double p = a == 40 ? Math.min(1, base * 2) : base;
                for (int k = 0; k < 4; k++) {
                    int succ = 0;
                    for (int t = 0; t < 50; t++) {
                        succ += rng.nextDouble() < p ? 1 : 0;
                    }
                    if (succ > 0) {
                        r.append("p").append(i).append(",anneal=").append(a).append(',').append(k).append(",-7,")
                                .append(succ).append(",0,").append(a).append(',').append(a).append('\n');
                    }
                    if (succ < 50) {
                        r.append("p").append(i).append(",anneal=").append(a).append(',').append(k).append(",-5,")
                                .append(50 - succ).append(",2,").append(a).append(',').append(a).append('\n');
                    }
                }
            }
        }
        Files.writeString(results, r);
        Files.writeString(ground, g);
    }

    @Test
    void writesContractFilesAndJson() throws IOException {
        Path res = dir.resolve("results.csv");
        Path gr = dir.resolve("ground.csv");
        campaign(res, gr, 11);
        Path out = dir.resolve("scores");
        Run r = run("score", "--results", res.toString(), "--ground", gr.toString(), "--out", out.toString(),
                "--replicates", "200", "--compare", "anneal=40", "anneal=10", "--sweep", "anneal_us");
        assertThat(r.code()).as(r.err()).isZero();
        assertThat(r.out()).contains("anneal=10").contains("TTS (us)").contains("anneal=40 against anneal=10");
        List<String> inst = Files.readAllLines(out.resolve("instances.csv"));
        assertThat(inst.get(0)).startsWith("instance,setting,reads,successes,p_success,tts_us");
        assertThat(inst).hasSize(1 + 24);
        List<String> set = Files.readAllLines(out.resolve("settings.csv"));
        assertThat(set.get(0)).startsWith("setting,instances,solved_instances,instance_quantile,tts_us,tts_band_low_us,"
                + "tts_band_high_us,tts_outer_low_us,tts_outer_high_us,observed_tts_us,");
        assertThat(set).hasSize(3);
        assertThat(out.resolve("comparisons.csv")).exists();
        assertThat(out.resolve("sweep.csv")).exists();
        // Each instance row: TTS from its own p and run time (Rønnow et al. 2014).
        for (String line : inst.subList(1, inst.size())) {
            String[] f = line.split(",");
            double p = Double.parseDouble(f[4]);
            double run = Double.parseDouble(f[13]);
            double tts = p == 0 ? Double.POSITIVE_INFINITY : p >= 0.99 ? run : run * Math.log(0.01) / Math.log(1 - p);
            if (Double.isInfinite(tts)) {
                assertThat(f[5]).isEqualTo("inf");
            } else {
                assertThat(Double.parseDouble(f[5])).isCloseTo(tts, within(1e-9 * tts));
            }
        }
        // settings.csv: the median over instances (commons-math3 Percentile R_7, Hyndman & Fan
        // type 7) of the per-instance TTS of instances.csv; infinite values sort last.
        for (String row : set.subList(1, set.size())) {
            String[] f = row.split(",");
            double[] tts = inst.subList(1, inst.size()).stream().map(l -> l.split(","))
                    .filter(x -> x[1].equals(f[0])).mapToDouble(x -> x[5].equals("inf") ? Double.POSITIVE_INFINITY
                            : Double.parseDouble(x[5])).sorted().toArray();
            assertThat(Long.parseLong(f[1])).isEqualTo(tts.length);
            if (java.util.Arrays.stream(tts).allMatch(Double::isFinite)) {
                double median = new org.apache.commons.math3.stat.descriptive.rank.Percentile()
                        .withEstimationType(org.apache.commons.math3.stat.descriptive.rank.Percentile.EstimationType.R_7)
                        .evaluate(tts, 50);
                assertThat(Double.parseDouble(f[9])).isCloseTo(median, within(1e-9 * median));
            }
            // The headline (median of the replicates) lies inside both bands.
            assertThat(Double.parseDouble(f[5])).isLessThanOrEqualTo(Double.parseDouble(f[4]));
            assertThat(Double.parseDouble(f[4])).isLessThanOrEqualTo(Double.parseDouble(f[6]));
            assertThat(Double.parseDouble(f[7])).isLessThanOrEqualTo(Double.parseDouble(f[5]));
            assertThat(Double.parseDouble(f[6])).isLessThanOrEqualTo(Double.parseDouble(f[8]));
        }
        // Same seed, same digits; --json prints the same content.
        Run j = run("score", "--results", res.toString(), "--ground", gr.toString(), "--json", "--replicates", "200",
                "--compare", "anneal=40", "anneal=10", "--sweep", "anneal_us", "--threads", "1");
        assertThat(j.code()).isZero();
        JsonNode doc = new ObjectMapper().readTree(j.out());
        assertThat(doc.get("format").asText()).isEqualTo("obverse.scores/2");
        JsonNode s0 = doc.get("settings").get(0);
        String[] csv0 = set.get(1).split(",");
        assertThat(s0.get("setting").asText()).isEqualTo(csv0[0]);
        assertThat(s0.get("tts_band_low_us").asDouble()).isEqualTo(Double.parseDouble(csv0[5]));
        assertThat(s0.get("tts_band_high_us").asDouble()).isEqualTo(Double.parseDouble(csv0[6]));
        // An existing output is not replaced without --force.
        Run again = run("score", "--results", res.toString(), "--ground", gr.toString(), "--out", out.toString());
        assertThat(again.code()).isEqualTo(2);
        assertThat(again.err()).contains("already exists").contains("--force");
    }

    @Test
    void badInputIsOneLineAndExitTwo() throws IOException {
        Path res = dir.resolve("results.csv");
        Path gr = dir.resolve("ground.csv");
        campaign(res, gr, 12);
        Files.writeString(gr, "instance,ground_energy\np0,-7\n");
        Run r = run("score", "--results", res.toString(), "--ground", gr.toString(), "--json");
        assertThat(r.code()).isEqualTo(2);
        assertThat(r.err().strip().lines().count()).isEqualTo(1);
        assertThat(r.err()).contains("no ground energy for instance 'p1'");
        Path bad = dir.resolve("bad.csv");
        Files.writeString(bad, "instance,setting,gauge,energy,count,broken,run_us\np0,a,0,-7,-2,0,5\n");
        Run b = run("score", "--results", bad.toString());
        assertThat(b.code()).isEqualTo(2);
        assertThat(b.err()).contains("bad.csv: line 2, column count: value '-2' is not a count >= 1");
        Run c = run("score", "--results", res.toString(), "--compare", "anneal=10", "nope");
        assertThat(c.code()).isEqualTo(2);
        assertThat(c.err()).contains("no setting 'nope'");
        Run d = run("score", "--results", dir.resolve("missing.csv").toString());
        assertThat(d.code()).isEqualTo(2);
        assertThat(d.err()).contains("no such file");
    }
}
