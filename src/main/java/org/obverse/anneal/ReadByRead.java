package org.obverse.anneal;

import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.model.IsingProblem;
import org.obverse.samples.SampleBlock;

/**
 * What the single-read samplers (simulated annealing's exact kernel and the path-integral
 * sampler) share: the device problem in compressed rows (couplings per row entry, and as
 * integers where the integer kernels run), random start spins, per-read noise on a copy, and
 * the walk over one 64-read block that writes each read's spins and nominal energy.
 * Subclasses say how one read runs with a thread's workspace W; its output depends only on its
 * index.
 */
abstract class ReadByRead<W> implements BlockWork.Task {
    final IsingProblem nominal;
    final ControlErrors errors;
    final SampleBlock block;
    final double[] energies;
    final long seed;
    final int n;
    final int[] start;
    final int[] neighbour;
    final int[] edgeOf;
    final double[] fields;
    final double[] couplings;
    /** Coupling of each row entry: {@code csrCoupling[q] = couplings[edgeOf[q]]}. */
    final double[] csrCoupling;

    ReadByRead(IsingProblem nominal, IsingProblem device, ControlErrors errors, SampleBlock block, double[] energies,
               long seed) {
        this.nominal = nominal;
        this.errors = errors;
        this.block = block;
        this.energies = energies;
        this.seed = seed;
        this.n = device.size();
        this.start = device.adjacencyStarts();
        this.neighbour = device.adjacencyVariables();
        this.edgeOf = device.adjacencyEdges();
        this.fields = device.fields();
        this.couplings = device.couplings();
        this.csrCoupling = new double[neighbour.length];
        for (int q = 0; q < neighbour.length; q++) {
            csrCoupling[q] = couplings[edgeOf[q]];
        }
    }

    /**
     * The largest |local field| of the device problem where every field and coupling is an
     * integer, there is no per-read noise and that bound is at most limit; else −1 (the integer
     * kernels do not apply).
     */
    final int integerFieldBound(int limit) {
        return errors.hasReadNoise() ? -1
                : MetropolisKernels.integerFieldBound(n, start, csrCoupling, fields, limit);
    }

    /** The row-entry couplings as integers (call only where {@link #integerFieldBound} ≥ 0). */
    final int[] integerCouplings() {
        int[] out = new int[csrCoupling.length];
        for (int q = 0; q < csrCoupling.length; q++) {
            out[q] = (int) csrCoupling[q];
        }
        return out;
    }

    /** The fields as integers (call only where {@link #integerFieldBound} ≥ 0). */
    final int[] integerFields() {
        int[] out = new int[n];
        for (int k = 0; k < n; k++) {
            out[k] = (int) fields[k];
        }
        return out;
    }

    /**
     * The terms one read runs on, in a thread's workspace: after {@link #termsOf} they are the
     * device terms themselves or, with per-read noise, this thread's noisy copy of them.
     */
    static final class ReadTerms {
        /** Fields of the read (do not modify). */
        double[] fields;
        /** Row-entry couplings of the read (do not modify). */
        double[] csr;
        private final double[] noisyFields;
        private final double[] noisyCouplings;
        private final double[] noisyCsr;

        ReadTerms(ReadByRead<?> rows) {
            noisyFields = new double[rows.n];
            noisyCouplings = new double[rows.couplings.length];
            noisyCsr = new double[rows.neighbour.length];
        }
    }

    /**
     * The terms of the read that draws from rng, into {@code out}: the device terms, or with
     * per-read noise the device terms plus noise drawn from rng.
     */
    final ReadTerms termsOf(UniformRandomProvider rng, ReadTerms out) {
        if (!errors.hasReadNoise()) {
            out.fields = fields;
            out.csr = csrCoupling;
            return out;
        }
        System.arraycopy(fields, 0, out.noisyFields, 0, n);
        System.arraycopy(couplings, 0, out.noisyCouplings, 0, couplings.length);
        errors.addReadNoise(rng, out.noisyFields, out.noisyCouplings);
        for (int q = 0; q < out.noisyCsr.length; q++) {
            out.noisyCsr[q] = out.noisyCouplings[edgeOf[q]];
        }
        out.fields = out.noisyFields;
        out.csr = out.noisyCsr;
        return out;
    }

    /** Uniformly random ±1 spins, 64 from each word of rng (spin i from bit i mod 64). */
    static void randomSpins(byte[] s, UniformRandomProvider rng) {
        for (int k = 0; k < s.length; k += 64) {
            unpackWord(rng.nextLong(), s, k);
        }
    }

    /** As {@link #randomSpins(byte[], UniformRandomProvider)} from a bare generator state (the same words). */
    static void randomSpins(byte[] s, long[] state) {
        for (int k = 0; k < s.length; k += 64) {
            unpackWord(XoroshiroState.next(state), s, k);
        }
    }

    private static void unpackWord(long bits, byte[] s, int k) {
        for (int i = k; i < Math.min(s.length, k + 64); i++) {
            s[i] = (byte) ((((bits >>> (i - k)) & 1L) << 1) - 1);
        }
    }

    /** A new workspace for one thread. */
    @Override
    public abstract W workspace();

    @Override
    @SuppressWarnings("unchecked") // the workspace came from this task's own workspace()
    public final void block(int b, Object workspace) {
        W ws = (W) workspace;
        int first = b << 6;
        int last = Math.min(block.reads(), first + 64);
        reads(first, last, ws);
    }

    /** Runs reads first … last − 1 with this thread's workspace: one at a time unless a subclass groups them. */
    void reads(int first, int last, W ws) {
        for (int r = first; r < last; r++) {
            read(r, ws);
        }
    }

    /** Runs read r with this thread's workspace and ends with {@link #finish}. */
    abstract void read(int r, W ws);

    /** Writes read r's spins (first n of s) and its energy under the problem as submitted. */
    final void finish(int r, byte[] s) {
        // Each block is written by one thread only, so these bit writes never race.
        for (int k = 0; k < n; k++) {
            block.setSpin(r, k, s[k]);
        }
        energies[r] = nominal.energy(s);
    }
}
