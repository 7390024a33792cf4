package org.obverse.testsupport;

import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;

/** Generators of random test cases (seeded by the caller). */
public final class Generated {
    private Generated() {
    }

    /** Sparse, increasing ids: gaps of 1 to 4. */
    public static int[] sparseIds(UniformRandomProvider rng, int n) {
        int[] ids = new int[n];
        int next = rng.nextInt(4);
        for (int k = 0; k < n; k++) {
            ids[k] = next;
            next += 1 + rng.nextInt(4);
        }
        return ids;
    }

    /**
     * A random spin problem of 1..maxN variables on sparse ids: each field present with
     * probability 1/2, each pair coupled with probability density, values uniform in [-2, 2].
     */
    public static IsingProblem isingProblem(UniformRandomProvider rng, int maxN, double density) {
        int n = 1 + rng.nextInt(maxN);
        int[] ids = sparseIds(rng, n);
        IsingBuilder b = IsingProblem.builder();
        for (int k = 0; k < n; k++) {
            if (rng.nextBoolean()) {
                b.field(ids[k], rng.nextDouble() * 4 - 2);
            } else {
                b.variable(ids[k]);
            }
        }
        for (int i = 0; i < n; i++) {
            for (int j = i + 1; j < n; j++) {
                if (rng.nextDouble() < density) {
                    b.coupling(ids[j], ids[i], rng.nextDouble() * 4 - 2);
                }
            }
        }
        return b.offset(rng.nextDouble() * 10 - 5).build();
    }

    /** Random ±1 spins. */
    public static byte[] spins(UniformRandomProvider rng, int n) {
        byte[] s = new byte[n];
        for (int k = 0; k < n; k++) {
            s[k] = (byte) (rng.nextBoolean() ? 1 : -1);
        }
        return s;
    }
}
