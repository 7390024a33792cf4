package org.obverse.anneal;

import java.util.Arrays;

/**
 * The two schedule functions of an anneal, A(s) (driver) and B(s) (problem), for s in [0, 1].
 *
 * <p>Either the built-in illustrative pair A(s) = 1 − s, B(s) = s (dimensionless, labelled as
 * illustrative: it is not any device's schedule) or a table of (s, A, B) rows interpolated by
 * the shape-preserving piecewise cubic Hermite rule of Fritsch and Carlson (SIAM J. Numer.
 * Anal. 17, 238, 1980), with the end-point rule of Moler (Numerical Computing with MATLAB,
 * SIAM 2004, §3.4): a monotone run of table values stays monotone between its rows, so no
 * interpolated value leaves the range of its two neighbouring rows. Immutable.
 */
public final class EnergyScales {
    /** Name of the built-in pair, used in every output that uses it. */
    public static final String ILLUSTRATIVE_NAME = "illustrative linear schedule A(s) = 1 - s, B(s) = s"
            + " (dimensionless; not any device's schedule)";

    private final String name;
    private final String units;
    private final boolean illustrative;
    private final double[] s;
    private final double[] a;
    private final double[] b;
    private final double[] slopeA;
    private final double[] slopeB;

    private EnergyScales(String name, String units, boolean illustrative, double[] s, double[] a, double[] b) {
        this.name = name;
        this.units = units;
        this.illustrative = illustrative;
        this.s = s;
        this.a = a;
        this.b = b;
        this.slopeA = monotoneSlopes(s, a);
        this.slopeB = monotoneSlopes(s, b);
    }

    /** The built-in illustrative pair A(s) = 1 − s, B(s) = s, dimensionless. */
    public static EnergyScales illustrative() {
        return new EnergyScales(ILLUSTRATIVE_NAME, "dimensionless", true,
                new double[] {0.0, 1.0}, new double[] {1.0, 0.0}, new double[] {0.0, 1.0});
    }

    /**
     * A tabulated schedule. Input: at least two rows; s strictly increasing from exactly 0 to
     * exactly 1; A and B finite and at least 0. The arrays are copied, not modified.
     *
     * @param name  a label for outputs (for example the table's file name)
     * @param units the energy units of A and B as the user states them
     * @throws InvalidEnergyScalesException naming the row and the rule it breaks (rows count from 0)
     */
    public static EnergyScales fromTable(String name, String units, double[] s, double[] a, double[] b) {
        if (s.length != a.length || s.length != b.length) {
            throw new InvalidEnergyScalesException(-1, "columns differ in length: s " + s.length + ", A " + a.length
                    + ", B " + b.length);
        }
        if (s.length < 2) {
            throw new InvalidEnergyScalesException(-1, "has " + s.length + " rows; a schedule needs at least two"
                    + " (s = 0 and s = 1)");
        }
        for (int i = 0; i < s.length; i++) {
            if (!Double.isFinite(s[i]) || !Double.isFinite(a[i]) || !Double.isFinite(b[i])) {
                throw new InvalidEnergyScalesException(i, "holds a value that is not a finite number");
            }
            if (a[i] < 0 || b[i] < 0) {
                throw new InvalidEnergyScalesException(i, "has a negative value (A = " + a[i] + ", B = " + b[i]
                        + "); A and B must be >= 0");
            }
            if (i > 0 && !(s[i] > s[i - 1])) {
                throw new InvalidEnergyScalesException(i, "s = " + s[i] + " does not exceed the previous s = " + s[i - 1]
                        + "; s must increase strictly");
            }
        }
        if (s[0] != 0.0 || s[s.length - 1] != 1.0) {
            throw new InvalidEnergyScalesException(-1, "spans s from " + s[0] + " to " + s[s.length - 1]
                    + "; the table must run from s = 0 to s = 1");
        }
        return new EnergyScales(name, units, false, s.clone(), a.clone(), b.clone());
    }

