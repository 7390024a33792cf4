package org.obverse.random;

import java.lang.reflect.Field;
import java.lang.reflect.Modifier;
import java.util.HashSet;
import java.util.Set;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * {@code derive} and {@code generator} against golden values and against the recipe as it
 * stood in {@code anneal.StreamSeeds} before the move (copied below), which the sampler's
 * pinned reads, the campaign's job seeds and the demo's results depend on.
 */
class RandomStreamsTest extends QuietTest {
    private static final long G = 0x9E3779B97F4A7C15L;

    @Test
    void deriveAndGeneratorGiveTheGoldenValues() {
        // Printed by anneal.StreamSeeds (commit f4fe974) before it moved here.
        long[][] golden = {
            {2026, 1, 0, 8900250670685268616L, 4840454697990352337L},
            {2026, 5, 3, -4944471807604659196L, 346855597394371632L},
            {-7, 104, 11, -8453840639081064310L, 5684287297110462964L},
            {0, 0, 0, 0L, 5796966406249497665L},
            {123456789L, 6, 63, -8006624881004182465L, 1482899876373916025L},
        };
        for (long[] g : golden) {
            assertThat(RandomStreams.derive(g[0], g[1], g[2])).as("derive(%d, %d, %d)", g[0], g[1], g[2]).isEqualTo(g[3]);
            assertThat(RandomStreams.generator(g[0], g[1], g[2]).nextLong()).as("generator(%d, %d, %d)", g[0], g[1], g[2])
                    .isEqualTo(g[4]);
        }
    }

    @Test
    void matchesTheFormerStreamSeedsRecipeBitForBit() {
        Seeds.forEachCase(500, 3_000, (rng, seed) -> {
            long s = rng.nextLong();
            long purpose = rng.nextInt(8) == 0 ? rng.nextLong() : rng.nextInt(200);
            long index = rng.nextBoolean() ? rng.nextInt(1 << 20) : rng.nextLong();
            assertThat(RandomStreams.derive(s, purpose, index)).isEqualTo(formerDerive(s, purpose, index));
            UniformRandomProvider ours = RandomStreams.generator(s, purpose, index);
            UniformRandomProvider former = formerGenerator(s, purpose, index);
            for (int i = 0; i < 8; i++) {
                assertThat(ours.nextLong()).isEqualTo(former.nextLong());
            }
        });
    }

    @Test
    void mixIsTheSplitMix64Finaliser() {
        // SplitMix64 (Steele, Lea & Flood, OOPSLA 2014): the sequence from state 0 starts
        // 0xE220A8397B1DCDAF, 0x6E789E6AA1B965F4 (Vigna's reference splitmix64.c, from memory),
        // i.e. mix(G) and mix(2G).
        assertThat(RandomStreams.mix(G)).isEqualTo(0xE220A8397B1DCDAFL);
        assertThat(RandomStreams.mix(2 * G)).isEqualTo(0x6E789E6AA1B965F4L);
        assertThat(RandomStreams.mix(0)).isZero();
        // Consecutive inputs (the indices of one purpose) never collide.
        Set<Long> outputs = new HashSet<>();
        for (long x = -5_000; x < 5_000; x++) {
            outputs.add(RandomStreams.mix(x));
        }
        assertThat(outputs).hasSize(10_000);
    }

    @Test
    void generatorIsTheNamedAlgorithm() {
        long a = RandomStreams.derive(11, 2, 3);
        UniformRandomProvider direct = RandomSource.valueOf(RandomStreams.ALGORITHM)
                .create(new long[] {a, RandomStreams.mix(a + G)});
        UniformRandomProvider ours = RandomStreams.generator(11, 2, 3);
        for (int i = 0; i < 16; i++) {
            assertThat(ours.nextLong()).isEqualTo(direct.nextLong());
        }
    }

    @Test
    void everyPurposeNumberIsDistinct() throws IllegalAccessException {
        Set<Long> numbers = new HashSet<>();
        int count = 0;
        for (Field f : StreamPurpose.class.getFields()) {
            if (Modifier.isStatic(f.getModifiers()) && f.getType() == long.class) {
                assertThat(numbers.add(f.getLong(null))).as("purpose %s", f.getName()).isTrue();
                count++;
            }
        }
        assertThat(count).isEqualTo(10);
    }

    // The recipe of anneal.StreamSeeds as it stood before it moved here.
    private static long formerMix(long z) {
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }

    private static long formerDerive(long seed, long tag, long index) {
        return formerMix(seed ^ formerMix(tag * G + index));
    }

    private static UniformRandomProvider formerGenerator(long seed, long tag, long index) {
        long a = formerMix(seed ^ formerMix(tag * G + index));
        long b = formerMix(a + G);
        if (a == 0 && b == 0) {
            b = G;
        }
        return RandomSource.XO_RO_SHI_RO_128_PP.create(new long[] {a, b});
    }
}
