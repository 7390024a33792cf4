package org.obverse.random;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Each legacy recipe gives the numbers it gave before it moved here: golden first outputs
 * printed by the former code (commit f4fe974), and bit-for-bit agreement with that code,
 * copied below, over many seeds. These are the streams recorded manifests, bootstrap bands,
 * decoded reads and chain searches depend on.
 */
class LegacyStreamsTest extends QuietTest {
    private static final long G = 0x9E3779B97F4A7C15L;

    @Test
    void gaugeStreamsGiveTheGoldenValuesOfTheFormerSeedStream() {
        long[][] golden = {
            {5, 0, 4303094124001495694L},
            {2026, 0, -6068227573545617964L},
            {-1, 3, 793861958549491719L},
            {42, 7, -4928988828541706124L},
        };
        for (long[] g : golden) {
            assertThat(LegacyStreams.gauges(g[0], g[1]).nextLong()).as("gauges(%d, %d)", g[0], g[1]).isEqualTo(g[2]);
        }
    }

    @Test
    void bootstrapReplicatesGiveTheGoldenValuesOfTheFormerBootstrapStream() {
        long[][] golden = {
            {2026, 0, 2769800747669605070L},
            {2026, 999, 4596805402395234927L},
            {99, 5, 3608751185332412937L},
            {-3, 1, -5268892944293335773L},
        };
        for (long[] g : golden) {
            assertThat(LegacyStreams.bootstrapReplicate(g[0], (int) g[1]).nextLong())
                    .as("bootstrapReplicate(%d, %d)", g[0], g[1]).isEqualTo(g[2]);
        }
    }

    @Test
    void decodeTiesAndSingleSeedsGiveTheGoldenValuesOfTheFormerCalls() {
        long[][] ties = {{7, 0, -72731925034681372L}, {7, 15, 8018918133391704100L}, {-100, 2, -1494676384351018917L}};
        for (long[] g : ties) {
            assertThat(LegacyStreams.decodeTies(g[0], g[1]).nextLong()).as("decodeTies(%d, %d)", g[0], g[1])
                    .isEqualTo(g[2]);
        }
        long[][] single = {{0, 8027914721839836897L}, {11, -3200757153925343012L}, {-5, -7125426655218414276L}};
        for (long[] g : single) {
            assertThat(LegacyStreams.ofSeed(g[0]).nextLong()).as("ofSeed(%d)", g[0]).isEqualTo(g[1]);
        }
    }

    @Test
    void everyRecipeMatchesItsFormerCodeBitForBit() {
        Seeds.forEachCase(500, 4_000, (rng, seed) -> {
            long s = rng.nextLong();
            long stream = rng.nextBoolean() ? rng.nextInt(64) : rng.nextLong();
            int replicate = rng.nextInt(100_000);
            long block = rng.nextInt(1 << 24);
            assertSame(LegacyStreams.gauges(s, stream), formerSeedStream(s, stream));
            assertSame(LegacyStreams.bootstrapReplicate(s, replicate), formerBootstrapStream(s, replicate));
            // The chain decoder and the single-seed callers used Commons RNG's own long seeding.
            assertSame(LegacyStreams.decodeTies(s, block), RandomSource.XO_RO_SHI_RO_128_PP.create(s + (block + 1) * G));
            assertSame(LegacyStreams.ofSeed(s), RandomSource.XO_RO_SHI_RO_128_PP.create(s));
        });
    }

    private static void assertSame(UniformRandomProvider ours, UniformRandomProvider former) {
        for (int i = 0; i < 8; i++) {
            assertThat(ours.nextLong()).as("draw %d", i).isEqualTo(former.nextLong());
        }
    }

    private static long splitMix(long z) {
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }

    // gauge.SeedStream.of(seed, stream) as it stood before the move.
    private static UniformRandomProvider formerSeedStream(long seed, long stream) {
        long state = seed ^ (stream * 0xD1B54A32D192ED03L);
        long a = splitMix(state += G);
        long b = splitMix(state + G);
        if (a == 0 && b == 0) {
            b = 1;
        }
        return RandomSource.XO_RO_SHI_RO_128_PP.create(new long[] {a, b});
    }

    // stats.HierarchicalBootstrap.stream(seed, replicate) as it stood before the move.
    private static UniformRandomProvider formerBootstrapStream(long seed, int replicate) {
        long z = bootstrapMix(seed ^ 0x6a09e667f3bcc909L) + replicate * 0x9e3779b97f4a7c15L;
        long a = bootstrapMix(z);
        long b = bootstrapMix(z + 0x9e3779b97f4a7c15L);
        if ((a | b) == 0) {
            b = 1;
        }
        return RandomSource.XO_RO_SHI_RO_128_PP.create(new long[] {a, b});
    }

    private static long bootstrapMix(long x) {
        return splitMix(x + 0x9e3779b97f4a7c15L);
    }
}
