package org.obverse.stats;

import java.util.Arrays;
import java.util.List;
import org.apache.commons.math3.stat.descriptive.rank.Percentile;
import org.apache.commons.math3.stat.interval.ClopperPearsonInterval;
import org.apache.commons.math3.stat.interval.WilsonScoreInterval;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/** Cell scores against a direct computation with commons-math3 as the oracle for intervals and quantiles. */
class CampaignScoringTest extends QuietTest {
    @Test
    void cellsMatchDirectComputation() {
        Percentile r7 = new Percentile().withEstimationType(Percentile.EstimationType.R_7);
        Seeds.forEachCase(20, 900, (rng, seed) -> {
            int nI = 1 + rng.nextInt(5);
            int nS = 1 + rng.nextInt(3);
            double[][] rates = new double[nI][nS];
            for (double[] row : rates) {
                for (int s = 0; s < nS; s++) {
                    row[s] = rng.nextDouble() * 0.6 + 0.01;
                }
            }
            int gauges = 1 + rng.nextInt(8);
            int reads = 20 + rng.nextInt(200);
            Campaign c = SyntheticCampaigns.of(rng, rates, gauges, reads);
            List<CellScore> cells = CampaignScoring.cells(c, 0.99, 0.95);
            assertThat(cells).hasSize(nI * nS);
            for (CellScore cs : cells) {
                int cell = c.cell(cs.instance(), cs.setting());
                long succ = 0;
                long n = 0;
                double[] gp = new double[gauges];
                for (int k = c.gaugeFrom(cell); k < c.gaugeTo(cell); k++) {
                    succ += c.successes(k);
                    n += c.reads(k);
                    gp[k - c.gaugeFrom(cell)] = (double) c.successes(k) / c.reads(k);
                }
                assertThat(cs.reads()).isEqualTo(n);
                assertThat(cs.successes()).isEqualTo(succ);
                double p = (double) succ / n;
                assertThat(cs.pSuccess()).isEqualTo(p);
                double run = 1 + cs.setting();
                assertThat(cs.runTime()).isCloseTo(run, within(1e-12));
                // Rønnow et al. 2014: TTS = t ln(0.01)/ln(1-p), t when p >= 0.99, inf when p = 0.
                double tts = p == 0 ? Double.POSITIVE_INFINITY : p >= 0.99 ? run : run * Math.log(0.01) / Math.log(1 - p);
                assertThat(cs.tts()).isCloseTo(tts, within(1e-9 * tts));
                var w = new WilsonScoreInterval().createInterval((int) n, (int) succ, 0.95);
                assertThat(cs.wilson().lower()).isCloseTo(Math.max(0, w.getLowerBound()), within(1e-12));
                assertThat(cs.wilson().upper()).isCloseTo(Math.min(1, w.getUpperBound()), within(1e-12));
                if (succ > 0 && succ < n) {
                    var cp = new ClopperPearsonInterval().createInterval((int) n, (int) succ, 0.95);
                    assertThat(cs.clopperPearson().lower()).isCloseTo(cp.getLowerBound(), within(2e-8));
                    assertThat(cs.clopperPearson().upper()).isCloseTo(cp.getUpperBound(), within(2e-8));
                }
                Arrays.sort(gp);
                assertThat(cs.gaugeP()[0]).isEqualTo(gp[0]);
                assertThat(cs.gaugeP()[4]).isEqualTo(gp[gauges - 1]);
                assertThat(cs.gaugeP()[2]).isCloseTo(r7.evaluate(gp, 50), within(1e-12));
                assertThat(cs.gaugeP()[1]).isCloseTo(r7.evaluate(gp, 25), within(1e-12));
                assertThat(cs.gaugePMean()).isCloseTo(Arrays.stream(gp).average().orElseThrow(), within(1e-12));
                // Residual: the synthetic reads miss the ground by 2 when they fail.
                assertThat(cs.residualMean()).isCloseTo(2.0 * (n - succ) / n, within(1e-12));
            }
        });
    }

    @Test
    void gaugeMedianAndPooledDisagreeWhenSuccessIsRare() {
        // Nine gauges never succeed, one lucky gauge always does: pooled p = 0.1, median p = 0.
        Campaign.Builder b = Campaign.builder().ground("a", 0, true);
        for (int g = 0; g < 10; g++) {
            b.add("a", "s", g, 100, g == 3 ? 100 : 0, 0, 100, 0, 0);
        }
        CellScore cs = CampaignScoring.cells(b.build(), 0.99, 0.95).get(0);
        assertThat(cs.pSuccess()).isEqualTo(0.1);
        assertThat(cs.gaugeP()[2]).isZero();
        assertThat(cs.gaugeTtsMedian()).isInfinite();
        assertThat(cs.tts()).isCloseTo(Math.log(0.01) / Math.log(0.9), within(1e-12));
    }
}
