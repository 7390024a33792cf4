package org.obverse.bench;

import java.util.Collection;
import java.util.HashMap;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.obverse.anneal.BetaRange;
import org.obverse.anneal.MetropolisKernels;
import org.obverse.anneal.MultiSpinCoding;
import org.obverse.anneal.SamplerSettings;
import org.obverse.anneal.SteadyMultiSpin;
import org.obverse.model.IsingProblem;
import org.obverse.problems.SpinGlasses;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OperationsPerInvocation;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Threads;
import org.openjdk.jmh.annotations.Warmup;
import org.openjdk.jmh.results.RunResult;
import org.openjdk.jmh.runner.Runner;
import org.openjdk.jmh.runner.RunnerException;
import org.openjdk.jmh.runner.options.Options;
import org.openjdk.jmh.runner.options.OptionsBuilder;

/**
 * Spin-update attempts per nanosecond of the reference sampler's kernels on a ±J spin glass of
 * 16 × 16 K4,4 cells (2,048 qubits), eight sweeps (one for the multi-spin kernel) per
 * invocation, with β cycling through a
 * default 1,000-sweep anneal so the accept mix is that of a real run:
 * <ul>
 * <li>{@code baseline}: local field recomputed and Math.exp on every attempt;</li>
 * <li>{@code exact} (1 and 2 threads): maintained local fields and the bracketing table;</li>
 * <li>{@code exactInteger} (1 and 2 threads): what the sampler runs for integer problems such
 * as this one: integer local fields, thresholds per β, raw random bits compared as integers
 * (same decisions as {@code exact}), rows padded to a fixed stride;</li>
 * <li>{@code exactIntegerRows}: the same on the compressed rows without padding;</li>
 * <li>{@code exactIntegerBranchFree} (1 and 2 threads): the integer kernel without a branch on
 * the decision, on the generator's bare state; {@code exactIntegerFour} (1 and 2 threads): the
 * same on four reads swept together, what the sampler runs on integer problems;</li>
 * <li>{@code baselineGaussian}, {@code exactGaussian}, {@code exactGaussianSigned}: the
 * baseline, the double kernel with the generator object, and the signed-field kernel on the
 * bare state that the sampler runs, on the Gaussian glass of the same cells;</li>
 * <li>{@code multiSpinBareState}, {@code multiSpinFourWordsBareState} (1 and 2 threads),
 * {@code multiSpinLanes} (1 and 2 threads), {@code multiSpinLanesOne}, {@code multiSpinLanesFour}: the
 * multi-spin kernels, 64 reads a word (64 attempts per spin visit) on one, four or 64 blocks;</li>
 * <li>{@code multiSpinSteadyLanes} (1 and 2 threads), {@code multiSpinSteadyLanesWide} (1 and 2
 * threads): the steady multi-spin kernel ({@link SteadyMultiSpin}, twelve words every visit) on
 * 64 and 128 blocks as lanes, and {@code multiSpinLanesWide}, the first one on 128: the
 * samplers' units from 8,192 reads a thread are 128 blocks.</li>
 * </ul>
 * Scores are attempts/ns of wall time (JMH sums the threads). The machine these run on is
 * shared, so each benchmark also counts the attempts and the thread CPU time it used
 * ({@link CpuCounters}): attempts per CPU-nanosecond is the per-core speed with other
 * people's load taken out. Run the ratios table with
 * {@code java -cp target/obverse-bench.jar org.obverse.bench.SamplerBench}.
 */
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
@Warmup(iterations = 2, time = 2)
@Measurement(iterations = 3, time = 2)
@Fork(1)
public class SamplerBench {
    static final int ROWS = 16;
    static final int N = ROWS * ROWS * 8;
    /** Sweeps per invocation of the one-read kernels, so the CPU-time reads cost little beside them. */
    static final int SWEEPS = 8;
    /** Blocks swept together by the lane kernel, as the sampler does for 4,096 reads a thread or more. */
    static final int LANES = 64;
    /** Blocks swept together where a thread gets 8,192 reads or more (both multi-spin kernels). */
    static final int WIDE_LANES = 128;

