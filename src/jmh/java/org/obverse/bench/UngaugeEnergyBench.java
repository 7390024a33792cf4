package org.obverse.bench;

import java.util.ArrayList;
import java.util.Collection;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.ejml.data.DMatrixRMaj;
import org.ejml.data.DMatrixSparseCSC;
import org.ejml.data.DMatrixSparseTriplet;
import org.ejml.ops.DConvertMatrixStruct;
import org.ejml.sparse.csc.CommonOps_DSCC;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.samples.EnergyKernel;
import org.obverse.samples.SampleBlock;
import org.obverse.samples.SpinFlip;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.openjdk.jmh.infra.Blackhole;
import org.openjdk.jmh.results.RunResult;
import org.openjdk.jmh.runner.Runner;
import org.openjdk.jmh.runner.options.CommandLineOptions;
import org.openjdk.jmh.runner.options.Options;
import org.openjdk.jmh.runner.options.OptionsBuilder;

/**
 * Un-gauge + energy, {@value #CHUNK} reads per operation, on a grid of 16 × 16 K4,4 cells (2,048 qubits,
 * 6,016 couplers), with seeded Gaussian couplings and fields ({@code gaussian}) or ±1 ones
 * ({@code plusminus1}), a random gauge with about half the qubits flipped:
 *
 * <ul>
 *   <li>{@code bitSliced}: {@link SpinFlip} in place on the bit-sliced block, then the
 *       planned {@link EnergyKernel} (byte tables for Gaussian, bit counters for ±1);</li>
 *   <li>{@code bitSlicedExact}: the same with the exact kernel (the audit's path), for reference;</li>
 *   <li>{@code int8EdgeList}: the plain baseline, one byte per spin: s_k = g_k·s'_k per read,
 *       then fields and an edge list summed per read;</li>
 *   <li>{@code ejmlSparse}: EJML's sparse × dense product: the upper-triangular coupling
 *       matrix (CSC) times a dense n × 64 batch of un-gauged spins, then
 *       E = offset + Σ_k s_k (h_k + (J s)_k) per read;</li>
 *   <li>{@code plainRead} and {@code ungauge*}: one pass over the block's words, reading
 *       (XOR-reduce) against flipping in place and into a second block.</li>
 * </ul>
 *
 * Run {@code java -cp target/obverse-bench.jar org.obverse.bench.UngaugeEnergyBench -f 1 -wi 2
 * -i 3 -w 2s -r 2s}: the main method runs JMH and prints samples per second and the ratios.
 */
