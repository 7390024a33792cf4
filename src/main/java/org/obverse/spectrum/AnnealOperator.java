package org.obverse.spectrum;

import java.util.stream.IntStream;

/**
 * H(s) = -(A/2) Σ_k σˣ_k + (B/2) H_P(σᶻ) on a {@link SectorBasis}, for fixed weights A and B,
 * applied without storing a matrix: σˣ_k acts by the bit flip b → b ^ mask(k), H_P is the
 * precomputed diagonal. Immutable; {@link #apply} allocates nothing.
 *
 * <p>Cost of one product: 2^m · (n + 1) reads; split over both cores in fixed chunks above
 * {@link #PARALLEL_THRESHOLD} states (each chunk writes its own range and sums in a fixed
 * order, so the result does not depend on the thread count).
 */
public final class AnnealOperator {
    /** Sector dimension from which a product is split over threads. */
    public static final int PARALLEL_THRESHOLD = 1 << 15;
    private static final int CHUNK = 1 << 13;
    private static final int BLOCK = 64;

    private final SectorBasis basis;
    private final double driver;
    private final double problem;
    private final int[] masks;
    private final double[] energies;

    private AnnealOperator(SectorBasis basis, double a, double b) {
        this.basis = basis;
        this.driver = -0.5 * a;
        this.problem = 0.5 * b;
        this.masks = basis.flipMasks();
        this.energies = basis.problemEnergiesView();
    }

    /** The operator for weights A ≥ 0 and B ≥ 0 (finite). */
    public static AnnealOperator of(SectorBasis basis, double a, double b) {
        if (!(a >= 0) || !(b >= 0) || !Double.isFinite(a) || !Double.isFinite(b)) {
            throw new IllegalArgumentException("schedule weights A = " + a + ", B = " + b
                    + " must be finite and >= 0");
        }
        return new AnnealOperator(basis, a, b);
    }

    /** The sector it acts on. */
    public SectorBasis basis() {
        return basis;
    }

    /** Dimension of the sector. */
    public int dimension() {
        return energies.length;
    }

    /** The coefficient of Σσˣ, −A/2. */
    public double driverCoefficient() {
        return driver;
    }

    /** The coefficient of H_P, B/2. */
    public double problemCoefficient() {
        return problem;
    }

    /** Diagonal element b: (B/2) H_P(b). */
    public double diagonal(int b) {
        return problem * energies[b];
    }

    /**
     * y = H x. Input x (length dimension, not modified); Output y (length dimension,
     * overwritten; must not be x).
     */
    public void apply(double[] x, double[] y) {
        int dim = energies.length;
        if (dim < PARALLEL_THRESHOLD) {
            applyRange(x, y, 0, dim);
            return;
        }
        int chunks = (dim + CHUNK - 1) / CHUNK;
        IntStream.range(0, chunks).parallel().forEach(q -> applyRange(x, y, q * CHUNK, Math.min(dim, (q + 1) * CHUNK)));
    }

    /** y = H x on the calling thread only (for benchmarks and for callers that run their own threads). */
    public void applySingleThreaded(double[] x, double[] y) {
        applyRange(x, y, 0, energies.length);
    }

    private void applyRange(double[] x, double[] y, int from, int to) {
        if (from % BLOCK != 0 || to - from < BLOCK) {
            applyPlain(x, y, from, to);
            return;
        }
        // Aligned blocks of BLOCK states: a mask's high part moves the whole block to another
        // contiguous block (a loop the compiler vectorises), its low part permutes within it.
        final int[] m = masks;
        final double[] e = energies;
        final double c = driver;
        final double d = problem;
        final int low = BLOCK - 1;
        double[] acc = new double[BLOCK];
        int end = from + ((to - from) / BLOCK) * BLOCK;
        for (int base = from; base < end; base += BLOCK) {
            for (int j = 0; j < BLOCK; j++) {
                acc[j] = 0.0;
            }
            for (int k = 0; k < m.length; k++) {
                int source = base ^ (m[k] & ~low);
                int perm = m[k] & low;
                if (perm == 0) {
                    for (int j = 0; j < BLOCK; j++) {
                        acc[j] += x[source + j];
                    }
                } else {
                    for (int j = 0; j < BLOCK; j++) {
                        acc[j] += x[source + (j ^ perm)];
                    }
                }
            }
            for (int j = 0; j < BLOCK; j++) {
                int b = base + j;
                y[b] = d * e[b] * x[b] + c * acc[j];
            }
        }
        applyPlain(x, y, end, to);
    }

    // One state at a time (sectors smaller than a block, and any tail).
    private void applyPlain(double[] x, double[] y, int from, int to) {
        final int[] m = masks;
        final double[] e = energies;
        final double c = driver;
        final double d = problem;
        for (int b = from; b < to; b++) {
            double flips = 0.0;
            for (int k = 0; k < m.length; k++) {
                flips += x[b ^ m[k]];
            }
            y[b] = d * e[b] * x[b] + c * flips;
        }
    }

    /** Rough bound on the spectral radius: |B/2|·max|H_P| + n·|A/2|. */
    public double normBound() {
        double max = 0.0;
        for (double v : energies) {
            max = Math.max(max, Math.abs(v));
        }
        return Math.abs(problem) * max + masks.length * Math.abs(driver);
    }
}
