package org.obverse.bench;

import java.util.Collection;
import java.util.Locale;
import java.util.concurrent.TimeUnit;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.spectrum.AnnealOperator;
import org.obverse.anneal.EnergyScales;
import org.obverse.spectrum.AnnealSpectrum;
import org.obverse.spectrum.ScanSettings;
import org.obverse.spectrum.SectorBasis;
import org.obverse.spectrum.SolverChoice;
import org.obverse.spectrum.SpectrumSettings;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.results.RunResult;
import org.openjdk.jmh.runner.Runner;
import org.openjdk.jmh.runner.options.OptionsBuilder;
import org.openjdk.jmh.runner.options.TimeValue;

/**
 * The Lanczos solver's matrix-vector product H(s)·x for a 20-spin problem with fields (the
 * full 2^20-state space; a sparse random graph, about 1.5 couplers a spin), in products per
 * second: the kernel on both cores, on one core, and a plain baseline that recomputes H_P of
 * every basis state from the fields and couplers inside the product. Run {@code main} to print
 * the figures and their ratios. {@link SpectrumScanBench} times a whole 100-point scan.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
public class SpectrumBench {
    static final int SPINS = 20;

    private AnnealOperator operator;
    private IsingProblem problem;
    private double[] x;
    private double[] y;
    private double a;
    private double b;

    /** A connected sparse random problem with fields (invented, seeded). */
    static IsingProblem problem(int n, boolean fields, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        IsingBuilder builder = IsingProblem.builder();
        for (int k = 1; k < n; k++) {
            builder.coupling(k - 1, k, rng.nextDouble() * 2 - 1);
        }
        for (int e = 0; e < n / 2; e++) {
            int i = rng.nextInt(n);
            int j = rng.nextInt(n);
            if (Math.abs(i - j) > 1) {
                try {
                    builder.coupling(i, j, rng.nextDouble() * 2 - 1);
                } catch (RuntimeException duplicate) {
                    // drawn twice: keep the first
                }
            }
        }
        for (int k = 0; k < n; k++) {
            builder.field(k, fields ? rng.nextDouble() * 2 - 1 : 0.0);
        }
        return builder.build();
    }

    @Setup
    public void setup() {
        problem = problem(SPINS, true, 20261201L);
        SectorBasis basis = SectorBasis.of(problem, SectorBasis.Sector.REACHABLE);
        a = 0.6;
        b = 0.4;
        operator = AnnealOperator.of(basis, a, b);
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(7L);
        x = new double[basis.dimension()];
        y = new double[basis.dimension()];
        for (int i = 0; i < x.length; i++) {
            x[i] = rng.nextDouble() - 0.5;
        }
    }

    @Benchmark
    public double productBothCores() {
        operator.apply(x, y);
        return y[1];
    }

    @Benchmark
    public double productOneCore() {
        operator.applySingleThreaded(x, y);
        return y[1];
    }

    /** The plain way: H_P of each basis state recomputed from the terms inside the product. */
    @Benchmark
    public double naiveBaseline() {
        int n = problem.size();
        double[] h = problem.fields();
        int[] u = problem.edgeUs();
        int[] v = problem.edgeVs();
        double[] j = problem.couplings();
        int dim = 1 << n;
        for (int s = 0; s < dim; s++) {
            double e = 0.0;
            for (int k = 0; k < n; k++) {
                e += h[k] * (((s >>> k) & 1) == 1 ? 1 : -1);
            }
            for (int c = 0; c < j.length; c++) {
                e += j[c] * ((((s >>> u[c]) ^ (s >>> v[c])) & 1) == 0 ? 1 : -1);
            }
            double flips = 0.0;
            for (int k = 0; k < n; k++) {
                flips += x[s ^ (1 << k)];
            }
            y[s] = 0.5 * b * e * x[s] - 0.5 * a * flips;
        }
        return y[1];
    }

    /** Runs the product benchmarks briefly and prints products per second and the ratios. */
    public static void main(String[] args) throws Exception {
        Collection<RunResult> results = new Runner(new OptionsBuilder().include(SpectrumBench.class.getName() + "\\.")
                .forks(1).warmupIterations(2).measurementIterations(3).warmupTime(TimeValue.seconds(2))
                .measurementTime(TimeValue.seconds(2)).build()).run();
        double both = Double.NaN;
        double one = Double.NaN;
        double naive = Double.NaN;
        for (RunResult r : results) {
            String name = r.getParams().getBenchmark();
            double ops = r.getPrimaryResult().getScore();
            if (name.endsWith("productBothCores")) {
                both = ops;
            } else if (name.endsWith("productOneCore")) {
                one = ops;
            } else if (name.endsWith("naiveBaseline")) {
                naive = ops;
            }
        }
        System.out.printf(Locale.ROOT, "H(s)·x for %d spins (2^%d states):%n", SPINS, SPINS);
        System.out.printf(Locale.ROOT, "  kernel, both cores: %.1f products/s%n", both);
        System.out.printf(Locale.ROOT, "  kernel, one core  : %.1f products/s (both cores give %.2fx)%n", one, both / one);
        System.out.printf(Locale.ROOT, "  naive baseline    : %.1f products/s (kernel on one core is %.2fx faster)%n",
                naive, one / naive);
    }

    /** The scan benchmark's 16-spin problem with fields, Lanczos solver, four levels. */
    static AnnealSpectrum sixteenSpins() {
        IsingProblem p = problem(16, true, 20261202L);
        return AnnealSpectrum.of(p, EnergyScales.illustrative(),
                SpectrumSettings.defaults().withSolver(SolverChoice.LANCZOS));
    }

    /** The 100-point grid of the scan benchmark. */
    static double[] hundredPoints() {
        return ScanSettings.defaults().withPoints(100).grid();
    }
}
