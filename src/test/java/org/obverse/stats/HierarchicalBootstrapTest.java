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
        BootstrapPlan plan = BootstrapPlan.of(77, 64).withPairs(List.of(new int[] {1, 0}));
        BootstrapResult one = HierarchicalBootstrap.run(c, plan.withThreads(1), null);
        BootstrapResult two = HierarchicalBootstrap.run(c, plan.withThreads(2), null);
        for (int s = 0; s < 3; s++) {
            assertThat(two.ttsReplicates(s)).containsExactly(one.ttsReplicates(s));
            assertThat(two.pReplicates(s)).containsExactly(one.pReplicates(s));
        }
        assertThat(two.ratioReplicates(0)).containsExactly(one.ratioReplicates(0));
        BootstrapResult other = HierarchicalBootstrap.run(c, BootstrapPlan.of(78, 64), null);
        assertThat(other.ttsReplicates(0)).isNotEqualTo(one.ttsReplicates(0));
    }

    @Test
    void goldenReplicates() {
        // Golden vector: replicate medians for a fixed three-instance campaign and seed 2026.
        // Any change in the stream derivation, the draw order or the sampler changes these digits.
        Campaign c = Campaign.builder().ground("a", 0, true).ground("b", 0, true).ground("c", 0, true)
                .add("a", "s", 0, 100, 10, 0, 2000, 0, 0).add("a", "s", 1, 100, 30, 0, 2000, 0, 0)
                .add("b", "s", 0, 100, 50, 0, 2000, 0, 0).add("b", "s", 1, 100, 0, 0, 2000, 0, 0)
                .add("c", "s", 0, 100, 5, 0, 2000, 0, 0).add("c", "s", 1, 100, 7, 0, 2000, 0, 0).build();
        for (int threads = 1; threads <= 2; threads++) {
            BootstrapResult r = HierarchicalBootstrap.run(c, BootstrapPlan.of(2026, 5).withThreads(threads), null);
            assertThat(r.ttsReplicates(0)).containsExactly(238.81867773563218, 1370.407932595983, 450.2355174449124,
                    380.48006656911275, 370.69508103716623);
            assertThat(r.pReplicates(0)).containsExactly(0.32, 0.065, 0.185, 0.215, 0.22);
        }
    }

    @Test
    void pointEstimateIsTheMedianOverInstances() {
        Campaign c = campaign(4);
        BootstrapResult res = HierarchicalBootstrap.run(c, BootstrapPlan.of(1, 4), null);
        List<CellScore> cells = CampaignScoring.cells(c, 0.99, 0.95);
        for (int s = 0; s < 2; s++) {
            int setting = s;
            double[] tts = cells.stream().filter(x -> x.setting() == setting).mapToDouble(CellScore::tts).toArray();
            // Settings 0 and 1 have every TTS finite here: the oracle's R_7 median applies directly.
            assertThat(res.tts(s)).isCloseTo(new Percentile().withEstimationType(Percentile.EstimationType.R_7)
                    .evaluate(tts, 50), within(1e-12));
        }
    }

    @Test
    void replicatesMatchAnIndependentLoop() {
        // An independent re-implementation of the scheme with the same streams and draw order;
        // quantiles by commons-math3 (R_7), TTS by the formula of Rønnow et al. 2014.
        Campaign c = campaign(5);
        BootstrapPlan plan = BootstrapPlan.of(99, 20).withThreads(1);
        BootstrapResult res = HierarchicalBootstrap.run(c, plan, null);
        Percentile r7 = new Percentile().withEstimationType(Percentile.EstimationType.R_7);
        int nI = c.instanceCount();
        for (int r = 0; r < 20; r++) {
            UniformRandomProvider rng = HierarchicalBootstrap.stream(99, r);
            int[] drawn = new int[nI];
            for (int j = 0; j < nI; j++) {
                drawn[j] = rng.nextInt(nI);
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
                        int slot = from + rng.nextInt(g);
                        succ += BinomialSampler.of(c.reads(slot), (double) c.successes(slot) / c.reads(slot)).sample(rng);
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

    @Test
    void readResamplingHasTheBinomialSpread() {
        // One instance, one gauge, n = 400, p = 0.3: p* ~ Binomial(400, 0.3) / 400 with
        // variance 0.3·0.7/400 = 5.25e-4. Over 4000 replicates the sample variance has a
        // relative standard error of about sqrt(2/4000) = 2.2 %; a ±12 % window fails by chance
        // with probability below 1e-7.
        Campaign c = Campaign.builder().ground("a", 0, true).add("a", "s", 0, 400, 120, 0, 400, 0, 0).build();
        BootstrapResult res = HierarchicalBootstrap.run(c, BootstrapPlan.of(5, 4000), null);
        double[] p = res.pReplicates(0);
        double mean = java.util.Arrays.stream(p).average().orElseThrow();
        double var = java.util.Arrays.stream(p).map(x -> (x - mean) * (x - mean)).sum() / (p.length - 1);
        assertThat(var).isBetween(5.25e-4 * 0.88, 5.25e-4 * 1.12);
        assertThat(mean).isCloseTo(0.3, within(6 * Math.sqrt(5.25e-4 / 4000)));
    }

    @Test
    void withoutResamplingEveryReplicateIsThePoint() {
        Campaign c = Campaign.builder().ground("a", 0, true).add("a", "s", 0, 400, 120, 0, 400, 0, 0)
                .add("a", "s", 1, 400, 20, 0, 400, 0, 0).build();
        BootstrapPlan plan = new BootstrapPlan(1, 10, 0.5, 0.99, false, false, 1, List.of());
        BootstrapResult res = HierarchicalBootstrap.run(c, plan, null);
        assertThat(res.ttsReplicates(0)).containsOnly(res.tts(0));
        assertThat(res.tts(0)).isCloseTo(Math.log(0.01) / Math.log(1 - 140.0 / 800), within(1e-12));
    }

    @Test
    void pairsAndSweep() {
        Campaign c = campaign(6);
        BootstrapPlan plan = BootstrapPlan.of(2, 200).withPairs(List.of(new int[] {1, 0}));
        BootstrapResult res = HierarchicalBootstrap.run(c, plan, null);
        // Setting 1 has 1.5x the success rate at twice the run time (synthetic design).
        List<CellScore> cells = CampaignScoring.cells(c, 0.99, 0.95);
        double[] a = cells.stream().filter(x -> x.setting() == 1).mapToDouble(CellScore::tts).toArray();
        double[] b = cells.stream().filter(x -> x.setting() == 0).mapToDouble(CellScore::tts).toArray();
        double[] ratio = new double[a.length];
        for (int i = 0; i < a.length; i++) {
            ratio[i] = HierarchicalBootstrap.ratio(a[i], b[i]);
        }
        assertThat(res.ratio(0)).isEqualTo(Quantiles.of(ratio, 0.5));
        SettingComparison cmp = SettingComparison.of(a, b);
        assertThat(res.improvedFraction(0)).isEqualTo(cmp.fractionImproved());
        double[] band = BootstrapResult.band(res.ratioReplicates(0), 0.05, 0.95);
        assertThat(band[0]).isLessThanOrEqualTo(band[1]);
        BootstrapResult.Sweep sweep = res.sweep(new int[] {0, 1, 2}, 0.05, 0.95);
        assertThat(sweep.best()).isIn(0, 1);
        assertThat(sweep.tts()).isEqualTo(Math.min(res.tts(0), res.tts(1)));
        assertThat(sweep.bestFraction()[0] + sweep.bestFraction()[1] + sweep.bestFraction()[2]).isCloseTo(1, within(1e-12));
    }
}