    /** The problem, shared read-only. */
    @State(Scope.Benchmark)
    public static class Problem {
        IsingProblem problem;
        int[] start;
        int[] neighbour;
        double[] coupling;
        double[] fields;
        int[] intCoupling;
        int[] intFields;
        long[][] intThresholds;
        int degree;
        int[] padNeighbour;
        int[] padCoupling;
        int[] fourTerms;
        double[] betas;
        MultiSpinCoding coding;
        SteadyMultiSpin steady;
        long[][] thresholds;
        // The Gaussian glass on the same cells: its couplings (rows and padded) and anneal.
        double[] gaussCoupling;
        double[] gaussFields;
        double[] gaussBetas;

        @Setup
        public void setUp() {
            problem = problem(false);
            IsingProblem gauss = problem(true);
            int[] gaussEdge = gauss.adjacencyEdges();
            gaussCoupling = new double[gaussEdge.length];
            for (int q = 0; q < gaussEdge.length; q++) {
                gaussCoupling[q] = gauss.coupling(gaussEdge[q]);
            }
            gaussFields = gauss.fields();
            double[] gaussRange = BetaRange.automatic(gauss);
            gaussBetas = BetaRange.perSweep(SamplerSettings.defaults(), gaussRange[0], gaussRange[1]);
            start = problem.adjacencyStarts();
            neighbour = problem.adjacencyVariables();
            int[] edge = problem.adjacencyEdges();
            coupling = new double[edge.length];
            for (int q = 0; q < edge.length; q++) {
                coupling[q] = problem.coupling(edge[q]);
            }
            fields = problem.fields();
            double[] range = BetaRange.automatic(problem);
            betas = BetaRange.perSweep(SamplerSettings.defaults(), range[0], range[1]);
            int bound = MetropolisKernels.integerFieldBound(N, start, coupling, fields, 1 << 16);
            intCoupling = new int[coupling.length];
            for (int q = 0; q < coupling.length; q++) {
                intCoupling[q] = (int) coupling[q];
            }
            intFields = new int[N];
            for (int k = 0; k < N; k++) {
                intFields[k] = (int) fields[k];
            }
            intThresholds = new long[betas.length][bound + 1];
            degree = MetropolisKernels.maxDegree(N, start);
            padNeighbour = MetropolisKernels.padded(N, start, neighbour, degree, true);
            padCoupling = MetropolisKernels.padded(N, start, intCoupling, degree, false);
            fourTerms = MetropolisKernels.interleavedTerms(padNeighbour, padCoupling);
            coding = MultiSpinCoding.of(problem);
            steady = SteadyMultiSpin.of(problem);
            thresholds = new long[betas.length][MultiSpinCoding.thresholdLength()];
            for (int k = 0; k < betas.length; k++) {
                coding.thresholds(betas[k], thresholds[k]);
            }
        }
    }

    /** The benchmark's glass: 16 × 16 K4,4 cells, ±1 or N(0, 1) couplings, no fields. */
    static IsingProblem problem(boolean gaussian) {
        return SpinGlasses.cellGrid(ROWS, ROWS, gaussian ? SpinGlasses.Couplings.GAUSSIAN
                : SpinGlasses.Couplings.PLUS_MINUS_ONE, RandomSource.XO_RO_SHI_RO_128_PP.create(2026L));
    }

    /** One thread's replica: spins, fields, its own generator, the sweep counter. */
    @State(Scope.Thread)
    public static class Replica {
        byte[] spins;
        double[] localField;
        byte[] intSpins;
        int[] intLocalField;
        long[] scratchThresholds;
        long[] words;
        long[][] words4;
        UniformRandomProvider rng;
        UniformRandomProvider[] rng4;
        // The branch-free kernels' replicas and bare generator states.
        byte[] fastSpins;
        int[] fastLocalField;
        byte[] gaussSpins;
        double[] gaussLocalField;
        // Four reads of the four-read integer kernel: spins interleaved, packed fields, states.
        byte[] fourSpins;
        long[] fourField;
        long[] fourStates;
        // The signed-field double kernel: spins as ±1.0, signed fields, bare state.
        double[] signedSpin;
        double[] signedField;
        long[] signedState;
        long[] laneWords;
        MultiSpinCoding.Lanes lanes;
        long[] steadyWords;
        MultiSpinCoding.Lanes steadyLanes;
        long[] wideWords;
        MultiSpinCoding.Lanes wideLanes;
        long[] steadyWideWords;
        MultiSpinCoding.Lanes steadyWideLanes;
        // The lane kernel on one block and on four (the sampler's small cases).
        long[] laneWords1;
        MultiSpinCoding.Lanes lanes1;
        long[] laneWords4;
        MultiSpinCoding.Lanes lanes4;
        long[] state;
        long[] words4Fast;
        long[][] words4b;
        long[] states4;
        int sweep;
        int gaussSweep;
        private static int nextSeed;

