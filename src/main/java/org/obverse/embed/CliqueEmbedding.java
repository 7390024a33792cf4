package org.obverse.embed;

import org.obverse.device.CellLattice;
import org.obverse.model.VariableIndex;

/**
 * The native clique embedding of a defect-free grid of K_{t,t} cells: K_{t·m} in an m × m grid
 * with every chain of length m + 1 (Boothby, King &amp; Roy, "Fast clique minor generation in
 * Chimera qubit connectivity graphs", Quantum Inf. Process. 15, 495, 2016, who count the
 * family of such native embeddings; this is one member of it).
 *
 * <p>Clique vertex v = t·i + k (0 ≤ i &lt; m, 0 ≤ k &lt; t) gets an L-shaped chain: the
 * vertical qubits (r, i, 0, k) for r = 0 … i, down column i, and the horizontal qubits
 * (i, c, 1, k) for c = i … m − 1, along row i; the two arms meet in cell (i, i) through its
 * K_{t,t} coupler. Vertices i &lt; j meet in cell (i, j), where j's vertical arm crosses i's
 * horizontal arm; vertices with the same i meet in cell (i, i). On a non-square grid the
 * top-left min(rows, cols) square is used.
 */
public final class CliqueEmbedding {
    private CliqueEmbedding() {
    }

    /** The largest clique the construction gives on the lattice: t · min(rows, cols). */
    public static int maxSize(CellLattice lattice) {
        return lattice.shore() * Math.min(lattice.rows(), lattice.cols());
    }

    /** The chain length of the construction on the lattice: min(rows, cols) + 1. */
    public static int chainLength(CellLattice lattice) {
        return Math.min(lattice.rows(), lattice.cols()) + 1;
    }

    /** Chains for clique vertices with logical ids 0 … size − 1. */
    public static Chains of(CellLattice lattice, int size) {
        int[] ids = new int[size];
        for (int v = 0; v < size; v++) {
            ids[v] = v;
        }
        return forVariables(lattice, VariableIndex.of(ids));
    }

    /**
     * Chains for the given logical ids, the k-th smallest id on clique vertex k, so that any
     * problem on these variables (whatever its couplings) is embedded.
     *
     * @throws IllegalArgumentException where there are more ids than {@link #maxSize}
     */
    public static Chains forVariables(CellLattice lattice, VariableIndex ids) {
        int m = Math.min(lattice.rows(), lattice.cols());
        int t = lattice.shore();
        if (ids.size() > maxSize(lattice)) {
            throw new IllegalArgumentException(ids.size() + " variables do not fit the native clique of " + lattice
                    + ", which holds at most " + maxSize(lattice) + "; use a larger lattice or the heuristic finder");
        }
        int[][] chains = new int[ids.size()][];
        for (int v = 0; v < ids.size(); v++) {
            int i = v / t;
            int k = v % t;
            int[] chain = new int[m + 1];
            int p = 0;
            for (int r = 0; r <= i; r++) {
                chain[p++] = lattice.qubit(r, i, CellLattice.VERTICAL, k);
            }
            for (int c = i; c < m; c++) {
                chain[p++] = lattice.qubit(i, c, CellLattice.HORIZONTAL, k);
            }
            chains[v] = chain;
        }
        return Chains.of(ids.toArray(), chains);
    }
}
