package org.obverse.stats;

/**
 * The special functions the intervals and tests need: log gamma, the regularized incomplete
 * beta and gamma functions, the standard normal distribution and its inverse, and the inverse
 * of the regularized incomplete beta function. Implemented here because the library carries
 * no statistics dependency; the tests check them against commons-math3.
 *
 * <p>Methods: Lanczos approximation for log gamma; Lentz's continued fraction for the
 * incomplete beta (Press et al., Numerical Recipes, 3rd ed., Cambridge 2007, §6.4) and a
 * series / continued fraction for the incomplete gamma (§6.2); Acklam's rational
 * approximation for the normal quantile refined by one Halley step; safeguarded Newton
 * (Newton steps kept inside a shrinking bisection bracket) for the beta quantile.
 */
public final class SpecialFunctions {
    private static final double EPS = 1e-16;
    private static final double TINY = 1e-300;
    private static final int MAX_ITERATIONS = 1_000_000;
    private static final double HALF_LOG_TWO_PI = 0.9189385332046727;
    private static final double SQRT_TWO = Math.sqrt(2.0);
    private static final double SQRT_TWO_PI = Math.sqrt(2.0 * Math.PI);

    // Lanczos coefficients, g = 7, n = 9 (common practice, as printed in many references).
    private static final double LANCZOS_G = 7.0;
    private static final double[] LANCZOS = {
        0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313,
        -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6,
        1.5056327351493116e-7,
    };

    private SpecialFunctions() {
    }

