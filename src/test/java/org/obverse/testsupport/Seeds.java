package org.obverse.testsupport;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

/**
 * The one place tests get randomness: a named, stable generator from a recorded seed, and a
 * loop over generated cases whose failure message names the seed that replays the case.
 */
public final class Seeds {
    /** The generator every test uses: stable across machines and versions. */
    public static final RandomSource SOURCE = RandomSource.XO_RO_SHI_RO_128_PP;

    private Seeds() {
    }

    /** A generator for the seed. */
    public static UniformRandomProvider rng(long seed) {
        return SOURCE.create(seed);
    }

    /** One generated case. */
    @FunctionalInterface
    public interface Case {
        void run(UniformRandomProvider rng, long seed) throws Exception;
    }

    /**
     * Runs count cases with seeds base, base+1, …; a failing case is rethrown as an
     * AssertionError that names its seed: replay it with {@code forEachCase(1, seed, …)}.
     */
    public static void forEachCase(int count, long base, Case body) {
        for (int c = 0; c < count; c++) {
            long seed = base + c;
            try {
                body.run(rng(seed), seed);
            } catch (Throwable t) {
                throw new AssertionError("case failed; replay with seed " + seed + ": " + t.getMessage(), t);
            }
        }
    }
}
