package org.obverse.samples;

import org.obverse.model.IsingProblem;

/**
 * Energies E(s) = offset + Σ h_k s_k + Σ J_uv s_u s_v of every read of a bit-sliced
 * {@link SampleBlock}, 64 reads at a time.
 *
 * <p>Made once per problem; everything that depends only on the problem is precomputed, and
 * each instance owns a workspace, so {@link #energies} never allocates. An instance is
 * therefore not thread-safe: give each thread its own {@link #copy()}, which shares the
 * precomputed, immutable part.
 *
 * <ul>
 *   <li>{@link #exact}: per read, the value of {@link IsingProblem#energy(byte[])} bit for bit
 *       (fields by position, couplers by coupler order, then the offset). This is the path the
 *       audit uses: under a gauge every term changes by an exact sign flip, so the energy of a
 *       gauged sample under the gauged problem equals that of the un-gauged sample under the
 *       source problem exactly.</li>
 *   <li>{@link #tables}: for real-valued terms. With a set bit meaning s = +1, x = w_u ⊕ w_v has
 *       its bit set where s_u·s_v = −1, so J·s_u·s_v = J − 2J·[x] and h·s = −h + 2h·[w]. Each
 *       term's 2h or −2J is added into eight 256-entry tables indexed by the bytes of its
 *       word; once per block the tables are expanded into 64 per-read sums.</li>
 *   <li>{@link #counters}: for terms that take few distinct values (±1, say). Terms are grouped
 *       by value; per group, carry-save bit counters (bit-sliced adders) count the set bits
 *       of each read, and the energy is the constant plus Σ value·count.</li>
 *   <li>{@link #of}: the planner: values shared by many terms go to counters; where eight
 *       consecutive positions (a cell of a hardware graph, typically) have many terms among
 *       themselves, a 256-entry table of their energy for every configuration replaces those
 *       terms (cluster tables); the rest go to byte tables.</li>
 * </ul>
 *
 * <p>Tolerance of the fast kernels against the exact one ({@link #tolerance()}): both are sums
 * of the same exactly representable terms in different orders (the fast ones of at most
 * K = 2(n + m) + 2G + 2088 terms and partial sums, n fields, m couplers, G counter
 * groups). Summing N terms in any order errs by at most γ_{N−1}·Σ|x_i|, with
 * γ_k = k·u / (1 − k·u) and u = 2^−53 (Higham, Accuracy and Stability of Numerical
 * Algorithms, 2nd ed., SIAM 2002, §4.2). Adding both paths' errors gives, for every read,
 * |fast − exact| ≤ γ_K · (3·|offset| + 7·(Σ|h| + Σ|J|)). Where every term and partial sum
 * is an integer below 2^53, both are exact and agree exactly.
 */
public interface EnergyKernel {
    /** How a kernel computes. */
    enum Method {
        /** Per read, in the problem's fixed order. */
        EXACT,
        /** Byte tables for every term. */
        TABLES,
        /** Bit counters for every term, grouped by value. */
        COUNTERS,
        /** Bit counters for values shared by many terms, byte tables for the rest. */
        COUNTERS_AND_TABLES
    }

    /** The planner: counters for values that many terms share, byte tables for the rest. */
    static EnergyKernel of(IsingProblem problem) {
        return FastEnergy.plan(problem, FastEnergy.MIN_GROUP, FastEnergy.MIN_CLUSTER_TERMS);
    }

    /** The exact path: equal bit for bit to {@link IsingProblem#energy(byte[])}. */
    static EnergyKernel exact(IsingProblem problem) {
        return new ExactEnergy(problem);
    }

    /** Byte tables for every term. */
    static EnergyKernel tables(IsingProblem problem) {
        return FastEnergy.plan(problem, Integer.MAX_VALUE, Integer.MAX_VALUE);
    }

    /** Bit counters for every term, one group per distinct value (slow where there are many values). */
    static EnergyKernel counters(IsingProblem problem) {
        return FastEnergy.plan(problem, 1, Integer.MAX_VALUE);
    }

    /** The problem whose energies this computes. */
    IsingProblem problem();

    /** How this kernel computes. */
    Method method();

    /**
     * An absolute bound on |this − exact| for any read: 0 for the exact kernel; for the fast
     * ones γ_K · (3·|offset| + 7·(Σ|h| + Σ|J|)) as the type's comment derives.
     */
    double tolerance();

    /**
     * Energies of every read of the block: {@code out[offset + r]} for r &lt; reads.
     *
     * @param block Input, not modified; its width must be the problem's size
     * @param out Output, length at least offset + reads
     */
    void energies(SampleBlock block, double[] out, int offset);

    /** Energies of every read of the block, in a new array. */
    default double[] energies(SampleBlock block) {
        double[] out = new double[block.reads()];
        energies(block, out, 0);
        return out;
    }

    /** An instance with its own workspace, sharing the precomputed part. */
    EnergyKernel copy();
}
