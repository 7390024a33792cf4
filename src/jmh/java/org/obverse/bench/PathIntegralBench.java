package org.obverse.bench;

import java.util.Collection;
import java.util.HashMap;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.obverse.anneal.AnnealSchedule;
import org.obverse.anneal.EnergyScales;
import org.obverse.anneal.MetropolisKernels;
import org.obverse.anneal.PathIntegralKernels;
import org.obverse.anneal.PathIntegralSampler;
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
import org.openjdk.jmh.runner.options.TimeValue;

/**
 * Slice-spin attempts per nanosecond of the path-integral sampler's kernels on a ±J spin glass
 * of 8 × 8 K4,4 cells (512 qubits) with P = {@value #SLICES} slices at T = {@value #TEMPERATURE}
 * under the illustrative energy scales, s cycling through a 1,000-sweep linear anneal so the
 * accept mix is that of a real run. One sweep is P·n slice moves and n line moves, counted
 * together as P·n + n attempts. Benchmarks:
 * <ul>
 * <li>{@code baseline}: the plain form, every local field recomputed from the neighbours and
 * the logarithm and Math.exp evaluated on every attempt;</li>
 * <li>{@code doubles} (1 and 2 threads): maintained local fields per slice, weights once per
 * sweep, the bracketing exponential table;</li>
 * <li>{@code integers} (1 and 2 threads): what the sampler runs for this problem: integer local
 * fields and one threshold table per s, compared with raw random bits.</li>
 * </ul>
 * Scores are attempts/ns of wall time (JMH sums the threads); each benchmark also counts its
 * thread CPU time, since the machine is shared. Run the ratios table with
 * {@code java -cp target/obverse-bench.jar org.obverse.bench.PathIntegralBench}.
 */
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
@Warmup(iterations = 2, time = 2)
@Measurement(iterations = 3, time = 2)
@Fork(1)
public class PathIntegralBench {
    static final int ROWS = 8;
    static final int N = ROWS * ROWS * 8;
    static final int SLICES = 32;
    static final double TEMPERATURE = 0.2;
    static final int SWEEPS = 2;
    static final int ATTEMPTS = SWEEPS * (SLICES * N + N);

    /** The problem and the per-sweep weights and tables, shared read-only. */
    @State(Scope.Benchmark)
    public static class Problem {
        int[] start;
        int[] neighbour;
        double[] coupling;
        double[] fields;
        int[] intCoupling;
        int[] intFields;
        int bound;
        double[] a;
        double[] b;
        double[] fieldWeight;
        double[] chainWeight;
        long[][] tables;

        @Setup
        public void setUp() {
            IsingProblem problem = SpinGlasses.cellGrid(ROWS, ROWS, SpinGlasses.Couplings.PLUS_MINUS_ONE,
                    RandomSource.XO_RO_SHI_RO_128_PP.create(2026L));
            start = problem.adjacencyStarts();
            neighbour = problem.adjacencyVariables();
            int[] edge = problem.adjacencyEdges();
            coupling = new double[edge.length];
            intCoupling = new int[edge.length];
            for (int q = 0; q < edge.length; q++) {
                coupling[q] = problem.coupling(edge[q]);
                intCoupling[q] = (int) coupling[q];
            }
            fields = problem.fields();
            intFields = new int[N];
            for (int k = 0; k < N; k++) {
                intFields[k] = (int) fields[k];
            }
            bound = MetropolisKernels.integerFieldBound(N, start, coupling, fields, 1 << 12);
            double[] s = PathIntegralSampler.sweepFractions(AnnealSchedule.linear(1.0), 1000);
            EnergyScales scales = EnergyScales.illustrative();
            double beta = 1.0 / TEMPERATURE;
            a = new double[s.length];
            b = new double[s.length];
            fieldWeight = new double[s.length];
            chainWeight = new double[s.length];
            tables = new long[s.length][PathIntegralKernels.thresholdLength(bound)];
            for (int m = 0; m < s.length; m++) {
                a[m] = scales.a(s[m]);
                b[m] = scales.b(s[m]);
                fieldWeight[m] = PathIntegralKernels.fieldWeight(beta, b[m], SLICES);
                chainWeight[m] = PathIntegralKernels.chainWeight(beta, a[m], SLICES);
                PathIntegralKernels.sliceThresholds(fieldWeight[m], chainWeight[m], bound, tables[m]);
            }
        }
    }

    /** One thread's replica: slice-spins, local fields, its own generator, the sweep counter. */
    @State(Scope.Thread)
    public static class Replica {
        byte[] spins;
        double[] localField;
        byte[] intSpins;
        int[] intLocalField;
        UniformRandomProvider rng;
        int sweep;
        private static int nextSeed;

