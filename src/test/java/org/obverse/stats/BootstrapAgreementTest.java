package org.obverse.stats;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.random.Well19937c;
import org.apache.commons.math3.stat.descriptive.rank.Percentile;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The campaign bootstrap against a plain two- and three-stage bootstrap written here from the
 * textbook description (Davison and Hinkley, Bootstrap Methods and their Application, 1997,
 * §3.8, from memory): its own generator (SplitMix64), its own binomial draws (commons-math3
 * BinomialDistribution on a Well19937c), its own percentiles (commons-math3 Percentile R_7, the
 * Hyndman-Fan type 7), TTS from the formula of Rønnow et al., Science 345, 420 (2014). The two
 * must agree on the headline and band ends within the spread between seeds.
 */
class BootstrapAgreementTest extends QuietTest {
    private static final int INSTANCES = 25;
    private static final int GAUGES = 5;
    private static final int READS = 80;
    private static final int REPLICATES = 1000;
    private static final int SEEDS = 5;

    /** successes[i][g] of one setting, every instance with at least one success (finite TTS). */
    private static long[][] counts(long seed) {
        UniformRandomProvider rng = Seeds.rng(seed);
        long[][] succ = new long[INSTANCES][GAUGES];
        for (int i = 0; i < INSTANCES; i++) {
            double rate = 0.03 + 0.4 * rng.nextDouble();
            for (int g = 0; g < GAUGES; g++) {
                double p = Math.min(1, rate * (0.4 + 1.2 * rng.nextDouble()));
                for (int r = 0; r < READS; r++) {
                    succ[i][g] += rng.nextDouble() < p ? 1 : 0;
                }
            }
            if (Arrays.stream(succ[i]).sum() == 0) {
                succ[i][0] = 1;
            }
        }
        return succ;
    }

    private static Campaign campaign(long[][] succ) {
        Campaign.Builder b = Campaign.builder();
        for (int i = 0; i < succ.length; i++) {
            b.ground("i" + i, -1, true);
            for (int g = 0; g < GAUGES; g++) {
                b.add("i" + i, "s", g, READS, succ[i][g], 0, 2.0 * READS, 0, -1);
            }
        }
        return b.build();
    }

    private static double tts(long succ, long reads) {
        double p = (double) succ / reads;
        return p >= 0.99 ? 2.0 : 2.0 * Math.log(0.01) / Math.log(1 - p);
    }

    /** The plain bootstrap: replicate medians over instances of TTS. */
    private static double[] plain(long[][] succ, Resampling scheme, long seed) {
        UniformRandomProvider rng = RandomSource.SPLIT_MIX_64.create(seed);
        Well19937c well = new Well19937c(seed);
        Percentile r7 = new Percentile().withEstimationType(Percentile.EstimationType.R_7);
        double[] out = new double[REPLICATES];
        for (int r = 0; r < REPLICATES; r++) {
            double[] t = new double[INSTANCES];
            for (int j = 0; j < INSTANCES; j++) {
                int i = scheme.drawsInstances() ? rng.nextInt(INSTANCES) : j;
                long s = 0;
                for (int k = 0; k < GAUGES; k++) {
                    int g = scheme.drawsGauges() ? rng.nextInt(GAUGES) : k;
                    s += scheme.drawsReads()
                            ? new BinomialDistribution(well, READS, (double) succ[i][g] / READS).sample() : succ[i][g];
                }
                t[j] = tts(s, (long) READS * GAUGES);
            }
            out[r] = r7.evaluate(t, 50);
        }
        return out;
    }

    @Test
    void headlineAndBandsAgreeWithAPlainBootstrapWithinTheSeedSpread() {
        long[][] succ = counts(404);
        Campaign c = campaign(succ);
        Percentile r7 = new Percentile().withEstimationType(Percentile.EstimationType.R_7);
        for (Resampling scheme : List.of(Resampling.INSTANCES, Resampling.INSTANCES_THEN_GAUGES,
                Resampling.READS_ONLY)) {
            double[][] ours = new double[3][SEEDS];
            double[][] theirs = new double[3][SEEDS];
            for (int k = 0; k < SEEDS; k++) {
                double[] a = HierarchicalBootstrap.run(c, new BootstrapPlan(1000 + k, REPLICATES, 0.5, 0.99, scheme, 2,
                        List.of()), null).ttsReplicates(0);
                double[] b = plain(succ, scheme, 5000 + k);
                double[] q = {35, 50, 65};
                for (int m = 0; m < 3; m++) {
                    ours[m][k] = r7.evaluate(a, q[m]);
                    theirs[m][k] = r7.evaluate(b, q[m]);
                }
            }
            double width = mean(theirs[2]) - mean(theirs[0]);
            for (int m = 0; m < 3; m++) {
                double se = Math.sqrt(var(ours[m]) / SEEDS + var(theirs[m]) / SEEDS);
                // 4 standard errors of the seed-to-seed spread; the replicate quantiles are
                // discrete (order statistics), so a floor of 3 % of the band width as well.
                assertThat(Math.abs(mean(ours[m]) - mean(theirs[m])))
                        .as("%s quantile %d: ours %s, plain %s", scheme.label(), m, Arrays.toString(ours[m]),
                                Arrays.toString(theirs[m]))
                        .isLessThanOrEqualTo(4 * se + 0.03 * width);
            }
        }
    }

