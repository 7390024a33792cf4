package org.obverse.gauge;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

/**
 * Seeded generators that give the same numbers on every machine: the named algorithm
 * {@value #ALGORITHM} from Commons RNG, its 128-bit native seed expanded from a 64-bit seed
 * (and an optional stream number) by SplitMix64, so no library seed conversion is involved.
 */
public final class SeedStream {
    /** The generator's name as recorded in manifests. */
    public static final String ALGORITHM = "XO_RO_SHI_RO_128_PP";
    /** How a 64-bit seed becomes the native seed, as recorded in manifests. */
    public static final String EXPANSION = "splitmix64";

    private SeedStream() {
    }

    /** A generator for a seed. */
    public static UniformRandomProvider of(long seed) {
        return of(seed, 0);
    }

    /** A generator for stream number {@code stream} of a seed (streams are independent). */
    public static UniformRandomProvider of(long seed, long stream) {
        long state = seed ^ (stream * 0xD1B54A32D192ED03L);
        long a = splitMix(state += 0x9E3779B97F4A7C15L);
        long b = splitMix(state + 0x9E3779B97F4A7C15L);
        if (a == 0 && b == 0) {
            b = 1; // the all-zero state is not allowed for this generator
        }
        return RandomSource.XO_RO_SHI_RO_128_PP.create(new long[] {a, b});
    }

    /** The SplitMix64 finaliser (Steele, Lea & Flood, OOPSLA 2014). */
    static long splitMix(long z) {
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }
}
