package org.obverse.stats;

import org.apache.commons.math3.stat.interval.ClopperPearsonInterval;
import org.apache.commons.math3.stat.interval.ConfidenceInterval;
import org.apache.commons.math3.stat.interval.WilsonScoreInterval;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/**
 * Wilson (J. Am. Stat. Assoc. 22, 209, 1927) and Clopper–Pearson (Biometrika 26, 404, 1934)
 * intervals against commons-math3's implementations.
 */
class BinomialIntervalTest extends QuietTest {
    @Test
    void wilsonMatchesCommonsMath() {
        Seeds.forEachCase(500, 1000, (rng, seed) -> {
            int n = 1 + rng.nextInt(rng.nextBoolean() ? 50 : 200_000);
            int x = rng.nextInt(n + 1);
            double conf = new double[] {0.5, 0.9, 0.95, 0.99}[rng.nextInt(4)];
            ConfidenceInterval ref = new WilsonScoreInterval().createInterval(n, x, conf);
            BinomialInterval got = BinomialInterval.wilson(x, n, conf);
            assertThat(got.lower()).as("n=%s x=%s", n, x).isCloseTo(Math.max(0, ref.getLowerBound()), within(1e-12));
            assertThat(got.upper()).as("n=%s x=%s", n, x).isCloseTo(Math.min(1, ref.getUpperBound()), within(1e-12));
        });
    }

    @Test
    void clopperPearsonMatchesCommonsMath() {
        Seeds.forEachCase(300, 2000, (rng, seed) -> {
            int n = 1 + rng.nextInt(rng.nextBoolean() ? 50 : 100_000);
            // The oracle cannot do x = 0 or x = n (an F distribution with 0 degrees of freedom);
            // those ends are checked against the closed form below.
            int x = n == 1 ? 1 : 1 + rng.nextInt(n - 1);
            if (n == 1) {
                return;
            }
            double conf = new double[] {0.9, 0.95, 0.99}[rng.nextInt(3)];
            ConfidenceInterval ref = new ClopperPearsonInterval().createInterval(n, x, conf);
            BinomialInterval got = BinomialInterval.clopperPearson(x, n, conf);
            // The oracle inverts an F distribution with its solver's default absolute accuracy (1e-9).
            assertThat(got.lower()).as("n=%s x=%s", n, x).isCloseTo(ref.getLowerBound(), within(2e-8));
            assertThat(got.upper()).as("n=%s x=%s", n, x).isCloseTo(ref.getUpperBound(), within(2e-8));
        });
    }

    @Test
    void clopperPearsonHandbookValue() {
        // 0 successes in n: upper bound 1 - (α/2)^(1/n) (closed form of the exact interval).
        BinomialInterval i = BinomialInterval.clopperPearson(0, 30, 0.95);
        assertThat(i.lower()).isZero();
        assertThat(i.upper()).isCloseTo(1 - Math.pow(0.025, 1.0 / 30), within(1e-13));
        BinomialInterval all = BinomialInterval.clopperPearson(30, 30, 0.95);
        assertThat(all.upper()).isEqualTo(1.0);
        assertThat(all.lower()).isCloseTo(Math.pow(0.025, 1.0 / 30), within(1e-13));
    }
}
