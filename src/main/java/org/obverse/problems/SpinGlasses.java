package org.obverse.problems;

import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.random.StandardNormal;

/**
 * Random spin glasses on a rows × columns grid of K4,4 cells, the usual benchmark of analog
 * annealers (Boixo et al., Nature Physics 10, 218, 2014; Rønnow et al., Science 345, 420,
 * 2014). Qubit id of cell (r, c), side t ∈ {0, 1}, index k ∈ 0..3:
 * {@code ((r·columns + c)·2 + t)·4 + k}. Inside a cell every side-0 qubit meets every side-1
 * qubit (16 couplers); side-0 qubit k meets the same qubit of the cell below, side-1 qubit k
 * the same qubit of the cell to the right. No fields. rows · columns · 8 qubits.
 */
public final class SpinGlasses {
    /** Qubits on one side of a cell. */
    public static final int SIDE = 4;

    private SpinGlasses() {
    }

    /** How couplings are drawn. */
    public enum Couplings {
        /** J = ±1 with equal probability. */
        PLUS_MINUS_ONE,
        /** J ~ N(0, 1). */
        GAUSSIAN
    }

    /** The qubit id of cell (r, c), side t, index k. */
    public static int qubit(int columns, int r, int c, int side, int k) {
        return ((r * columns + c) * 2 + side) * SIDE + k;
    }

    /** The couplers of the cell grid as {a, b} id pairs (a &lt; b). */
    public static int[][] cellGridCouplers(int rows, int columns) {
        checkSize(rows, columns);
        int cells = rows * columns;
        int count = cells * SIDE * SIDE + (rows - 1) * columns * SIDE + rows * (columns - 1) * SIDE;
        int[][] out = new int[count][];
        int m = 0;
        for (int r = 0; r < rows; r++) {
            for (int c = 0; c < columns; c++) {
                for (int a = 0; a < SIDE; a++) {
                    for (int b = 0; b < SIDE; b++) {
                        out[m++] = new int[] {qubit(columns, r, c, 0, a), qubit(columns, r, c, 1, b)};
                    }
                }
                for (int k = 0; k < SIDE; k++) {
                    if (r + 1 < rows) {
                        out[m++] = new int[] {qubit(columns, r, c, 0, k), qubit(columns, r + 1, c, 0, k)};
                    }
                    if (c + 1 < columns) {
                        out[m++] = new int[] {qubit(columns, r, c, 1, k), qubit(columns, r, c + 1, 1, k)};
                    }
                }
            }
        }
        return out;
    }

    /** A spin glass on the cell grid with couplings drawn from the generator. */
    public static IsingProblem cellGrid(int rows, int columns, Couplings kind, UniformRandomProvider rng) {
        IsingBuilder b = IsingProblem.builder();
        for (int q = 0; q < rows * columns * 2 * SIDE; q++) {
            b.variable(q);
        }
        for (int[] c : cellGridCouplers(rows, columns)) {
            double j = kind == Couplings.PLUS_MINUS_ONE ? (rng.nextBoolean() ? 1.0 : -1.0) : StandardNormal.draw(rng);
            b.coupling(c[0], c[1], j);
        }
        return b.build();
    }

    private static void checkSize(int rows, int columns) {
        if (rows < 1 || columns < 1) {
            throw new IllegalArgumentException("grid " + rows + " x " + columns + " needs at least one cell");
        }
    }
}
