package org.obverse.spectrum;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.apache.commons.rng.UniformRandomProvider;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
import org.obverse.random.LegacyStreams;

/**
 * Lowest levels by a matrix-free thick-restart Lanczos method with full reorthogonalisation,
 * locking and deflation.
 *
 * <p>The basis grows from a block of p random vectors (p = 1 by default): H is applied by
 * {@link AnnealOperator#apply} to the next unapplied vector, the components that T already
 * gives by symmetry are taken off, and the rest is orthogonalised against the basis and the
 * locked vectors by classical Gram–Schmidt, repeated where it cancelled by more than 1/√2
 * (the Daniel–Gragg–Kaufman–Stewart test), its coefficients
 * recorded as a column of the projected matrix T = QᵀHQ. Ritz pairs of T (EJML) carry their
 * exact residual ‖Hy − θy‖, read from the coupling of the applied vectors to the unapplied
 * ones. A Ritz pair is converged when that residual is at most
 * {@code tolerance · max(1, ‖H‖)} (‖H‖ bounded by |B/2|·max|H_P| + n·A/2); its eigenvalue is
 * then within that bound of a true one (Parlett, The Symmetric Eigenvalue Problem, SIAM 1998,
 * §11.5). The lowest converged pairs are locked, and later vectors are kept orthogonal to them
 * (deflation). When the basis is full it is restarted thick (Wu and Simon, SIAM J. Matrix
 * Anal. Appl. 22, 602, 2000): the lowest unconverged Ritz vectors stay, with T diagonal on
 * them, plus the unapplied vectors that hold their residuals, so no progress is lost. Once the
 * wanted number are locked, a confirmation run starts afresh from random vectors
 * orthogonal to the locked ones; its lowest Ritz value converges to the lowest unlocked level
 * (extreme eigenvalues converge first, and a random start has a part along every eigenvector,
 * so a degenerate partner absent from earlier Krylov spaces is found). A level found below
 * the last wanted one is locked and the confirmation repeats; it stops when the converged
 * lowest Ritz value of a confirmation run is no lower than the last wanted locked level.
 * Where no level is locked for {@link #STALL_RESTARTS} restarts in a row (a cluster of
 * near-degenerate levels wider than the block), the solve starts again with a block twice as
 * wide, up to {@link #MAX_BLOCK}: a block spanning the cluster resolves it by Rayleigh–Ritz.
 *
 * <p>{@link #lowestWithVectors} seeds the basis with the sum of given vectors (warm start,
 * used along a scan); convergence and confirmation are unchanged.
 *
 * <p>Memory: (basis + locked + 1) vectors of 2^m doubles; the basis holds at most
 * {@link #MAX_BASIS} vectors and at most {@link #BASIS_BYTES}. Start vectors come from a fixed
 * seed: results are reproducible and do not depend on the thread count. Immutable; safe to
 * share.
 */
public final class LanczosLevelSolver implements LevelSolver {
    /** Largest number of stored spins (a sector of 2^20 states). */
    public static final int MAX_STORED_SPINS = 20;
    /** Default residual tolerance relative to max(1, ‖H‖). */
    public static final double DEFAULT_TOLERANCE = 1e-12;
    /** Memory budget of the Krylov basis. */
    public static final long BASIS_BYTES = 256L << 20;
    /** Most basis vectors. */
    public static final int MAX_BASIS = 40;
    private static final int MAX_RESTARTS = 400;
    /** Restarts without a lock after which the block is widened. */
    public static final int STALL_RESTARTS = 40;
    /** The widest block. */
    public static final int MAX_BLOCK = 8;
    private static final double REORTHOGONALISE_BELOW = 0.7071;
    private static final long SEED = 0x5EC7_2A11_0B5E_77E1L;

    /** The fewest basis vectors by default (see {@link #basisVectors}). */
    public static final int DEFAULT_MINIMUM_BASIS = 16;

    private final double tolerance;
    private final int blockSize;
    private final int minimumBasis;

    private LanczosLevelSolver(double tolerance, int blockSize, int minimumBasis) {
        this.tolerance = tolerance;
        this.blockSize = blockSize;
        this.minimumBasis = minimumBasis;
    }

    /** The solver with the default tolerance and block size 1. */
    public static LanczosLevelSolver create() {
        return new LanczosLevelSolver(DEFAULT_TOLERANCE, 1, DEFAULT_MINIMUM_BASIS);
    }