    /** ln Γ(x) for x > 0. */
    public static double logGamma(double x) {
        if (!(x > 0)) {
            throw new IllegalArgumentException("logGamma needs x > 0, got " + x);
        }
        if (x < 0.5) {
            // Reflection: Γ(x) Γ(1 - x) = π / sin(π x).
            return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1.0 - x);
        }
        if (x >= 20) {
            // Stirling series; more accurate than Lanczos for large arguments.
            double inv = 1.0 / x;
            double inv2 = inv * inv;
            double series = inv * (1.0 / 12 - inv2 * (1.0 / 360 - inv2 * (1.0 / 1260 - inv2 * (1.0 / 1680
                    - inv2 * (1.0 / 1188)))));
            return (x - 0.5) * Math.log(x) - x + HALF_LOG_TWO_PI + series;
        }
        double z = x - 1.0;
        double a = LANCZOS[0];
        double t = z + LANCZOS_G + 0.5;
        for (int i = 1; i < LANCZOS.length; i++) {
            a += LANCZOS[i] / (z + i);
        }
        return HALF_LOG_TWO_PI + (z + 0.5) * Math.log(t) - t + Math.log(a);
    }

    /** ln B(a, b) = ln Γ(a) + ln Γ(b) − ln Γ(a + b). */
    public static double logBeta(double a, double b) {
        return logGamma(a) + logGamma(b) - logGamma(a + b);
    }

    /** The regularized incomplete beta function I_x(a, b), for a, b > 0 and 0 ≤ x ≤ 1. */
    public static double regularizedBeta(double x, double a, double b) {
        if (!(a > 0) || !(b > 0) || !(x >= 0) || !(x <= 1)) {
            throw new IllegalArgumentException("regularizedBeta needs a, b > 0 and 0 <= x <= 1, got x=" + x
                    + ", a=" + a + ", b=" + b);
        }
        if (x == 0) {
            return 0;
        }
        if (x == 1) {
            return 1;
        }
        double front = Math.exp(a * Math.log(x) + b * Math.log1p(-x) - logBeta(a, b));
        if (x < (a + 1) / (a + b + 2)) {
            return front * betaContinuedFraction(x, a, b) / a;
        }
        return 1.0 - front * betaContinuedFraction(1.0 - x, b, a) / b;
    }

    private static double betaContinuedFraction(double x, double a, double b) {
        double qab = a + b;
        double qap = a + 1;
        double qam = a - 1;
        double c = 1;
        double d = 1 - qab * x / qap;
        if (Math.abs(d) < TINY) {
            d = TINY;
        }
        d = 1 / d;
        double h = d;
        for (int m = 1; m <= MAX_ITERATIONS; m++) {
            int m2 = 2 * m;
            double aa = m * (b - m) * x / ((qam + m2) * (a + m2));
            d = 1 + aa * d;
            if (Math.abs(d) < TINY) {
                d = TINY;
            }
            c = 1 + aa / c;
            if (Math.abs(c) < TINY) {
                c = TINY;
            }
            d = 1 / d;
            h *= d * c;
            aa = -(a + m) * (qab + m) * x / ((a + m2) * (qap + m2));
            d = 1 + aa * d;
            if (Math.abs(d) < TINY) {
                d = TINY;
            }
            c = 1 + aa / c;
            if (Math.abs(c) < TINY) {
                c = TINY;
            }
            d = 1 / d;
            double del = d * c;
            h *= del;
            if (Math.abs(del - 1) < EPS) {
                return h;
            }
        }
        throw new ArithmeticException("incomplete beta continued fraction did not converge for x=" + x
                + ", a=" + a + ", b=" + b);
    }

    /**
     * The x with I_x(a, b) = y (the quantile of the Beta(a, b) distribution), for 0 ≤ y ≤ 1.
     * Converged to a relative width of about 1e-15 of the bracket.
     */
    public static double inverseRegularizedBeta(double y, double a, double b) {
        if (!(a > 0) || !(b > 0) || !(y >= 0) || !(y <= 1)) {
            throw new IllegalArgumentException("inverseRegularizedBeta needs a, b > 0 and 0 <= y <= 1, got y=" + y
                    + ", a=" + a + ", b=" + b);
        }
        if (y == 0) {
            return 0;
        }
        if (y == 1) {
            return 1;
        }
        double lo = 0;
        double hi = 1;
        double logB = logBeta(a, b);
        double x = a / (a + b);
        for (int it = 0; it < 400; it++) {
            double f = regularizedBeta(x, a, b) - y;
            if (f == 0) {
                return x;
            }
            if (f < 0) {
                lo = x;
            } else {
                hi = x;
            }
            if (hi - lo <= 1e-15 * Math.max(hi, Double.MIN_NORMAL) || hi - lo <= Double.MIN_VALUE) {
                break;
            }
            double logPdf = (a - 1) * Math.log(x) + (b - 1) * Math.log1p(-x) - logB;
            double next = x - f / Math.exp(logPdf);
            if (!(next > lo && next < hi) || Double.isNaN(next)) {
                next = 0.5 * (lo + hi);
            }
            if (next == x) {
                break;
            }
            x = next;
        }
        return x;
    }

    /** The regularized upper incomplete gamma function Q(a, x) = Γ(a, x) / Γ(a), a > 0, x ≥ 0. */
    public static double regularizedGammaQ(double a, double x) {
        if (!(a > 0) || !(x >= 0)) {
            throw new IllegalArgumentException("regularizedGammaQ needs a > 0 and x >= 0, got a=" + a + ", x=" + x);
        }
        if (x == 0) {
            return 1;
        }
        if (x < a + 1) {
            return 1.0 - gammaSeries(a, x);
        }
        return gammaContinuedFraction(a, x);
    }

    /** The regularized lower incomplete gamma function P(a, x) = 1 − Q(a, x). */
    public static double regularizedGammaP(double a, double x) {
        if (!(a > 0) || !(x >= 0)) {
            throw new IllegalArgumentException("regularizedGammaP needs a > 0 and x >= 0, got a=" + a + ", x=" + x);
        }
        if (x == 0) {
            return 0;
        }
        if (x < a + 1) {
            return gammaSeries(a, x);
        }
        return 1.0 - gammaContinuedFraction(a, x);
    }

    private static double gammaSeries(double a, double x) {
        double ap = a;
        double sum = 1.0 / a;
        double del = sum;
        for (int n = 0; n < MAX_ITERATIONS; n++) {
            ap += 1;
            del *= x / ap;
            sum += del;
            if (Math.abs(del) < Math.abs(sum) * EPS) {
                return sum * Math.exp(-x + a * Math.log(x) - logGamma(a));
            }
        }
        throw new ArithmeticException("incomplete gamma series did not converge for a=" + a + ", x=" + x);
    }

    private static double gammaContinuedFraction(double a, double x) {
        double b = x + 1 - a;
        double c = 1 / TINY;
        double d = 1 / b;
        double h = d;
        for (int i = 1; i < MAX_ITERATIONS; i++) {
            double an = -i * (i - a);
            b += 2;
            d = an * d + b;
            if (Math.abs(d) < TINY) {
                d = TINY;
            }
            c = b + an / c;
            if (Math.abs(c) < TINY) {
                c = TINY;
            }
            d = 1 / d;
            double del = d * c;
            h *= del;
            if (Math.abs(del - 1) < EPS) {
                return Math.exp(-x + a * Math.log(x) - logGamma(a)) * h;
            }
        }
        throw new ArithmeticException("incomplete gamma fraction did not converge for a=" + a + ", x=" + x);
    }

    /** The complementary error function erfc(x) = Q(1/2, x²) for x ≥ 0, 2 − erfc(−x) otherwise. */
    public static double erfc(double x) {
        if (x >= 0) {
            return regularizedGammaQ(0.5, x * x);
        }
        return 2.0 - regularizedGammaQ(0.5, x * x);
    }

    /** Φ(x), the standard normal distribution function. */
    public static double normalCdf(double x) {
        return 0.5 * erfc(-x / SQRT_TWO);
    }

    /** Φ⁻¹(p), the standard normal quantile, for 0 < p < 1 (±∞ at 0 and 1). */
    public static double normalQuantile(double p) {
        if (!(p >= 0) || !(p <= 1)) {
            throw new IllegalArgumentException("normalQuantile needs 0 <= p <= 1, got " + p);
        }
        if (p == 0) {
            return Double.NEGATIVE_INFINITY;
        }
        if (p == 1) {
            return Double.POSITIVE_INFINITY;
        }
        // Acklam's rational approximation (relative error about 1.15e-9), then one Halley step.
        double[] a = {-3.969683028665376e+01, 2.209460984245205e+02, -2.759285104469687e+02,
            1.383577518672690e+02, -3.066479806614716e+01, 2.506628277459239e+00};
        double[] b = {-5.447609879822406e+01, 1.615858368580409e+02, -1.556989798598866e+02,
            6.680131188771972e+01, -1.328068155288572e+01};
        double[] c = {-7.784894002430293e-03, -3.223964580411365e-01, -2.400758277161838e+00,
            -2.549732539343734e+00, 4.374664141464968e+00, 2.938163982698783e+00};
        double[] d = {7.784695709041462e-03, 3.224671290700398e-01, 2.445134137142996e+00,
            3.754408661907416e+00};
        double low = 0.02425;
        double x;
        if (p < low) {
            double q = Math.sqrt(-2 * Math.log(p));
            x = (((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5])
                    / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
        } else if (p <= 1 - low) {
            double q = p - 0.5;
            double r = q * q;
            x = (((((a[0] * r + a[1]) * r + a[2]) * r + a[3]) * r + a[4]) * r + a[5]) * q
                    / (((((b[0] * r + b[1]) * r + b[2]) * r + b[3]) * r + b[4]) * r + 1);
        } else {
            double q = Math.sqrt(-2 * Math.log1p(-p));
            x = -(((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5])
                    / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
        }
        for (int step = 0; step < 2; step++) {
            // Work in the tail that is away from 1 to keep the residual accurate.
            double e = x < 0 ? 0.5 * erfc(-x / SQRT_TWO) - p : (1 - p) - 0.5 * erfc(x / SQRT_TWO);
            double u = e * SQRT_TWO_PI * Math.exp(x * x / 2);
            x = x - u / (1 + x * u / 2);
        }
        return x;
    }
}
