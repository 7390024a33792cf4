package org.obverse.anneal;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.model.BinaryProblem;
import org.obverse.model.IsingProblem;
import org.obverse.random.RandomStreams;
import org.obverse.random.StreamPurpose;
import org.obverse.samples.SampleBlock;

/**
 * Simulated quantum annealing: path-integral Monte Carlo of the anneal Hamiltonian
 * H(s) = −(A(s)/2) Σ σˣ_i + (B(s)/2) H_P (the convention of {@code spectrum}) at a fixed
 * temperature T, with P Trotter slices (Santoro, Martoňák, Tosatti &amp; Car, Science 295,
 * 2427, 2002; Martoňák, Santoro &amp; Tosatti, Phys. Rev. B 66, 094203, 2002). s follows the
 * anneal schedule through {@link #sweepFractions}; each sweep is P·n slice moves and n line
 * moves ({@link PathIntegralKernels}). Where the run holds still at s for long enough, the z
 * configuration of any one slice is distributed as the diagonal of the Trotter approximant of
 * e^{−H(s)/T}/Z, which differs from the exact thermal state's by O(1/P²).
 *
 * <p>Read r draws everything (the start of every slice-spin, per-read noise, the Metropolis
 * numbers, and last the slice it reports) from its own generator
 * {@code RandomStreams.generator(seed, PATH_INTEGRAL_READS, r)}; reads are split over threads
 * in 64-read blocks, so the output never depends on the thread count. Reads start from
 * uniformly random slice-spins. Static control errors and per-read noise act on H_P as in
 * simulated annealing; energies are those of the problem as submitted, by
 * {@link IsingProblem#energy}.
 *
 * <p>A problem with small integer fields and couplings (and no per-read noise) runs the integer
 * kernel, with one shared table of slice-move thresholds per distinct s of the run: the same
 * reads as the double kernel, in less time.
 *
 * <p>Cost: sweeps × P × (n + 2·couplers) per read, plus the line moves; P·n spins and local
 * fields per thread.
 */
public final class PathIntegralSampler {
    /** Most threshold-table entries (over all distinct s of a run) the integer kernel keeps. */
    static final long TABLE_ENTRY_LIMIT = 1L << 21;
    /** Largest local field the integer kernel takes. */
    static final int INTEGER_FIELD_LIMIT = 1 << 12;
    /** A segment's sweep count is rounded down after adding this much (absorbs rounding of d·rate). */
    static final double SWEEP_ROUNDING = 1e-6;

    private final SamplerSettings settings;
    private final PathIntegralSettings quantum;
    private final boolean integerAllowed;

    private PathIntegralSampler(SamplerSettings settings, boolean integerAllowed) {
        this.settings = settings;
        this.quantum = settings.pathIntegral();
        this.integerAllowed = integerAllowed;
    }

    /**
     * The sampler for these settings.
     *
     * @throws IllegalArgumentException where the settings do not choose the path-integral
     *                                  method, or choose the multi-spin kernel
     */
    public static PathIntegralSampler of(SamplerSettings settings) {
        return of(settings, true);
    }

    /** As {@link #of(SamplerSettings)}; integerAllowed = false keeps every problem on the double kernel (tests). */
    static PathIntegralSampler of(SamplerSettings settings, boolean integerAllowed) {
        if (settings == null || settings.pathIntegral() == null) {
            throw new IllegalArgumentException("the settings do not choose the path-integral method");
        }
        if (settings.kernel() != SamplerSettings.Kernel.EXACT) {
            throw new IllegalArgumentException("the multi-spin kernel runs simulated annealing only; the path-integral"
                    + " sampler has its own kernel");
        }
        return new PathIntegralSampler(settings, integerAllowed);
    }

    public SamplerSettings settings() {
        return settings;
    }

