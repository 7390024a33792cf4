package org.obverse.device;

/**
 * A closed interval [lo, hi] of allowed values, compared exactly (no tolerance): a device's
 * limits are the ones its user gives.
 */
public record ValueRange(double lo, double hi) {
    public ValueRange {
        if (!Double.isFinite(lo) || !Double.isFinite(hi) || lo > hi) {
            throw new IllegalArgumentException("range [" + lo + ", " + hi + "] needs finite lo <= hi");
        }
    }

    public static ValueRange of(double lo, double hi) {
        return new ValueRange(lo, hi);
    }

    /** lo ≤ v ≤ hi. */
    public boolean contains(double v) {
        return lo <= v && v <= hi;
    }

    /** Whether a value may change sign and stay inside: lo ≤ -v ≤ hi. */
    public boolean allowsSignChange(double v) {
        return contains(-v);
    }

    /** The largest symmetric interval [-m, m] inside this one (m = min(-lo, hi), at least 0). */
    public double symmetricHalfWidth() {
        return Math.max(0.0, Math.min(-lo, hi));
    }

    @Override
    public String toString() {
        return "[" + lo + ", " + hi + "]";
    }
}
