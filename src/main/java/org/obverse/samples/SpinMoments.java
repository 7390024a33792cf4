package org.obverse.samples;

import org.obverse.model.IsingProblem;

/**
 * The sums a bias diagnosis needs from one gauge's reads: Σ s_k per variable and Σ s_a s_b per
 * coupler (pairs of columns), with the read count, tallied from bit-sliced
 * {@link SampleBlock}s by popcounts: per 64-read word, Σ s = 2·(set bits) − reads and
 * Σ s_a s_b = reads − 2·(bits where a and b differ). Mutable, not thread-safe; cost one
 * {@code long} per variable and coupler.
 */
public final class SpinMoments {
    private final int variables;
    private final int[] a;
    private final int[] b;
    private final long[] up;
    private final long[] differ;
    private long reads;

    private SpinMoments(int variables, int[] a, int[] b) {
        this.variables = variables;
        this.a = a;
        this.b = b;
        up = new long[variables];
        differ = new long[a.length];
    }

    /** Sums over a problem's variables and its couplers, in its coupler order. */
    public static SpinMoments of(IsingProblem p) {
        return new SpinMoments(p.size(), p.edgeUs(), p.edgeVs());
    }

    /**
     * Sums over {@code variables} columns and the couplers {@code couplers[c] = {a, b}} (two
     * distinct columns each; may be empty).
     */
    public static SpinMoments of(int variables, int[][] couplers) {
        if (variables < 1) {
            throw new IllegalArgumentException("need at least one variable, got " + variables);
        }
        int[] a = new int[couplers.length];
        int[] b = new int[couplers.length];
        for (int c = 0; c < couplers.length; c++) {
            int[] pair = couplers[c];
            if (pair.length != 2 || pair[0] == pair[1] || Math.min(pair[0], pair[1]) < 0
                    || Math.max(pair[0], pair[1]) >= variables) {
                throw new IllegalArgumentException("coupler " + c + " must name two distinct columns in [0, "
                        + variables + ")");
            }
            a[c] = pair[0];
            b[c] = pair[1];
        }
        return new SpinMoments(variables, a, b);
    }

    /** Adds every read of a block (not modified). */
    public void add(SampleBlock block) {
        if (block.variables() != variables) {
            throw new IllegalArgumentException("reads have " + block.variables() + " columns, the sums "
                    + variables);
        }
        long[] w = block.words();
        for (int blk = 0; blk < block.blockCount(); blk++) {
            long mask = block.validMask(blk);
            int base = blk * variables;
            for (int k = 0; k < variables; k++) {
                up[k] += Long.bitCount(w[base + k] & mask);
            }
            for (int c = 0; c < a.length; c++) {
                differ[c] += Long.bitCount((w[base + a[c]] ^ w[base + b[c]]) & mask);
            }
        }
        reads += block.reads();
    }

    /** Reads added so far. */
    public long reads() {
        return reads;
    }

    /** Number of couplers tallied. */
    public int couplers() {
        return a.length;
    }

    /** Σ s_k over the reads. */
    public long spinSum(int k) {
        return 2 * up[k] - reads;
    }

    /** Σ s_a s_b over the reads, for coupler c. */
    public long productSum(int c) {
        return reads - 2 * differ[c];
    }
}
