package org.obverse.spectrum;

import java.util.ArrayList;
import java.util.List;
import java.util.function.IntConsumer;
import org.obverse.anneal.EnergyScales;
import org.obverse.model.IsingProblem;

/**
 * The low spectrum of the anneal Hamiltonian H(s) = -(A(s)/2) Σ σˣ_i + (B(s)/2) H_P(σᶻ) of one
 * problem under one schedule, in the sector the anneal can reach ({@link SectorBasis}).
 *
 * <p><b>The relevant gap.</b> Let g be the number of sector states whose problem energy equals
 * the ground energy (within {@link SectorBasis#DEGENERACY_TOLERANCE}): the levels E_0 … E_{g−1}
 * merge into the ground manifold at s = 1, and ending in any of them solves the problem. The
 * relevant gap is Δ(s) = E_g(s) − E_0(s): from the ground level to the first level that lies in
 * the reachable sector and does not end in the ground manifold. Levels of one symmetry sector
 * do not cross generically (avoided crossings; von Neumann and Wigner, Phys. Z. 30, 467,
 * 1929), so index order follows each level along s.
 *
 * <p>Immutable; each call solves afresh (cost: one eigensolve per value of s; within a scan or
 * a refinement the Lanczos solves are warm-started from the previous s).
 */
public final class AnnealSpectrum {
    /** Most levels the Lanczos solver is asked for (ground manifold included). */
    public static final int MAX_LANCZOS_LEVELS = 64;

    private final SectorBasis basis;
    private final EnergyScales schedule;
    private final LevelSolver solver;
    private final int levelCount;
    private final int relevant;

    private AnnealSpectrum(SectorBasis basis, EnergyScales schedule, LevelSolver solver, int levelCount,
                           int relevant) {
        this.basis = basis;
        this.schedule = schedule;
        this.solver = solver;
        this.levelCount = levelCount;
        this.relevant = relevant;
    }

    /**
     * The spectrum of a problem under a schedule.
     *
     * @throws SpectrumLimitException when the sector is too large for the chosen solver (the
     *         message names the limit and the memory it would need)
     * @throws IllegalArgumentException when the sector has no level above the ground manifold
     */
    public static AnnealSpectrum of(IsingProblem problem, EnergyScales schedule, SpectrumSettings settings) {
        int m = SectorBasis.storedSpins(problem, settings.sector());
        LevelSolver solver = settings.solver().solverFor(m, settings.tolerance());
        if (m > solver.maxStoredSpins()) {
            throw SpectrumLimitException.of(solver.name(), problem.size(), m, solver.maxStoredSpins(),
                    solver.memoryBytes(m, settings.levels()));
        }
        SectorBasis basis = SectorBasis.of(problem, settings.sector());
        int g = basis.groundDegeneracy();
        if (g >= basis.dimension()) {
            throw new IllegalArgumentException("every one of the " + basis.dimension() + " states of the sector has"
                    + " the ground energy: the problem has no excited level and so no gap");
        }
        int count = Math.min(basis.dimension(), Math.max(settings.levels(), g + 1));
        if (solver instanceof LanczosLevelSolver && count > MAX_LANCZOS_LEVELS) {
            throw new IllegalArgumentException("the ground manifold holds " + g + " sector states, so " + count
                    + " levels are needed; the Lanczos solver is limited to " + MAX_LANCZOS_LEVELS);
        }
        return new AnnealSpectrum(basis, schedule, solver, count, g);
    }

    /** The sector basis. */
    public SectorBasis basis() {
        return basis;
    }

    /** The schedule. */
    public EnergyScales schedule() {
        return schedule;
    }

    /** The solver in use. */
    public LevelSolver solver() {
        return solver;
    }

    /** Levels computed at each s: the requested count, raised to g + 1 where needed. */
    public int levelCount() {
        return levelCount;
    }

    /** Index g of the relevant level (the ground manifold's size in the sector). */
    public int relevantLevel() {
        return relevant;
    }

