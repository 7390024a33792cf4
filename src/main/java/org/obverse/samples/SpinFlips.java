package org.obverse.samples;

/**
 * Flipping chosen spins of every read of a block: the un-gauge (and gauge) step in one call.
 * A convenience over {@link SpinFlip}, which holds the kernels; a caller that flips many
 * blocks with one gauge should make the {@link SpinFlip} once.
 */
public final class SpinFlips {
    private SpinFlips() {
    }

    /** Flips the spins at the given positions (each in [0, n), none twice) in every read, in place. */
    public static void flipInPlace(SampleBlock block, int[] positions) {
        SpinFlip.of(block.variables(), positions).applyInPlace(block);
    }
}
