package org.obverse.bench;

import java.util.Collection;
import java.util.HashMap;
import java.util.Map;
import java.util.concurrent.ForkJoinPool;
import java.util.concurrent.TimeUnit;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.obverse.embed.ChainBreakRule;
import org.obverse.embed.ChainDecoder;
import org.obverse.embed.Chains;
import org.obverse.embed.DecodedSamples;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.samples.SampleBlock;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.annotations.Warmup;
import org.openjdk.jmh.results.RunResult;
import org.openjdk.jmh.runner.Runner;
import org.openjdk.jmh.runner.RunnerException;
import org.openjdk.jmh.runner.options.Options;
import org.openjdk.jmh.runner.options.OptionsBuilder;
import org.openjdk.jmh.runner.options.TimeValue;

/**
 * Majority decoding of 100,000 reads of 300 chains (lengths 1 … 7, 1,200 qubits; each chain's
 * qubits agree except that each is flipped with probability 0.05, so ties and breaks occur),
 * seeded. Milliseconds per decode of all reads:
 * <ul>
 * <li>{@code baseline}: a plain loop over int8 rows, one read and one chain at a time (count
 * the +1s, compare with L/2, the same energy tie rule), one thread;</li>
 * <li>{@code bitSlicedOneThread}: {@link ChainDecoder} (majority) on a {@link SampleBlock},
 * forced onto one thread;</li>
 * <li>{@code bitSliced}: the same on the common pool (both cores);</li>
 * <li>{@code bitSlicedWithEnergies}: as bitSliced, plus the logical energy of every read.</li>
 * </ul>
 * Each kernel gets its input in its own natural form (rows or bit planes) built in setup.
 * Ratios: {@code java -cp target/obverse-bench.jar org.obverse.bench.DecodeBench}.
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 2, time = 2)
@Measurement(iterations = 3, time = 2)
@Fork(value = 1, jvmArgsAppend = "-Xmx4g")
public class DecodeBench {
    static final int READS = 100_000;
    static final int CHAINS = 300;

    /** Problem, chains and reads, shared read-only. */
    @State(Scope.Benchmark)
    public static class Data {
        IsingProblem logical;
        Chains chains;
        VariableIndex qubits;
        SampleBlock block;
        byte[] rows;
        ChainDecoder decoder;
        int[][] chainColumns;
        ForkJoinPool single;

        @Setup
        public void setUp() {
            UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(2026L);
            IsingBuilder b = IsingProblem.builder();
            for (int v = 0; v < CHAINS; v++) {
                b.field(v, 2 * rng.nextDouble() - 1);
            }
            for (int e = 0; e < 3 * CHAINS; e++) {
                int u = rng.nextInt(CHAINS);
                int v = rng.nextInt(CHAINS);
                if (u != v) {
                    try {
                        b.coupling(u, v, 2 * rng.nextDouble() - 1);
                    } catch (IllegalArgumentException twice) {
                        // a pair drawn twice keeps its first coupling
                    }
                }
            }
            logical = b.build();
            int[] ids = new int[CHAINS];
            int[][] groups = new int[CHAINS][];
            int next = 0;
            for (int v = 0; v < CHAINS; v++) {
                ids[v] = v;
                groups[v] = new int[1 + rng.nextInt(7)];
                for (int i = 0; i < groups[v].length; i++) {
                    groups[v][i] = next++;
                }
            }
            chains = Chains.of(ids, groups);
            qubits = chains.allQubits();
            int n = qubits.size();
            rows = new byte[READS * n];
            for (int r = 0; r < READS; r++) {
                for (int v = 0; v < CHAINS; v++) {
                    byte s = (byte) (rng.nextBoolean() ? 1 : -1);
                    for (int q : groups[v]) {
                        rows[r * n + q] = rng.nextDouble() < 0.05 ? (byte) -s : s;
                    }
                }
            }
            block = SampleBlock.fromSpins(rows, READS, n);
            decoder = ChainDecoder.of(logical, chains, qubits, ChainBreakRule.MAJORITY, 7);
            chainColumns = groups;
            single = new ForkJoinPool(1);
        }

        @TearDown
        public void tearDown() {
            single.shutdown();
        }
    }

    @Benchmark
    public int baseline(Data d) {
        int n = d.qubits.size();
        int[] start = d.logical.adjacencyStarts();
        int[] adj = d.logical.adjacencyVariables();
        int[] edge = d.logical.adjacencyEdges();
        double[] j = d.logical.couplings();
        byte[] x = new byte[CHAINS];
        boolean[] tied = new boolean[CHAINS];
        int[] broken = new int[READS];
        int sink = 0;
        for (int r = 0; r < READS; r++) {
            int base = r * n;
            int b = 0;
            for (int c = 0; c < CHAINS; c++) {
                int[] q = d.chainColumns[c];
                int plus = 0;
                for (int col : q) {
                    plus += d.rows[base + col] > 0 ? 1 : 0;
                }
                b += plus != 0 && plus != q.length ? 1 : 0;
                x[c] = (byte) (2 * plus > q.length ? 1 : -1);
                tied[c] = 2 * plus == q.length;
            }
            for (int c = 0; c < CHAINS; c++) {
                if (tied[c]) {
                    double f = d.logical.field(c);
                    for (int p = start[c]; p < start[c + 1]; p++) {
                        int u = adj[p];
                        if (!(u > c && tied[u])) {
                            f += j[edge[p]] * x[u];
                        }
                    }
                    x[c] = (byte) (f < 0 ? 1 : -1);
                }
            }
            broken[r] = b;
            sink += x[r % CHAINS];
        }
        return sink + broken[READS - 1];
    }

    @Benchmark
    public DecodedSamples bitSliced(Data d) {
        return d.decoder.decode(d.block, false);
    }

    @Benchmark
    public DecodedSamples bitSlicedOneThread(Data d) throws Exception {
        return d.single.submit(() -> d.decoder.decode(d.block, false)).get();
    }

    @Benchmark
    public DecodedSamples bitSlicedWithEnergies(Data d) {
        return d.decoder.decode(d.block, true);
    }

    public static void main(String[] args) throws RunnerException {
        Options opt = new OptionsBuilder().include(DecodeBench.class.getName() + "\\.").forks(1)
                .warmupIterations(2).warmupTime(TimeValue.seconds(2))
                .measurementIterations(3).measurementTime(TimeValue.seconds(2)).build();
        Collection<RunResult> results = new Runner(opt).run();
        Map<String, Double> ms = new HashMap<>();
        for (RunResult r : results) {
            String name = r.getParams().getBenchmark();
            ms.put(name.substring(name.lastIndexOf('.') + 1), r.getPrimaryResult().getScore());
        }
        double base = ms.get("baseline");
        System.out.printf("%-24s %12s %12s %12s%n", "kernel", "ms/decode", "reads/us", "x baseline");
        for (String k : new String[] {"baseline", "bitSlicedOneThread", "bitSliced", "bitSlicedWithEnergies"}) {
            System.out.printf("%-24s %12.2f %12.2f %12.2f%n", k, ms.get(k), READS / (ms.get(k) * 1000), base / ms.get(k));
        }
    }
}