    /** The operator H(s). */
    public AnnealOperator operator(double s) {
        return AnnealOperator.of(basis, schedule.a(s), schedule.b(s));
    }

    /** The lowest {@link #levelCount()} levels at s, ascending. */
    public double[] levels(double s) {
        return solver.lowest(operator(s), levelCount);
    }

    /** The relevant gap E_g(s) − E_0(s). */
    public double gap(double s) {
        double[] e = levels(s);
        return e[relevant] - e[0];
    }

    /**
     * Levels and gaps on a grid (values in [0, 1], ascending). With the Lanczos solver each
     * point is warm-started from the eigenvectors of the one before (see {@link Path}).
     */
    public GapScan scan(double[] grid) {
        return scan(grid, null);
    }

    /** The same, telling pointsDone (if not null) how many grid points are solved after each. */
    public GapScan scan(double[] grid, IntConsumer pointsDone) {
        double[][] levels = new double[grid.length][];
        double[] gap = new double[grid.length];
        Path path = new Path();
        for (int r = 0; r < grid.length; r++) {
            if (r > 0 && !(grid[r] > grid[r - 1])) {
                throw new IllegalArgumentException("s grid must increase strictly; s[" + r + "] = " + grid[r]);
            }
            levels[r] = path.levels(grid[r]);
            gap[r] = levels[r][relevant] - levels[r][0];
            if (pointsDone != null) {
                pointsDone.accept(r + 1);
            }
        }
        return new GapScan(grid.clone(), levels, gap);
    }

    /**
     * Refines the scan's smallest gap by golden-section search over the bracket of its two grid
     * neighbours (the gap is taken to have one minimum there) until the bracket is at most
     * 2·sTolerance wide.
     */
    public MinimumGap minimumGap(GapScan scan, double sTolerance) {
        return refine(scan, scan.minimumRow(), sTolerance);
    }

    /**
     * Refines the minimum at grid row r by golden-section search over the bracket of its two
     * grid neighbours (the gap is taken to have one minimum there) until the bracket is at most
     * 2·sTolerance wide.
     */
    MinimumGap refine(GapScan scan, int r, double sTolerance) {
        int last = scan.points() - 1;
        double lo = scan.s(Math.max(0, r - 1));
        double hi = scan.s(Math.min(last, r + 1));
        double bestS = scan.s(r);
        double bestGap = scan.gap(r);
        double invPhi = (Math.sqrt(5.0) - 1.0) / 2.0;
        double a = lo;
        double b = hi;
        double c = b - invPhi * (b - a);
        double d = a + invPhi * (b - a);
        Path path = new Path();
        double fc = path.gap(c);
        double fd = path.gap(d);
        double[] best = {bestS, bestGap};
        keep(best, c, fc);
        keep(best, d, fd);
        while (b - a > 2 * sTolerance) {
            if (fc < fd) {
                b = d;
                d = c;
                fd = fc;
                c = b - invPhi * (b - a);
                fc = path.gap(c);
                keep(best, c, fc);
            } else {
                a = c;
                c = d;
                fc = fd;
                d = a + invPhi * (b - a);
                fd = path.gap(d);
                keep(best, d, fd);
            }
        }
        double spread = Math.max(Math.abs(fc - best[1]), Math.abs(fd - best[1]));
        double solverError = 2 * solver.tolerance() * Math.max(1.0, operator(best[0]).normBound());
        double sTol = Math.max((b - a) / 2, Math.abs(best[0] - 0.5 * (a + b)));
        boolean edge = best[0] <= scan.s(0) + 2 * sTolerance || best[0] >= scan.s(last) - 2 * sTolerance;
        return new MinimumGap(best[0], sTol, best[1], spread + solverError, edge);
    }

    private static void keep(double[] best, double s, double gap) {
        if (gap < best[1]) {
            best[0] = s;
            best[1] = gap;
        }
    }

