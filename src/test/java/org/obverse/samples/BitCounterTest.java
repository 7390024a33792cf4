package org.obverse.samples;

import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;
import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;

/** Carry-save counting against the plain definition: lane r counts the words with bit r set. */
class BitCounterTest extends QuietTest {
    @Test
    void countsEveryLaneLikeTheDefinition() {
        Seeds.forEachCase(300, 90_000, (rng, seed) -> {
            int size = rng.nextInt(rng.nextBoolean() ? 40 : 3000);
            long[] x = new long[size];
            // Dense, sparse and all-ones words, so that long carries happen.
            int mode = rng.nextInt(3);
            for (int i = 0; i < size; i++) {
                x[i] = mode == 0 ? rng.nextLong() : mode == 1 ? rng.nextLong() & rng.nextLong() & rng.nextLong() : -1L;
            }
            int[] counts = new int[64];
            BitCounter.count(x, size, new long[32], counts);
            for (int r = 0; r < 64; r++) {
                int expected = 0;
                for (int i = 0; i < size; i++) {
                    expected += (int) ((x[i] >>> r) & 1);
                }
                assertThat(counts[r]).as("lane %d of %d words", r, size).isEqualTo(expected);
            }
        });
    }
}
