package org.obverse.random;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

/**
 * Independent seeded generators for numbered items (reads, 64-read words, qubits, gauges,
 * jobs) derived from one recorded seed, so that work split over threads never depends on the
 * thread count.
 *
 * <p>Item {@code index} for {@code purpose} under {@code seed} gets the seed
 * {@code a = mix(seed ^ mix(purpose · G + index))} and the {@value #ALGORITHM} generator with
 * state words {@code (a, mix(a + G))}, where {@code mix} is the SplitMix64 finaliser (Steele,
 * Lea &amp; Flood, OOPSLA 2014) and G = 0x9E3779B97F4A7C15. The state is never all zero:
 * {@code mix} is a bijection with {@code mix(0) = 0}, so {@code a = 0} gives the second word
 * {@code mix(G) ≠ 0}.
 */
public final class RandomStreams {
    /** The generator's name as Commons RNG spells it (and manifests record it). */
    public static final String ALGORITHM = "XO_RO_SHI_RO_128_PP";
    /** How a 64-bit seed becomes the generator's 128-bit state, as manifests record it. */
    public static final String EXPANSION = "splitmix64";

    /** The 64-bit golden ratio, SplitMix64's increment. */
    static final long GOLDEN = 0x9E3779B97F4A7C15L;

    private RandomStreams() {
    }

    /** The SplitMix64 finaliser: a bijection of 64-bit words that mixes every input bit. */
    public static long mix(long z) {
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }

    /**
     * The seed of item {@code index} for {@code purpose} under {@code seed}: nearby seeds,
     * purposes and indices give unrelated seeds. Purposes are listed in {@link StreamPurpose}.
     */
    public static long derive(long seed, long purpose, long index) {
        return mix(seed ^ mix(purpose * GOLDEN + index));
    }

    /** The generator of item {@code index} for {@code purpose} under {@code seed}. */
    public static UniformRandomProvider generator(long seed, long purpose, long index) {
        long a = derive(seed, purpose, index);
        return ofState(a, mix(a + GOLDEN));
    }

    /**
     * The two state words {a, b} of {@link #generator}, as a new array, for kernels that step
     * the same algorithm on local variables (the sampler's xoroshiro128++ kernels): they then
     * draw the very numbers of the generator.
     */
    public static long[] state(long seed, long purpose, long index) {
        long a = derive(seed, purpose, index);
        return new long[] {a, mix(a + GOLDEN)};
    }

    /**
     * The generator whose state is the first two outputs of a SplitMix64 sequence started at
     * {@code start}: {@code (mix(start + G), mix(start + 2G))}. Never all zero (as above).
     * Only the named recipes of {@link LegacyStreams} use it.
     */
    static UniformRandomProvider expand(long start) {
        return ofState(mix(start + GOLDEN), mix(start + 2 * GOLDEN));
    }

    private static UniformRandomProvider ofState(long a, long b) {
        return RandomSource.XO_RO_SHI_RO_128_PP.create(new long[] {a, b});
    }
}
