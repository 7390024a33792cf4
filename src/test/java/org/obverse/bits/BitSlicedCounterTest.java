package org.obverse.bits;

import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Bit-sliced counting against the plain definition (common practice, no source): lane r of a
 * count is the number of words with bit r set, compared lane by lane with plain integers.
 */
class BitSlicedCounterTest extends QuietTest {
    @Test
    void countsEveryLaneLikeTheDefinition() {
        Seeds.forEachCase(300, 90_000, (rng, seed) -> {
            int size = rng.nextInt(rng.nextBoolean() ? 40 : 3000);
            long[] x = words(rng, size);
            int[] counts = new int[64];
            BitSlicedCounter.countLanes(x, size, new long[32], counts);
            assertThat(counts).as("%d words", size).isEqualTo(plainCounts(x, size));
        });
    }

    @Test
    void aVerticalCounterAddsComparesAndReadsLikePlainCounts() {
        Seeds.forEachCase(300, 91_000, (rng, seed) -> {
            int planeCount = 1 + rng.nextInt(8);
            // Fewer words than 2^planeCount, so that no lane overflows the counter.
            int size = rng.nextInt(1 << planeCount);
            long[] x = words(rng, size);
            long[] planes = new long[planeCount];
            for (int i = 0; i < size; i++) {
                BitSlicedCounter.add(planes, planeCount, x[i]);
            }
            int[] plain = plainCounts(x, size);
            int t = rng.nextInt(1 << planeCount);
            long atLeast = BitSlicedCounter.atLeast(planes, planeCount, t);
            long exactly = BitSlicedCounter.exactly(planes, planeCount, t);
            for (int r = 0; r < 64; r++) {
                assertThat(BitSlicedCounter.lane(planes, planeCount, r)).as("lane %d", r).isEqualTo(plain[r]);
                assertThat((atLeast >>> r) & 1L).as("lane %d at least %d", r, t).isEqualTo(plain[r] >= t ? 1L : 0L);
                assertThat((exactly >>> r) & 1L).as("lane %d exactly %d", r, t).isEqualTo(plain[r] == t ? 1L : 0L);
            }
        });
    }

    // Dense, sparse and all-ones words, so that long carries happen.
    private static long[] words(org.apache.commons.rng.UniformRandomProvider rng, int size) {
        long[] x = new long[size];
        int mode = rng.nextInt(3);
        for (int i = 0; i < size; i++) {
            x[i] = mode == 0 ? rng.nextLong() : mode == 1 ? rng.nextLong() & rng.nextLong() & rng.nextLong() : -1L;
        }
        return x;
    }

    private static int[] plainCounts(long[] x, int size) {
        int[] c = new int[64];
        for (int i = 0; i < size; i++) {
            for (int r = 0; r < 64; r++) {
                c[r] += (int) ((x[i] >>> r) & 1);
            }
        }
        return c;
    }
}