    @Test
    void resamplingGaugesAgainCountsTheirScatterTwice() {
        // Davison and Hinkley §3.8 (from memory): with clusters (instances) whose means differ
        // only through their within-cluster noise (gauges and reads), resampling the second
        // stage again adds that variance a second time: the replicate spread grows by about √2.
        UniformRandomProvider rng = Seeds.rng(406);
        long[][] succ = new long[40][GAUGES];
        for (long[] row : succ) {
            for (int g = 0; g < GAUGES; g++) {
                double p = 0.05 + 0.3 * rng.nextDouble();
                for (int r = 0; r < READS; r++) {
                    row[g] += rng.nextDouble() < p ? 1 : 0;
                }
            }
        }
        Campaign c = campaign(succ);
        BootstrapPlan plan = new BootstrapPlan(9, 3000, 0.5, 0.99, Resampling.INSTANCES, 2, List.of());
        double one = sd(HierarchicalBootstrap.run(c, plan, null).pReplicates(0));
        double two = sd(HierarchicalBootstrap.run(c, plan.withResampling(Resampling.INSTANCES_THEN_GAUGES), null)
                .pReplicates(0));
        assertThat(two / one).isBetween(1.15, 1.7);
    }

    @Test
    void everyHeadlineLiesInsideItsBands() {
        // Property over many invented campaigns with known success rates (some settings never
        // succeed on some instances, so infinite TTS occurs).
        Seeds.forEachCase(40, 7100, (rng, seed) -> {
            int nI = 3 + rng.nextInt(10);
            int nS = 2 + rng.nextInt(3);
            double[][] rates = new double[nI][nS];
            for (double[] row : rates) {
                for (int s = 0; s < nS; s++) {
                    row[s] = rng.nextInt(5) == 0 ? 0 : 0.01 + 0.5 * rng.nextDouble();
                }
            }
            Campaign c = SyntheticCampaigns.of(rng, rates, 1 + rng.nextInt(4), 30);
            Resampling scheme = Resampling.values()[rng.nextInt(Resampling.values().length)];
            List<int[]> pairs = new ArrayList<>();
            for (int s = 1; s < nS; s++) {
                pairs.add(new int[] {s, 0});
            }
            int[] all = new int[nS];
            Arrays.setAll(all, s -> s);
            SummaryOptions o = new SummaryOptions(0.99, 0.95, rng.nextBoolean() ? 0.5 : 0.25,
                    new double[] {0.35, 0.65}, new double[] {0.05, 0.95}, seed, 101, 2, scheme, pairs, List.of(all));
            CampaignSummary sum = CampaignSummary.of(c, o, null);
            for (CampaignSummary.SettingRow r : sum.settings()) {
                inside(r.tts(), "tts of setting " + r.setting());
                inside(r.p(), "p of setting " + r.setting());
            }
            for (CampaignSummary.ComparisonRow r : sum.comparisons()) {
                inside(r.ratio(), "ratio");
                inside(r.saved(), "difference");
                inside(r.improved(), "fraction improved");
            }
            BootstrapResult.Sweep sw = sum.sweeps().get(0);
            if (!Double.isNaN(sw.leastTts())) {
                assertThat(sw.leastTts()).isBetween(sw.bandLow(), sw.bandHigh());
            }
        });
    }

    private static void inside(CampaignSummary.Banded b, String what) {
        if (Double.isNaN(b.headline())) {
            return; // undefined (an interpolation between −∞ and +∞): nothing to place
        }
        assertThat(b.headline()).as(what + " in its inner band").isBetween(b.band()[0], b.band()[1]);
        assertThat(b.headline()).as(what + " in its outer band").isBetween(b.outer()[0], b.outer()[1]);
    }

    private static double mean(double[] v) {
        return Arrays.stream(v).average().orElseThrow();
    }

    private static double var(double[] v) {
        double m = mean(v);
        return Arrays.stream(v).map(x -> (x - m) * (x - m)).sum() / (v.length - 1);
    }

    private static double sd(double[] v) {
        return Math.sqrt(var(v));
    }
}
