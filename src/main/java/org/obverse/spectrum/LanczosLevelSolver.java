package org.obverse.spectrum;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;

/**
 * Lowest levels by a matrix-free block Lanczos method with full reorthogonalisation, locking
 * and explicit restarts.
 *
 * <p>Each round grows an orthonormal block Krylov basis from a block of p vectors (H applied
 * by {@link AnnealOperator#apply}, every new vector orthogonalised twice against the basis and
 * the locked vectors by classical Gram–Schmidt), forms the projected banded matrix T = QᵀHQ
 * and its Ritz pairs (EJML), and reads each Ritz pair's exact residual ‖Hy − θy‖ from the
 * coupling of the basis to the vectors beyond it. A Ritz pair is converged when that residual
 * is at most {@code tolerance · max(1, ‖H‖)} (‖H‖ bounded by |B/2|·max|H_P| + n·A/2); then
 * its eigenvalue is within that bound of a true one (Kahan; see Parlett, The Symmetric
 * Eigenvalue Problem, SIAM 1998, §11.5). The lowest converged pairs are locked (later rounds
 * work orthogonally to them: deflation); the next round restarts from the lowest unconverged
 * Ritz vectors plus a small random part, so a level whose partner was absent from one Krylov
 * space (an exact degeneracy) is found later. It stops when at least the wanted number are
 * locked and a round's converged lowest Ritz value is no lower than the last wanted locked
 * one. Blocks of p ≥ 2 resolve near-degenerate pairs that a single vector converges to only
 * slowly.
 *
 * <p>Memory: (basis + p + locked) vectors of 2^m doubles; the basis is capped by
 * {@link #BASIS_BYTES}. Start vectors come from a fixed seed: results are reproducible.
 * Immutable; safe to share.
 */
public final class LanczosLevelSolver implements LevelSolver {
    /** Largest number of stored spins (a sector of 2^20 states). */
    public static final int MAX_STORED_SPINS = 20;
    /** Default residual tolerance relative to max(1, ‖H‖). */
    public static final double DEFAULT_TOLERANCE = 1e-10;
    /** Memory budget of the Krylov basis. */
    public static final long BASIS_BYTES = 256L << 20;
    /** Most basis vectors per round. */
    public static final int MAX_BASIS = 96;
    private static final int MAX_ROUNDS = 400;
    private static final long SEED = 0x5EC7_2A11_0B5E_77E1L;
    private static final double RESTART_NOISE = 1e-3;

    private final double tolerance;
    private final int blockSize;

    private LanczosLevelSolver(double tolerance, int blockSize) {
        this.tolerance = tolerance;
        this.blockSize = blockSize;
    }

    /** The solver with the default tolerance and block size 4. */
    public static LanczosLevelSolver create() {
        return new LanczosLevelSolver(DEFAULT_TOLERANCE, 4);
    }

    /**
     * A solver. Input: tolerance in [1e-14, 1e-2]; block size 1 to 8.
     */
    public static LanczosLevelSolver of(double tolerance, int blockSize) {
        if (!(tolerance >= 1e-14 && tolerance <= 1e-2)) {
            throw new IllegalArgumentException("Lanczos tolerance " + tolerance + " must lie in [1e-14, 1e-2]");
        }
        if (blockSize < 1 || blockSize > 8) {
            throw new IllegalArgumentException("Lanczos block size " + blockSize + " must lie in 1..8");
        }
        return new LanczosLevelSolver(tolerance, blockSize);
    }

    @Override
    public String name() {
        return "lanczos";
    }

    @Override
    public int maxStoredSpins() {
        return MAX_STORED_SPINS;
    }

    @Override
    public long memoryBytes(int storedSpins, int levels) {
        long d = 1L << storedSpins;
        return 8L * d * (basisVectors(d, blockSize) + 2L * blockSize + levels + 2L);
    }

    @Override
    public double tolerance() {
        return tolerance;
    }

    /** Basis vectors per round for a sector of dimension d. */
    static int basisVectors(long d, int p) {
        long byBudget = BASIS_BYTES / (8L * d);
        long m = Math.max(6L * p, Math.min(MAX_BASIS, byBudget));
        return (int) Math.min(d, m);
    }

