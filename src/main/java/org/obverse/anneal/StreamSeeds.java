package org.obverse.anneal;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

/**
 * Independent generators for numbered items (reads, 64-read words, qubits, couplers) derived
 * from one recorded seed, so that work split over threads never depends on the thread count.
 *
 * <p>Item {@code i} of stream {@code tag} under seed {@code s} gets an
 * {@link RandomSource#XO_RO_SHI_RO_128_PP} generator whose two state words are
 * {@code mix(s ^ mix(tag · G + i))} and {@code mix(that + G)}, where {@code mix} is the
 * SplitMix64 finaliser (Steele, Lea &amp; Flood, OOPSLA 2014) and G = 0x9E3779B97F4A7C15. An
 * all-zero state (which the generator cannot leave) is replaced by a fixed non-zero one.
 */
public final class StreamSeeds {
    /** Stream of the per-read generators of the exact sampler. */
    public static final long READS = 1;
    /** Stream of the per-word generators of the multi-spin-coded sampler. */
    public static final long WORDS = 2;
    /** Stream of the static per-qubit field offsets of a simulated device. */
    public static final long FIELD_OFFSETS = 3;
    /** Stream of the static per-coupler offsets of a simulated device. */
    public static final long COUPLER_OFFSETS = 4;

    /** Stream of the per-gauge seeds when one call samples every gauge of a manifest. */
    public static final long GAUGES = 5;

    /** Stream of the per-read generators of the path-integral sampler. */
    public static final long PATH_INTEGRAL_READS = 6;

    private static final long GOLDEN = 0x9E3779B97F4A7C15L;

    private StreamSeeds() {
    }

    /** The SplitMix64 finaliser: a bijection of 64-bit words that mixes every input bit. */
    public static long mix(long z) {
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }

    /**
     * A seed for item {@code index} of stream {@code tag} under {@code seed}: the first state
     * word of {@link #generator}, so that nearby seeds and indices give unrelated seeds.
     */
    public static long derive(long seed, long tag, long index) {
        return mix(seed ^ mix(tag * GOLDEN + index));
    }

    /** The generator of item {@code index} of stream {@code tag} under {@code seed}. */
    public static UniformRandomProvider generator(long seed, long tag, long index) {
        return RandomSource.XO_RO_SHI_RO_128_PP.create(state(seed, tag, index));
    }

    /**
     * The two state words {a, b} of {@link #generator}: a fresh array that
     * {@link XoroshiroState#next} advances through the same numbers as the generator.
     */
    public static long[] state(long seed, long tag, long index) {
        long a = mix(seed ^ mix(tag * GOLDEN + index));
        long b = mix(a + GOLDEN);
        if (a == 0 && b == 0) {
            b = GOLDEN;
        }
        return new long[] {a, b};
    }

    /** One standard normal deviate by the Marsaglia polar method (two uniforms per try). */
    public static double gaussian(UniformRandomProvider rng) {
        while (true) {
            double x = 2.0 * rng.nextDouble() - 1.0;
            double y = 2.0 * rng.nextDouble() - 1.0;
            double r = x * x + y * y;
            if (r > 0.0 && r < 1.0) {
                return x * StrictMath.sqrt(-2.0 * StrictMath.log(r) / r);
            }
        }
    }
}