        @Setup(Level.Trial)
        public void setUp(Problem p) {
            int seed;
            synchronized (Replica.class) {
                seed = nextSeed++;
            }
            rng = RandomSource.XO_RO_SHI_RO_128_PP.create(new long[] {7L, seed});
            spins = new byte[N];
            words = new long[N];
            for (int k = 0; k < N; k++) {
                spins[k] = (byte) (rng.nextBoolean() ? 1 : -1);
                words[k] = rng.nextLong();
            }
            words4 = new long[4][N];
            rng4 = new UniformRandomProvider[4];
            for (int w = 0; w < 4; w++) {
                rng4[w] = RandomSource.XO_RO_SHI_RO_128_PP.create(new long[] {11L + w, seed});
                for (int k = 0; k < N; k++) {
                    words4[w][k] = rng4[w].nextLong();
                }
            }
            localField = new double[N];
            MetropolisKernels.localFields(N, p.start, p.neighbour, p.coupling, p.fields, spins, localField);
            intSpins = spins.clone();
            intLocalField = new int[N];
            MetropolisKernels.localFields(N, p.start, p.neighbour, p.intCoupling, p.intFields, intSpins, intLocalField);
            scratchThresholds = new long[p.intThresholds[0].length];
            fastSpins = spins.clone();
            fastLocalField = intLocalField.clone();
            fourSpins = new byte[4 * N];
            for (int k = 0; k < 4 * N; k++) {
                fourSpins[k] = (byte) (rng.nextBoolean() ? 1 : -1);
            }
            fourField = new long[N];
            MetropolisKernels.packedLocalFields(N, p.start, p.neighbour, p.intCoupling, p.intFields, fourSpins, fourField);
            fourStates = new long[8];
            for (int i = 0; i < 8; i++) {
                fourStates[i] = rng.nextLong();
            }
            gaussSpins = spins.clone();
            gaussLocalField = new double[N];
            MetropolisKernels.localFields(N, p.start, p.neighbour, p.gaussCoupling, p.gaussFields, gaussSpins,
                    gaussLocalField);
            signedSpin = new double[N];
            signedField = gaussLocalField.clone();
            MetropolisKernels.signedFields(N, gaussSpins, signedSpin, signedField);
            signedState = new long[] {rng.nextLong(), rng.nextLong()};
            lanes = new MultiSpinCoding.Lanes(LANES);
            laneWords = new long[N * LANES];
            for (int i = 0; i < laneWords.length; i++) {
                laneWords[i] = rng.nextLong();
            }
            for (int i = 0; i < LANES; i++) {
                lanes.setState(i, rng.nextLong(), rng.nextLong());
            }
            steadyLanes = new MultiSpinCoding.Lanes(LANES);
            steadyWords = laneWords.clone();
            for (int i = 0; i < LANES; i++) {
                steadyLanes.setState(i, rng.nextLong(), rng.nextLong());
            }
            wideWords = new long[N * WIDE_LANES];
            for (int i = 0; i < wideWords.length; i++) {
                wideWords[i] = rng.nextLong();
            }
            steadyWideWords = wideWords.clone();
            wideLanes = new MultiSpinCoding.Lanes(WIDE_LANES);
            steadyWideLanes = new MultiSpinCoding.Lanes(WIDE_LANES);
            for (int i = 0; i < WIDE_LANES; i++) {
                long a = rng.nextLong();
                long b = rng.nextLong();
                wideLanes.setState(i, a, b);
                steadyWideLanes.setState(i, a, b);
            }
            laneWords1 = words.clone();
            lanes1 = new MultiSpinCoding.Lanes(1);
            lanes1.setState(0, rng.nextLong(), rng.nextLong());
            laneWords4 = new long[N * 4];
            lanes4 = new MultiSpinCoding.Lanes(4);
            for (int w = 0; w < 4; w++) {
                for (int k = 0; k < N; k++) {
                    laneWords4[k * 4 + w] = words4[w][k];
                }
                lanes4.setState(w, rng.nextLong(), rng.nextLong());
            }
            state = new long[] {rng.nextLong(), rng.nextLong()};
            words4b = new long[4][];
            states4 = new long[8];
            for (int w = 0; w < 4; w++) {
                words4b[w] = words4[w].clone();
                states4[2 * w] = rng.nextLong();
                states4[2 * w + 1] = rng.nextLong();
            }
            words4Fast = words.clone();
        }