    @Override
    public double[] lowest(AnnealOperator op, int count) {
        checkSize(op.basis(), count);
        int dim = op.dimension();
        int k = Math.min(count, dim);
        double scale = Math.max(1.0, op.normBound());
        double tol = tolerance * scale;
        double tiny = 1e-14 * scale;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        int p = Math.max(1, Math.min(blockSize, k));
        int basisMax = basisVectors(dim, p);
        double[][] q = new double[basisMax][];
        double[] w = new double[dim];
        List<double[]> locked = new ArrayList<>();
        double[] lockedValues = new double[0];
        double[][] restart = null;
        for (int round = 0; round < MAX_ROUNDS; round++) {
            int nLocked = locked.size();
            int avail = dim - nLocked;
            if (avail <= 0) {
                break;
            }
            double[][] lockedArr = locked.toArray(new double[0][]);
            int pb = Math.min(p, avail);
            int maxSize = Math.min(basisMax, avail);
            double[][] t = new double[maxSize][maxSize];
            int size = 0;
            for (int c = 0; c < pb; c++) {
                q[c] = q[c] == null ? new double[dim] : q[c];
                double[] start = restart != null && c < restart.length ? restart[c] : null;
                newDirection(q[c], start, rng, lockedArr, q, c, dim, tiny);
                size++;
            }
            int need = nLocked >= k ? 1 : k - nLocked;
            double kth = nLocked >= k ? sortedCopy(lockedValues)[k - 1] : Double.NaN;
            int done = 0;
            Ritz ritz = null;
            while (done < size) {
                boolean grow = size < maxSize;
                boolean exhausted = size == avail;
                if (!grow && !exhausted) {
                    break;
                }
                op.apply(q[done], w);
                double[] column = new double[size];
                for (int pass = 0; pass < 2; pass++) {
                    Vectors.projectOut(lockedArr, lockedArr.length, w, dim, null);
                    Vectors.projectOut(q, size, w, dim, column);
                }
                for (int i = 0; i < size; i++) {
                    t[i][done] = column[i];
                }
                if (grow) {
                    double nu = Vectors.norm(w, dim);
                    q[size] = q[size] == null ? new double[dim] : q[size];
                    if (nu > tiny) {
                        System.arraycopy(w, 0, q[size], 0, dim);
                        Vectors.scale(q[size], dim, 1.0 / nu);
                        t[size][done] = nu;
                    } else {
                        // An invariant subspace: continue with a fresh direction.
                        newDirection(q[size], null, rng, lockedArr, q, size, dim, tiny);
                        t[size][done] = 0.0;
                    }
                    size++;
                }
                done++;
                if (done >= need && (done % pb == 0 || done == size)) {
                    ritz = Ritz.of(t, done, size);
                    if (ritz.converged(need, tol)) {
                        break;
                    }
                }
            }
            if (ritz == null || ritz.columns != done) {
                ritz = Ritz.of(t, done, size);
            }
            if (nLocked >= k && ritz.residual[0] <= tol && ritz.value[0] >= kth - tol) {
                break;
            }
            int accepted = 0;
            for (int i = 0; i < Math.min(need, done); i++) {
                if (ritz.residual[i] > tol || (nLocked >= k && ritz.value[i] >= kth - tol)) {
                    break;
                }
                double[] y = new double[dim];
                Vectors.combine(q, ritz.vector(i), done, y, dim);
                Vectors.projectOut(lockedArr, lockedArr.length, y, dim, null);
                Vectors.scale(y, dim, 1.0 / Vectors.norm(y, dim));
                locked.add(y);
                lockedValues = Arrays.copyOf(lockedValues, lockedValues.length + 1);
                lockedValues[lockedValues.length - 1] = ritz.value[i];
                accepted++;
            }
            int restartCount = Math.min(pb, done - accepted);
            restart = new double[Math.max(0, restartCount)][];
            for (int c = 0; c < restartCount; c++) {
                restart[c] = new double[dim];
                Vectors.combine(q, ritz.vector(accepted + c), done, restart[c], dim);
            }
            if (locked.size() >= dim) {
                break;
            }
            if (round == MAX_ROUNDS - 1) {
                throw new IllegalStateException("the Lanczos solver did not reach residual " + tol + " in "
                        + MAX_ROUNDS + " rounds (dimension " + dim + ", " + locked.size() + " of " + k
                        + " levels locked); use --solver dense for a small problem or a looser --tolerance");
            }
        }
        double[] values = sortedCopy(lockedValues);
        return Arrays.copyOf(values, Math.min(k, values.length));
    }

