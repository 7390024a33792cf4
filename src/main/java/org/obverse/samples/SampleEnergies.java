package org.obverse.samples;

import org.obverse.model.IsingProblem;

/**
 * Exact energies of the reads of a block: per read, the same value bit for bit as
 * {@link IsingProblem#energy(byte[])} (fields in position order, then couplers in coupler
 * order, then the offset). This is the path audits trust; faster kernels are compared with it.
 */
public final class SampleEnergies {
    private SampleEnergies() {
    }

    /** Output: energies[r] for each read r of the block (energies.length ≥ reads). */
    public static void exact(IsingProblem p, SampleBlock block, double[] energies) {
        int n = block.variables();
        if (n != p.size()) {
            throw new IllegalArgumentException("block has " + n + " spins per read for a problem of " + p.size());
        }
        double[] h = p.fields();
        double[] j = p.couplings();
        int[] u = p.edgeUs();
        int[] v = p.edgeVs();
        double offset = p.offset();
        long[] w = block.words();
        for (int r = 0; r < block.reads(); r++) {
            int base = (r >>> 6) * n;
            int shift = r & 63;
            double sum = 0.0;
            for (int k = 0; k < n; k++) {
                sum += h[k] * (int) ((((w[base + k] >>> shift) & 1L) << 1) - 1);
            }
            for (int e = 0; e < j.length; e++) {
                long x = (w[base + u[e]] ^ w[base + v[e]]) >>> shift;
                sum += j[e] * (int) (1 - ((x & 1L) << 1));
            }
            energies[r] = sum + offset;
        }
    }
}