        int nextGaussSweep(int sweeps) {
            int s = gaussSweep;
            gaussSweep = s + 1 == sweeps ? 0 : s + 1;
            return s;
        }

        int nextSweep(int sweeps) {
            int s = sweep;
            sweep = s + 1 == sweeps ? 0 : s + 1;
            return s;
        }
    }

    @Benchmark
    @OperationsPerInvocation(SWEEPS * N)
    public byte baseline(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        for (int i = 0; i < SWEEPS; i++) {
            double beta = p.betas[r.nextSweep(p.betas.length)];
            MetropolisKernels.sweepBaseline(N, p.start, p.neighbour, p.coupling, p.fields, r.spins, beta, r.rng);
        }
        c.cpuNanos += c.now() - t0;
        c.attempts += SWEEPS * N;
        return r.spins[0];
    }

    /** The plain baseline on the Gaussian glass. */
    @Benchmark
    @OperationsPerInvocation(SWEEPS * N)
    public byte baselineGaussian(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        for (int i = 0; i < SWEEPS; i++) {
            double beta = p.gaussBetas[r.nextGaussSweep(p.gaussBetas.length)];
            MetropolisKernels.sweepBaseline(N, p.start, p.neighbour, p.gaussCoupling, p.gaussFields, r.gaussSpins, beta,
                    r.rng);
        }
        c.cpuNanos += c.now() - t0;
        c.attempts += SWEEPS * N;
        return r.gaussSpins[0];
    }

    /** The double kernel with the generator object and the branching bracket, Gaussian glass. */
    @Benchmark
    @OperationsPerInvocation(SWEEPS * N)
    public byte exactGaussian(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        for (int i = 0; i < SWEEPS; i++) {
            double beta = p.gaussBetas[r.nextGaussSweep(p.gaussBetas.length)];
            MetropolisKernels.sweep(N, p.start, p.neighbour, p.gaussCoupling, r.gaussSpins, r.gaussLocalField, beta,
                    r.rng);
        }
        c.cpuNanos += c.now() - t0;
        c.attempts += SWEEPS * N;
        return r.gaussSpins[0];
    }

    /** What {@code sample} runs on the ±1 glass: integer, branch-free, bare state, padded rows. */
    @Benchmark
    @OperationsPerInvocation(SWEEPS * N)
    public byte exactIntegerBranchFree(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        for (int i = 0; i < SWEEPS; i++) {
            double beta = p.betas[r.nextSweep(p.betas.length)];
            MetropolisKernels.integerThresholds(beta, r.scratchThresholds);
            MetropolisKernels.sweepIntegerBranchFree(N, p.degree, p.start, p.padNeighbour, p.padCoupling, r.fastSpins,
                    r.fastLocalField, r.scratchThresholds, r.state);
        }
        c.cpuNanos += c.now() - t0;
        c.attempts += SWEEPS * N;
        return r.fastSpins[0];
    }

    /** What {@code sample} runs on the ±1 glass: four reads swept together, each as {@code exactIntegerBranchFree}. */
    @Benchmark
    @OperationsPerInvocation(4 * SWEEPS * N)
    public byte exactIntegerFour(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        for (int i = 0; i < SWEEPS; i++) {
            double beta = p.betas[r.nextSweep(p.betas.length)];
            MetropolisKernels.integerThresholds(beta, r.scratchThresholds);
            MetropolisKernels.sweepIntegerFour(N, p.degree, p.start, p.fourTerms, r.fourSpins, r.fourField, r.fourStates,
                    r.scratchThresholds);
        }
        c.cpuNanos += c.now() - t0;
        c.attempts += 4 * SWEEPS * N;
        return r.fourSpins[0];
    }

    @Benchmark
    @Threads(2)
    @OperationsPerInvocation(4 * SWEEPS * N)
    public byte exactIntegerFourTwoThreads(Problem p, Replica r, CpuCounters c) {
        return exactIntegerFour(p, r, c);
    }

