package org.obverse.spectrum;

import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;

/** Generated problems for property checks (invented data, seeded). */
final class TestProblems {
    private TestProblems() {
    }

    /**
     * A connected random problem on n spins: a random spanning tree plus extra couplers with
     * probability density, couplings uniform in [-1, 1], fields uniform in [-1, 1] when withFields.
     */
    static IsingProblem random(UniformRandomProvider rng, int n, double density, boolean withFields) {
        IsingBuilder b = IsingProblem.builder();
        boolean[][] used = new boolean[n][n];
        for (int k = 1; k < n; k++) {
            int parent = rng.nextInt(k);
            b.coupling(parent, k, nonZero(rng));
            used[parent][k] = true;
        }
        for (int i = 0; i < n; i++) {
            for (int j = i + 1; j < n; j++) {
                if (!used[i][j] && rng.nextDouble() < density) {
                    b.coupling(i, j, nonZero(rng));
                }
            }
        }
        for (int k = 0; k < n; k++) {
            b.variable(k);
            if (withFields) {
                b.field(k, nonZero(rng));
            }
        }
        b.offset(rng.nextDouble() * 4 - 2);
        return b.build();
    }

    private static double nonZero(UniformRandomProvider rng) {
        double v = rng.nextDouble() * 2 - 1;
        return v == 0.0 ? 0.5 : v;
    }

    /** Applies a gauge by definition: h'_i = g_i h_i, J'_ij = g_i g_j J_ij (DESIGN.md). */
    static IsingProblem gauged(IsingProblem p, int[] g) {
        IsingBuilder b = IsingProblem.builder();
        for (int k = 0; k < p.size(); k++) {
            int id = p.variables().id(k);
            b.variable(id);
            if (p.field(k) != 0.0) {
                b.field(id, g[k] * p.field(k));
            }
        }
        for (int e = 0; e < p.edgeCount(); e++) {
            int u = p.edgeU(e);
            int v = p.edgeV(e);
            b.coupling(p.variables().id(u), p.variables().id(v), g[u] * g[v] * p.coupling(e));
        }
        b.offset(p.offset());
        return b.build();
    }

    static int[] randomGauge(UniformRandomProvider rng, int n) {
        int[] g = new int[n];
        for (int k = 0; k < n; k++) {
            g[k] = rng.nextBoolean() ? 1 : -1;
        }
        return g;
    }
}