    /** The label used in outputs. */
    public String name() {
        return name;
    }

    /** The energy units of A and B. */
    public String units() {
        return units;
    }

    /** Whether this is the built-in illustrative pair. */
    public boolean isIllustrative() {
        return illustrative;
    }

    /** Number of table rows (2 for the built-in pair). */
    public int rows() {
        return s.length;
    }

    /** A(s), the driver's weight; s in [0, 1]. */
    public double a(double at) {
        return interpolate(at, a, slopeA);
    }

    /** B(s), the problem's weight; s in [0, 1]. */
    public double b(double at) {
        return interpolate(at, b, slopeB);
    }

    /** The same schedule with A and B multiplied by factor (factor &gt; 0). */
    public EnergyScales scaled(double factor) {
        if (!(factor > 0) || !Double.isFinite(factor)) {
            throw new IllegalArgumentException("scale factor " + factor + " must be a finite number > 0");
        }
        double[] a2 = a.clone();
        double[] b2 = b.clone();
        for (int i = 0; i < a2.length; i++) {
            a2[i] *= factor;
            b2[i] *= factor;
        }
        return new EnergyScales(name + " x " + factor, units, illustrative, s, a2, b2);
    }

    private double interpolate(double at, double[] y, double[] d) {
        if (!(at >= 0.0 && at <= 1.0)) {
            throw new IllegalArgumentException("s = " + at + " lies outside [0, 1]");
        }
        int i = Arrays.binarySearch(s, at);
        if (i >= 0) {
            return y[i];
        }
        int hi = -i - 1;
        int lo = hi - 1;
        double h = s[hi] - s[lo];
        double t = (at - s[lo]) / h;
        double t2 = t * t;
        double t3 = t2 * t;
        // Cubic Hermite basis on [lo, hi].
        double h00 = 2 * t3 - 3 * t2 + 1;
        double h10 = t3 - 2 * t2 + t;
        double h01 = -2 * t3 + 3 * t2;
        double h11 = t3 - t2;
        return h00 * y[lo] + h10 * h * d[lo] + h01 * y[hi] + h11 * h * d[hi];
    }

    /** Fritsch–Carlson slopes: zero at a local extremum, a weighted harmonic mean elsewhere. */
    static double[] monotoneSlopes(double[] x, double[] y) {
        int n = x.length;
        double[] d = new double[n];
        double[] h = new double[n - 1];
        double[] delta = new double[n - 1];
        for (int i = 0; i < n - 1; i++) {
            h[i] = x[i + 1] - x[i];
            delta[i] = (y[i + 1] - y[i]) / h[i];
        }
        if (n == 2) {
            d[0] = delta[0];
            d[1] = delta[0];
            return d;
        }
        for (int i = 1; i < n - 1; i++) {
            if (delta[i - 1] * delta[i] <= 0) {
                d[i] = 0.0;
            } else {
                double w1 = 2 * h[i] + h[i - 1];
                double w2 = h[i] + 2 * h[i - 1];
                d[i] = (w1 + w2) / (w1 / delta[i - 1] + w2 / delta[i]);
            }
        }
        d[0] = endSlope(h[0], h[1], delta[0], delta[1]);
        d[n - 1] = endSlope(h[n - 2], h[n - 3], delta[n - 2], delta[n - 3]);
        return d;
    }

    // Moler's shape-preserving one-sided three-point slope.
    private static double endSlope(double h0, double h1, double del0, double del1) {
        double d = ((2 * h0 + h1) * del0 - h0 * del1) / (h0 + h1);
        if (Math.signum(d) != Math.signum(del0)) {
            return 0.0;
        }
        if (Math.signum(del0) != Math.signum(del1) && Math.abs(d) > Math.abs(3 * del0)) {
            return 3 * del0;
        }
        return d;
    }

    @Override
    public String toString() {
        return "EnergyScales[" + name + ", " + s.length + " rows, units " + units + "]";
    }
}