    /** What {@code sample} runs on the Gaussian glass: signed fields, bare state, bracket on raw bits. */
    @Benchmark
    @OperationsPerInvocation(SWEEPS * N)
    public double exactGaussianSigned(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        for (int i = 0; i < SWEEPS; i++) {
            double beta = p.gaussBetas[r.nextGaussSweep(p.gaussBetas.length)];
            MetropolisKernels.sweepSigned(N, p.start, p.neighbour, p.gaussCoupling, r.signedSpin, r.signedField, beta,
                    r.signedState);
        }
        c.cpuNanos += c.now() - t0;
        c.attempts += SWEEPS * N;
        return r.signedSpin[0];
    }

    @Benchmark
    @Threads(2)
    @OperationsPerInvocation(SWEEPS * N)
    public byte exactIntegerBranchFreeTwoThreads(Problem p, Replica r, CpuCounters c) {
        return exactIntegerBranchFree(p, r, c);
    }

    @Benchmark
    @OperationsPerInvocation(SWEEPS * N)
    public byte exact(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        for (int i = 0; i < SWEEPS; i++) {
            double beta = p.betas[r.nextSweep(p.betas.length)];
            MetropolisKernels.sweep(N, p.start, p.neighbour, p.coupling, r.spins, r.localField, beta, r.rng);
        }
        c.cpuNanos += c.now() - t0;
        c.attempts += SWEEPS * N;
        return r.spins[0];
    }

    @Benchmark
    @Threads(2)
    @OperationsPerInvocation(SWEEPS * N)
    public byte exactTwoThreads(Problem p, Replica r, CpuCounters c) {
        return exact(p, r, c);
    }

    @Benchmark
    @OperationsPerInvocation(SWEEPS * N)
    public byte exactInteger(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        for (int i = 0; i < SWEEPS; i++) {
            double beta = p.betas[r.nextSweep(p.betas.length)];
            // Thresholds per sweep, as the sampler does: a few exponentials per 2,048 spins.
            MetropolisKernels.integerThresholds(beta, r.scratchThresholds);
            MetropolisKernels.sweepIntegerPadded(N, p.degree, p.padNeighbour, p.padCoupling, r.intSpins, r.intLocalField,
                    r.scratchThresholds, r.rng);
        }
        c.cpuNanos += c.now() - t0;
        c.attempts += SWEEPS * N;
        return r.intSpins[0];
    }

    @Benchmark
    @OperationsPerInvocation(SWEEPS * N)
    public byte exactIntegerRows(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        for (int i = 0; i < SWEEPS; i++) {
            double beta = p.betas[r.nextSweep(p.betas.length)];
            MetropolisKernels.integerThresholds(beta, r.scratchThresholds);
            MetropolisKernels.sweepInteger(N, p.start, p.neighbour, p.intCoupling, r.intSpins, r.intLocalField,
                    r.scratchThresholds, r.rng);
        }
        c.cpuNanos += c.now() - t0;
        c.attempts += SWEEPS * N;
        return r.intSpins[0];
    }

    @Benchmark
    @Threads(2)
    @OperationsPerInvocation(SWEEPS * N)
    public byte exactIntegerTwoThreads(Problem p, Replica r, CpuCounters c) {
        return exactInteger(p, r, c);
    }

    /** One word, the generator's state in local variables ({@link MultiSpinCoding#sweep}). */
    @Benchmark
    @OperationsPerInvocation(64 * N)
    public long multiSpinBareState(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        p.coding.sweep(r.words4Fast, p.thresholds[r.nextSweep(p.betas.length)], r.state);
        c.cpuNanos += c.now() - t0;
        c.attempts += 64 * N;
        return r.words4Fast[0];
    }

    /** What {@code sample --kernel multi-spin} runs: four blocks, bare generator states. */
    @Benchmark
    @OperationsPerInvocation(4 * 64 * N)
    public long multiSpinFourWordsBareState(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        long[][] w = r.words4b;
        p.coding.sweep4(w[0], w[1], w[2], w[3], p.thresholds[r.nextSweep(p.betas.length)], r.states4);
        c.cpuNanos += c.now() - t0;
        c.attempts += 4 * 64 * N;
        return w[0][0];
    }

