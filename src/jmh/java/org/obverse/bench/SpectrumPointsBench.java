package org.obverse.bench;

import java.util.Collection;
import java.util.Locale;
import java.util.concurrent.TimeUnit;
import org.obverse.model.IsingProblem;
import org.obverse.spectrum.AnnealOperator;
import org.obverse.spectrum.LanczosLevelSolver;
import org.obverse.spectrum.ScanSettings;
import org.obverse.spectrum.SectorBasis;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.openjdk.jmh.results.RunResult;
import org.openjdk.jmh.runner.Runner;
import org.openjdk.jmh.runner.options.OptionsBuilder;

/**
 * The Lanczos solver along a warm 40-point scan (four lowest levels of a 16-spin problem with
 * fields, 2^16 states, s from 0.2 to 1: past the driver's degenerate start, which the scan
 * handles with its own start vectors; without them the levels inside the driver's cluster
 * stall and this would time the block widening instead), each point seeded with the sum of the previous point's
 * eigenvectors, for the former minimum basis (12 vectors, the baseline) and today's default.
 * Single-shot: one op is one scan. Run {@code main} for the time and the products H·x per
 * point of each, and the ratio.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 1)
@Measurement(iterations = 3)
public class SpectrumPointsBench {
    static final int POINTS = 40;

    @Param({"12", "16"})
    public int minimumBasis;

    private SectorBasis basis;
    private double[] grid;
    private LanczosLevelSolver solver;

    @Setup
    public void setup() {
        IsingProblem p = SpectrumBench.problem(16, true, 20261202L);
        basis = SectorBasis.of(p, SectorBasis.Sector.REACHABLE);
        double[] uniform = ScanSettings.defaults().withPoints(POINTS).grid();
        grid = new double[POINTS];
        for (int r = 0; r < POINTS; r++) {
            grid[r] = 0.2 + 0.8 * uniform[r];
        }
        solver = LanczosLevelSolver.create().withMinimumBasis(minimumBasis);
    }

    /** Products H·x of the whole scan. */
    @Benchmark
    public long scan() {
        long products = 0;
        double[] seed = null;
        int d = basis.dimension();
        for (double s : grid) {
            AnnealOperator op = AnnealOperator.of(basis, 1 - s, s);
            LanczosLevelSolver.Solution sol = solver.lowestWithVectors(op, 4, seed == null ? null : new double[][] {seed});
            products += sol.products();
            seed = new double[d];
            for (double[] v : sol.vectors()) {
                for (int i = 0; i < d; i++) {
                    seed[i] += v[i];
                }
            }
        }
        return products;
    }

    /** Runs both configurations and prints time and products per point, and the ratios. */
    public static void main(String[] args) throws Exception {
        Collection<RunResult> results = new Runner(new OptionsBuilder()
                .include(SpectrumPointsBench.class.getName() + "\\.").forks(1).build()).run();
        double[] ms = new double[2];
        long[] products = new long[2];
        for (RunResult r : results) {
            int basis = Integer.parseInt(r.getParams().getParam("minimumBasis"));
            ms[basis == 12 ? 0 : 1] = r.getPrimaryResult().getScore();
        }
        for (int c = 0; c < 2; c++) {
            SpectrumPointsBench b = new SpectrumPointsBench();
            b.minimumBasis = c == 0 ? 12 : LanczosLevelSolver.DEFAULT_MINIMUM_BASIS;
            b.setup();
            products[c] = b.scan();
        }
        System.out.printf(Locale.ROOT, "warm %d-point scan, 2^16 states, 4 levels:%n", POINTS);
        System.out.printf(Locale.ROOT, "  basis 12 (baseline): %.1f ms/point, %.0f products/point%n",
                ms[0] / POINTS, products[0] / (double) POINTS);
        System.out.printf(Locale.ROOT, "  basis %d (default) : %.1f ms/point, %.0f products/point (%.2fx faster)%n",
                LanczosLevelSolver.DEFAULT_MINIMUM_BASIS, ms[1] / POINTS, products[1] / (double) POINTS, ms[0] / ms[1]);
    }
}
