package org.obverse.spectrum;

import java.util.stream.IntStream;

/**
 * Dense vector kernels for the Lanczos solver, split over threads in fixed chunks above a size
 * where that pays. Partial sums are added in chunk order, so results do not depend on the
 * thread count. For internal use.
 */
final class Vectors {
    private static final int CHUNK = 1 << 13;
    private static final int PARALLEL_FROM = 1 << 16;

    private Vectors() {
    }

    static double dot(double[] x, double[] y, int n) {
        if (n < PARALLEL_FROM) {
            return dotRange(x, y, 0, n);
        }
        int chunks = (n + CHUNK - 1) / CHUNK;
        double[] partial = new double[chunks];
        IntStream.range(0, chunks).parallel().forEach(q -> partial[q] = dotRange(x, y, q * CHUNK, Math.min(n, (q + 1) * CHUNK)));
        double s = 0.0;
        for (double p : partial) {
            s += p;
        }
        return s;
    }

    private static double dotRange(double[] x, double[] y, int from, int to) {
        double s = 0.0;
        for (int i = from; i < to; i++) {
            s += x[i] * y[i];
        }
        return s;
    }

    static double norm(double[] x, int n) {
        return Math.sqrt(dot(x, x, n));
    }

    static void scale(double[] x, int n, double factor) {
        for (int i = 0; i < n; i++) {
            x[i] *= factor;
        }
    }

    /**
     * Classical Gram–Schmidt step: w ← w − Σ_i (q_i·w) q_i over q[0..count), the coefficients
     * added into coefficients[0..count) (when not null). Input q (orthonormal, not modified);
     * Output w (modified).
     */
    static void projectOut(double[][] q, int count, double[] w, int n, double[] coefficients) {
        if (count == 0) {
            return;
        }
        double[] c = new double[count];
        if (n < PARALLEL_FROM) {
            for (int i = 0; i < count; i++) {
                c[i] = dotRange(q[i], w, 0, n);
            }
            for (int i = 0; i < count; i++) {
                axpyRange(-c[i], q[i], w, 0, n);
            }
        } else {
            int chunks = (n + CHUNK - 1) / CHUNK;
            double[][] partial = new double[chunks][count];
            IntStream.range(0, chunks).parallel().forEach(p -> {
                int from = p * CHUNK;
                int to = Math.min(n, from + CHUNK);
                for (int i = 0; i < count; i++) {
                    partial[p][i] = dotRange(q[i], w, from, to);
                }
            });
            for (int p = 0; p < chunks; p++) {
                for (int i = 0; i < count; i++) {
                    c[i] += partial[p][i];
                }
            }
            IntStream.range(0, chunks).parallel().forEach(p -> {
                int from = p * CHUNK;
                int to = Math.min(n, from + CHUNK);
                for (int i = 0; i < count; i++) {
                    axpyRange(-c[i], q[i], w, from, to);
                }
            });
        }
        if (coefficients != null) {
            for (int i = 0; i < count; i++) {
                coefficients[i] += c[i];
            }
        }
    }

    /** y ← y + a·x over the first n entries. */
    static void axpy(double a, double[] x, double[] y, int n) {
        if (n < PARALLEL_FROM) {
            axpyRange(a, x, y, 0, n);
            return;
        }
        int chunks = (n + CHUNK - 1) / CHUNK;
        IntStream.range(0, chunks).parallel().forEach(q -> axpyRange(a, x, y, q * CHUNK, Math.min(n, (q + 1) * CHUNK)));
    }

    private static void axpyRange(double a, double[] x, double[] y, int from, int to) {
        for (int i = from; i < to; i++) {
            y[i] += a * x[i];
        }
    }

    /** y ← Σ_j s[j] q_j over j &lt; count. Output y (overwritten). */
    static void combine(double[][] q, double[] s, int count, double[] y, int n) {
        java.util.Arrays.fill(y, 0, n, 0.0);
        for (int j = 0; j < count; j++) {
            if (s[j] != 0.0) {
                axpyRange(s[j], q[j], y, 0, n);
            }
        }
    }
}
