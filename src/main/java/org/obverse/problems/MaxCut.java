package org.obverse.problems;

import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;

/**
 * Max-cut of a weighted graph as a spin problem: E(s) = Σ_{(ij)} w_ij s_i s_j, so a cut C
 * (the edges whose ends differ) has weight (W − E)/2 with W = Σ w_ij; the ground state is a
 * maximum cut. Nodes are ids 0 … n−1 (every node is a variable, edges or not).
 */
public final class MaxCut {
    private MaxCut() {
    }

    /** Unit weights. */
    public static IsingProblem of(int nodes, int[][] edges) {
        double[] w = new double[edges.length];
        java.util.Arrays.fill(w, 1.0);
        return of(nodes, edges, w);
    }

    /** Edge e joins edges[e][0] and edges[e][1] with weight weights[e]. */
    public static IsingProblem of(int nodes, int[][] edges, double[] weights) {
        if (weights.length != edges.length) {
            throw new IllegalArgumentException(edges.length + " edges but " + weights.length + " weights");
        }
        IsingBuilder b = IsingProblem.builder();
        for (int v = 0; v < nodes; v++) {
            b.variable(v);
        }
        for (int e = 0; e < edges.length; e++) {
            int u = edges[e][0];
            int v = edges[e][1];
            if (u < 0 || v < 0 || u >= nodes || v >= nodes) {
                throw new IllegalArgumentException("edge " + e + " (" + u + ", " + v + ") leaves nodes 0.." + (nodes - 1));
            }
            b.coupling(u, v, weights[e]);
        }
        return b.build();
    }

    /** The cut weight (W − E)/2 of a state of energy E, W the total weight. */
    public static double cutWeight(double totalWeight, double energy) {
        return (totalWeight - energy) / 2.0;
    }
}