    /** What {@code sample --kernel multi-spin} runs for 4,096 reads a thread or more: 64 blocks as vector lanes. */
    @Benchmark
    @OperationsPerInvocation(LANES * 64 * N)
    public long multiSpinLanes(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        p.coding.sweepLanes(r.laneWords, p.thresholds[r.nextSweep(p.betas.length)], r.lanes);
        c.cpuNanos += c.now() - t0;
        c.attempts += LANES * 64 * N;
        return r.laneWords[0];
    }

    /** The first multi-spin kernel on 128 blocks as lanes (the sampler's units from 8,192 reads a thread). */
    @Benchmark
    @OperationsPerInvocation(WIDE_LANES * 64 * N)
    public long multiSpinLanesWide(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        p.coding.sweepLanes(r.wideWords, p.thresholds[r.nextSweep(p.betas.length)], r.wideLanes);
        c.cpuNanos += c.now() - t0;
        c.attempts += WIDE_LANES * 64 * N;
        return r.wideWords[0];
    }

    /** The steady kernel on 128 blocks as lanes: what {@code sample --kernel multi-spin-steady} runs from 8,192 reads a thread. */
    @Benchmark
    @OperationsPerInvocation(WIDE_LANES * 64 * N)
    public long multiSpinSteadyLanesWide(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        p.steady.sweepLanes(r.steadyWideWords, p.thresholds[r.nextSweep(p.betas.length)], r.steadyWideLanes);
        c.cpuNanos += c.now() - t0;
        c.attempts += WIDE_LANES * 64 * N;
        return r.steadyWideWords[0];
    }

    @Benchmark
    @Threads(2)
    @OperationsPerInvocation(WIDE_LANES * 64 * N)
    public long multiSpinSteadyLanesWideTwoThreads(Problem p, Replica r, CpuCounters c) {
        return multiSpinSteadyLanesWide(p, r, c);
    }

    /** The steady kernel on 64 blocks as lanes (like for like with {@code multiSpinLanes}). */
    @Benchmark
    @OperationsPerInvocation(LANES * 64 * N)
    public long multiSpinSteadyLanes(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        p.steady.sweepLanes(r.steadyWords, p.thresholds[r.nextSweep(p.betas.length)], r.steadyLanes);
        c.cpuNanos += c.now() - t0;
        c.attempts += LANES * 64 * N;
        return r.steadyWords[0];
    }

    @Benchmark
    @Threads(2)
    @OperationsPerInvocation(LANES * 64 * N)
    public long multiSpinSteadyLanesTwoThreads(Problem p, Replica r, CpuCounters c) {
        return multiSpinSteadyLanes(p, r, c);
    }

    /** The lane kernel on one block: what the sampler runs for a last block of its own. */
    @Benchmark
    @OperationsPerInvocation(64 * N)
    public long multiSpinLanesOne(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        p.coding.sweepLanes(r.laneWords1, p.thresholds[r.nextSweep(p.betas.length)], r.lanes1);
        c.cpuNanos += c.now() - t0;
        c.attempts += 64 * N;
        return r.laneWords1[0];
    }

    /** The lane kernel on four blocks: what the sampler runs for fewer than 16 blocks a thread. */
    @Benchmark
    @OperationsPerInvocation(4 * 64 * N)
    public long multiSpinLanesFour(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        p.coding.sweepLanes(r.laneWords4, p.thresholds[r.nextSweep(p.betas.length)], r.lanes4);
        c.cpuNanos += c.now() - t0;
        c.attempts += 4 * 64 * N;
        return r.laneWords4[0];
    }

    @Benchmark
    @Threads(2)
    @OperationsPerInvocation(LANES * 64 * N)
    public long multiSpinLanesTwoThreads(Problem p, Replica r, CpuCounters c) {
        return multiSpinLanes(p, r, c);
    }

    @Benchmark
    @Threads(2)
    @OperationsPerInvocation(4 * 64 * N)
    public long multiSpinFourWordsBareStateTwoThreads(Problem p, Replica r, CpuCounters c) {
        return multiSpinFourWordsBareState(p, r, c);
    }

