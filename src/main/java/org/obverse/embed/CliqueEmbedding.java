package org.obverse.embed;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.obverse.device.CellLattice;
import org.obverse.device.QubitGraph;
import org.obverse.model.VariableIndex;

/**
 * The native clique embedding of a defect-free grid of K_{t,t} cells: K_{t·m} in an m × m grid
 * with every chain of length m + 1 (Boothby, King &amp; Roy, "Fast clique minor generation in
 * … qubit connectivity graphs", Quantum Inf. Process. 15, 495, 2016, who count the
 * family of such native embeddings; this is one member of it).
 *
 * <p>Clique vertex v = t·i + k (0 ≤ i &lt; m, 0 ≤ k &lt; t) gets an L-shaped chain: the
 * vertical qubits (r, i, 0, k) for r = 0 … i, down column i, and the horizontal qubits
 * (i, c, 1, k) for c = i … m − 1, along row i; the two arms meet in cell (i, i) through its
 * K_{t,t} coupler. Vertices i &lt; j meet in cell (i, j), where j's vertical arm crosses i's
 * horizontal arm; vertices with the same i meet in cell (i, i). On a non-square grid the
 * top-left min(rows, cols) square is used.
 *
 * <p>{@link #avoidingDefects} makes the construction usable on a lattice with defects: it tries
 * every square of s × s cells (s from the smallest that can hold the clique upward, so chains
 * are as short as possible), every position, and the four mirror images of the L shape, drops
 * the chains that use a missing qubit or coupler and then, greedily, those whose meeting
 * coupler with another kept chain is missing, and takes the first placement that keeps enough
 * chains.
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

    /**
     * A clique embedding of the given logical ids that avoids the graph's defects, with chains
     * of length s + 1 for the smallest square of s × s cells that works.
     *
     * @throws EmbeddingNotFoundException where no square, position and mirror image keeps enough chains
     */
    public static Chains avoidingDefects(CellLattice lattice, QubitGraph graph, VariableIndex ids) {
        int t = lattice.shore();
        int n = ids.size();
        int largest = Math.min(lattice.rows(), lattice.cols());
        for (int size = Math.max(1, (n + t - 1) / t); size <= largest; size++) {
            for (int r0 = 0; r0 + size <= lattice.rows(); r0++) {
                for (int c0 = 0; c0 + size <= lattice.cols(); c0++) {
                    for (int mirror = 0; mirror < 4; mirror++) {
                        int[][] kept = usableChains(lattice, graph, size, r0, c0, mirror);
                        if (kept.length >= n) {
                            return Chains.of(ids.toArray(), Arrays.copyOf(kept, n));
                        }
                    }
                }
            }
        }
        throw new EmbeddingNotFoundException("no native clique of " + n + " variables avoids the defects of " + lattice
                + " (largest square " + largest + " x " + largest + " cells, " + t * largest
                + " chains at most); use the reroute finder or a larger lattice");
    }

    private static int[][] usableChains(CellLattice lattice, QubitGraph graph, int m, int r0, int c0, int mirror) {
        int t = lattice.shore();
        List<int[]> chains = new ArrayList<>();
        for (int v = 0; v < t * m; v++) {
            int i = v / t;
            int k = v % t;
            int[] chain = new int[m + 1];
            int p = 0;
            for (int r = 0; r <= i; r++) {
                chain[p++] = cell(lattice, m, r0, c0, mirror, r, i, CellLattice.VERTICAL, k);
            }
            for (int c = i; c < m; c++) {
                chain[p++] = cell(lattice, m, r0, c0, mirror, i, c, CellLattice.HORIZONTAL, k);
            }
            if (intact(chain, graph)) {
                chains.add(chain);
            }
        }
        // Drop, one at a time, the chain with the most missing meeting couplers.
        int c = chains.size();
        boolean[][] apart = new boolean[c][c];
        int[] missing = new int[c];
        for (int a = 0; a < c; a++) {
            for (int b = a + 1; b < c; b++) {
                if (!touch(chains.get(a), chains.get(b), graph)) {
                    apart[a][b] = true;
                    apart[b][a] = true;
                    missing[a]++;
                    missing[b]++;
                }
            }
        }
        boolean[] gone = new boolean[c];
        while (true) {
            int worst = -1;
            for (int a = 0; a < c; a++) {
                if (!gone[a] && missing[a] > 0 && (worst < 0 || missing[a] > missing[worst])) {
                    worst = a;
                }
            }
            if (worst < 0) {
                break;
            }
            gone[worst] = true;
            for (int b = 0; b < c; b++) {
                if (apart[worst][b]) {
                    missing[b]--;
                }
            }
        }
        List<int[]> out = new ArrayList<>();
        for (int a = 0; a < c; a++) {
            if (!gone[a]) {
                out.add(chains.get(a));
            }
        }
        return out.toArray(new int[0][]);
    }

    /** Qubit (row, col, side, k) of an m × m square at (r0, c0), mirrored: bit 0 flips rows, bit 1 flips columns. */
    private static int cell(CellLattice lattice, int m, int r0, int c0, int mirror, int row, int col, int side, int k) {
        int r = (mirror & 1) != 0 ? m - 1 - row : row;
        int c = (mirror & 2) != 0 ? m - 1 - col : col;
        return lattice.qubit(r0 + r, c0 + c, side, k);
    }

    private static boolean intact(int[] chain, QubitGraph graph) {
        for (int q : chain) {
            if (!graph.hasQubit(q)) {
                return false;
            }
        }
        // The L is a path: the vertical arm in order, then the horizontal arm from the corner.
        int[] order = chain;
        for (int p = 0; p + 1 < order.length; p++) {
            if (!graph.hasCoupler(order[p], order[p + 1])) {
                return false;
            }
        }
        return true;
    }

    private static boolean touch(int[] a, int[] b, QubitGraph graph) {
        for (int x : a) {
            for (int y : b) {
                if (graph.hasCoupler(x, y)) {
                    return true;
                }
            }
        }
        return false;
    }
}
