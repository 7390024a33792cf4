package org.obverse.bench;

import java.util.Collection;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.TimeUnit;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.obverse.stats.BinomialSampler;
import org.obverse.stats.BootstrapPlan;
import org.obverse.stats.BootstrapResult;
import org.obverse.stats.Campaign;
import org.obverse.stats.HierarchicalBootstrap;
import org.obverse.stats.Resampling;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.results.RunResult;
import org.openjdk.jmh.runner.Runner;
import org.openjdk.jmh.runner.options.OptionsBuilder;
import org.openjdk.jmh.runner.options.TimeValue;

/**
 * The hierarchical bootstrap on 10^3 instances × 10^2 gauges × 10^3 reads per gauge, held as
 * counts (10^5 gauge slots; the 10^8 reads are never materialised). One op of
 * {@code hierarchical} is {@link #REPLICATES} replicates (with the per-run sampler set-up,
 * measured alone by {@code samplerSetup});
 * the plain baselines are one replicate each: {@code perReadBaseline} redraws every read as a
 * Bernoulli trial (the naive way to resample reads from counts) and {@code drawsOnlyBaseline}
 * draws one gauge index and one uniform per slot (the floor of any scheme that touches every
 * gauge). Run {@code main} to print the per-replicate figures and their ratios.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class BootstrapBench {
    static final int INSTANCES = 1000;
    static final int GAUGES = 100;
    static final int READS = 1000;
    static final int REPLICATES = 20;

    @Param({"1", "2"})
    public int threads;

    /** The resampling scheme (spec/results.md): the default redraws instances only. */
    @Param({"instances", "instances-then-gauges", "reads-only"})
    public String scheme;

    private Campaign campaign;
    private long[] reads;
    private double[] p;

    @Setup
    public void setup() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(20261201L);
        Campaign.Builder b = Campaign.builder();
        reads = new long[INSTANCES * GAUGES];
        p = new double[INSTANCES * GAUGES];
        int k = 0;
        for (int i = 0; i < INSTANCES; i++) {
            String inst = "i" + i;
            b.ground(inst, -1, true);
            // Instance hardness spread over three decades of success probability.
            double base = Math.pow(10, -3 * rng.nextDouble());
            for (int g = 0; g < GAUGES; g++) {
                double pg = Math.min(1, base * (0.5 + rng.nextDouble()));
                long succ = BinomialSampler.of(READS, pg).sample(rng);
                b.add(inst, "s", g, READS, succ, 0, 20.0 * READS, 0, -1);
                reads[k] = READS;
                p[k++] = (double) succ / READS;
            }
        }
        campaign = b.build();
    }

    @Benchmark
    public BootstrapResult hierarchical() {
        return HierarchicalBootstrap.run(campaign,
                new BootstrapPlan(7, REPLICATES, 0.5, 0.99, Resampling.of(scheme), threads, List.of()), null);
    }

    @Benchmark
    public long samplerSetup() {
        long total = 0;
        for (int k = 0; k < p.length; k++) {
            total += BinomialSampler.of(reads[k], p[k]).trials();
        }
        return total;
    }

    @Benchmark
    public long perReadBaseline() {
        UniformRandomProvider rng = HierarchicalBootstrap.stream(7, 0);
        long total = 0;
        for (int i = 0; i < INSTANCES; i++) {
            int inst = rng.nextInt(INSTANCES);
            for (int g = 0; g < GAUGES; g++) {
                int slot = inst * GAUGES + rng.nextInt(GAUGES);
                double q = p[slot];
                long n = reads[slot];
                for (long r = 0; r < n; r++) {
                    if (rng.nextDouble() < q) {
                        total++;
                    }
                }
            }
        }
        return total;
    }

    @Benchmark
    public double drawsOnlyBaseline() {
        UniformRandomProvider rng = HierarchicalBootstrap.stream(7, 0);
        double total = 0;
        for (int i = 0; i < INSTANCES; i++) {
            int inst = rng.nextInt(INSTANCES);
            for (int g = 0; g < GAUGES; g++) {
                int slot = inst * GAUGES + rng.nextInt(GAUGES);
                total += rng.nextDouble() * p[slot];
            }
        }
        return total;
    }

    /** Runs the three benchmarks briefly and prints per-replicate times and ratios. */
    public static void main(String[] args) throws Exception {
        Collection<RunResult> results = new Runner(new OptionsBuilder().include(BootstrapBench.class.getName() + "\\.")
                .forks(1).warmupIterations(2).measurementIterations(3).warmupTime(TimeValue.seconds(2))
                .measurementTime(TimeValue.seconds(2)).build()).run();
        double perRead = Double.NaN;
        double drawsOnly = Double.NaN;
        double setup = Double.NaN;
        java.util.Map<String, double[]> hier = new java.util.TreeMap<>();
        for (RunResult r : results) {
            String name = r.getParams().getBenchmark();
            String t = r.getParams().getParam("threads");
            double ms = r.getPrimaryResult().getScore();
            if (name.endsWith("hierarchical")) {
                hier.computeIfAbsent(r.getParams().getParam("scheme"), k -> new double[3])[Integer.parseInt(t)] =
                        ms / REPLICATES;
            } else if (name.endsWith("perReadBaseline") && "1".equals(t)) {
                perRead = ms;
            } else if (name.endsWith("samplerSetup") && "1".equals(t)) {
                setup = ms;
            } else if (name.endsWith("drawsOnlyBaseline") && "1".equals(t)) {
                drawsOnly = ms;
            }
        }
        System.out.printf(Locale.ROOT, "per replicate (10^3 instances x 10^2 gauges x 10^3 reads as counts):%n");
        System.out.printf(Locale.ROOT, "  sampler set-up per run : %.2f ms (once per bootstrap, only when reads are redrawn)%n",
                setup);
        for (java.util.Map.Entry<String, double[]> e : hier.entrySet()) {
            double[] h = e.getValue();
            System.out.printf(Locale.ROOT, "  %-22s: %.3f ms on 1 thread, %.3f ms on 2 (speed-up %.2f); "
                    + "per-read baseline / it = %.1f; it / draws-only floor = %.2f%n", e.getKey(), h[1], h[2],
                    h[1] / h[2], perRead / h[1], h[1] / drawsOnly);
        }
        System.out.printf(Locale.ROOT, "  per-read baseline      : %.2f ms; draws-only floor: %.2f ms%n", perRead, drawsOnly);
    }
}
