package org.obverse.anneal;

import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.model.BinaryProblem;
import org.obverse.model.IsingProblem;
import org.obverse.random.RandomStreams;
import org.obverse.random.StreamPurpose;
import org.obverse.samples.SampleBlock;

/**
 * The reference sampler: simulated annealing with single-spin Metropolis sweeps, standing in
 * for an imperfect analog machine. It runs the problem as the device would (plus the static
 * control errors of {@link ControlErrors}, plus per-read noise where set), follows the anneal
 * schedule through {@link BetaRange} (a pause is held as extra sweeps at the pause point: an
 * emulation, not a model of quantum dynamics) and reports energies under the problem as
 * submitted.
 *
 * <p>Reproducible: read r (exact kernel) draws its start state, its noise and every
 * Metropolis number from its own generator {@code RandomStreams.generator(seed, READS, r)}; with
 * either multi-spin kernel, 64-read word w uses {@code generator(seed, WORDS, w)}. Work is split
 * into 64-read blocks over the worker threads, so the output never depends on the thread
 * count. Reads start from uniformly random spins.
 *
 * <p>The exact kernel runs problems with small integer fields and couplings (and no per-read
 * noise) in integer arithmetic without a branch on the decision, drawing on the generator's
 * bare state, four reads of a block swept together
 * ({@link MetropolisKernels#sweepIntegerFour}); other problems without per-read
 * noise on signed fields and the bare state ({@link MetropolisKernels#sweepSigned}): the same
 * decisions from the same random numbers, so the same reads, in less time. The multi-spin kernel sweeps its
 * blocks four at a time or as vector lanes ({@link MultiSpinCoding#sweepLanes}), again with
 * each block's own draws in their own order; the steady multi-spin kernel
 * ({@link SteadyMultiSpin}) sweeps its blocks as lanes, with its own per-block draw rule.
 *
 * <p>Cost: sweeps × (spins + 2 × couplers) per read; the exact kernel keeps one copy of the
 * problem's arrays per thread (spins and local fields four times over for integer problems).
 *
 * <p>Settings that choose the path-integral method ({@link SamplerSettings#withPathIntegral})
 * are run by {@link PathIntegralSampler} instead, so callers pass settings through and never
 * pick the class themselves.
 */
public final class ReferenceSampler {
    private final SamplerSettings settings;

    private ReferenceSampler(SamplerSettings settings) {
        this.settings = settings;
    }

    /** A sampler with these settings. */
    public static ReferenceSampler of(SamplerSettings settings) {
        if (settings == null) {
            throw new IllegalArgumentException("settings must not be null");
        }
        return new ReferenceSampler(settings);
    }

    /** A sampler with the defaults. */
    public static ReferenceSampler withDefaults() {
        return of(SamplerSettings.defaults());
    }

    public SamplerSettings settings() {
        return settings;
    }

    /**
     * Samples a binary problem through its spin form; set bits are x = 1 and the energies are
     * the binary problem's own.
     */
    public SampledReads sample(BinaryProblem problem, int reads, long seed) {
        return asBinary(problem, sample(problem.toIsing(), reads, seed));
    }

    /** Reads of a binary problem's spin form as reads of the binary problem, with its own energies. */
    static SampledReads asBinary(BinaryProblem problem, SampledReads spin) {
        int reads = spin.reads();
        double[] energies = new double[reads];
        byte[] row = new byte[problem.size()];
        SampleBlock block = spin.samples();
        for (int r = 0; r < reads; r++) {
            for (int k = 0; k < row.length; k++) {
                row[k] = (byte) ((block.spin(r, k) + 1) >> 1);
            }
            energies[r] = problem.energy(row);
        }
        return new SampledReads(spin.variables(), block, energies, spin.sweeps(), spin.runTimeMicros());
    }

