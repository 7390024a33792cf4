package org.obverse.samples;

import java.util.Arrays;

/**
 * Reverses chosen spins of every read: the un-gauging kernel. For a gauge g, the positions
 * with g_k = −1 are flipped, s_k = g_k·s'_k; since g∘g is the identity, the same flip also
 * applies a gauge. On a bit-sliced block this is an XOR of the flipped spins' words with the
 * block's valid-read mask, 64 reads per instruction.
 *
 * <p>Immutable; made once per gauge by {@link #of}, then applied to any number of blocks of
 * its width. It keeps both the list of flipped positions and one mask word per position
 * (−1 where flipped, 0 elsewhere): many flips are applied as a sequential, vectorisable pass
 * over every word, few as a pass over the flipped words only. Cost of {@link #of}: O(n).
 */
public final class SpinFlip {
    // Below n / SPARSE_RATIO flipped spins, touching only their words is cheaper than a full pass.
    private static final int SPARSE_RATIO = 8;

    private final int variables;
    private final int[] positions;
    private final long[] maskWords;

    private SpinFlip(int variables, int[] positions, long[] maskWords) {
        this.variables = variables;
        this.positions = positions;
        this.maskWords = maskWords;
    }

    /**
     * A flip of the given positions of n spins.
     *
     * @param positions flipped positions, each in [0, n), none twice; the array is not modified
     * @throws IllegalArgumentException naming the first position out of range or repeated
     */
    public static SpinFlip of(int variables, int[] positions) {
        if (variables < 0) {
            throw new IllegalArgumentException("variables " + variables + " must be >= 0");
        }
        long[] mask = new long[variables];
        int[] sorted = positions.clone();
        Arrays.sort(sorted);
        for (int i = 0; i < sorted.length; i++) {
            int k = sorted[i];
            if (k < 0 || k >= variables) {
                throw new IllegalArgumentException("flipped position " + k + " is outside [0, " + variables + ")");
            }
            if (i > 0 && sorted[i - 1] == k) {
                throw new IllegalArgumentException("flipped position " + k + " is given twice");
            }
            mask[k] = -1L;
        }
        return new SpinFlip(variables, sorted, mask);
    }

    /** A flip from signs by position: flipped where {@code signs[k] < 0}. */
    public static SpinFlip ofSigns(byte[] signs) {
        int count = 0;
        for (byte s : signs) {
            if (s < 0) {
                count++;
            }
        }
        int[] p = new int[count];
        count = 0;
        for (int k = 0; k < signs.length; k++) {
            if (signs[k] < 0) {
                p[count++] = k;
            }
        }
        return of(signs.length, p);
    }

    /** Spins per read. */
    public int variables() {
        return variables;
    }

    /** The flipped positions, ascending (a copy). */
    public int[] positions() {
        return positions.clone();
    }

    /** Number of flipped positions. */
    public int flippedCount() {
        return positions.length;
    }

    /** Flips the spins of every read of the block, in place. */
    public void applyInPlace(SampleBlock block) {
        check(block);
        if (positions.length * SPARSE_RATIO < variables) {
            flipListed(block.words(), block, positions);
        } else {
            flipAll(block.words(), block.words(), block, maskWords);
        }
    }

    /**
     * Writes the flipped reads of {@code in} into {@code out}, which must have the same reads
     * and width; {@code in} is not modified (out may be in).
     */
    public void apply(SampleBlock in, SampleBlock out) {
        check(in);
        if (out.reads() != in.reads() || out.variables() != in.variables()) {
            throw new IllegalArgumentException("output block of " + out.reads() + " reads of " + out.variables()
                    + " differs from input block of " + in.reads() + " reads of " + in.variables());
        }
        flipAll(in.words(), out.words(), in, maskWords);
    }

    private void check(SampleBlock block) {
        if (block.variables() != variables) {
            throw new IllegalArgumentException("block has " + block.variables() + " spins per read; flip is for "
                    + variables);
        }
    }

    /** Kernel: {@code words[b·n + k] ^= valid(b)} for the listed k of every block b. */
    static void flipListed(long[] words, SampleBlock shape, int[] flipped) {
        int n = shape.variables();
        int blocks = shape.blockCount();
        for (int b = 0; b < blocks; b++) {
            long valid = shape.validMask(b);
            int base = b * n;
            for (int p : flipped) {
                words[base + p] ^= valid;
            }
        }
    }

    /** Kernel: {@code out[b·n + k] = in[b·n + k] ^ (mask[k] & valid(b))} over every word. */
    static void flipAll(long[] in, long[] out, SampleBlock shape, long[] mask) {
        int n = shape.variables();
        int blocks = shape.blockCount();
        int full = shape.reads() >>> 6;
        for (int b = 0; b < full; b++) {
            int base = b * n;
            for (int k = 0; k < n; k++) {
                out[base + k] = in[base + k] ^ mask[k];
            }
        }
        if (full < blocks) {
            long valid = shape.validMask(full);
            int base = full * n;
            for (int k = 0; k < n; k++) {
                out[base + k] = in[base + k] ^ (mask[k] & valid);
            }
        }
    }
}