    /**
     * A solver. Input: tolerance in [1e-14, 1e-2]; block size 1 to 8 (a larger block resolves
     * clusters of near-degenerate levels in fewer restarts, at more products per level).
     */
    public static LanczosLevelSolver of(double tolerance, int blockSize) {
        if (!(tolerance >= 1e-14 && tolerance <= 1e-2)) {
            throw new IllegalArgumentException("Lanczos tolerance " + tolerance + " must lie in [1e-14, 1e-2]");
        }
        if (blockSize < 1 || blockSize > 8) {
            throw new IllegalArgumentException("Lanczos block size " + blockSize + " must lie in 1..8");
        }
        return new LanczosLevelSolver(tolerance, blockSize, DEFAULT_MINIMUM_BASIS);
    }

    /**
     * The same solver with at least this many basis vectors (6 to {@link #MAX_BASIS}; the
     * default is {@link #DEFAULT_MINIMUM_BASIS}). For measuring the trade-off between products
     * and orthogonalisation; the levels agree to the tolerance whatever the basis.
     */
    public LanczosLevelSolver withMinimumBasis(int vectors) {
        if (vectors < 6 || vectors > MAX_BASIS) {
            throw new IllegalArgumentException("Lanczos minimum basis " + vectors + " must lie in 6.." + MAX_BASIS);
        }
        return new LanczosLevelSolver(tolerance, blockSize, vectors);
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
        return 8L * d * (basisVectors(d, blockSize, levels) + 2L * blockSize + levels + 2L);
    }

    @Override
    public double tolerance() {
        return tolerance;
    }

    /**
     * Basis vectors for a sector of dimension d, block size p and k wanted levels: a small
     * basis (2k + 4, at least 16 by default) restarted often is cheaper than a large one,
     * because the thick restart keeps the progress and full reorthogonalisation costs grow
     * with the basis (measured: 12 vectors solve 2^17 states about 3 times faster than 40).
     * Along a 40-point scan of 16 spins, 12 vectors took 10,500 products and 151,000 vector
     * passes of orthogonalisation, 16 took 8,100 and 117,000, 20 took 7,750 and 131,000 (a
     * product costs about nine passes).
     */
    int basisVectors(long d, int p, int k) {
        long byBudget = BASIS_BYTES / (8L * d);
        long wanted = Math.max(Math.max(minimumBasis, 2L * k + 4), 6L * p);
        long m = Math.max(Math.max(6L * p, k + 2L * p + 2), Math.min(Math.min(MAX_BASIS, wanted), byBudget));
        return (int) Math.min(d, m);
    }

    @Override
    public double[] lowest(AnnealOperator op, int count) {
        return lowestWithVectors(op, count, null).values();
    }

    /**
     * The lowest levels with their eigenvectors, the Krylov basis seeded with start vectors
     * (warm start). Input: start is null or holds vectors of the operator's dimension, such as
     * the eigenvectors of a nearby s (not modified). They only
     * decide where the search begins: every level still has to reach the residual tolerance,
     * and the confirmation run from random vectors that rules out a missed lower level is the
     * same as in a cold solve, so the levels are as accurate as {@link #lowest}'s.
     */
    public Solution lowestWithVectors(AnnealOperator op, int count, double[][] start) {
        checkSize(op.basis(), count);
        int k = Math.min(count, op.dimension());
        // A cluster of near-degenerate levels that a block of p vectors cannot span makes the
        // run stall (no lock for many restarts): start again with a block twice as wide.
        int[] spent = {0};
        for (int p = Math.max(1, Math.min(blockSize, k)); ; p *= 2) {
            boolean last = p >= MAX_BLOCK;
            Solution solution = solve(op, k, p, last ? MAX_RESTARTS : STALL_RESTARTS, last, start, spent);
            if (solution != null) {
                return solution;
            }
        }
    }

    /**
     * Levels ascending and their orthonormal eigenvectors ({@code vectors[i]} belongs to
     * {@code values[i]}), and the number of products H·x the solve took (for measuring). The
     * arrays are the caller's.
     */
    public record Solution(double[] values, double[][] vectors, int products) {
    }

