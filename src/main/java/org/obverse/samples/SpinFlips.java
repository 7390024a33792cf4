package org.obverse.samples;

/**
 * Flipping chosen spins of every read of a block: the un-gauge (and gauge) kernel. With the
 * bit-sliced layout a flipped spin is one XOR of its words with the live-read mask; the words of
 * unflipped spins are not touched.
 */
public final class SpinFlips {
    private SpinFlips() {
    }

    /** Flips the spins at the given positions in every read, in place. */
    public static void flipInPlace(SampleBlock block, int[] positions) {
        long[] w = block.words();
        int n = block.variables();
        int blocks = block.blockCount();
        for (int b = 0; b < blocks; b++) {
            long mask = block.validMask(b);
            int base = b * n;
            for (int k : positions) {
                w[base + k] ^= mask;
            }
        }
    }
}