@BenchmarkMode(Mode.SampleTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
@Warmup(iterations = 2, time = 2)
@Measurement(iterations = 3, time = 2)
@Fork(1)
public class UngaugeEnergyBench {
    static final int CELLS = 16;
    /** Reads held by a benchmark state; each operation takes the next {@value #CHUNK} of them. */
    static final int READS = 4096;
    /** Reads per operation: one bit-sliced block, one EJML batch. */
    static final int CHUNK = 64;
    static final long SEED = 20_260_101L;

    /** The problem, its samples in the device frame, and every method's prepared data. */
    @State(Scope.Thread)
    public static class Problem {
        @Param({"gaussian", "plusminus1"})
        public String couplings;

        int n;
        int cursor;
        // Bit-sliced: one block per chunk of reads.
        SampleBlock[] blocks;
        SpinFlip flip;
        EnergyKernel kernel;
        EnergyKernel exact;
        double[] energies = new double[CHUNK];
        // int8 per spin.
        byte[] raw;
        byte[] gauge;
        byte[] row;
        double[] h;
        int[] edgeU;
        int[] edgeV;
        double[] j;
        double offset;
        // EJML.
        DMatrixSparseCSC upper;
        DMatrixRMaj batch;
        DMatrixRMaj product;

        @Setup
        public void setup() {
            UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
            boolean gaussian = couplings.equals("gaussian");
            IsingProblem p = cellGrid(rng, gaussian);
            n = p.size();
            h = p.fields();
            edgeU = p.edgeUs();
            edgeV = p.edgeVs();
            j = p.couplings();
            offset = p.offset();
            raw = new byte[READS * n];
            for (int i = 0; i < raw.length; i++) {
                raw[i] = (byte) (rng.nextBoolean() ? 1 : -1);
            }
            gauge = new byte[n];
            for (int k = 0; k < n; k++) {
                gauge[k] = (byte) (rng.nextBoolean() ? 1 : -1);
            }
            row = new byte[n];
            blocks = new SampleBlock[READS / CHUNK];
            for (int b = 0; b < blocks.length; b++) {
                blocks[b] = SampleBlock.allDown(CHUNK, n);
                blocks[b].packRows(raw, b * CHUNK, CHUNK, 0);
            }
            flip = SpinFlip.ofSigns(gauge);
            kernel = EnergyKernel.of(p);
            exact = EnergyKernel.exact(p);
            DMatrixSparseTriplet t = new DMatrixSparseTriplet(n, n, edgeU.length);
            for (int e = 0; e < edgeU.length; e++) {
                t.addItem(edgeU[e], edgeV[e], j[e]);
            }
            upper = DConvertMatrixStruct.convert(t, (DMatrixSparseCSC) null);
            batch = new DMatrixRMaj(n, CHUNK);
            product = new DMatrixRMaj(n, CHUNK);
            checkAgreement(p);
        }

        /** The next chunk of reads, cycling. */
        int next() {
            int c = cursor;
            cursor = c + 1 == blocks.length ? 0 : c + 1;
            return c;
        }

        /** The three methods must give the same energies before they are timed. */
        private void checkAgreement(IsingProblem p) {
            EnergyKernel exact = EnergyKernel.exact(p);
            double[] a = new double[CHUNK];
            double[] b = new double[CHUNK];
            double[] c = new double[CHUNK];
            for (int chunk = 0; chunk < blocks.length; chunk++) {
                SampleBlock copy = blocks[chunk].copy();
                flip.applyInPlace(copy);
                kernel.energies(copy, a, 0);
                int8EdgeList(this, chunk, b);
                ejmlSparse(this, chunk, c);
                double[] e = exact.energies(copy);
                for (int r = 0; r < CHUNK; r++) {
                    double scale = 1e-9 * (1 + Math.abs(e[r]));
                    if (Math.abs(a[r] - e[r]) > kernel.tolerance() || b[r] != e[r] || Math.abs(c[r] - e[r]) > scale) {
                        throw new IllegalStateException("read " + (chunk * CHUNK + r) + ": bit-sliced " + a[r] + ", int8 "
                                + b[r] + ", EJML " + c[r] + ", exact " + e[r]);
                    }
                }
            }
        }
    }

    /** Blocks of the same size for the un-gauge and plain-read comparison. */
    @State(Scope.Thread)
    public static class Words {
        SampleBlock[] blocks;
        SampleBlock out;
        SpinFlip flip;
        int cursor;

        @Setup
        public void setup() {
            UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED + 1);
            int n = CELLS * CELLS * 8;
            blocks = new SampleBlock[READS / CHUNK];
            for (int b = 0; b < blocks.length; b++) {
                blocks[b] = SampleBlock.allDown(CHUNK, n);
                long[] w = blocks[b].words();
                for (int i = 0; i < w.length; i++) {
                    w[i] = rng.nextLong();
                }
            }
            out = SampleBlock.allDown(CHUNK, n);
            byte[] g = new byte[n];
            for (int k = 0; k < n; k++) {
                g[k] = (byte) (rng.nextBoolean() ? 1 : -1);
            }
            flip = SpinFlip.ofSigns(g);
        }

        SampleBlock next() {
            int c = cursor;
            cursor = c + 1 == blocks.length ? 0 : c + 1;
            return blocks[c];
        }
    }

    /** K4,4 cells on a grid; qubits 0–3 of a cell couple down the column, 4–7 along the row. */
    static IsingProblem cellGrid(UniformRandomProvider rng, boolean gaussian) {
        IsingBuilder b = IsingProblem.builder();
        for (int r = 0; r < CELLS; r++) {
            for (int c = 0; c < CELLS; c++) {
                int base = (r * CELLS + c) * 8;
                for (int q = 0; q < 8; q++) {
                    b.field(base + q, gaussian ? 0.5 * gaussian(rng) : (rng.nextBoolean() ? 1 : -1));
                }
                for (int a = 0; a < 4; a++) {
                    for (int d = 4; d < 8; d++) {
                        b.coupling(base + a, base + d, value(rng, gaussian));
                    }
                }
                for (int a = 0; a < 4; a++) {
                    if (r + 1 < CELLS) {
                        b.coupling(base + a, base + CELLS * 8 + a, value(rng, gaussian));
                    }
                    if (c + 1 < CELLS) {
                        b.coupling(base + 4 + a, base + 8 + 4 + a, value(rng, gaussian));
                    }
                }
            }
        }
        return b.build();
    }

    private static double value(UniformRandomProvider rng, boolean gaussian) {
        return gaussian ? gaussian(rng) : rng.nextBoolean() ? 1 : -1;
    }

    private static double gaussian(UniformRandomProvider rng) {
        return Math.sqrt(-2 * Math.log(1 - rng.nextDouble())) * Math.cos(2 * Math.PI * rng.nextDouble());
    }

    @Benchmark
    public void bitSliced(Problem p, Blackhole bh) {
        SampleBlock block = p.blocks[p.next()];
        p.flip.applyInPlace(block);
        p.kernel.energies(block, p.energies, 0);
        bh.consume(p.energies);
    }

    /** The exact path (what audits use), for reference. */
    @Benchmark
    public void bitSlicedExact(Problem p, Blackhole bh) {
        SampleBlock block = p.blocks[p.next()];
        p.flip.applyInPlace(block);
        p.exact.energies(block, p.energies, 0);
        bh.consume(p.energies);
    }

    @Benchmark
    public void int8EdgeList(Problem p, Blackhole bh) {
        int8EdgeList(p, p.next(), p.energies);
        bh.consume(p.energies);
    }

    /** Un-gauges each read of a chunk into one byte per spin, then sums fields and the edge list. */
    static void int8EdgeList(Problem p, int chunk, double[] out) {
        int n = p.n;
        byte[] raw = p.raw;
        byte[] g = p.gauge;
        byte[] s = p.row;
        double[] h = p.h;
        int[] u = p.edgeU;
        int[] v = p.edgeV;
        double[] j = p.j;
        for (int r = 0; r < CHUNK; r++) {
            int at = (chunk * CHUNK + r) * n;
            for (int k = 0; k < n; k++) {
                s[k] = (byte) (raw[at + k] * g[k]);
            }
            double e = 0;
            for (int k = 0; k < n; k++) {
                e += h[k] * s[k];
            }
            for (int c = 0; c < u.length; c++) {
                e += j[c] * (s[u[c]] * s[v[c]]);
            }
            out[r] = e + p.offset;
        }
    }

    @Benchmark
    public void ejmlSparse(Problem p, Blackhole bh) {
        ejmlSparse(p, p.next(), p.energies);
        bh.consume(p.energies);
    }

    /** Un-gauges a chunk into a dense n × 64 batch, multiplies by the sparse J, reduces per read. */
    static void ejmlSparse(Problem p, int chunk, double[] out) {
        int n = p.n;
        double[] s = p.batch.data;
        double[] y = p.product.data;
        byte[] raw = p.raw;
        byte[] g = p.gauge;
        for (int c = 0; c < CHUNK; c++) {
            int at = (chunk * CHUNK + c) * n;
            for (int k = 0; k < n; k++) {
                s[k * CHUNK + c] = raw[at + k] * g[k];
            }
        }
        CommonOps_DSCC.mult(p.upper, p.batch, p.product);
        for (int c = 0; c < CHUNK; c++) {
            out[c] = p.offset;
        }
        for (int k = 0; k < n; k++) {
            double hk = p.h[k];
            int row = k * CHUNK;
            for (int c = 0; c < CHUNK; c++) {
                out[c] += s[row + c] * (hk + y[row + c]);
            }
        }
    }

    @Benchmark
    public long plainRead(Words w) {
        long[] a = w.next().words();
        long x = 0;
        for (long v : a) {
            x ^= v;
        }
        return x;
    }

    @Benchmark
    public void ungaugeInPlace(Words w, Blackhole bh) {
        SampleBlock b = w.next();
        w.flip.applyInPlace(b);
        bh.consume(b);
    }

    @Benchmark
    public void ungaugeInto(Words w, Blackhole bh) {
        w.flip.apply(w.next(), w.out);
        bh.consume(w.out);
    }

    /**
     * Runs the benchmarks (JMH command-line options apply) and prints samples per second and the
     * ratios. Each operation is one chunk of {@value #CHUNK} reads; the figures use the median
     * time of an operation, which a shared machine's preemptions disturb far less than the mean.
     */
    public static void main(String[] args) throws Exception {
        CommandLineOptions cli = new CommandLineOptions(args);
        Options opts = new OptionsBuilder().parent(cli).include(UngaugeEnergyBench.class.getName() + "\\.").build();
        Collection<RunResult> results = new Runner(opts).run();
        Map<String, double[]> micros = new LinkedHashMap<>();
        for (RunResult r : results) {
            String name = r.getParams().getBenchmark();
            name = name.substring(name.lastIndexOf('.') + 1);
            String param = r.getParams().getParam("couplings");
            org.openjdk.jmh.util.Statistics st = r.getPrimaryResult().getStatistics();
            micros.put(param == null ? name : name + "/" + param, new double[] {st.getPercentile(50), st.getMean()});
        }
        List<String> lines = new ArrayList<>();
        lines.add(String.format("%nUn-gauge + energy on %d qubits, %d reads per operation; samples/s from the median"
                + " (mean) time per operation:", CELLS * CELLS * 8, CHUNK));
        for (String c : new String[] {"gaussian", "plusminus1"}) {
            double[] bits = micros.get("bitSliced/" + c);
            double[] base = micros.get("int8EdgeList/" + c);
            double[] ejml = micros.get("ejmlSparse/" + c);
            if (bits == null || base == null || ejml == null) {
                continue;
            }
            lines.add(String.format("  %-10s bit-sliced %,11.0f (%,11.0f)  int8 %,9.0f (%,9.0f)  EJML %,9.0f (%,9.0f)",
                    c, rate(bits[0]), rate(bits[1]), rate(base[0]), rate(base[1]), rate(ejml[0]), rate(ejml[1])));
            lines.add(String.format("  %-10s bit-sliced / int8 %6.1fx (%6.1fx)   bit-sliced / EJML %6.1fx (%6.1fx)", "",
                    base[0] / bits[0], base[1] / bits[1], ejml[0] / bits[0], ejml[1] / bits[1]));
            double[] exact = micros.get("bitSlicedExact/" + c);
            if (exact != null) {
                lines.add(String.format("  %-10s exact path %,11.0f (%,11.0f): %4.1fx the int8 baseline", "", rate(exact[0]),
                        rate(exact[1]), base[0] / exact[0]));
            }
        }
        double[] read = micros.get("plainRead");
        if (read != null) {
            double bytes = (double) CELLS * CELLS * 8 * 8;
            for (String u : new String[] {"ungaugeInPlace", "ungaugeInto"}) {
                double[] f = micros.get(u);
                if (f != null) {
                    lines.add(String.format("  %-15s %6.2f GB/s, plain read %6.2f GB/s: %5.1f %% (mean: %5.1f %%)", u,
                            bytes / f[0] / 1e3, bytes / read[0] / 1e3, 100 * read[0] / f[0], 100 * read[1] / f[1]));
                }
            }
        }
        lines.forEach(System.out::println);
    }

    private static double rate(double microsPerChunk) {
        return CHUNK / microsPerChunk * 1e6;
    }
}
