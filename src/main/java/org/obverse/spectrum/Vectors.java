package org.obverse.spectrum;

import java.util.stream.IntStream;

/**
 * Dense vector kernels for the Lanczos solver, split over threads in fixed chunks above a size
 * where that pays. Partial sums are added in chunk order, so results do not depend on the
 * thread count. For internal use.
 */
final class Vectors {
    private static final int CHUNK = 1 << 13;
    // Below this a pass over a vector takes well under 0.1 ms, and handing chunks to the other
    // core costs more cpu time than it saves (measured on a 2^16-state scan: 20% more cpu).
    private static final int PARALLEL_FROM = 1 << 18;

    private Vectors() {
    }

    static double dot(double[] x, double[] y, int n) {
        int chunks = (n + CHUNK - 1) / CHUNK;
        if (chunks == 1) {
            return dotRange(x, y, 0, n);
        }
        double[] partial = new double[chunks];
        if (n < PARALLEL_FROM) {
            for (int q = 0; q < chunks; q++) {
                partial[q] = dotRange(x, y, q * CHUNK, Math.min(n, (q + 1) * CHUNK));
            }
        } else {
            IntStream.range(0, chunks).parallel().forEach(q ->
                    partial[q] = dotRange(x, y, q * CHUNK, Math.min(n, (q + 1) * CHUNK)));
        }
        double s = 0.0;
        for (double p : partial) {
            s += p;
        }
        return s;
    }

    // Four independent partial sums: a single running sum waits on each add's latency (Java
    // keeps the order of floating-point adds, so the compiler cannot split it), four keep the
    // adder busy; they are combined in a fixed order.
    static double dotRange(double[] x, double[] y, int from, int to) {
        double s0 = 0.0;
        double s1 = 0.0;
        double s2 = 0.0;
        double s3 = 0.0;
        int i = from;
        for (int end = to - 3; i < end; i += 4) {
            s0 += x[i] * y[i];
            s1 += x[i + 1] * y[i + 1];
            s2 += x[i + 2] * y[i + 2];
            s3 += x[i + 3] * y[i + 3];
        }
        for (; i < to; i++) {
            s0 += x[i] * y[i];
        }
        return (s0 + s1) + (s2 + s3);
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
     * Output w (modified). Works chunk by chunk so that w's chunk stays in cache while every
     * q_i streams past it once for the dots and once for the update.
     */
    static void projectOut(double[][] q, int count, double[] w, int n, double[] coefficients) {
        if (count == 0) {
            return;
        }
        double[] c = new double[count];
        int chunks = (n + CHUNK - 1) / CHUNK;
        double[][] partial = new double[chunks][count];
        if (n < PARALLEL_FROM) {
            for (int p = 0; p < chunks; p++) {
                chunkDots(q, count, w, p * CHUNK, Math.min(n, (p + 1) * CHUNK), partial[p]);
            }
        } else {
            IntStream.range(0, chunks).parallel().forEach(p ->
                    chunkDots(q, count, w, p * CHUNK, Math.min(n, (p + 1) * CHUNK), partial[p]));
        }
        for (int p = 0; p < chunks; p++) {
            for (int i = 0; i < count; i++) {
                c[i] += partial[p][i];
            }
        }
        if (n < PARALLEL_FROM) {
            for (int p = 0; p < chunks; p++) {
                chunkSubtract(q, count, c, w, p * CHUNK, Math.min(n, (p + 1) * CHUNK));
            }
        } else {
            IntStream.range(0, chunks).parallel().forEach(p ->
                    chunkSubtract(q, count, c, w, p * CHUNK, Math.min(n, (p + 1) * CHUNK)));
        }
        if (coefficients != null) {
            for (int i = 0; i < count; i++) {
                coefficients[i] += c[i];
            }
        }
    }

    // out[i] = q_i·w over [from, to), two vectors at a time (w read once for both, four sums).
    private static void chunkDots(double[][] q, int count, double[] w, int from, int to, double[] out) {
        int i = 0;
        for (; i + 1 < count; i += 2) {
            double[] a = q[i];
            double[] b = q[i + 1];
            double a0 = 0.0;
            double a1 = 0.0;
            double b0 = 0.0;
            double b1 = 0.0;
            int j = from;
            for (int end = to - 1; j < end; j += 2) {
                double w0 = w[j];
                double w1 = w[j + 1];
                a0 += a[j] * w0;
                a1 += a[j + 1] * w1;
                b0 += b[j] * w0;
                b1 += b[j + 1] * w1;
            }
            for (; j < to; j++) {
                a0 += a[j] * w[j];
                b0 += b[j] * w[j];
            }
            out[i] = a0 + a1;
            out[i + 1] = b0 + b1;
        }
        if (i < count) {
            out[i] = dotRange(q[i], w, from, to);
        }
    }

    // w ← w − Σ_i c_i q_i over [from, to), two vectors at a time (one load and store of w for both).
    private static void chunkSubtract(double[][] q, int count, double[] c, double[] w, int from, int to) {
        int i = 0;
        for (; i + 1 < count; i += 2) {
            double[] a = q[i];
            double[] b = q[i + 1];
            double ca = c[i];
            double cb = c[i + 1];
            for (int j = from; j < to; j++) {
                w[j] -= ca * a[j] + cb * b[j];
            }
        }
        if (i < count) {
            axpyRange(-c[i], q[i], w, from, to);
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
