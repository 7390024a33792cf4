package org.obverse.samples;

import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;

/** Generated problems and samples for the kernel property checks. */
final class GeneratedProblems {
    /** How term values are drawn. */
    enum Values {
        /** Gaussian with a random scale from 1e-3 to 1e3, some exact zeros. */
        REAL,
        /** A few distinct values: ±1, ±0.5, and zeros. */
        FEW,
        /** Small integers: every partial sum is exact, so fast and exact agree exactly. */
        INTEGER
    }

    private GeneratedProblems() {
    }

    static double value(UniformRandomProvider rng, Values kind, double scale) {
        if (rng.nextInt(10) == 0) {
            return 0.0;
        }
        switch (kind) {
            case FEW:
                return (rng.nextBoolean() ? 1 : -1) * (rng.nextInt(4) == 0 ? 0.5 : 1.0);
            case INTEGER:
                return rng.nextInt(21) - 10;
            default:
                // Box–Muller: a normal deviate from two uniforms.
                double r = Math.sqrt(-2 * Math.log(1 - rng.nextDouble()));
                return scale * r * Math.cos(2 * Math.PI * rng.nextDouble());
        }
    }

    /** A random problem on sparse ids with n in [1, maxN] and a random edge density. */
    static IsingProblem problem(UniformRandomProvider rng, Values kind, int maxN) {
        int n = 1 + rng.nextInt(maxN);
        int[] ids = new int[n];
        int next = rng.nextInt(3);
        for (int k = 0; k < n; k++) {
            ids[k] = next;
            next += 1 + rng.nextInt(4);
        }
        double scale = Math.pow(10, rng.nextDouble() * 6 - 3);
        double density = rng.nextDouble();
        double[] h = new double[n];
        for (int k = 0; k < n; k++) {
            h[k] = rng.nextInt(4) == 0 ? 0.0 : value(rng, kind, scale);
        }
        int cap = n * (n - 1) / 2;
        int[] u = new int[cap];
        int[] v = new int[cap];
        double[] j = new double[cap];
        int m = 0;
        for (int a = 0; a < n; a++) {
            for (int b = a + 1; b < n; b++) {
                if (rng.nextDouble() < density) {
                    u[m] = a;
                    v[m] = b;
                    j[m++] = value(rng, kind, scale);
                }
            }
        }
        double offset = kind == Values.INTEGER ? rng.nextInt(100) - 50 : value(rng, Values.REAL, scale);
        return IsingProblem.of(VariableIndex.of(ids), h, java.util.Arrays.copyOf(u, m), java.util.Arrays.copyOf(v, m),
                java.util.Arrays.copyOf(j, m), offset);
    }

    static byte[] spins(UniformRandomProvider rng, int count) {
        byte[] s = new byte[count];
        for (int i = 0; i < count; i++) {
            s[i] = (byte) (rng.nextBoolean() ? 1 : -1);
        }
        return s;
    }

    /** Row r of row-major spins. */
    static byte[] row(byte[] spins, int r, int n) {
        return java.util.Arrays.copyOfRange(spins, r * n, (r + 1) * n);
    }
}
