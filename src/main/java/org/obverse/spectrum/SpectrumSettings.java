package org.obverse.spectrum;

/**
 * How the levels are computed: how many (at least; more are taken where the ground manifold
 * needs them), by which solver, to which Lanczos tolerance, in which sector.
 */
public record SpectrumSettings(int levels, SolverChoice solver, double tolerance, SectorBasis.Sector sector) {
    /** Validates once. */
    public SpectrumSettings {
        if (levels < 2 || levels > 64) {
            throw new IllegalArgumentException("levels " + levels + " must lie in 2..64");
        }
        if (!(tolerance >= 1e-14 && tolerance <= 1e-2)) {
            throw new IllegalArgumentException("tolerance " + tolerance + " must lie in [1e-14, 1e-2]");
        }
        if (solver == null || sector == null) {
            throw new IllegalArgumentException("solver and sector must be given");
        }
    }

    /** Four levels, AUTO solver, Lanczos tolerance {@link LanczosLevelSolver#DEFAULT_TOLERANCE}, the reachable sector. */
    public static SpectrumSettings defaults() {
        return new SpectrumSettings(4, SolverChoice.AUTO, LanczosLevelSolver.DEFAULT_TOLERANCE,
                SectorBasis.Sector.REACHABLE);
    }

    /** The same with another level count. */
    public SpectrumSettings withLevels(int count) {
        return new SpectrumSettings(count, solver, tolerance, sector);
    }

    /** The same with another solver. */
    public SpectrumSettings withSolver(SolverChoice choice) {
        return new SpectrumSettings(levels, choice, tolerance, sector);
    }

    /** The same with another sector. */
    public SpectrumSettings withSector(SectorBasis.Sector kind) {
        return new SpectrumSettings(levels, solver, tolerance, kind);
    }
}
