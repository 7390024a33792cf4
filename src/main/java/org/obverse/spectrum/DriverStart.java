package org.obverse.spectrum;

import java.util.Arrays;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;

/**
 * Start vectors for the Lanczos solver near s = 0, from the closed-form spectrum of the pure
 * driver and first-order degenerate perturbation theory.
 *
 * <p>In the sector basis the driver is −(A/2) Σ_k X_k with X_k: b → b ^ mask(k), commuting
 * involutions; their common eigenvectors are the characters v_c(b) = (−1)^{|b ∧ c|}/√d, with
 * X_k v_c = (−1)^{|mask(k) ∧ c|} v_c, so v_c has driver level −(A/2) ε(c), ε(c) = Σ_k
 * (−1)^{|mask(k) ∧ c|} (in the full space ε = n − 2|c|: the levels −(A/2)(n − 2j) with
 * binomial degeneracies). For small B the lowest levels of H(s) grow out of the driver's
 * highest-ε groups of characters, split in first order by H_P restricted to each group
 * (degenerate perturbation theory: Sakurai and Napolitano, Modern Quantum Mechanics, 2nd ed.,
 * Addison-Wesley 2011, §5.2). The restriction is ⟨v_c|H_P|v_c'⟩ = W(c ⊕ c')/d with W the
 * Walsh–Hadamard transform of the problem energies, so each group's zeroth-order combinations
 * come from a small dense eigenproblem. These vectors only seed the search: the solver still
 * converges and confirms every level.
 */
final class DriverStart {
    /** Largest group of equal driver level that is diagonalised (larger: no start vectors). */
    static final int MAX_GROUP = 256;

    private DriverStart() {
    }

    /**
     * The number of levels in the driver's lowest degenerate groups that together hold at
     * least count levels: asking for all of them puts the boundary of the wanted levels in a
     * gap of width about A, where Lanczos converges fast, rather than inside a tight cluster.
     */
    static int groupCover(SectorBasis basis, int count) {
        int[] epsilon = epsilon(basis);
        int n = basis.spins();
        int[] histogram = new int[2 * n + 1];
        for (int e : epsilon) {
            histogram[e + n]++;
        }
        int covered = 0;
        for (int e = 2 * n; e >= 0 && covered < count; e--) {
            covered += histogram[e];
        }
        return Math.min(covered, epsilon.length);
    }

    // ε(c) = Σ_k (−1)^{|mask(k) ∧ c|} for every character c.
    private static int[] epsilon(SectorBasis basis) {
        int d = basis.dimension();
        int[] masks = basis.flipMasks();
        int[] epsilon = new int[d];
        for (int c = 0; c < d; c++) {
            int e = 0;
            for (int mask : masks) {
                e += (Integer.bitCount(mask & c) & 1) == 0 ? 1 : -1;
            }
            epsilon[c] = e;
        }
        return epsilon;
    }

    /**
     * Orthonormal start vectors for the lowest count levels at small B/A > 0 (exact
     * eigenvectors at B = 0), or null where a needed driver level is more degenerate than
     * {@link #MAX_GROUP}.
     */
    static double[][] vectors(SectorBasis basis, int count) {
        return build(basis, count, false);
    }

    /**
     * The normalised sum of {@link #vectors}, as one vector (the warm start uses only the sum;
     * one vector of memory instead of count), or null as there.
     */
    static double[] seed(SectorBasis basis, int count) {
        double[][] one = build(basis, count, true);
        return one == null ? null : one[0];
    }

    private static double[][] build(SectorBasis basis, int count, boolean summed) {
        int d = basis.dimension();
        int[] epsilon = epsilon(basis);
        int want = Math.min(count, d);
        double[] walsh = basis.problemEnergiesView().clone();
        walshHadamard(walsh);
        double[][] out = new double[summed ? 1 : want][];
        // Summed: the coefficients of every vector on the characters (the groups are disjoint).
        double[] total = summed ? new double[d] : null;
        int filled = 0;
        int level = Integer.MAX_VALUE;
        while (filled < want) {
            // The next lower driver level (highest ε not yet taken) and its characters.
            int next = Integer.MIN_VALUE;
            for (int e : epsilon) {
                if (e < level && e > next) {
                    next = e;
                }
            }
            level = next;
            int size = 0;
            for (int e : epsilon) {
                if (e == level) {
                    size++;
                }
            }
            if (size > MAX_GROUP) {
                return null;
            }
            int[] group = new int[size];
            int g = 0;
            for (int c = 0; c < d; c++) {
                if (epsilon[c] == level) {
                    group[g++] = c;
                }
            }
            int take = Math.min(size, want - filled);
            double[][] combos = lowestCombinations(walsh, d, group, take);
            if (combos == null) {
                return null;
            }
            for (double[] u : combos) {
                if (summed) {
                    for (int i = 0; i < size; i++) {
                        total[group[i]] += u[i];
                    }
                    filled++;
                    continue;
                }
                double[] y = new double[d];
                for (int i = 0; i < size; i++) {
                    y[group[i]] = u[i];
                }
                // Σ_c u_c v_c: the transform maps coefficients on characters to amplitudes.
                walshHadamard(y);
                Vectors.scale(y, d, 1.0 / Math.sqrt(d));
                out[filled++] = y;
            }
        }
        if (summed) {
            walshHadamard(total);
            Vectors.scale(total, d, 1.0 / Math.sqrt(filled * (double) d));
            out[0] = total;
        }
        return out;
    }

    // The take lowest eigenvectors of M[i][j] = W(group[i] ^ group[j]) / d, ascending.
    private static double[][] lowestCombinations(double[] walsh, int d, int[] group, int take) {
        int size = group.length;
        DMatrixRMaj m = new DMatrixRMaj(size, size);
        for (int i = 0; i < size; i++) {
            for (int j = 0; j < size; j++) {
                m.set(i, j, walsh[group[i] ^ group[j]] / d);
            }
        }
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(size, true, true);
        if (!eig.decompose(m)) {
            return null;
        }
        Integer[] order = new Integer[size];
        double[] values = new double[size];
        for (int i = 0; i < size; i++) {
            order[i] = i;
            values[i] = eig.getEigenvalue(i).getReal();
        }
        Arrays.sort(order, (x, y) -> Double.compare(values[x], values[y]));
        double[][] out = new double[take][size];
        for (int r = 0; r < take; r++) {
            DMatrixRMaj v = eig.getEigenVector(order[r]);
            if (v == null) {
                return null;
            }
            for (int i = 0; i < size; i++) {
                out[r][i] = v.get(i, 0);
            }
        }
        return out;
    }

    // In place: x[c] ← Σ_b x[b] (−1)^{|b ∧ c|} (the unnormalised fast transform; d a power of 2).
    static void walshHadamard(double[] x) {
        int d = x.length;
        for (int len = 1; len < d; len <<= 1) {
            for (int i = 0; i < d; i += len << 1) {
                for (int j = i; j < i + len; j++) {
                    double a = x[j];
                    double b = x[j + len];
                    x[j] = a + b;
                    x[j + len] = a - b;
                }
            }
        }
    }
}