    /**
     * The anneal fraction s of every sweep of a run. Each segment of the schedule (from one
     * point to the next, duration d µs) takes m = ⌊d·rate + 10⁻⁶⌋ sweeps, sweep j at the
     * midpoint of the j-th of m equal parts: s = s_a + (j + ½)/m·(s_b − s_a). A segment shorter
     * than one sweep takes none, so a quench within one sweep after a pause leaves the state
     * reached at the pause (the pause-and-quench read-out).
     *
     * @param rate sweeps per µs
     * @throws IllegalArgumentException where no segment is as long as one sweep
     */
    public static double[] sweepFractions(AnnealSchedule schedule, double rate) {
        List<double[]> parts = new ArrayList<>();
        int total = 0;
        for (int j = 0; j + 1 < schedule.pointCount(); j++) {
            double d = schedule.time(j + 1) - schedule.time(j);
            double m = Math.floor(d * rate + SWEEP_ROUNDING);
            if (m > Integer.MAX_VALUE - total) {
                throw new IllegalArgumentException("the schedule asks for more than " + Integer.MAX_VALUE + " sweeps");
            }
            double from = schedule.fraction(j);
            double to = schedule.fraction(j + 1);
            double[] s = new double[(int) m];
            for (int k = 0; k < s.length; k++) {
                s[k] = from == to ? from : from + (k + 0.5) / m * (to - from);
            }
            parts.add(s);
            total += s.length;
        }
        if (total == 0) {
            throw new IllegalArgumentException("every segment of the schedule is shorter than one sweep at " + rate
                    + " sweeps per microsecond, so the path-integral sampler would make no sweep; raise the sweep rate");
        }
        double[] all = new double[total];
        int at = 0;
        for (double[] s : parts) {
            System.arraycopy(s, 0, all, at, s.length);
            at += s.length;
        }
        return all;
    }

    /**
     * Samples a binary problem through its spin form; set bits are x = 1 and the energies are
     * the binary problem's own.
     */
    public SampledReads sample(BinaryProblem problem, int reads, long seed) {
        return ReferenceSampler.asBinary(problem, sample(problem.toIsing(), reads, seed));
    }

    /**
     * Samples a spin problem: reads ≥ 0 reads from the seed.
     *
     * @throws IllegalArgumentException for a negative read count
     */
    public SampledReads sample(IsingProblem problem, int reads, long seed) {
        if (reads < 0) {
            throw new IllegalArgumentException("reads " + reads + " must be >= 0");
        }
        SampleBlock block = SampleBlock.allDown(reads, problem.size());
        double[] energies = new double[reads];
        Task task = task(problem, block, energies, seed);
        BlockWork.run(task, block.blockCount(), settings.threads());
        return new SampledReads(problem.variables(), block, energies, task.fieldWeight.length,
                settings.schedule().runTimeMicros());
    }

    /** Whether this problem runs on the integer kernel (tests). */
    boolean runsInteger(IsingProblem problem) {
        return task(problem, SampleBlock.allDown(0, problem.size()), new double[0], 0L).tables != null;
    }

    private Task task(IsingProblem problem, SampleBlock block, double[] energies, long seed) {
        double[] fractions = sweepFractions(settings.schedule(), settings.sweepsPerMicrosecond());
        int slices = quantum.slices();
        double beta = quantum.beta();
        EnergyScales scales = quantum.energyScales();
        double[] fieldWeight = new double[fractions.length];
        double[] chainWeight = new double[fractions.length];
        for (int m = 0; m < fractions.length; m++) {
            fieldWeight[m] = PathIntegralKernels.fieldWeight(beta, scales.b(fractions[m]), slices);
            chainWeight[m] = PathIntegralKernels.chainWeight(beta, scales.a(fractions[m]), slices);
        }
        IsingProblem device = settings.errors().applyStatic(problem);
        return new Task(problem, device, settings.errors(), slices, fieldWeight, chainWeight, block, energies, seed,
                integerAllowed);
    }