    /**
     * Samples a spin problem: reads ≥ 0 reads from the seed. Where the settings choose the
     * path-integral method, the {@link PathIntegralSampler} runs the reads.
     *
     * @throws IllegalArgumentException for a negative read count, or a problem the chosen
     *                                  kernel cannot run (the message says why)
     */
    public SampledReads sample(IsingProblem problem, int reads, long seed) {
        if (settings.method() == SamplerSettings.Method.PATH_INTEGRAL) {
            return PathIntegralSampler.of(settings).sample(problem, reads, seed);
        }
        if (reads < 0) {
            throw new IllegalArgumentException("reads " + reads + " must be >= 0");
        }
        double hot = settings.betaHot();
        double cold = settings.betaCold();
        if (settings.automaticBeta()) {
            double[] range = BetaRange.automatic(problem);
            hot = range[0];
            cold = range[1];
        }
        double[] betas = BetaRange.perSweep(settings, hot, cold);
        SampleBlock block = SampleBlock.allDown(reads, problem.size());
        double[] energies = new double[reads];
        IsingProblem device = settings.errors().applyStatic(problem);
        BlockWork.Task task;
        if (settings.kernel() != SamplerSettings.Kernel.EXACT && !settings.errors().isNone()) {
            throw new IllegalArgumentException("the multi-spin kernel runs without control errors; "
                    + "use the exact kernel to sample with errors");
        }
        if (settings.kernel() == SamplerSettings.Kernel.MULTI_SPIN) {
            MultiSpinCoding coding = MultiSpinCoding.of(problem);
            task = new MultiSpinTask(problem, coding, betas, block, energies, seed, settings.threads());
        } else if (settings.kernel() == SamplerSettings.Kernel.MULTI_SPIN_STEADY) {
            task = new SteadyTask(problem, SteadyMultiSpin.of(problem), betas, block, energies, seed,
                    settings.threads());
        } else {
            task = new ExactTask(problem, device, settings.errors(), betas, block, energies, seed);
        }
        BlockWork.run(task, task.units(block.blockCount()), settings.threads());
        return new SampledReads(problem.variables(), block, energies, betas.length, settings.schedule().runTimeMicros());
    }

    /** The exact kernel: one read at a time, or four at once on integer problems. */
    private static final class ExactTask extends ReadByRead<ExactTask.Workspace> {
        /** Largest local field the integer kernel takes (its threshold table has one entry per value). */
        private static final int INTEGER_FIELD_LIMIT = 1 << 12; // within MetropolisKernels.FOUR_FIELD_LIMIT

        private final double[] betas;
        // Where every field and coupling is a small integer and there is no per-read noise:
        // the integer kernel (same decisions, integer arithmetic), else null.
        private final int[] intCoupling;
        private final int[] intFields;
        private final int fieldBound;
        // The padded layout (stride degree) where padding costs at most twice the compressed
        // rows, else degree 0 and nulls; its couplings as integers or as doubles.
        private final int degree;
        private final int[] paddedNeighbour;
        private final int[] paddedCoupling;
        // The same terms interleaved for the four-read kernel (padded where degree > 0).
        private final int[] fourTerms;

        ExactTask(IsingProblem nominal, IsingProblem device, ControlErrors errors, double[] betas, SampleBlock block,
                  double[] energies, long seed) {
            super(nominal, device, errors, block, energies, seed);
            this.betas = betas;
            this.fieldBound = integerFieldBound(INTEGER_FIELD_LIMIT);
            this.intCoupling = fieldBound >= 0 ? integerCouplings() : null;
            this.intFields = fieldBound >= 0 ? integerFields() : null;
            int d = MetropolisKernels.maxDegree(n, start);
            if (intCoupling != null && d > 0 && (long) n * d <= 2L * neighbour.length) {
                degree = d;
                paddedNeighbour = MetropolisKernels.padded(n, start, neighbour, d, true);
                paddedCoupling = MetropolisKernels.padded(n, start, intCoupling, d, false);
            } else {
                degree = 0;
                paddedNeighbour = null;
                paddedCoupling = null;
            }
            fourTerms = intCoupling == null ? null : degree > 0
                    ? MetropolisKernels.interleavedTerms(paddedNeighbour, paddedCoupling)
                    : MetropolisKernels.interleavedTerms(neighbour, intCoupling);
        }

        private static final class Workspace {
            final byte[] spins;
            final double[] localField;
            final double[] spinValue;
            final ReadTerms terms;
            final int[] intLocalField;
            final long[] thresholds;
            // Four reads at once (integer kernel): spins interleaved, packed fields, states.
            final byte[] spins4;
            final long[] packedField;
            final long[] states4 = new long[2 * MetropolisKernels.FOUR];

            Workspace(ExactTask task) {
                boolean integer = task.fieldBound >= 0;
                intLocalField = integer ? new int[task.n] : null;
                thresholds = integer ? new long[task.fieldBound + 1] : null;
                spins4 = integer ? new byte[MetropolisKernels.FOUR * task.n] : null;
                packedField = integer ? new long[task.n] : null;
                spins = new byte[task.n];
                localField = new double[task.n];
                spinValue = integer ? null : new double[task.n];
                terms = new ReadTerms(task);
            }
        }

