package org.obverse.samples;

import org.obverse.model.IsingProblem;

/**
 * Exact energies of the reads of a block in one call: per read, the same value bit for bit as
 * {@link IsingProblem#energy(byte[])} (fields in position order, then couplers in coupler
 * order, then the offset). This is the path audits trust. A convenience over
 * {@link EnergyKernel#exact}, which holds the kernel; a caller that scores many blocks of one
 * problem should make the kernel once.
 */
public final class SampleEnergies {
    private SampleEnergies() {
    }

    /** Output: energies[r] for each read r of the block (energies.length ≥ reads). */
    public static void exact(IsingProblem p, SampleBlock block, double[] energies) {
        EnergyKernel.exact(p).energies(block, energies, 0);
    }
}
