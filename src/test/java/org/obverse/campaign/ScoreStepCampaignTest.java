package org.obverse.campaign;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.stat.descriptive.rank.Percentile;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.BadInputException;
import org.obverse.io.table.ScoreFiles;
import org.obverse.stats.CampaignSummary;
import org.obverse.stats.Resampling;
import org.obverse.testsupport.CampaignTables;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

/** ScoreStep on an invented campaign folder: baselines, sweeps over several columns, several tables. */
class ScoreStepCampaignTest extends QuietTest {
    @TempDir
    Path dir;

    private static ScoreStep.Request request(List<Path> results, String baseline, List<String> sweep) {
        return new ScoreStep.Request(results, null, 0.99, 0.95, 0.5, new double[] {0.35, 0.65},
                new double[] {0.05, 0.95}, 300, 3, 2, List.of(), baseline, sweep, 1e-9, 1e-9, Resampling.INSTANCES,
                null);
    }

    /** TTS by the formula of Rønnow et al., Science 345, 420 (2014), written out here. */
    private static double tts(long succ, long reads, double run) {
        double p = (double) succ / reads;
        return p == 0 ? Double.POSITIVE_INFINITY : p >= 0.99 ? run : run * Math.log(0.01) / Math.log(1 - p);
    }

    @Test
    void baselinePairsGiveTheInstanceWiseDeltaTtsAndTheSignTest() throws Exception {
        Path camp = dir.resolve("camp");
        List<CampaignTables.Cell> cells = CampaignTables.write(camp, CampaignTables.Plan.standard(), Seeds.rng(21));
        ScoreStep.Result r = ScoreStep.run(request(List.of(camp), "pause_s=", List.of()));
        // The folder's ground.csv was used.
        assertThat(r.ground()).isEqualTo(camp.resolve("ground.csv"));
        ScoreFiles.Tables t = ScoreFiles.tables(r.scores());
        // 3 couplings × 2 gauged × 8 pauses pair with their own no-pause baseline.
        assertThat(t.baseline()).hasSize(48);
        assertThat(r.withoutBaseline()).isEmpty();
        Percentile r7 = new Percentile().withEstimationType(Percentile.EstimationType.R_7);
        for (Map<String, Object> row : t.baseline()) {
            String setting = (String) row.get("setting");
            String reference = (String) row.get("reference");
            CampaignTables.Cell one = cells.stream().filter(c -> c.setting().equals(setting)).findFirst().orElseThrow();
            // The reference is the no-pause setting at the same coupling and gauging.
            CampaignTables.Cell base = cells.stream().filter(c -> c.setting().equals(reference)).findFirst().orElseThrow();
            assertThat(Double.isNaN(base.pauseS())).isTrue();
            assertThat(base.coupling()).isEqualTo(one.coupling());
            assertThat(base.gauged()).isEqualTo(one.gauged());
            // Independent ΔTTS: per instance from the written counts, then the R_7 median.
            List<Double> deltas = new ArrayList<>();
            int faster = 0;
            int slower = 0;
            for (CampaignTables.Cell c : cells) {
                if (!c.setting().equals(setting)) {
                    continue;
                }
                CampaignTables.Cell b = cells.stream().filter(x -> x.setting().equals(reference)
                        && x.instance().equals(c.instance())).findFirst().orElseThrow();
                double ts = tts(java.util.Arrays.stream(c.successes()).sum(), c.readsPerGauge() * c.successes().length,
                        c.runUs());
                double tb = tts(java.util.Arrays.stream(b.successes()).sum(), b.readsPerGauge() * b.successes().length,
                        b.runUs());
                deltas.add(tb == ts ? 0 : tb - ts);
                faster += ts < tb ? 1 : 0;
                slower += ts > tb ? 1 : 0;
            }
            double[] d = deltas.stream().mapToDouble(Double::doubleValue).toArray();
            double observed = (Double) row.get("observed_tts_reference_minus_setting_us");
            if (java.util.Arrays.stream(d).allMatch(Double::isFinite)) {
                double expected = r7.evaluate(d, 50);
                assertThat(observed).isCloseTo(expected, within(1e-9 * Math.max(1, Math.abs(expected))));
            }
            assertThat(row.get("setting_faster")).isEqualTo((long) faster);
            assertThat(row.get("reference_faster")).isEqualTo((long) slower);
            // Sign test against commons-math3's binomial distribution (two-sided, doubled tail).
            int n = faster + slower;
            double p = n == 0 ? 1 : Math.min(1, 2 * new BinomialDistribution(n, 0.5)
                    .cumulativeProbability(Math.min(faster, slower)));
            assertThat((Double) row.get("sign_test_p")).isCloseTo(p, within(1e-12));
            double h = (Double) row.get("tts_reference_minus_setting_us");
            if (!Double.isNaN(h)) {
                assertThat(h).isBetween((Double) row.get("tts_reference_minus_setting_band_low_us"),
                        (Double) row.get("tts_reference_minus_setting_band_high_us"));
            }
        }
    }

