package org.obverse.stats;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.stat.descriptive.rank.Percentile;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class HierarchicalBootstrapTest extends QuietTest {
    private static Campaign campaign(long seed) {
        UniformRandomProvider rng = Seeds.rng(seed);
        double[][] rates = new double[30][3];
        for (double[] row : rates) {
            row[0] = 0.05 + 0.3 * rng.nextDouble();
            row[1] = row[0] * 1.5;
            row[2] = rng.nextInt(4) == 0 ? 0 : 0.02;
        }
        return SyntheticCampaigns.of(rng, rates, 6, 100);
    }

    @Test
    void sameDigitsWhateverTheThreads() {
        Campaign c = campaign(3);
        for (Resampling scheme : Resampling.values()) {
        BootstrapPlan plan = BootstrapPlan.of(77, 64).withPairs(List.of(new int[] {1, 0})).withResampling(scheme);
        BootstrapResult one = HierarchicalBootstrap.run(c, plan.withThreads(1), null);
        BootstrapResult two = HierarchicalBootstrap.run(c, plan.withThreads(2), null);
        for (int s = 0; s < 3; s++) {
            assertThat(two.ttsReplicates(s)).containsExactly(one.ttsReplicates(s));
            assertThat(two.pReplicates(s)).containsExactly(one.pReplicates(s));
        }
        assertThat(two.ratioReplicates(0)).containsExactly(one.ratioReplicates(0));
        BootstrapResult other = HierarchicalBootstrap.run(c, BootstrapPlan.of(78, 64).withResampling(scheme), null);
        assertThat(other.ttsReplicates(0)).isNotEqualTo(one.ttsReplicates(0));
        }
    }

    @Test
    void goldenReplicates() {
        // Golden vectors, re-pinned when the default scheme became instances-only (issue 10): the
        // replicate medians for a fixed three-instance campaign and seed 2026. Pooled p: a 40/200,
        // b 50/200, c 12/200. Any change in the stream derivation or the draw order changes them.
        Campaign c = Campaign.builder().ground("a", 0, true).ground("b", 0, true).ground("c", 0, true)
                .add("a", "s", 0, 100, 10, 0, 2000, 0, 0).add("a", "s", 1, 100, 30, 0, 2000, 0, 0)
                .add("b", "s", 0, 100, 50, 0, 2000, 0, 0).add("b", "s", 1, 100, 0, 0, 2000, 0, 0)
                .add("c", "s", 0, 100, 5, 0, 2000, 0, 0).add("c", "s", 1, 100, 7, 0, 2000, 0, 0).build();
        for (int threads = 1; threads <= 2; threads++) {
            BootstrapResult r = HierarchicalBootstrap.run(c, BootstrapPlan.of(2026, 5).withThreads(threads), null);
            assertThat(r.pReplicates(0)).containsExactly(GOLDEN_P);
            BootstrapResult reads = HierarchicalBootstrap.run(c, BootstrapPlan.of(2026, 5).withThreads(threads)
                    .withResampling(Resampling.READS_ONLY), null);
            assertThat(reads.pReplicates(0)).containsExactly(GOLDEN_P_READS);
        }
        // The instances-only replicates by hand: the median of the pooled p of the drawn instances.
        double[] pooled = {0.2, 0.25, 0.06};
        for (int r = 0; r < 5; r++) {
            UniformRandomProvider rng = HierarchicalBootstrap.stream(2026, r);
            double[] drawn = {pooled[rng.nextInt(3)], pooled[rng.nextInt(3)], pooled[rng.nextInt(3)]};
            java.util.Arrays.sort(drawn);
            assertThat(GOLDEN_P[r]).isEqualTo(drawn[1]);
        }
    }

    private static final double[] GOLDEN_P = {0.2, 0.25, 0.2, 0.2, 0.2};
    private static final double[] GOLDEN_P_READS = {0.2, 0.205, 0.155, 0.125, 0.14};

    @Test
    void observedIsTheMedianOverInstancesAndTheHeadlineTheMedianOfReplicates() {
        Campaign c = campaign(4);
        BootstrapResult res = HierarchicalBootstrap.run(c, BootstrapPlan.of(1, 41), null);
        List<CellScore> cells = CampaignScoring.cells(c, 0.99, 0.95);
        Percentile r7 = new Percentile().withEstimationType(Percentile.EstimationType.R_7);
        for (int s = 0; s < 2; s++) {
            int setting = s;
            double[] tts = cells.stream().filter(x -> x.setting() == setting).mapToDouble(CellScore::tts).toArray();
            // Settings 0 and 1 have every TTS finite here: the oracle's R_7 median applies directly.
            assertThat(res.observedTts(s)).isCloseTo(r7.evaluate(tts, 50), within(1e-12));
            assertThat(BootstrapResult.headline(res.ttsReplicates(s))).isCloseTo(r7.evaluate(res.ttsReplicates(s), 50),
                    within(1e-12));
        }
    }

    @Test
    void replicatesMatchAnIndependentLoop() {
        // An independent re-implementation of instances-then-gauges and of reads-only with the
        // same streams and draw order; quantiles by commons-math3 (R_7), TTS by the formula of
        // Rønnow et al., Science 345, 420 (2014).
        Campaign c = campaign(5);
        for (Resampling scheme : List.of(Resampling.INSTANCES_THEN_GAUGES, Resampling.READS_ONLY)) {
            BootstrapPlan plan = BootstrapPlan.of(99, 20).withThreads(1).withResampling(scheme);
            BootstrapResult res = HierarchicalBootstrap.run(c, plan, null);
            Percentile r7 = new Percentile().withEstimationType(Percentile.EstimationType.R_7);
            int nI = c.instanceCount();
            for (int r = 0; r < 20; r++) {
                UniformRandomProvider rng = HierarchicalBootstrap.stream(99, r);
                int[] drawn = new int[nI];
                for (int j = 0; j < nI; j++) {
                    drawn[j] = scheme.drawsInstances() ? rng.nextInt(nI) : j;
                }
                for (int s = 0; s < 3; s++) {
                    List<Double> tts = new ArrayList<>();
                    for (int j = 0; j < nI; j++) {
                        int cell = c.cell(drawn[j], s);
                        int from = c.gaugeFrom(cell);
                        int g = c.gaugeTo(cell) - from;
                        long succ = 0;
                        long n = 0;
                        for (int k = 0; k < g; k++) {
                            int slot = scheme.drawsGauges() ? from + rng.nextInt(g) : from + k;
                            succ += scheme.drawsReads() ? BinomialSampler.of(c.reads(slot),
                                    (double) c.successes(slot) / c.reads(slot)).sample(rng) : c.successes(slot);
                            n += c.reads(slot);
                        }
                        double p = (double) succ / n;
                        double run = 1 + s;
                        tts.add(p == 0 ? Double.POSITIVE_INFINITY : run * Math.log(0.01) / Math.log(1 - p));
                    }
                    double[] v = tts.stream().mapToDouble(Double::doubleValue).toArray();
                    boolean finite = java.util.Arrays.stream(v).allMatch(Double::isFinite);
                    if (finite) {
                        assertThat(res.ttsReplicates(s)[r]).isCloseTo(r7.evaluate(v, 50), within(1e-9));
                    } else {
                        double expected = Quantiles.of(v, 0.5);
                        if (Double.isInfinite(expected)) {
                            assertThat(res.ttsReplicates(s)[r]).isInfinite();
                        } else {
                            assertThat(res.ttsReplicates(s)[r]).isCloseTo(expected, within(1e-12 * expected));
                        }
                    }
                }
            }
        }
    }

    @Test
    void readResamplingHasTheBinomialSpread() {
        // One instance, one gauge, n = 400, p = 0.3: p* ~ Binomial(400, 0.3) / 400 with
        // variance 0.3·0.7/400 = 5.25e-4. Over 4000 replicates the sample variance has a
        // relative standard error of about sqrt(2/4000) = 2.2 %; a ±12 % window fails by chance
        // with probability below 1e-7. Gauges-only on a one-gauge run redraws the reads too.
        Campaign c = Campaign.builder().ground("a", 0, true).add("a", "s", 0, 400, 120, 0, 400, 0, 0).build();
        for (Resampling scheme : List.of(Resampling.READS_ONLY, Resampling.GAUGES_ONLY)) {
            BootstrapResult res = HierarchicalBootstrap.run(c, BootstrapPlan.of(5, 4000).withResampling(scheme), null);
            double[] p = res.pReplicates(0);
            double mean = java.util.Arrays.stream(p).average().orElseThrow();
            double var = java.util.Arrays.stream(p).map(x -> (x - mean) * (x - mean)).sum() / (p.length - 1);
            assertThat(var).isBetween(5.25e-4 * 0.88, 5.25e-4 * 1.12);
            assertThat(mean).isCloseTo(0.3, within(6 * Math.sqrt(5.25e-4 / 4000)));
        }
    }

    @Test
    void oneInstanceResampledByInstancesIsAlwaysTheObservedValue() {
        // Instances-only keeps a drawn instance's reads as observed: one instance, no spread.
        Campaign c = Campaign.builder().ground("a", 0, true).add("a", "s", 0, 400, 120, 0, 400, 0, 0)
                .add("a", "s", 1, 400, 20, 0, 400, 0, 0).build();
        BootstrapResult res = HierarchicalBootstrap.run(c, BootstrapPlan.of(1, 10), null);
        assertThat(res.ttsReplicates(0)).containsOnly(res.observedTts(0));
        assertThat(res.observedTts(0)).isCloseTo(Math.log(0.01) / Math.log(1 - 140.0 / 800), within(1e-12));
        // Gauges-only resamples the two gauges: both all-first and all-second draws occur.
        BootstrapResult g = HierarchicalBootstrap.run(c, BootstrapPlan.of(1, 200)
                .withResampling(Resampling.GAUGES_ONLY), null);
        assertThat(g.pReplicates(0)).contains(0.3, 0.05);
    }

    @Test
    void pairsAndSweep() {
        Campaign c = campaign(6);
        BootstrapPlan plan = BootstrapPlan.of(2, 200).withPairs(List.of(new int[] {1, 0}));
        BootstrapResult res = HierarchicalBootstrap.run(c, plan, null);
        // Pair {setting 1, reference 0}: ratio TTS_0 / TTS_1, difference TTS_0 − TTS_1.
        List<CellScore> cells = CampaignScoring.cells(c, 0.99, 0.95);
        double[] a = cells.stream().filter(x -> x.setting() == 1).mapToDouble(CellScore::tts).toArray();
        double[] b = cells.stream().filter(x -> x.setting() == 0).mapToDouble(CellScore::tts).toArray();
        double[] ratio = new double[a.length];
        double[] diff = new double[a.length];
        for (int i = 0; i < a.length; i++) {
            ratio[i] = HierarchicalBootstrap.ratio(b[i], a[i]);
            diff[i] = b[i] == a[i] ? 0 : b[i] - a[i];
        }
        assertThat(res.observedRatio(0)).isEqualTo(Quantiles.of(ratio, 0.5));
        assertThat(res.observedDifference(0)).isEqualTo(Quantiles.of(diff, 0.5));
        SettingComparison cmp = SettingComparison.of(a, b);
        assertThat(res.observedImproved(0)).isEqualTo(cmp.fractionImproved());
        double[] band = BootstrapResult.band(res.ratioReplicates(0), 0.05, 0.95);
        assertThat(band[0]).isLessThanOrEqualTo(band[1]);
        BootstrapResult.Sweep sweep = res.sweep(new int[] {0, 1, 2}, 0.05, 0.95);
        assertThat(sweep.best()).isIn(0, 1);
        assertThat(sweep.observedLeast()).isEqualTo(Math.min(res.observedTts(0), res.observedTts(1)));
        assertThat(sweep.leastTts()).isBetween(sweep.bandLow(), sweep.bandHigh());
        assertThat(sweep.bestFraction()[0] + sweep.bestFraction()[1] + sweep.bestFraction()[2]).isCloseTo(1, within(1e-12));
    }
}