    /**
     * The pause window after the minimum (see {@link PauseWindow}): each end is the first grid
     * crossing of its ratio after s*, refined by bisection.
     */
    public PauseWindow pauseWindow(GapScan scan, MinimumGap minimum, ScanSettings settings) {
        return pauseWindow(scan, minimum.sStar(), minimum.gapMin(), scan.points() - 1, settings);
    }

    // The window after a minimum (s, gap), searched on grid rows up to lastRow: where the gap
    // does not reach a ratio by then, that end is cut at lastRow's s and flagged capped.
    private PauseWindow pauseWindow(GapScan scan, double s, double gap, int lastRow, ScanSettings settings) {
        double[] from = crossing(scan, s, settings.pauseFromRatio() * gap, settings.pauseTolerance(), lastRow);
        double[] to = crossing(scan, from[0], settings.pauseToRatio() * gap, settings.pauseTolerance(), lastRow);
        return new PauseWindow(from[0], to[0], settings.pauseFromRatio(), settings.pauseToRatio(),
                settings.pauseTolerance(), from[1] != 0, to[1] != 0);
    }

    // First s ≥ start where the gap reaches target, on rows up to lastRow: {s, capped ? 1 : 0}.
    private double[] crossing(GapScan scan, double start, double target, double tolerance, int lastRow) {
        double prev = start;
        for (int r = 0; r <= lastRow; r++) {
            double s = scan.s(r);
            if (s <= start) {
                continue;
            }
            if (scan.gap(r) >= target) {
                double lo = prev;
                double hi = s;
                Path path = new Path();
                if (path.gap(lo) >= target) {
                    return new double[] {lo, 0};
                }
                while (hi - lo > tolerance) {
                    double mid = 0.5 * (lo + hi);
                    if (path.gap(mid) >= target) {
                        hi = mid;
                    } else {
                        lo = mid;
                    }
                }
                return new double[] {hi, 0};
            }
            prev = s;
        }
        return new double[] {Math.max(start, scan.s(lastRow)), 1};
    }

    /**
     * Solves at a sequence of nearby s, each Lanczos solve seeded with the eigenvectors of the
     * one before: where the levels move little between steps the seeds are nearly converged
     * and only the confirmation run of a cold solve remains. Near s = 0, where the driver's
     * degenerate levels split into tight clusters, the first solves start from the driver's
     * closed-form eigenvectors in the combinations first-order perturbation theory picks
     * ({@link DriverStart}). The accuracy is the solver's own
     * (every level is converged and confirmed afresh); results may differ from cold solves
     * within the tolerance. Other solvers solve each s cold. Not thread-safe: one per path.
     */
    private final class Path {
        // The sum of the last solve's eigenvectors: all the warm start uses (one vector kept).
        private double[] seed;
        // Whether the vectors belong to the pure driver (B = 0): any basis of its degenerate
        // levels, not the combinations that small B picks.
        private boolean pureDriver;

        double[] levels(double s) {
            AnnealOperator op = operator(s);
            if (!(solver instanceof LanczosLevelSolver lanczos)) {
                return solver.lowest(op, levelCount);
            }
            double[] start = seed;
            int want = levelCount;
            // Near the driver, (B/2)·scale below A: the wanted levels end inside a tight cluster
            // grown out of a degenerate driver level, so ask for the whole cluster (its edge
            // is a gap of about A); start from the driver's eigenvectors split by first-order
            // perturbation theory where there is nothing better.
            if (op.problemCoefficient() * basis.energyScale() < -2.0 * op.driverCoefficient()) {
                int cover = DriverStart.groupCover(basis, levelCount);
                if (cover <= MAX_LANCZOS_LEVELS && 8.0 * cover * basis.dimension() <= LanczosLevelSolver.BASIS_BYTES / 2) {
                    want = cover;
                }
                if (start == null || pureDriver) {
                    start = DriverStart.seed(basis, want);
                }
            }
            LanczosLevelSolver.Solution solution = lanczos.lowestWithVectors(op, want,
                    start == null ? null : new double[][] {start});
            seed = sum(solution.vectors(), basis.dimension());
            pureDriver = op.problemCoefficient() == 0.0;
            return java.util.Arrays.copyOf(solution.values(), levelCount);
        }