    @Test
    void aSweepOverTwoColumnsFindsTheBestPausePerCouplingAndGauging() throws Exception {
        Path camp = dir.resolve("camp");
        CampaignTables.write(camp, CampaignTables.Plan.standard(), Seeds.rng(22));
        ScoreStep.Result r = ScoreStep.run(request(List.of(camp), null, List.of("pause_s", "pause_us")));
        ScoreFiles.Tables t = ScoreFiles.tables(r.scores());
        // Groups: chain_coupling × gauged; each holds the 8 pauses and the baseline.
        assertThat(t.sweep()).hasSize(6);
        for (Map<String, Object> row : t.sweep()) {
            assertThat(row.get("candidates")).isEqualTo(9L);
            assertThat((String) row.get("group")).contains("chain_coupling=").contains("gauged=");
            double f = (Double) row.get("best_fraction");
            assertThat(f).isBetween(0.0, 1.0);
            // The invented rates peak at s = 0.45 with the longer pause: the best is a pause at 0.4 or 0.5.
            assertThat((String) row.get("best_values")).containsAnyOf("pause_s=0.4", "pause_s=0.5");
            assertThat((Double) row.get("least_tts_us")).isBetween((Double) row.get("least_tts_band_low_us"),
                    (Double) row.get("least_tts_band_high_us"));
        }
        // Within a group the best fractions add up to one.
        for (int[] group : r.summary().options().sweepGroups()) {
            double sum = 0;
            for (int s : group) {
                sum += (Double) t.settings().get(s).get("best_fraction");
            }
            assertThat(sum).isCloseTo(1, within(1e-9));
        }
    }

    @Test
    void severalTablesAreReadAsOneAndARepeatedGaugeIsRefused() throws Exception {
        Path camp = dir.resolve("camp");
        CampaignTables.write(camp, CampaignTables.Plan.standard(), Seeds.rng(23));
        List<String> lines = Files.readAllLines(camp.resolve("results.csv"));
        // Split the table by instance: inst-0..1 in one file, the rest in another.
        List<String> a = new ArrayList<>(List.of(lines.get(0)));
        List<String> b = new ArrayList<>(List.of(lines.get(0)));
        for (String l : lines.subList(1, lines.size())) {
            (l.startsWith("inst-0,") || l.startsWith("inst-1,") ? a : b).add(l);
        }
        Files.write(dir.resolve("a.csv"), a);
        Files.write(dir.resolve("b.csv"), b);
        ScoreStep.Request whole = new ScoreStep.Request(List.of(camp.resolve("results.csv")),
                camp.resolve("ground.csv"), 0.99, 0.95, 0.5, new double[] {0.35, 0.65}, new double[] {0.05, 0.95}, 50,
                3, 1, List.of(), null, List.of(), 1e-9, 1e-9, Resampling.INSTANCES, null);
        ScoreStep.Result one = ScoreStep.run(whole);
        ScoreStep.Result two = ScoreStep.run(new ScoreStep.Request(List.of(dir.resolve("a.csv"), dir.resolve("b.csv")),
                camp.resolve("ground.csv"), 0.99, 0.95, 0.5, new double[] {0.35, 0.65}, new double[] {0.05, 0.95}, 50,
                3, 1, List.of(), null, List.of(), 1e-9, 1e-9, Resampling.INSTANCES, null));
        assertThat(two.loaded().rows()).isEqualTo(one.loaded().rows());
        for (int s = 0; s < one.summary().settings().size(); s++) {
            CampaignSummary.SettingRow x = one.summary().settings().get(s);
            CampaignSummary.SettingRow y = two.summary().settings().get(s);
            assertThat(y.tts().observed()).isEqualTo(x.tts().observed());
        }
        // b.csv again under another name: every gauge of it is found twice.
        Files.write(dir.resolve("b-copy.csv"), b);
        assertThatThrownBy(() -> ScoreStep.run(request(List.of(dir.resolve("b.csv"), dir.resolve("b-copy.csv")), null,
                List.of()))).isInstanceOf(BadInputException.class).hasMessageContaining("b-copy.csv")
                .hasMessageContaining("already read from").hasMessageContaining("b.csv");
        // The same file twice.
        assertThatThrownBy(() -> ScoreStep.run(request(List.of(dir.resolve("a.csv"), dir.resolve("a.csv")), null,
                List.of()))).isInstanceOf(BadInputException.class).hasMessageContaining("is given twice");
    }

    @Test
    void badBaselinesAreOneLine() throws Exception {
        Path camp = dir.resolve("camp");
        CampaignTables.write(camp, CampaignTables.Plan.standard(), Seeds.rng(24));
        assertThatThrownBy(() -> ScoreStep.run(request(List.of(camp), "pause_s", List.of())))
                .isInstanceOf(BadInputException.class).hasMessageContaining("is not COLUMN=VALUE");
        assertThatThrownBy(() -> ScoreStep.run(request(List.of(camp), "nothing=1", List.of())))
                .isInstanceOf(BadInputException.class).hasMessageContaining("has no setting column nothing");
        assertThatThrownBy(() -> ScoreStep.run(request(List.of(camp), "pause_s=0.9", List.of())))
                .isInstanceOf(BadInputException.class).hasMessageContaining("no setting with value '0.9'");
        // A non-numeric swept column is allowed: groups still form, the axis value is empty.
        ScoreStep.Result g = ScoreStep.run(request(List.of(camp), null, List.of("gauged")));
        assertThat(g.sweepGroups()).hasSize(27);
        assertThat(g.sweepValueBySetting()[0]).isNaN();
        assertThatThrownBy(() -> ScoreStep.run(request(List.of(dir), null, List.of())))
                .isInstanceOf(BadInputException.class).hasMessageContaining("without results.csv");
    }
}
