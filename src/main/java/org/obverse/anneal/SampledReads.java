package org.obverse.anneal;

import org.obverse.model.VariableIndex;
import org.obverse.samples.SampleBlock;

/**
 * What one call of the sampler returns: the reads, bit-sliced (column k belongs to the k-th
 * smallest variable id; set bit = spin +1, or x = 1 for a binary problem), and the energy of
 * each read under the problem as submitted (without control errors), computed by the
 * problem's own fixed-order energy. The arrays are the caller's to keep.
 *
 * @param variables       the ids of the columns
 * @param samples         the reads
 * @param energies        energy of each read, length reads
 * @param sweeps          Metropolis sweeps per read
 * @param runTimeMicros   run time of one anneal (pause included), for time-to-solution
 */
public record SampledReads(VariableIndex variables, SampleBlock samples, double[] energies, int sweeps,
                           double runTimeMicros) {
    /** Number of reads. */
    public int reads() {
        return samples.reads();
    }

    /** The lowest energy among the reads (+∞ when there are none). */
    public double minimumEnergy() {
        double m = Double.POSITIVE_INFINITY;
        for (double e : energies) {
            m = Math.min(m, e);
        }
        return m;
    }

    /** Reads whose energy is at most target + tolerance. */
    public int countAtMost(double target, double tolerance) {
        int c = 0;
        for (double e : energies) {
            if (e <= target + tolerance) {
                c++;
            }
        }
        return c;
    }
}
