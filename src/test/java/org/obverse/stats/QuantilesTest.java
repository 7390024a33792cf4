package org.obverse.stats;

import org.apache.commons.math3.stat.descriptive.rank.Percentile;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/** Hyndman &amp; Fan type 7 (Am. Stat. 50, 361, 1996) against commons-math3's Percentile R_7. */
class QuantilesTest extends QuietTest {
    @Test
    void matchesPercentileType7() {
        Percentile ref = new Percentile().withEstimationType(Percentile.EstimationType.R_7);
        Seeds.forEachCase(300, 50, (rng, seed) -> {
            int n = 1 + rng.nextInt(60);
            double[] v = new double[n];
            for (int i = 0; i < n; i++) {
                v[i] = rng.nextInt(3) == 0 ? rng.nextInt(5) : (rng.nextDouble() - 0.5) * 20;
            }
            double p = rng.nextInt(5) == 0 ? rng.nextInt(5) / 4.0 : rng.nextDouble();
            double expected = ref.evaluate(v, Math.max(1e-12, p * 100));
            if (p == 0) {
                expected = ref.evaluate(v, 1e-300);
            }
            assertThat(Quantiles.of(v, p)).as("n=%s p=%s", n, p).isCloseTo(expected, within(1e-12));
        });
    }

    @Test
    void infiniteRule() {
        double inf = Double.POSITIVE_INFINITY;
        assertThat(Quantiles.of(new double[] {1, 2, inf}, 0.5)).isEqualTo(2);
        assertThat(Quantiles.of(new double[] {1, inf, inf}, 0.5)).isInfinite();
        assertThat(Quantiles.of(new double[] {1, 2, inf, inf}, 0.5)).isInfinite();
        assertThat(Quantiles.of(new double[] {1, 2, 3, inf}, 0.5)).isEqualTo(2.5);
        assertThat(Quantiles.of(new double[] {1, 2, 3, inf}, 1.0)).isInfinite();
        assertThat(Quantiles.of(new double[] {-inf, 2, 3}, 0.25)).isEqualTo(-inf);
        assertThat(Quantiles.of(new double[] {-inf, inf}, 0.5)).isNaN();
    }
}
