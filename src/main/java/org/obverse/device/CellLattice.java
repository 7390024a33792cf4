package org.obverse.device;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.apache.commons.rng.UniformRandomProvider;

/**
 * A rows × cols grid of K_{t,t} cells (t = shore), the sparse lattice of many annealers and of
 * the embedding literature (Choi, Quantum Inf. Process. 10, 343, 2011; Boothby, King &amp; Roy,
 * Quantum Inf. Process. 15, 495, 2016). Immutable; it only names qubits and builds graphs.
 *
 * <p>Numbering: qubit (row r, col c, side s, index k) has id {@code ((r·cols + c)·2 + s)·t + k},
 * with 0 ≤ r &lt; rows, 0 ≤ c &lt; cols, s ∈ {0, 1}, 0 ≤ k &lt; t. Couplers:
 * <ul>
 * <li>inside a cell, every side-0 qubit couples to every side-1 qubit (the K_{t,t});</li>
 * <li>side 0 is the vertical side: (r, c, 0, k) couples to (r + 1, c, 0, k);</li>
 * <li>side 1 is the horizontal side: (r, c, 1, k) couples to (r, c + 1, 1, k).</li>
 * </ul>
 * A full lattice has 2·t·rows·cols qubits and t²·rows·cols + t·(rows − 1)·cols + t·rows·(cols − 1)
 * couplers.
 */
public final class CellLattice {
    /** Side whose qubits couple to the cell below (same column). */
    public static final int VERTICAL = 0;
    /** Side whose qubits couple to the cell to the right (same row). */
    public static final int HORIZONTAL = 1;

    private final int rows;
    private final int cols;
    private final int shore;

    private CellLattice(int rows, int cols, int shore) {
        this.rows = rows;
        this.cols = cols;
        this.shore = shore;
    }

    /**
     * A lattice of rows × cols cells with t qubits on each side of a cell.
     *
     * @throws IllegalArgumentException where a size is below 1 or the qubit count overflows an int
     */
    public static CellLattice of(int rows, int cols, int shore) {
        if (rows < 1 || cols < 1 || shore < 1) {
            throw new IllegalArgumentException("lattice " + rows + " x " + cols + " cells of shore " + shore
                    + ": rows, cols and shore must be >= 1");
        }
        if (2L * rows * cols * shore > Integer.MAX_VALUE / 2) {
            throw new IllegalArgumentException("lattice " + rows + " x " + cols + " cells of shore " + shore
                    + " has too many qubits");
        }
        return new CellLattice(rows, cols, shore);
    }

    public int rows() {
        return rows;
    }

    public int cols() {
        return cols;
    }

    public int shore() {
        return shore;
    }

    /** Number of qubits of the full lattice. */
    public int qubitCount() {
        return 2 * rows * cols * shore;
    }

    /** The id of qubit (row, col, side, index); arguments are not checked beyond the formula. */
    public int qubit(int row, int col, int side, int index) {
        return ((row * cols + col) * 2 + side) * shore + index;
    }

    /** Row of a qubit id. */
    public int rowOf(int qubit) {
        return qubit / (2 * shore * cols);
    }

    /** Column of a qubit id. */
    public int colOf(int qubit) {
        return (qubit / (2 * shore)) % cols;
    }

    /** Side (0 vertical, 1 horizontal) of a qubit id. */
    public int sideOf(int qubit) {
        return (qubit / shore) % 2;
    }

    /** Index within its side of a qubit id. */
    public int indexOf(int qubit) {
        return qubit % shore;
    }

    /** The couplers of the full lattice as {a, b} pairs with a &lt; b. */
    public int[][] couplers() {
        List<int[]> out = new ArrayList<>();
        for (int r = 0; r < rows; r++) {
            for (int c = 0; c < cols; c++) {
                for (int i = 0; i < shore; i++) {
                    for (int j = 0; j < shore; j++) {
                        out.add(new int[] {qubit(r, c, VERTICAL, i), qubit(r, c, HORIZONTAL, j)});
                    }
                }
                for (int k = 0; k < shore; k++) {
                    if (r + 1 < rows) {
                        out.add(new int[] {qubit(r, c, VERTICAL, k), qubit(r + 1, c, VERTICAL, k)});
                    }
                    if (c + 1 < cols) {
                        out.add(new int[] {qubit(r, c, HORIZONTAL, k), qubit(r, c + 1, HORIZONTAL, k)});
                    }
                }
            }
        }
        return out.toArray(new int[0][]);
    }

    /** The full working graph, without defects. */
    public QubitGraph graph() {
        int[] ids = new int[qubitCount()];
        Arrays.setAll(ids, q -> q);
        return QubitGraph.of(ids, couplers());
    }

    /**
     * The full graph without the listed qubits and couplers.
     *
     * @throws IllegalArgumentException where a listed qubit or coupler is not in the lattice
     */
    public QubitGraph graphWithout(int[] removedQubits, int[][] removedCouplers) {
        QubitGraph full = graph();
        for (int q : removedQubits) {
            if (!full.hasQubit(q)) {
                throw new IllegalArgumentException("qubit " + q + " to remove is not in the lattice (ids 0.."
                        + (qubitCount() - 1) + ")");
            }
        }
        for (int[] c : removedCouplers) {
            if (c.length != 2 || !full.hasCoupler(c[0], c[1])) {
                throw new IllegalArgumentException("coupler " + Arrays.toString(c) + " to remove is not in the lattice");
            }
        }
        return full.without(removedQubits, removedCouplers);
    }

    /**
     * A graph (any, often a lattice's) with random defects: {@code qubitDefects} qubits and then {@code couplerDefects}
     * of the couplers that remain are removed, each set drawn uniformly without replacement
     * (partial Fisher–Yates shuffle) from the generator.
     *
     * @throws IllegalArgumentException where more qubits or couplers are asked for than exist
     */
    public static QubitGraph withRandomDefects(QubitGraph start, int qubitDefects, int couplerDefects,
                                               UniformRandomProvider rng) {
        int[] qubits = start.qubits().toArray();
        if (qubitDefects < 0 || qubitDefects > qubits.length) {
            throw new IllegalArgumentException("cannot remove " + qubitDefects + " of " + qubits.length + " qubits");
        }
        int[] goneQubits = drawWithoutReplacement(qubits, qubitDefects, rng);
        QubitGraph afterQubits = start.without(goneQubits, new int[0][]);
        int[][] couplers = afterQubits.couplers();
        if (couplerDefects < 0 || couplerDefects > couplers.length) {
            throw new IllegalArgumentException("cannot remove " + couplerDefects + " of " + couplers.length
                    + " remaining couplers");
        }
        int[] order = new int[couplers.length];
        Arrays.setAll(order, c -> c);
        int[] chosen = drawWithoutReplacement(order, couplerDefects, rng);
        int[][] goneCouplers = new int[chosen.length][];
        for (int i = 0; i < chosen.length; i++) {
            goneCouplers[i] = couplers[chosen[i]];
        }
        return afterQubits.without(new int[0], goneCouplers);
    }

    private static int[] drawWithoutReplacement(int[] pool, int count, UniformRandomProvider rng) {
        int[] a = pool.clone();
        for (int i = 0; i < count; i++) {
            int j = i + rng.nextInt(a.length - i);
            int t = a[i];
            a[i] = a[j];
            a[j] = t;
        }
        return Arrays.copyOf(a, count);
    }

    @Override
    public String toString() {
        return "CellLattice[" + rows + " x " + cols + " cells of K" + shore + "," + shore + "]";
    }
}
