package org.obverse.stats;

/**
 * The two-sided sign test: under the null hypothesis each untied pair is equally likely to
 * favour either side, so the count of pairs favouring one side is Binomial(n, 1/2); the
 * p-value is P(X ≤ min(k, n − k)) + P(X ≥ max(k, n − k)), capped at 1 (Conover, Practical
 * Nonparametric Statistics, Wiley 1999, §3.4). Ties are dropped before counting.
 */
public final class SignTest {
    private SignTest() {
    }

    /** Two-sided p-value for {@code favouring} of {@code untied} pairs. */
    public static double twoSidedP(long favouring, long untied) {
        if (untied < 0 || favouring < 0 || favouring > untied) {
            throw new IllegalArgumentException("need 0 <= favouring <= untied, got " + favouring + " of " + untied);
        }
        if (untied == 0) {
            return 1.0;
        }
        long k = Math.min(favouring, untied - favouring);
        if (2 * k == untied) {
            return 1.0;
        }
        return Math.min(1.0, 2.0 * binomialHalfLowerTail(k, untied));
    }

    /** P(X ≤ k) for X ~ Binomial(n, 1/2), summed exactly in the log domain (k ≤ n / 2 is fastest). */
    public static double binomialHalfLowerTail(long k, long n) {
        if (k < 0) {
            return 0;
        }
        if (k >= n) {
            return 1;
        }
        if (2 * k > n) {
            return 1 - binomialHalfLowerTail(n - k - 1, n);
        }
        // Terms increase up to k <= n/2: sum from the largest down for accuracy.
        double logTop = SpecialFunctions.logGamma(n + 1.0) - SpecialFunctions.logGamma(k + 1.0)
                - SpecialFunctions.logGamma(n - k + 1.0) - n * Math.log(2);
        double term = 1.0;
        double sum = 1.0;
        for (long i = k; i > 0; i--) {
            term *= (double) i / (n - i + 1);
            sum += term;
            if (term < 1e-18 * sum) {
                break;
            }
        }
        return Math.exp(logTop) * sum;
    }
}
