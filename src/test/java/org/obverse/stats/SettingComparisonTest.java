package org.obverse.stats;

import org.apache.commons.math3.distribution.BinomialDistribution;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class SettingComparisonTest extends QuietTest {
    @Test
    void countsTiesAndSignTest() {
        double inf = Double.POSITIVE_INFINITY;
        double[] a = {1, 2, 3, 4, inf, 5, 6, Double.NaN, 1, 1};
        double[] b = {2, 3, 4, 5, inf, inf, 5, 1, 1.5, 2};
        SettingComparison c = SettingComparison.of(a, b);
        assertThat(c.paired()).isEqualTo(9);
        assertThat(c.faster()).isEqualTo(7);
        assertThat(c.slower()).isEqualTo(1);
        assertThat(c.ties()).isEqualTo(1);
        assertThat(c.fractionImproved()).isEqualTo(7.0 / 9);
        // Sign test over 8 untied pairs, 1 against: 2 P(X <= 1), X ~ Binomial(8, 1/2).
        assertThat(c.signTestP()).isCloseTo(2 * new BinomialDistribution(null, 8, 0.5).cumulativeProbability(1),
                within(1e-15));
    }
}