    /**
     * Runs the benchmarks briefly (an optional argument: a regular expression naming some of
     * them; the baseline always runs) and prints attempts/ns and the ratios to the baseline.
     */
    public static void main(String[] args) throws RunnerException {
        // An optional argument picks benchmarks by a regular expression (the baseline always runs).
        String only = args.length > 0 ? "(baseline|baselineGaussian|" + args[0] + ")" : "";
        Options opt = new OptionsBuilder().include(SamplerBench.class.getName() + "\\." + only).forks(1)
                .warmupIterations(2).warmupTime(org.openjdk.jmh.runner.options.TimeValue.seconds(2))
                .measurementIterations(3).measurementTime(org.openjdk.jmh.runner.options.TimeValue.seconds(2)).build();
        Collection<RunResult> results = new Runner(opt).run();
        Map<String, Double> score = new HashMap<>();
        Map<String, Double> perCpu = new HashMap<>();
        for (RunResult r : results) {
            String name = r.getParams().getBenchmark();
            String k = name.substring(name.lastIndexOf('.') + 1);
            score.put(k, r.getPrimaryResult().getScore());
            double attempts = r.getSecondaryResults().get("attempts").getScore();
            double cpu = r.getSecondaryResults().get("cpuNanos").getScore();
            perCpu.put(k, attempts / cpu);
        }
        double base = score.get("baseline");
        double baseCpu = perCpu.get("baseline");
        double gaussBase = score.getOrDefault("baselineGaussian", base);
        double gaussBaseCpu = perCpu.getOrDefault("baselineGaussian", baseCpu);
        System.out.printf("%-38s %12s %10s %16s %10s%n", "kernel", "attempts/ns", "x baseline", "attempts/cpu-ns",
                "x baseline");
        for (String k : new String[] {"baseline", "exact", "exactTwoThreads", "exactInteger", "exactIntegerRows",
                "exactIntegerTwoThreads", "exactIntegerBranchFree", "exactIntegerBranchFreeTwoThreads",
                "exactIntegerFour", "exactIntegerFourTwoThreads", "baselineGaussian", "exactGaussian",
                "exactGaussianSigned",
                "multiSpinBareState", "multiSpinFourWordsBareState", "multiSpinFourWordsBareStateTwoThreads",
                "multiSpinLanes", "multiSpinLanesTwoThreads", "multiSpinLanesOne", "multiSpinLanesFour",
                "multiSpinLanesWide", "multiSpinSteadyLanes", "multiSpinSteadyLanesTwoThreads", "multiSpinSteadyLanesWide",
                "multiSpinSteadyLanesWideTwoThreads"}) {
            if (!score.containsKey(k)) {
                continue;
            }
            // Gaussian-glass kernels are compared with the baseline on the Gaussian glass.
            boolean gauss = k.contains("Gaussian");
            double b = gauss ? gaussBase : base;
            double bc = gauss ? gaussBaseCpu : baseCpu;
            System.out.printf("%-38s %12.4f %10.2f %16.4f %10.2f%n", k, score.get(k), score.get(k) / b, perCpu.get(k),
                    perCpu.get(k) / bc);
        }
        if (score.containsKey("multiSpinBareState") && score.containsKey("multiSpinFourWordsBareState")) {
            System.out.printf("multi-spin, four words / one: %.2f%n",
                    score.get("multiSpinFourWordsBareState") / score.get("multiSpinBareState"));
        }
        if (perCpu.containsKey("multiSpinLanes") && perCpu.containsKey("multiSpinSteadyLanes")) {
            System.out.printf("multi-spin per CPU-ns, steady lanes / lanes (64): %.2f%n",
                    perCpu.get("multiSpinSteadyLanes") / perCpu.get("multiSpinLanes"));
        }
        if (perCpu.containsKey("multiSpinLanesWide") && perCpu.containsKey("multiSpinSteadyLanesWide")) {
            System.out.printf("multi-spin per CPU-ns, steady lanes / lanes (128): %.2f%n",
                    perCpu.get("multiSpinSteadyLanesWide") / perCpu.get("multiSpinLanesWide"));
        }
        for (String k : new String[] {"exact", "exactInteger", "exactIntegerFour", "multiSpinFourWordsBareState",
                "multiSpinLanes", "multiSpinSteadyLanes", "multiSpinSteadyLanesWide"}) {
            if (score.containsKey(k) && score.containsKey(k + "TwoThreads")) {
                System.out.printf("wall-clock, two threads / one: %s %.2f%n", k, score.get(k + "TwoThreads") / score.get(k));
            }
        }
    }
}
