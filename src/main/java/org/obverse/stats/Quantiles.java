package org.obverse.stats;

import java.util.Arrays;

/**
 * Sample quantiles by Hyndman and Fan's definition 7 (The American Statistician 50, 361,
 * 1996; the default of R and of commons-math3's {@code Percentile} with estimation type
 * R_7): with sorted values x₀ ≤ … ≤ x_{n−1} and h = (n − 1)·p, Q(p) = x_⌊h⌋ + (h − ⌊h⌋)
 * (x_⌊h⌋₊₁ − x_⌊h⌋).
 *
 * <p>Infinite values (an infinite TTS) rule: +∞ sorts above every finite value and the
 * interpolation gives +∞ whenever it puts a positive weight on +∞; a weight of exactly zero
 * on an +∞ neighbour is ignored. So a median of an odd count is +∞ when more than half the
 * values are +∞, and of an even count when at least half are. −∞ (a difference of TTS)
 * sorts below every finite value with the mirror rule; interpolating between −∞ and +∞ with
 * positive weight on both is undefined and gives NaN. NaN is refused as input.
 */
public final class Quantiles {
    private Quantiles() {
    }

    /** The type-7 p-quantile (0 ≤ p ≤ 1) of the values; the input is not modified. */
    public static double of(double[] values, double p) {
        return of(values, 0, values.length, p);
    }

    /** The type-7 p-quantile of values[from, to); the input is not modified. */
    public static double of(double[] values, int from, int to, double p) {
        checkP(p);
        if (to <= from) {
            throw new IllegalArgumentException("quantile of no values");
        }
        double[] copy = Arrays.copyOfRange(values, from, to);
        for (double v : copy) {
            if (Double.isNaN(v)) {
                throw new IllegalArgumentException("quantile of a NaN value");
            }
        }
        Arrays.sort(copy);
        return sorted(copy, 0, copy.length, p);
    }

    /** Several quantiles of the values at once (one sort); the input is not modified. */
    public static double[] of(double[] values, double... ps) {
        double[] copy = values.clone();
        Arrays.sort(copy);
        double[] out = new double[ps.length];
        for (int i = 0; i < ps.length; i++) {
            checkP(ps[i]);
            out[i] = sorted(copy, 0, copy.length, ps[i]);
        }
        return out;
    }

    /** Unchecked kernel over an ascending sorted range without NaN. */
    public static double sorted(double[] sorted, int from, int to, double p) {
        int n = to - from;
        double h = (n - 1) * p;
        int lo = (int) Math.floor(h);
        if (lo >= n - 1) {
            return sorted[to - 1];
        }
        double frac = h - lo;
        double a = sorted[from + lo];
        if (frac == 0) {
            return a;
        }
        double b = sorted[from + lo + 1];
        if (b == Double.POSITIVE_INFINITY) {
            return a == Double.NEGATIVE_INFINITY ? Double.NaN : Double.POSITIVE_INFINITY;
        }
        if (a == Double.NEGATIVE_INFINITY) {
            return Double.NEGATIVE_INFINITY;
        }
        return a + frac * (b - a);
    }

    private static void checkP(double p) {
        if (!(p >= 0) || !(p <= 1)) {
            throw new IllegalArgumentException("quantile level must be in [0, 1], got " + p);
        }
    }
}
