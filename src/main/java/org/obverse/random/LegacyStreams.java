package org.obverse.random;

import org.apache.commons.rng.UniformRandomProvider;

/**
 * Older seed recipes kept bit for bit, because recorded files and golden vectors pin the
 * numbers they give. Each is a SplitMix64 sequence ({@link RandomStreams#expand}) started at a
 * word computed from the seed; none is {@link RandomStreams#derive}, so none could move onto it
 * without changing those outputs. New code uses {@link RandomStreams#generator}.
 */
public final class LegacyStreams {
    private static final long GOLDEN = RandomStreams.GOLDEN;

    private LegacyStreams() {
    }

    /**
     * Gauge draws: stream {@code stream} of a gauge seed, started at
     * {@code seed ^ (stream · 0xD1B54A32D192ED03)}; stream 0 draws a manifest's gauges (a
     * manifest records the seed, and the audit redraws its gauges from it), other streams the
     * audit's seeded random reads. Pins: every manifest's gauges and redraw count.
     */
    public static UniformRandomProvider gauges(long seed, long stream) {
        return RandomStreams.expand(seed ^ (stream * 0xD1B54A32D192ED03L));
    }

    /**
     * Bootstrap replicate {@code replicate}: started at
     * {@code mix((seed ^ 0x6A09E667F3BCC909) + G) + replicate · G}. Pins: every bootstrap band
     * and replicate fraction in score and report outputs.
     */
    public static UniformRandomProvider bootstrapReplicate(long seed, int replicate) {
        return RandomStreams.expand(RandomStreams.mix((seed ^ 0x6A09E667F3BCC909L) + GOLDEN) + replicate * GOLDEN);
    }

    /**
     * The tie coin of 64-read block {@code block} in chain decoding, started at
     * {@code seed + (block + 1) · G}. Consecutive blocks' states overlap by one word (block b's
     * second word is block b + 1's first); kept because decoded reads pin it. Pins: decoded
     * samples and results rows of chains with exact ties.
     */
    public static UniformRandomProvider decodeTies(long seed, long block) {
        return RandomStreams.expand(seed + (block + 1) * GOLDEN);
    }

    /**
     * The generator of one recorded seed, started at the seed itself: what Commons RNG's
     * {@code RandomSource.create(long)} gives, written out so that no library conversion is
     * involved. Pins: chain searches from a seed (embed, campaign chains), a lattice's random
     * defects, the Lanczos start block, and each try of a chain search.
     */
    public static UniformRandomProvider ofSeed(long seed) {
        return RandomStreams.expand(seed);
    }
}