    /** All reads of one call: the problem's arrays, the per-sweep weights, the outputs. */
    private static final class Task extends ReadByRead<Task.Workspace> {
        private final int slices;
        private final double[] fieldWeight;
        private final double[] chainWeight;
        // The integer kernel's data where it runs, else null: integer terms, the field bound,
        // one threshold table per run of equal weights and the table of each sweep.
        private final int[] intCoupling;
        private final int[] intFields;
        private final int bound;
        private final long[][] tables;
        private final int[] tableOfSweep;

        Task(IsingProblem nominal, IsingProblem device, ControlErrors errors, int slices, double[] fieldWeight,
             double[] chainWeight, SampleBlock block, double[] energies, long seed, boolean integerAllowed) {
            super(nominal, device, errors, block, energies, seed);
            this.slices = slices;
            this.fieldWeight = fieldWeight;
            this.chainWeight = chainWeight;
            int b = integerAllowed ? integerFieldBound(INTEGER_FIELD_LIMIT) : -1;
            int distinct = 0;
            int[] tableOf = new int[fieldWeight.length];
            for (int m = 0; m < fieldWeight.length; m++) {
                boolean same = m > 0 && fieldWeight[m] == fieldWeight[m - 1] && chainWeight[m] == chainWeight[m - 1];
                if (!same) {
                    distinct++;
                }
                tableOf[m] = distinct - 1;
            }
            if (b >= 0 && (long) distinct * PathIntegralKernels.thresholdLength(b) <= TABLE_ENTRY_LIMIT) {
                bound = b;
                intCoupling = integerCouplings();
                intFields = integerFields();
                tables = new long[distinct][PathIntegralKernels.thresholdLength(b)];
                for (int m = 0; m < fieldWeight.length; m++) {
                    if (m == 0 || tableOf[m] != tableOf[m - 1]) {
                        PathIntegralKernels.sliceThresholds(fieldWeight[m], chainWeight[m], b, tables[tableOf[m]]);
                    }
                }
                tableOfSweep = tableOf;
            } else {
                bound = -1;
                intCoupling = null;
                intFields = null;
                tables = null;
                tableOfSweep = null;
            }
        }

        private static final class Workspace {
            final byte[] spins;
            final byte[] row;
            final ReadTerms terms;
            final double[] localField;
            final int[] intLocalField;

            Workspace(Task task) {
                boolean integer = task.tables != null;
                spins = new byte[task.slices * task.n];
                row = new byte[task.n];
                terms = new ReadTerms(task);
                localField = integer ? null : new double[task.slices * task.n];
                intLocalField = integer ? new int[task.slices * task.n] : null;
            }
        }

        @Override
        public Workspace workspace() {
            return new Workspace(this);
        }

        @Override
        void read(int r, Workspace ws) {
            UniformRandomProvider rng = RandomStreams.generator(seed, StreamPurpose.PATH_INTEGRAL_READS, r);
            byte[] s = ws.spins;
            randomSpins(s, rng);
            if (tables != null) {
                PathIntegralKernels.localFields(n, slices, start, neighbour, intCoupling, intFields, s, ws.intLocalField);
                for (int m = 0; m < fieldWeight.length; m++) {
                    PathIntegralKernels.sweepInteger(n, slices, start, neighbour, intCoupling, s, ws.intLocalField,
                            tables[tableOfSweep[m]], bound, fieldWeight[m], rng);
                }
            } else {
                ReadTerms t = termsOf(rng, ws.terms);
                PathIntegralKernels.localFields(n, slices, start, neighbour, t.csr, t.fields, s, ws.localField);
                for (int m = 0; m < fieldWeight.length; m++) {
                    PathIntegralKernels.sweep(n, slices, start, neighbour, t.csr, s, ws.localField, fieldWeight[m],
                            chainWeight[m], rng);
                }
            }
            int slice = slices == 1 ? 0 : rng.nextInt(slices);
            System.arraycopy(s, slice * n, ws.row, 0, n);
            finish(r, ws.row);
        }
    }
}
