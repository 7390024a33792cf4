package org.obverse.spectrum;

import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;

/**
 * A hand-made embedding for the tests, following DESIGN.md's rule: a logical h_v is spread
 * evenly over the qubits of chain v, a logical J_uv evenly over the listed physical couplers
 * between chains u and v, and every coupler inside a chain (a path along the chain) gets the
 * chain coupling.
 */
final class TinyEmbedding implements ChainCouplingScan.EmbeddedFamily {
    private final IsingProblem logical;
    private final int[][] chains;
    private final int[][][] between;

    /**
     * @param chains  chains[v] = the qubits of logical variable at position v, in path order
     * @param between between[e] = the physical couplers {qu, qv} that carry logical coupler e
     */
    TinyEmbedding(IsingProblem logical, int[][] chains, int[][][] between) {
        this.logical = logical;
        this.chains = chains;
        this.between = between;
    }

    @Override
    public IsingProblem at(double chainCoupling) {
        IsingBuilder b = IsingProblem.builder();
        for (int v = 0; v < chains.length; v++) {
            for (int q : chains[v]) {
                b.field(q, logical.field(v) / chains[v].length);
            }
            for (int i = 0; i + 1 < chains[v].length; i++) {
                b.coupling(chains[v][i], chains[v][i + 1], chainCoupling);
            }
        }
        for (int e = 0; e < logical.edgeCount(); e++) {
            for (int[] pair : between[e]) {
                b.coupling(pair[0], pair[1], logical.coupling(e) / between[e].length);
            }
        }
        b.offset(logical.offset());
        return b.build();
    }

    /** Three logical spins on a triangle with fields; chains of 2, 3 and 2 qubits (7 qubits). */
    static TinyEmbedding triangle() {
        IsingProblem logical = IsingProblem.builder().field(0, 0.3).field(1, -0.2).field(2, 0.1)
                .coupling(0, 1, 1.0).coupling(0, 2, 0.6).coupling(1, 2, -0.8).build();
        int[][] chains = {{0, 1}, {2, 3, 4}, {5, 6}};
        // Logical couplers in ascending order: (0,1), (0,2), (1,2).
        int[][][] between = {
            {{1, 2}, {0, 3}},
            {{1, 5}},
            {{4, 6}, {3, 5}},
        };
        return new TinyEmbedding(logical, chains, between);
    }
}