        @Override
        public Workspace workspace() {
            return new Workspace(this);
        }

        /** Integer problems: reads in fours, each four swept together; a last one to three alone. */
        @Override
        void reads(int first, int last, Workspace ws) {
            if (intCoupling == null) {
                super.reads(first, last, ws);
                return;
            }
            int r = first;
            for (; r + MetropolisKernels.FOUR <= last; r += MetropolisKernels.FOUR) {
                readIntegerFour(r, ws);
            }
            for (; r < last; r++) {
                readInteger(r, ws);
            }
        }

        @Override
        void read(int r, Workspace ws) {
            if (intCoupling != null) {
                readInteger(r, ws);
                return;
            }
            if (!errors.hasReadNoise()) {
                readSigned(r, ws);
                return;
            }
            UniformRandomProvider rng = RandomStreams.generator(seed, StreamPurpose.READS, r);
            byte[] s = ws.spins;
            randomSpins(s, rng);
            // Per-read noise: the double kernel on the generator, which drew the noise too.
            ReadTerms t = termsOf(rng, ws.terms);
            MetropolisKernels.localFields(n, start, neighbour, t.csr, t.fields, s, ws.localField);
            for (double beta : betas) {
                MetropolisKernels.sweep(n, start, neighbour, t.csr, s, ws.localField, beta, rng);
            }
            finish(r, s);
        }

        /**
         * A read of a problem whose fields or couplings are not small integers, without per-read
         * noise: signed fields on the generator's bare state ({@link MetropolisKernels#sweepSigned}),
         * the same draws and decisions as {@link MetropolisKernels#sweep} with the generator. (A
         * branch-free form measured slower here: on Gaussian couplings few moves are taken, so
         * the branch is well predicted and skipping the updates pays.)
         */
        private void readSigned(int r, Workspace ws) {
            long[] state = RandomStreams.state(seed, StreamPurpose.READS, r);
            byte[] s = ws.spins;
            randomSpins(s, state);
            MetropolisKernels.localFields(n, start, neighbour, csrCoupling, fields, s, ws.localField);
            MetropolisKernels.signedFields(n, s, ws.spinValue, ws.localField);
            for (double beta : betas) {
                MetropolisKernels.sweepSigned(n, start, neighbour, csrCoupling, ws.spinValue, ws.localField, beta, state);
            }
            for (int k = 0; k < n; k++) {
                s[k] = (byte) ws.spinValue[k];
            }
            finish(r, s);
        }

        /**
         * Reads r … r + 3 of an integer problem, swept together
         * ({@link MetropolisKernels#sweepIntegerFour}): each from its own generator state, so
         * each the same as {@link #readInteger} alone.
         */
        private void readIntegerFour(int r, Workspace ws) {
            int four = MetropolisKernels.FOUR;
            byte[] s = ws.spins;
            byte[] s4 = ws.spins4;
            long[] states = ws.states4;
            for (int i = 0; i < four; i++) {
                long[] state = RandomStreams.state(seed, StreamPurpose.READS, r + i);
                randomSpins(s, state);
                for (int k = 0; k < n; k++) {
                    s4[four * k + i] = s[k];
                }
                states[2 * i] = state[0];
                states[2 * i + 1] = state[1];
            }
            MetropolisKernels.packedLocalFields(n, start, neighbour, intCoupling, intFields, s4, ws.packedField);
            for (double beta : betas) {
                MetropolisKernels.integerThresholds(beta, ws.thresholds);
                MetropolisKernels.sweepIntegerFour(n, degree, start, fourTerms, s4, ws.packedField, states,
                        ws.thresholds);
            }
            for (int i = 0; i < four; i++) {
                for (int k = 0; k < n; k++) {
                    s[k] = s4[four * k + i];
                }
                finish(r + i, s);
            }
        }

        /**
         * A read of an integer problem: the branch-free integer kernel on the generator's bare
         * state ({@link MetropolisKernels#sweepIntegerBranchFree}), the same draws and
         * decisions as {@link MetropolisKernels#sweepExactExponential} with the generator.
         */
        private void readInteger(int r, Workspace ws) {
            long[] state = RandomStreams.state(seed, StreamPurpose.READS, r);
            byte[] s = ws.spins;
            randomSpins(s, state);
            int[] rowNeighbour = degree > 0 ? paddedNeighbour : neighbour;
            int[] rowCoupling = degree > 0 ? paddedCoupling : intCoupling;
            MetropolisKernels.localFields(n, start, neighbour, intCoupling, intFields, s, ws.intLocalField);
            for (double beta : betas) {
                MetropolisKernels.integerThresholds(beta, ws.thresholds);
                MetropolisKernels.sweepIntegerBranchFree(n, degree, start, rowNeighbour, rowCoupling, s,
                        ws.intLocalField, ws.thresholds, state);
            }
            finish(r, s);
        }
    }

