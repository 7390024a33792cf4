package org.obverse.spectrum;

/**
 * Computes the lowest levels of an {@link AnnealOperator}. Implementations: a dense symmetric
 * eigendecomposition ({@link DenseLevelSolver}) and a matrix-free Lanczos solver
 * ({@link LanczosLevelSolver}).
 */
public interface LevelSolver {
    /** Short name for outputs ("dense", "lanczos"). */
    String name();

    /** Largest number of stored spins (log2 of the sector dimension) this solver accepts. */
    int maxStoredSpins();

    /** Bytes of working memory the solver would need for a sector of dimension 2^m. */
    long memoryBytes(int storedSpins, int levels);

    /** Absolute accuracy of each level as a multiple of max(1, ‖H‖), stated for outputs. */
    double tolerance();

    /**
     * The lowest min(count, dimension) eigenvalues, ascending, with multiplicity.
     *
     * @throws SpectrumLimitException when the sector is larger than {@link #maxStoredSpins()}
     */
    double[] lowest(AnnealOperator operator, int count);

    /** Refuses a sector that is too large, naming the limit and the memory it would take. */
    default void checkSize(SectorBasis basis, int levels) {
        int m = basis.storedSpins();
        if (m > maxStoredSpins()) {
            throw SpectrumLimitException.of(name(), basis.spins(), m, maxStoredSpins(), memoryBytes(m, levels));
        }
    }
}