        @Setup(Level.Trial)
        public void setUp(Problem p) {
            int seed;
            synchronized (Replica.class) {
                seed = nextSeed++;
            }
            rng = RandomSource.XO_RO_SHI_RO_128_PP.create(new long[] {11L, seed});
            spins = new byte[SLICES * N];
            for (int q = 0; q < spins.length; q++) {
                spins[q] = (byte) (rng.nextBoolean() ? 1 : -1);
            }
            localField = new double[SLICES * N];
            PathIntegralKernels.localFields(N, SLICES, p.start, p.neighbour, p.coupling, p.fields, spins, localField);
            intSpins = spins.clone();
            intLocalField = new int[SLICES * N];
            PathIntegralKernels.localFields(N, SLICES, p.start, p.neighbour, p.intCoupling, p.intFields, intSpins,
                    intLocalField);
        }

        int nextSweep(int sweeps) {
            int s = sweep;
            sweep = s + 1 == sweeps ? 0 : s + 1;
            return s;
        }
    }

    @Benchmark
    @OperationsPerInvocation(ATTEMPTS)
    public byte baseline(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        double beta = 1.0 / TEMPERATURE;
        for (int i = 0; i < SWEEPS; i++) {
            int m = r.nextSweep(p.a.length);
            PathIntegralKernels.sweepBaseline(N, SLICES, p.start, p.neighbour, p.coupling, p.fields, r.spins, beta,
                    p.a[m], p.b[m], r.rng);
        }
        c.cpuNanos += c.now() - t0;
        c.attempts += ATTEMPTS;
        return r.spins[0];
    }

    @Benchmark
    @OperationsPerInvocation(ATTEMPTS)
    public byte doubles(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        for (int i = 0; i < SWEEPS; i++) {
            int m = r.nextSweep(p.a.length);
            PathIntegralKernels.sweep(N, SLICES, p.start, p.neighbour, p.coupling, r.spins, r.localField,
                    p.fieldWeight[m], p.chainWeight[m], r.rng);
        }
        c.cpuNanos += c.now() - t0;
        c.attempts += ATTEMPTS;
        return r.spins[0];
    }

    @Benchmark
    @Threads(2)
    @OperationsPerInvocation(ATTEMPTS)
    public byte doublesTwoThreads(Problem p, Replica r, CpuCounters c) {
        return doubles(p, r, c);
    }

    @Benchmark
    @OperationsPerInvocation(ATTEMPTS)
    public byte integers(Problem p, Replica r, CpuCounters c) {
        long t0 = c.now();
        for (int i = 0; i < SWEEPS; i++) {
            int m = r.nextSweep(p.a.length);
            PathIntegralKernels.sweepInteger(N, SLICES, p.start, p.neighbour, p.intCoupling, r.intSpins,
                    r.intLocalField, p.tables[m], p.bound, p.fieldWeight[m], r.rng);
        }
        c.cpuNanos += c.now() - t0;
        c.attempts += ATTEMPTS;
        return r.intSpins[0];
    }

    @Benchmark
    @Threads(2)
    @OperationsPerInvocation(ATTEMPTS)
    public byte integersTwoThreads(Problem p, Replica r, CpuCounters c) {
        return integers(p, r, c);
    }

    /**
     * Runs the benchmarks briefly (an optional argument: a regular expression naming some of
     * them; the baseline always runs) and prints attempts/ns and the ratios to the baseline.
     */
    public static void main(String[] args) throws RunnerException {
        String only = args.length > 0 ? "(baseline|" + args[0] + ")" : "";
        Options opt = new OptionsBuilder().include(PathIntegralBench.class.getName() + "\\." + only).forks(1)
                .warmupIterations(2).warmupTime(TimeValue.seconds(2)).measurementIterations(3)
                .measurementTime(TimeValue.seconds(2)).build();
        Collection<RunResult> results = new Runner(opt).run();
        Map<String, Double> score = new HashMap<>();
        Map<String, Double> perCpu = new HashMap<>();
        for (RunResult r : results) {
            String name = r.getParams().getBenchmark();
            String k = name.substring(name.lastIndexOf('.') + 1);
            score.put(k, r.getPrimaryResult().getScore());
            perCpu.put(k, r.getSecondaryResults().get("attempts").getScore()
                    / r.getSecondaryResults().get("cpuNanos").getScore());
        }
        double base = score.get("baseline");
        double baseCpu = perCpu.get("baseline");
        System.out.printf("%-20s %12s %10s %16s %10s%n", "kernel", "attempts/ns", "x baseline", "attempts/cpu-ns",
                "x baseline");
        for (String k : new String[] {"baseline", "doubles", "doublesTwoThreads", "integers", "integersTwoThreads"}) {
            if (score.containsKey(k)) {
                System.out.printf("%-20s %12.4f %10.2f %16.4f %10.2f%n", k, score.get(k), score.get(k) / base,
                        perCpu.get(k), perCpu.get(k) / baseCpu);
            }
        }
    }
}
