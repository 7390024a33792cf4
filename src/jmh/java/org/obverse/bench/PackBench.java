package org.obverse.bench;

import java.util.Collection;
import java.util.HashMap;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
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
import org.openjdk.jmh.annotations.Warmup;
import org.openjdk.jmh.results.RunResult;
import org.openjdk.jmh.runner.Runner;
import org.openjdk.jmh.runner.RunnerException;
import org.openjdk.jmh.runner.options.Options;
import org.openjdk.jmh.runner.options.OptionsBuilder;
import org.openjdk.jmh.runner.options.TimeValue;

/**
 * Checking and packing stored int8 spins into bit planes, and the way back, on {@value #READS}
 * near-random reads of {@value #N} spins (a 16 × 16 grid of K4,4 cells), per operation:
 *
 * <ul>
 *   <li>{@code plainPack}: the baseline, the loop the readers had: per byte, a branch on +1, on
 *       −1, else an error; sets or clears one bit;</li>
 *   <li>{@code plainCheck}: the baseline check alone (a branch per byte);</li>
 *   <li>{@code pack}: {@link SampleBlock#packChecked}, one branch-free pass;</li>
 *   <li>{@code plainUnpack}: the baseline writer's path: one bit per byte out, then a branching
 *       re-check of every byte;</li>
 *   <li>{@code unpack}: {@link SampleBlock#unpackRows} with no re-check.</li>
 * </ul>
 *
 * Run {@code java -cp target/obverse-bench.jar org.obverse.bench.PackBench}: prints MB/s and
 * the ratios against the plain loops measured in the same run.
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
@Warmup(iterations = 2, time = 2)
@Measurement(iterations = 3, time = 2)
@Fork(1)
public class PackBench {
    static final int N = 2048;
    static final int READS = 4096;

    @State(Scope.Thread)
    public static class Data {
        byte[] raw;
        byte[] out;
        SampleBlock block;

        @Setup
        public void setup() {
            UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(20_261_202L);
            raw = new byte[READS * N];
            for (int i = 0; i < raw.length; i++) {
                raw[i] = (byte) (rng.nextBoolean() ? 1 : -1);
            }
            out = new byte[raw.length];
            block = SampleBlock.allDown(READS, N);
            block.packRows(raw, 0, READS, 0);
        }
    }

    @Benchmark
    public long plainCheck(Data d) {
        byte[] r = d.raw;
        long bad = 0;
        for (int i = 0; i < r.length; i++) {
            byte b = r[i];
            if (b != 1 && b != -1) {
                bad += i;
            }
        }
        return bad;
    }

    @Benchmark
    public long[] plainPack(Data d) {
        long[] words = d.block.words();
        byte[] spins = d.raw;
        for (int read = 0; read < READS; read++) {
            int base = (read >>> 6) * N;
            long bit = 1L << (read & 63);
            int row = read * N;
            for (int k = 0; k < N; k++) {
                byte s = spins[row + k];
                if (s == 1) {
                    words[base + k] |= bit;
                } else if (s == -1) {
                    words[base + k] &= ~bit;
                } else {
                    throw new IllegalArgumentException("read " + read + ", column " + k);
                }
            }
        }
        return words;
    }

    @Benchmark
    public int pack(Data d) {
        return d.block.packChecked(d.raw, 0, READS, 0, false);
    }

    @Benchmark
    public byte[] plainUnpack(Data d) {
        long[] words = d.block.words();
        byte[] out = d.out;
        for (int read = 0; read < READS; read++) {
            int base = (read >>> 6) * N;
            int shift = read & 63;
            int row = read * N;
            for (int k = 0; k < N; k++) {
                out[row + k] = (byte) ((((words[base + k] >>> shift) & 1L) << 1) - 1);
            }
        }
        for (int i = 0; i < out.length; i++) {
            if (out[i] != 1 && out[i] != -1) {
                throw new IllegalArgumentException("value at " + i);
            }
        }
        return out;
    }

    @Benchmark
    public byte[] unpack(Data d) {
        d.block.unpackRows(0, READS, d.out);
        return d.out;
    }

    public static void main(String[] args) throws RunnerException {
        Options opt = new OptionsBuilder().include(PackBench.class.getName() + "\\.").forks(1)
                .warmupIterations(2).warmupTime(TimeValue.seconds(2))
                .measurementIterations(3).measurementTime(TimeValue.seconds(2)).build();
        Collection<RunResult> results = new Runner(opt).run();
        Map<String, Double> us = new HashMap<>();
        for (RunResult r : results) {
            String name = r.getParams().getBenchmark();
            us.put(name.substring(name.lastIndexOf('.') + 1), r.getPrimaryResult().getScore());
        }
        double mb = (double) READS * N / 1e6;
        System.out.printf("%-12s %12s %10s %14s%n", "kernel", "us/op", "MB/s", "x plain");
        String[][] rows = {{"plainCheck", "plainCheck"}, {"plainPack", "plainPack"}, {"pack", "plainPack"},
            {"plainUnpack", "plainUnpack"}, {"unpack", "plainUnpack"}};
        for (String[] r : rows) {
            double t = us.get(r[0]);
            System.out.printf("%-12s %12.1f %10.0f %14.2f%n", r[0], t, mb / (t * 1e-6), us.get(r[1]) / t);
        }
    }
}
