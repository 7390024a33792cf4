package org.obverse.stats;

import org.apache.commons.rng.UniformRandomProvider;

/**
 * Exact draws from Binomial(n, p) by inversion of the distribution function, searched
 * outward from the mode: X is the least k with F(k) > u for one uniform u. The mass at the
 * mode and F(mode) are set up once (the probabilities are normalised to sum to one over the
 * range where they are representable), so a draw costs about 0.8·√(n p (1 − p)) + 1 steps
 * of the recurrence f(k+1) = f(k) · (n − k) / (k + 1) · p / (1 − p). No normal or Poisson
 * approximation is used; the only error is floating-point rounding of the probabilities.
 *
 * <p>Immutable and thread-safe; the generator is passed to each draw.
 */
public final class BinomialSampler {
    private final long trials;
    private final double p;
    private final long mode;
    private final double massAtMode;
    private final double cdfAtMode;
    private final double oddsUp;
    private final double oddsDown;

    private BinomialSampler(long trials, double p) {
        this.trials = trials;
        this.p = p;
        if (p <= 0 || p >= 1 || trials == 0) {
            mode = p >= 1 ? trials : 0;
            massAtMode = 1;
            cdfAtMode = 1;
            oddsUp = 0;
            oddsDown = 0;
            return;
        }
        double q = 1 - p;
        oddsUp = p / q;
        oddsDown = q / p;
        mode = Math.min(trials, (long) Math.floor((trials + 1) * p));
        // Unnormalised masses relative to the mode: walk both ways until they vanish.
        double below = 0;
        double f = 1;
        for (long k = mode; k > 0; k--) {
            f *= (double) k / (trials - k + 1) * oddsDown;
            below += f;
            if (f < 1e-20 * (1 + below)) {
                break;
            }
        }
        double above = 0;
        f = 1;
        for (long k = mode; k < trials; k++) {
            f *= (double) (trials - k) / (k + 1) * oddsUp;
            above += f;
            if (f < 1e-20 * (1 + above)) {
                break;
            }
        }
        double total = below + 1 + above;
        massAtMode = 1 / total;
        cdfAtMode = (below + 1) / total;
    }

    /** A sampler for Binomial(trials, p); trials ≥ 0, 0 ≤ p ≤ 1. */
    public static BinomialSampler of(long trials, double p) {
        if (trials < 0) {
            throw new IllegalArgumentException("trials must be >= 0, got " + trials);
        }
        if (!(p >= 0) || !(p <= 1)) {
            throw new IllegalArgumentException("probability must be in [0, 1], got " + p);
        }
        return new BinomialSampler(trials, p);
    }

    /** The number of trials n. */
    public long trials() {
        return trials;
    }

    /** The success probability p. */
    public double probability() {
        return p;
    }

    /** One draw. */
    public long sample(UniformRandomProvider rng) {
        if (massAtMode == 1 && cdfAtMode == 1) {
            return mode;
        }
        double u = rng.nextDouble();
        long k = mode;
        double cdf = cdfAtMode;
        double f = massAtMode;
        if (u < cdf) {
            // Walk down while F(k - 1) = F(k) - f(k) still exceeds u.
            while (k > 0) {
                double lower = cdf - f;
                if (lower <= u) {
                    break;
                }
                cdf = lower;
                f *= (double) k / (trials - k + 1) * oddsDown;
                k--;
                if (f == 0) {
                    break;
                }
            }
            return k;
        }
        // Walk up until F(k) > u.
        while (k < trials) {
            f *= (double) (trials - k) / (k + 1) * oddsUp;
            k++;
            cdf += f;
            if (cdf > u || f == 0) {
                break;
            }
        }
        return k;
    }
}