    /**
     * The multi-spin kernel: 64 reads a word (a block), blocks grouped into units. Where each
     * thread gets at least {@link #MIN_LANES} blocks, a unit is up to {@link #MAX_LANES} blocks
     * swept together as lanes ({@link MultiSpinCoding#sweepLanes}, vectorised); otherwise four
     * ({@link MultiSpinCoding#sweep4}). Every block draws from its own generator in the same
     * order either way, so the grouping never changes a bit of the output.
     */
    private static final class MultiSpinTask implements BlockWork.Task {
        /** Lanes per unit at most: 8,192 reads (measured: 128 lanes sweep faster than 64, the loop ends cost less). */
        static final int MAX_LANES = 128;
        /** Fewest lanes worth the lane kernel (its loops need this many to use vector instructions). */
        static final int MIN_LANES = 16;

        private final IsingProblem nominal;
        private final MultiSpinCoding coding;
        private final double[] betas;
        private final SampleBlock block;
        private final double[] energies;
        private final long seed;
        private final int lanes;

        MultiSpinTask(IsingProblem nominal, MultiSpinCoding coding, double[] betas, SampleBlock block,
                      double[] energies, long seed, int threads) {
            this.nominal = nominal;
            this.coding = coding;
            this.betas = betas;
            this.block = block;
            this.energies = energies;
            this.seed = seed;
            int perThread = (block.blockCount() + threads - 1) / Math.max(1, threads);
            int l = Math.min(MAX_LANES, perThread);
            this.lanes = l >= MIN_LANES ? l : 4;
        }

        private static final class Workspace {
            final long[][] bits;
            final long[] thresholds = new long[MultiSpinCoding.thresholdLength()];
            // The four blocks' generator states, block i at [2i, 2i + 1].
            final long[] states = new long[8];
            final byte[] row;
            final long[] laneBits;
            final MultiSpinCoding.Lanes lanes;

            Workspace(int n, int lanes) {
                bits = lanes == 4 ? new long[4][n] : null;
                laneBits = lanes == 4 ? null : new long[n * lanes];
                this.lanes = lanes == 4 ? null : new MultiSpinCoding.Lanes(lanes);
                row = new byte[n];
            }
        }

        @Override
        public Object workspace() {
            return new Workspace(coding.size(), lanes);
        }

        @Override
        public int units(int blocks) {
            return (blocks + lanes - 1) / lanes;
        }

        @Override
        public void block(int unit, Object workspace) {
            Workspace ws = (Workspace) workspace;
            int first = unit * lanes;
            int count = Math.min(lanes, block.blockCount() - first);
            if (ws.lanes != null && count == lanes) {
                sweepLanes(first, ws);
                return;
            }
            int n = coding.size();
            // Four blocks at a time (a last short unit of the lane kernel too, in fours).
            for (int from = first; from < first + count; from += 4) {
                int c = Math.min(4, first + count - from);
                long[][] bits = ws.bits != null ? ws.bits : new long[4][n];
                long[][] state = new long[c][];
                for (int i = 0; i < c; i++) {
                    state[i] = RandomStreams.state(seed, StreamPurpose.WORDS, from + i);
                    for (int k = 0; k < n; k++) {
                        bits[i][k] = XoroshiroState.next(state[i]);
                    }
                    ws.states[2 * i] = state[i][0];
                    ws.states[2 * i + 1] = state[i][1];
                }
                for (double beta : betas) {
                    coding.thresholds(beta, ws.thresholds);
                    if (c == 4) {
                        coding.sweep4(bits[0], bits[1], bits[2], bits[3], ws.thresholds, ws.states);
                    } else {
                        for (int i = 0; i < c; i++) {
                            coding.sweep(bits[i], ws.thresholds, state[i]);
                        }
                    }
                }
                for (int i = 0; i < c; i++) {
                    finishBlock(from + i, bits[i], 1, 0, ws.row);
                }
            }
        }

