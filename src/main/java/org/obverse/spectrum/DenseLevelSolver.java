package org.obverse.spectrum;

import java.util.Arrays;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;

/**
 * Lowest levels by forming H(s) on the sector as a dense symmetric matrix and taking EJML's
 * symmetric eigendecomposition (Householder tridiagonalisation and implicit QR), eigenvalues
 * only, falling back to EJML's general eigendecomposition where the symmetric one reports no
 * convergence. Exact to rounding: the oracle for the Lanczos solver. Cost O(d³) time and 8·d² bytes
 * for d = 2^m; refused above {@link #MAX_STORED_SPINS}. Stateless.
 */
public final class DenseLevelSolver implements LevelSolver {
    /** Largest number of stored spins: a 4096 × 4096 matrix, 128 MiB. */
    public static final int MAX_STORED_SPINS = 12;
    /** Backward-stable eigendecomposition: levels accurate to a few ulps of ‖H‖. */
    public static final double TOLERANCE = 1e-12;

    /** The solver. */
    public static DenseLevelSolver create() {
        return new DenseLevelSolver();
    }

    private DenseLevelSolver() {
    }

    @Override
    public String name() {
        return "dense";
    }

    @Override
    public int maxStoredSpins() {
        return MAX_STORED_SPINS;
    }

    @Override
    public long memoryBytes(int storedSpins, int levels) {
        long d = 1L << storedSpins;
        // The matrix and EJML's tridiagonal working copy.
        return 2L * 8L * d * d;
    }

    @Override
    public double tolerance() {
        return TOLERANCE;
    }

    @Override
    public double[] lowest(AnnealOperator operator, int count) {
        checkSize(operator.basis(), count);
        DMatrixRMaj h = matrix(operator);
        int d = h.numRows;
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(d, false, true);
        if (!eig.decompose(h.copy())) {
            // EJML's symmetric QR gives up on some massively degenerate matrices (the pure driver
            // at s = 0 has binomial multiplicities); the general Hessenberg QR is backward
            // stable too, and a symmetric matrix's eigenvalues are perfectly conditioned.
            eig = DecompositionFactory_DDRM.eig(d, false, false);
            if (!eig.decompose(h)) {
                throw new IllegalStateException("the dense eigendecomposition did not converge (dimension " + d + ")");
            }
        }
        double[] values = new double[d];
        for (int i = 0; i < d; i++) {
            values[i] = eig.getEigenvalue(i).getReal();
        }
        Arrays.sort(values);
        return Arrays.copyOf(values, Math.min(count, d));
    }

    /** H(s) on the sector as a dense matrix (row b, column b ^ mask(k) gets −A/2 per spin k). */
    public static DMatrixRMaj matrix(AnnealOperator operator) {
        SectorBasis basis = operator.basis();
        int d = operator.dimension();
        DMatrixRMaj h = new DMatrixRMaj(d, d);
        int[] masks = basis.flipMasks();
        double c = operator.driverCoefficient();
        for (int b = 0; b < d; b++) {
            h.add(b, b, operator.diagonal(b));
            for (int mask : masks) {
                h.add(b, b ^ mask, c);
            }
        }
        return h;
    }
}
