package org.obverse.stats;

import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.stat.inference.AlternativeHypothesis;
import org.apache.commons.math3.stat.inference.BinomialTest;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/** The sign test against the binomial distribution and the binomial test of commons-math3. */
class SignTestTest extends QuietTest {
    @Test
    void matchesBinomial() {
        Seeds.forEachCase(300, 77, (rng, seed) -> {
            int n = 1 + rng.nextInt(rng.nextBoolean() ? 30 : 3000);
            int k = rng.nextInt(n + 1);
            BinomialDistribution dist = new BinomialDistribution(null, n, 0.5);
            double ref = Math.min(1, 2 * dist.cumulativeProbability(Math.min(k, n - k)));
            if (2 * k == n) {
                ref = 1;
            }
            double p = SignTest.twoSidedP(k, n);
            assertThat(p).as("n=%s k=%s", n, k).isCloseTo(ref, within(1e-12 + 1e-9 * ref));
            double tail = dist.cumulativeProbability(k);
            assertThat(SignTest.binomialHalfLowerTail(k, n)).isCloseTo(tail, within(1e-12 + 1e-9 * tail));
        });
        // commons-math3's BinomialTest agrees where its walk over the two tails stays symmetric
        // (for larger n the rounding of its mass function can make it walk one tail only).
        assertThat(SignTest.twoSidedP(3, 12)).isCloseTo(
                new BinomialTest().binomialTest(12, 3, 0.5, AlternativeHypothesis.TWO_SIDED), within(1e-14));
        // Hand value: 9 of 10 favour one side: p = 2 · (1 + 10) / 1024.
        assertThat(SignTest.twoSidedP(9, 10)).isCloseTo(22.0 / 1024, within(1e-15));
        assertThat(SignTest.twoSidedP(0, 0)).isEqualTo(1.0);
    }
}