    // The lowest k levels with block size p, or null where no level was locked for stallLimit
    // restarts in a row and the caller may widen the block (when not last).
    private Solution solve(AnnealOperator op, int k, int p, int stallLimit, boolean last, double[][] start,
                           int[] spent) {
        int dim = op.dimension();
        double scale = Math.max(1.0, op.normBound());
        double tol = tolerance * scale;
        double tiny = 1e-14 * scale;
        UniformRandomProvider rng = LegacyStreams.ofSeed(SEED + p);
        int basisMax = basisVectors(dim, p, k);
        int sinceLock = 0;
        double[][] q = new double[basisMax][];
        double[][] t = new double[basisMax][basisMax];
        double[] w = new double[dim];
        List<double[]> locked = new ArrayList<>();
        double[] lockedValues = new double[0];
        double[][] lockedArr = new double[0][];
        int size = 0;
        int done = 0;
        // Whether the basis grew from one random vector alone after the last lock: only then is
        // its lowest converged Ritz value taken as the lowest unlocked level.
        boolean fresh = false;
        int freshSteps = 0;
        if (start != null && start.length > 0) {
            // Warm start: one vector, the sum of the given ones. It lies almost wholly in the
            // wanted eigenspace, and a single start keeps the whole basis for Krylov depth (a
            // block of k start vectors in a basis of 2k + 4 leaves only a few steps per restart).
            double[] v = new double[dim];
            for (int c = 0; c < start.length; c++) {
                if (start[c] == null || start[c].length != dim) {
                    throw new IllegalArgumentException("start vector " + c + " must have length " + dim);
                }
                double norm = Vectors.norm(start[c], dim);
                if (norm > 0) {
                    Vectors.axpy(1.0 / norm, start[c], v, dim);
                }
            }
            double norm = Vectors.norm(v, dim);
            if (norm > 1e-8) {
                Vectors.scale(v, dim, 1.0 / norm);
                q[size++] = v;
            }
        }
        for (int c = size; c < Math.min(p, dim); c++) {
            q[c] = new double[dim];
            newDirection(q[c], rng, lockedArr, q, c, dim);
            size++;
        }
        for (int restart = 0; restart <= MAX_RESTARTS; restart++) {
            int nLocked = locked.size();
            int avail = dim - nLocked;
            int maxSize = Math.min(basisMax, avail);
            int need = nLocked >= k ? 1 : k - nLocked;
            double kth = nLocked >= k ? sortedCopy(lockedValues)[k - 1] : Double.NaN;
            int checkEvery = Math.max(p, 6);
            boolean confirming = nLocked >= k;
            Ritz ritz = null;
            // Expand the basis: apply H to the next unapplied vector, orthogonalise, append.
            while (done < size) {
                boolean grow = size < maxSize;
                if (!grow && size < avail) {
                    break;
                }
                op.apply(q[done], w);
                spent[0]++;
                freshSteps++;
                double[] column = new double[size];
                // The large component along q[done] first, then classical Gram–Schmidt against
                // everything, repeated only where it cancelled much (Daniel, Gragg, Kaufman and
                // Stewart, Math. Comp. 30, 772, 1976: the "twice is enough" test).
                double own = Vectors.dot(q[done], w, dim);
                Vectors.axpy(-own, q[done], w, dim);
                column[done] += own;
                // The components along earlier vectors are known from symmetry, q_j·Hq = q·Hq_j
                // = T[done][j] (the coupling that made q[done]: the previous vector in a plain
                // step, the kept Ritz vectors after a restart): taking them off first leaves the
                // Gram–Schmidt pass only rounding to remove, so its repetition is rarely needed.
                for (int j = 0; j < done; j++) {
                    double known = t[done][j];
                    if (known != 0.0) {
                        Vectors.axpy(-known, q[j], w, dim);
                        column[j] += known;
                    }
                }
                double before = Vectors.norm(w, dim);
                Vectors.projectOut(lockedArr, lockedArr.length, w, dim, null);
                Vectors.projectOut(q, size, w, dim, column);
                double after = Vectors.norm(w, dim);
                if (after < REORTHOGONALISE_BELOW * before) {
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
                        // An invariant subspace: continue with a fresh direction (coupling 0).
                        newDirection(q[size], rng, lockedArr, q, size, dim);
                        t[size][done] = 0.0;
                    }
                    for (int j = 0; j < done; j++) {
                        t[size][j] = 0.0;
                    }
                    size++;
                }
                done++;
                if ((!confirming || fresh) && done >= need && (done % checkEvery == 0 || done == size)) {
                    ritz = Ritz.of(t, done, size);
                    if (ritz.converged(need, tol)) {
                        break;
                    }
                }
            }
            if (ritz == null || ritz.columns != done) {
                ritz = Ritz.of(t, done, size);
            }
            // Nothing unlocked lies below the last wanted level: in a Lanczos run from a random
            // vector orthogonal to the locked ones, the lowest Ritz value has converged at or above
            // it, or (after a whole basis of steps) lies above it by more than its residual.
            if (confirming && fresh && ritz.value[0] >= kth - tol
                    && (ritz.residual[0] <= tol || (freshSteps >= Math.min(basisMax, avail) - 1
                    && ritz.value[0] - ritz.residual[0] >= kth - tol))) {
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
                fresh = false;
            }
            lockedArr = locked.toArray(new double[0][]);
            if (locked.size() >= dim) {
                break;
            }
            sinceLock = accepted > 0 ? 0 : sinceLock + 1;
            if (!last && sinceLock > stallLimit) {
                return null;
            }
            if (restart == MAX_RESTARTS) {
                throw new SolverNotConvergedException("the Lanczos solver did not reach residual " + tol + " in "
                        + MAX_RESTARTS + " restarts (dimension " + dim + ", " + locked.size() + " of " + k
                        + " levels locked)");
            }
            if (locked.size() >= k && !fresh) {
                // Confirm from scratch: a new basis from a block of random vectors orthogonal to
                // the locked ones, so a level missing from every earlier Krylov space (a degenerate
                // partner, or one the restarts passed by) shows up as its lowest Ritz value.
                for (double[] row : t) {
                    Arrays.fill(row, 0.0);
                }
                size = 0;
                for (int c = 0; c < Math.min(p, dim - locked.size()); c++) {
                    q[c] = q[c] == null ? new double[dim] : q[c];
                    newDirection(q[c], rng, lockedArr, q, c, dim);
                    size++;
                }
                done = 0;
                fresh = true;
                freshSteps = 0;
                continue;
            }
            // Thick restart: keep the lowest unconverged Ritz vectors (applied, with T diagonal)
            // and the unapplied vectors that hold their residuals.
            int residualCount = size - done;
            int room = Math.min(basisMax, dim - locked.size()) - residualCount;
            int keep = Math.min(done - accepted, Math.max(need + p, room / 2));
            keep = Math.max(0, Math.min(keep, room - p));
            double[][] coupling = new double[residualCount][keep];
            for (int c = 0; c < keep; c++) {
                double[] sv = ritz.vector(accepted + c);
                for (int i = 0; i < residualCount; i++) {
                    double sum = 0.0;
                    for (int j = 0; j < done; j++) {
                        sum += t[done + i][j] * sv[j];
                    }
                    coupling[i][c] = sum;
                }
            }
            rotateInPlace(q, done, ritz, accepted, keep, dim);
            for (int i = 0; i < residualCount; i++) {
                double[] tmp = q[keep + i];
                q[keep + i] = q[done + i];
                q[done + i] = tmp;
            }
            for (double[] row : t) {
                Arrays.fill(row, 0.0);
            }
            for (int c = 0; c < keep; c++) {
                t[c][c] = ritz.value[accepted + c];
                for (int i = 0; i < residualCount; i++) {
                    t[keep + i][c] = coupling[i][c];
                    t[c][keep + i] = coupling[i][c];
                }
            }
            done = keep;
            size = keep + residualCount;
            if (size == 0) {
                q[0] = q[0] == null ? new double[dim] : q[0];
                newDirection(q[0], rng, lockedArr, q, 0, dim);
                size = 1;
            }
        }
        Integer[] order = new Integer[lockedValues.length];
        for (int i = 0; i < order.length; i++) {
            order[i] = i;
        }
        double[] byValue = lockedValues;
        Arrays.sort(order, (x, y) -> Double.compare(byValue[x], byValue[y]));
        int n = Math.min(k, order.length);
        double[] values = new double[n];
        double[][] vectors = new double[n][];
        for (int i = 0; i < n; i++) {
            values[i] = lockedValues[order[i]];
            vectors[i] = locked.get(order[i]);
        }
        return new Solution(values, vectors, spent[0]);
    }

    // q[c] ← Σ_j S[j][from + c] q[j] for c < keep, row by row in place (q[keep..done) is left as scratch).
    private static void rotateInPlace(double[][] q, int done, Ritz ritz, int from, int keep, int dim) {
        if (keep == 0) {
            return;
        }
        double[][] s = new double[keep][];
        for (int c = 0; c < keep; c++) {
            s[c] = ritz.vector(from + c);
        }
        int chunk = 1 << 12;
        int chunks = (dim + chunk - 1) / chunk;
        java.util.stream.IntStream.range(0, chunks).parallel().forEach(part -> {
            double[] old = new double[done];
            int end = Math.min(dim, (part + 1) * chunk);
            for (int i = part * chunk; i < end; i++) {
                for (int j = 0; j < done; j++) {
                    old[j] = q[j][i];
                }
                for (int c = 0; c < keep; c++) {
                    double sum = 0.0;
                    double[] sc = s[c];
                    for (int j = 0; j < done; j++) {
                        sum += sc[j] * old[j];
                    }
                    q[c][i] = sum;
                }
            }
        });
    }

    // Fills v with a random vector orthonormal to the locked vectors and q[0..count).
    private static void newDirection(double[] v, UniformRandomProvider rng, double[][] locked,
                                     double[][] q, int count, int dim) {
        for (int attempt = 0; attempt < 8; attempt++) {
            for (int i = 0; i < dim; i++) {
                v[i] = rng.nextDouble() - 0.5;
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