        private void sweepLanes(int first, Workspace ws) {
            int n = coding.size();
            int m = lanes;
            long[] bits = ws.laneBits;
            seedLanes(seed, first, m, n, bits, ws.lanes);
            for (double beta : betas) {
                coding.thresholds(beta, ws.thresholds);
                coding.sweepLanes(bits, ws.thresholds, ws.lanes);
            }
            for (int i = 0; i < m; i++) {
                finishBlock(first + i, bits, m, i, ws.row);
            }
        }

        private void finishBlock(int b, long[] bits, int stride, int lane, byte[] row) {
            ReferenceSampler.finishBlock(block, nominal, energies, coding.size(), b, bits, stride, lane, row);
        }
    }

    /**
     * The steady multi-spin kernel ({@link SteadyMultiSpin}): blocks in units of up to
     * {@link #MAX_LANES} lanes. Its draw rule is per block, so the grouping (which depends on
     * the thread count) never changes a bit of the output.
     */
    private static final class SteadyTask implements BlockWork.Task {
        /** Lanes per unit at most: 8,192 reads. */
        static final int MAX_LANES = 128;

        private final IsingProblem nominal;
        private final SteadyMultiSpin kernel;
        private final double[] betas;
        private final SampleBlock block;
        private final double[] energies;
        private final long seed;
        private final int lanes;

        SteadyTask(IsingProblem nominal, SteadyMultiSpin kernel, double[] betas, SampleBlock block, double[] energies,
                   long seed, int threads) {
            this.nominal = nominal;
            this.kernel = kernel;
            this.betas = betas;
            this.block = block;
            this.energies = energies;
            this.seed = seed;
            int perThread = (block.blockCount() + threads - 1) / Math.max(1, threads);
            this.lanes = Math.max(1, Math.min(MAX_LANES, perThread));
        }

        private static final class Workspace {
            final long[] thresholds = new long[MultiSpinCoding.thresholdLength()];
            final byte[] row;
            final long[] bits;
            final MultiSpinCoding.Lanes lanes;

            Workspace(int n, int lanes) {
                bits = new long[n * lanes];
                this.lanes = new MultiSpinCoding.Lanes(lanes);
                row = new byte[n];
            }
        }

        @Override
        public Object workspace() {
            return new Workspace(kernel.size(), lanes);
        }

        @Override
        public int units(int blocks) {
            return (blocks + lanes - 1) / lanes;
        }

        @Override
        public void block(int unit, Object workspace) {
            Workspace ws = (Workspace) workspace;
            int first = unit * lanes;
            int m = Math.min(lanes, block.blockCount() - first);
            int n = kernel.size();
            // A last short unit gets working arrays of its own size.
            long[] bits = m == lanes ? ws.bits : new long[n * m];
            MultiSpinCoding.Lanes state = m == lanes ? ws.lanes : new MultiSpinCoding.Lanes(m);
            seedLanes(seed, first, m, n, bits, state);
            for (double beta : betas) {
                kernel.thresholds(beta, ws.thresholds);
                kernel.sweepLanes(bits, ws.thresholds, state);
            }
            for (int i = 0; i < m; i++) {
                finishBlock(block, nominal, energies, n, first + i, bits, m, i, ws.row);
            }
        }
    }

    /**
     * The 64-read blocks first … first+m−1 seeded as lanes, each from its own stream
     * {@code generator(seed, WORDS, block)}: its random start words into {@code bits} (spin k
     * of lane i at k·m + i), then its generator state into {@code lanes}.
     */
    private static void seedLanes(long seed, int first, int m, int n, long[] bits, MultiSpinCoding.Lanes lanes) {
        for (int i = 0; i < m; i++) {
            long[] s = RandomStreams.state(seed, StreamPurpose.WORDS, first + i);
            for (int k = 0; k < n; k++) {
                bits[k * m + i] = XoroshiroState.next(s);
            }
            lanes.setState(i, s[0], s[1]);
        }
    }

    /** Block b's words from {@code bits} (spin k at k·stride + lane) into the output, and its nominal energies. */
    private static void finishBlock(SampleBlock block, IsingProblem nominal, double[] energies, int n, int b,
                                    long[] bits, int stride, int lane, byte[] row) {
        long mask = block.validMask(b);
        long[] words = block.words();
        for (int k = 0; k < n; k++) {
            words[b * n + k] = bits[k * stride + lane] & mask;
        }
        int first = b << 6;
        int last = Math.min(block.reads(), first + 64);
        for (int r = first; r < last; r++) {
            block.unpackRows(r, 1, row);
            energies[r] = nominal.energy(row);
        }
    }
}
