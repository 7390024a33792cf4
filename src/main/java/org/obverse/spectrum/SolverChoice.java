package org.obverse.spectrum;

/** Which eigensolver to use; {@link #AUTO} takes the dense one for small sectors. */
public enum SolverChoice {
    /** Dense for at most {@link #AUTO_DENSE_STORED_SPINS} stored spins, Lanczos above. */
    AUTO,
    /** {@link DenseLevelSolver}. */
    DENSE,
    /** {@link LanczosLevelSolver}. */
    LANCZOS;

    /** Largest sector (log2 of its dimension) that AUTO hands to the dense solver. */
    public static final int AUTO_DENSE_STORED_SPINS = 8;

    /** The solver for a sector of 2^storedSpins states. */
    public LevelSolver solverFor(int storedSpins, double lanczosTolerance) {
        switch (this) {
            case DENSE:
                return DenseLevelSolver.create();
            case LANCZOS:
                return LanczosLevelSolver.of(lanczosTolerance, 1);
            default:
                return storedSpins <= AUTO_DENSE_STORED_SPINS ? DenseLevelSolver.create()
                        : LanczosLevelSolver.of(lanczosTolerance, 1);
        }
    }
}