        private static double[] sum(double[][] vectors, int dim) {
            double[] total = new double[dim];
            for (double[] v : vectors) {
                Vectors.axpy(1.0, v, total, dim);
            }
            return total;
        }

        double gap(double s) {
            double[] e = levels(s);
            return e[relevant] - e[0];
        }
    }

    /**
     * Every dip of the scan's gap ({@link GapDip}), in the order of s: the local minima at least
     * {@link #dipDepthFloor} deep, each refined as {@link #minimumGap} refines the global one,
     * with its pause window. The window of a dip is searched up to the highest grid point
     * between it and the next dip (s = 1 for the last). The dip at the grid row of the global
     * minimum reuses {@code minimum} (the same computation).
     */
    public List<GapDip> dips(GapScan scan, MinimumGap minimum, ScanSettings settings) {
        List<DipSearch.Candidate> found = DipSearch.candidates(scan.gaps(), dipDepthFloor(scan, settings));
        int globalRow = scan.minimumRow();
        List<GapDip> dips = new ArrayList<>(found.size());
        for (int k = 0; k < found.size(); k++) {
            DipSearch.Candidate c = found.get(k);
            MinimumGap m = c.row() == globalRow ? minimum : refine(scan, c.row(), settings.sTolerance());
            int lastRow = scan.points() - 1;
            if (k + 1 < found.size()) {
                lastRow = c.row();
                int next = found.get(k + 1).row();
                for (int r = c.row() + 1; r < next; r++) {
                    if (scan.gap(r) > scan.gap(lastRow)) {
                        lastRow = r;
                    }
                }
            }
            PauseWindow pause = pauseWindow(scan, m.sStar(), m.gapMin(), lastRow, settings);
            dips.add(new GapDip(m.sStar(), m.sTolerance(), m.gapMin(), m.gapTolerance(), c.depthBelow(m.gapMin()),
                    c.atEnd(), pause));
        }
        return dips;
    }

    /**
     * The noise rule for dips: {@link ScanSettings#dipDepth()} times the largest gap on the grid,
     * and at least ten times the solver's accuracy (twice its tolerance times the operator's
     * norm bound at the ends of the anneal).
     */
    public double dipDepthFloor(GapScan scan, ScanSettings settings) {
        double largest = 0;
        for (int r = 0; r < scan.points(); r++) {
            largest = Math.max(largest, scan.gap(r));
        }
        double norm = Math.max(1.0, Math.max(operator(0.0).normBound(), operator(1.0).normBound()));
        return Math.max(settings.dipDepth() * largest, 20 * solver.tolerance() * norm);
    }

    /** Scan, refine the minimum, find every dip and suggest the pause window. */
    public SpectrumAnalysis analyse(ScanSettings settings) {
        return analyse(settings, null);
    }

    /**
     * The same, telling pointsDone (if not null) how many grid points of the scan are solved
     * (the refinements after the scan cost about a fifth of a 101-point scan per dip).
     */
    public SpectrumAnalysis analyse(ScanSettings settings, IntConsumer pointsDone) {
        GapScan scan = scan(settings.grid(), pointsDone);
        MinimumGap minimum = minimumGap(scan, settings.sTolerance());
        List<GapDip> dips = dips(scan, minimum, settings);
        int suggested = SpectrumAnalysis.suggestedDip(dips);
        PauseWindow pause = suggested >= 0 ? dips.get(suggested).pause() : pauseWindow(scan, minimum, settings);
        return new SpectrumAnalysis(scan, minimum, pause, dips, suggested);
    }
}
