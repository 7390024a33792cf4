package org.obverse.stats;

/**
 * A two-sided confidence interval for a binomial success probability from {@code successes}
 * out of {@code trials}. Two methods: Wilson's score interval (Wilson, J. Am. Stat. Assoc. 22,
 * 209, 1927) and the exact Clopper–Pearson interval (Clopper and Pearson, Biometrika 26, 404,
 * 1934), whose bounds are Beta quantiles: lower = B⁻¹(α/2; x, n − x + 1) (0 when x = 0),
 * upper = B⁻¹(1 − α/2; x + 1, n − x) (1 when x = n), α = 1 − confidence.
 *
 * @param lower the lower bound, in [0, 1]
 * @param upper the upper bound, in [lower, 1]
 */
public record BinomialInterval(double lower, double upper) {
    /** Wilson's score interval at the given confidence level (e.g. 0.95). */
    public static BinomialInterval wilson(long successes, long trials, double confidence) {
        check(successes, trials, confidence);
        double z = SpecialFunctions.normalQuantile(1 - (1 - confidence) / 2);
        double z2 = z * z;
        double n = trials;
        double mean = successes / n;
        // Same arrangement of terms as the textbook formula, so results agree to rounding.
        double factor = 1.0 / (1 + z2 / n);
        double centre = mean + z2 / (2 * n);
        double half = z * Math.sqrt(mean * (1 - mean) / n + z2 / (4 * n * n));
        return new BinomialInterval(Math.max(0, factor * (centre - half)), Math.min(1, factor * (centre + half)));
    }

    /** The Clopper–Pearson ("exact") interval at the given confidence level. */
    public static BinomialInterval clopperPearson(long successes, long trials, double confidence) {
        check(successes, trials, confidence);
        double alpha = (1 - confidence) / 2;
        double lower = successes == 0 ? 0
                : SpecialFunctions.inverseRegularizedBeta(alpha, successes, trials - successes + 1.0);
        double upper = successes == trials ? 1
                : SpecialFunctions.inverseRegularizedBeta(1 - alpha, successes + 1.0, trials - successes);
        return new BinomialInterval(lower, upper);
    }

    private static void check(long successes, long trials, double confidence) {
        if (trials <= 0) {
            throw new IllegalArgumentException("trials must be > 0, got " + trials);
        }
        if (successes < 0 || successes > trials) {
            throw new IllegalArgumentException("successes must be in [0, trials=" + trials + "], got " + successes);
        }
        if (!(confidence > 0) || !(confidence < 1)) {
            throw new IllegalArgumentException("confidence must be in (0, 1), got " + confidence);
        }
    }
}