    // Fills v with start (if any) plus noise, orthonormal to the locked vectors and q[0..count).
    private static void newDirection(double[] v, double[] start, UniformRandomProvider rng, double[][] locked,
                                     double[][] q, int count, int dim, double tiny) {
        for (int attempt = 0; attempt < 8; attempt++) {
            double noise = start == null ? 1.0 : RESTART_NOISE / Math.sqrt(dim);
            for (int i = 0; i < dim; i++) {
                v[i] = noise * (rng.nextDouble() - 0.5) + (start == null ? 0.0 : start[i]);
            }
            for (int pass = 0; pass < 2; pass++) {
                Vectors.projectOut(locked, locked.length, v, dim, null);
                Vectors.projectOut(q, count, v, dim, null);
            }
            double norm = Vectors.norm(v, dim);
            if (norm > 1e-8) {
                Vectors.scale(v, dim, 1.0 / norm);
                return;
            }
            start = null;
        }
        throw new IllegalStateException("could not find a direction orthogonal to " + (locked.length + count)
                + " vectors in dimension " + dim);
    }

    private static double[] sortedCopy(double[] v) {
        double[] s = v.clone();
        Arrays.sort(s);
        return s;
    }

    /** Ritz pairs of the leading block of T, ascending, with exact residual norms. */
    private static final class Ritz {
        final int columns;
        final double[] value;
        final double[] residual;
        final double[][] vectors;

        private Ritz(int columns, double[] value, double[] residual, double[][] vectors) {
            this.columns = columns;
            this.value = value;
            this.residual = residual;
            this.vectors = vectors;
        }

        static Ritz of(double[][] t, int columns, int size) {
            DMatrixRMaj lead = new DMatrixRMaj(columns, columns);
            for (int i = 0; i < columns; i++) {
                for (int j = 0; j < columns; j++) {
                    lead.set(i, j, 0.5 * (t[i][j] + t[j][i]));
                }
            }
            EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(columns, true, true);
            if (!eig.decompose(lead)) {
                throw new IllegalStateException("the projected eigenproblem did not converge");
            }
            Integer[] order = new Integer[columns];
            double[] raw = new double[columns];
            for (int i = 0; i < columns; i++) {
                order[i] = i;
                raw[i] = eig.getEigenvalue(i).getReal();
            }
            Arrays.sort(order, (x, y) -> Double.compare(raw[x], raw[y]));
            double[] value = new double[columns];
            double[] residual = new double[columns];
            double[][] vectors = new double[columns][];
            for (int r = 0; r < columns; r++) {
                DMatrixRMaj vec = eig.getEigenVector(order[r]);
                double[] s = new double[columns];
                for (int j = 0; j < columns; j++) {
                    s[j] = vec.get(j, 0);
                }
                value[r] = raw[order[r]];
                vectors[r] = s;
                // H y − θ y lies in the span of q[columns..size): its coefficients are T[i][0..columns) · s.
                double sum = 0.0;
                for (int i = columns; i < size; i++) {
                    double c = 0.0;
                    for (int j = 0; j < columns; j++) {
                        c += t[i][j] * s[j];
                    }
                    sum += c * c;
                }
                residual[r] = Math.sqrt(sum);
            }
            return new Ritz(columns, value, residual, vectors);
        }

        boolean converged(int need, double tol) {
            for (int i = 0; i < Math.min(need, columns); i++) {
                if (residual[i] > tol) {
                    return false;
                }
            }
            return need <= columns;
        }

        double[] vector(int i) {
            return vectors[i];
        }
    }
}
