package org.obverse.samples;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

/**
 * The branch-free packing and unpacking kernels against the plain one-bit-at-a-time
 * definition of the layout (common practice, no source), over random widths (odd ones and
 * ones below 8 included), read counts that are not multiples of 8 or 64, unaligned targets,
 * both codings, and blocks that already hold other bits.
 */
class BitPackTest extends QuietTest {

    @Test
    void packMatchesThePlainDefinition() {
        Seeds.forEachCase(300, 7200, (rng, seed) -> {
            int n = width(rng);
            int reads = rng.nextInt(300);
            boolean binary = rng.nextBoolean();
            int count = reads == 0 ? 0 : rng.nextInt(reads + 1);
            int toRead = rng.nextInt(reads - count + 1);
            int fromRow = rng.nextInt(3);
            byte[] src = new byte[(fromRow + count) * n];
            for (int i = 0; i < src.length; i++) {
                src[i] = (byte) (rng.nextBoolean() ? 1 : binary ? 0 : -1);
            }
            SampleBlock fast = randomBlock(rng, reads, n);
            SampleBlock plain = fast.copy();
            int bad = fast.packChecked(src, fromRow, count, toRead, binary);
            assertThat(bad).isEqualTo(-1);
            for (int r = 0; r < count; r++) {
                for (int k = 0; k < n; k++) {
                    byte v = src[(fromRow + r) * n + k];
                    plain.setSpin(toRead + r, k, binary ? 2 * v - 1 : v);
                }
            }
            assertThat(fast.words()).as("n %d reads %d count %d toRead %d", n, reads, count, toRead)
                    .containsExactly(plain.words());
        });
    }

    @Test
    void packFindsTheFirstBadValueInRowOrder() {
        Seeds.forEachCase(300, 7300, (rng, seed) -> {
            int n = 1 + width(rng);
            int count = 1 + rng.nextInt(200);
            boolean binary = rng.nextBoolean();
            byte[] src = new byte[count * n];
            for (int i = 0; i < src.length; i++) {
                src[i] = (byte) (rng.nextBoolean() ? 1 : binary ? 0 : -1);
            }
            int first = Integer.MAX_VALUE;
            int plant = 1 + rng.nextInt(3);
            for (int p = 0; p < plant; p++) {
                int at = rng.nextInt(src.length);
                byte v;
                do {
                    v = (byte) rng.nextInt(256);
                } while (binary ? v == 0 || v == 1 : v == 1 || v == -1);
                src[at] = v;
                first = Math.min(first, at);
            }
            SampleBlock b = SampleBlock.allDown(count, n);
            assertThat(b.packChecked(src, 0, count, 0, binary)).isEqualTo(first);
        });
    }

    /** Chunks large enough to be packed in two halves on two cores: same words, same first bad value. */
    @Test
    void largeChunksPackedInHalvesMatchThePlainDefinition() {
        Seeds.forEachCase(6, 7600, (rng, seed) -> {
            int n = 700 + rng.nextInt(600);
            int count = 1600 + rng.nextInt(400);
            int toRead = rng.nextInt(100);
            byte[] src = new byte[count * n];
            for (int i = 0; i < src.length; i++) {
                src[i] = (byte) (rng.nextBoolean() ? 1 : -1);
            }
            SampleBlock fast = SampleBlock.allDown(toRead + count, n);
            assertThat(fast.packChecked(src, 0, count, toRead, false)).isEqualTo(-1);
            for (int r = 0; r < count; r += 1 + rng.nextInt(50)) {
                for (int k = 0; k < n; k += 1 + rng.nextInt(40)) {
                    assertThat(fast.spin(toRead + r, k)).isEqualTo(src[r * n + k]);
                }
            }
            assertThat(SampleBlock.fromSpins(src, count, n).toSpins()).containsExactly(src);
            // Bad values in both halves: the one in the first half is named.
            int late = src.length - 1 - rng.nextInt(n * 10);
            int early = rng.nextInt(src.length / 3);
            src[late] = 5;
            src[early] = 0;
            assertThat(SampleBlock.allDown(toRead + count, n).packChecked(src, 0, count, toRead, false)).isEqualTo(early);
            src[early] = 1;
            assertThat(SampleBlock.allDown(toRead + count, n).packChecked(src, 0, count, toRead, false)).isEqualTo(late);
        });
    }

    @Test
    void packRowsNamesReadAndColumn() {
        byte[] src = new byte[130 * 9];
        java.util.Arrays.fill(src, (byte) 1);
        src[100 * 9 + 4] = 0;
        SampleBlock b = SampleBlock.allDown(130, 9);
        assertThatThrownBy(() -> b.packRows(src, 0, 130, 0)).hasMessage("read 100, column 4 holds 0; spins must be -1 or +1");
    }

    @Test
    void unpackMatchesThePlainDefinition() {
        Seeds.forEachCase(300, 7400, (rng, seed) -> {
            int n = width(rng);
            int reads = rng.nextInt(300);
            SampleBlock b = randomBlock(rng, reads, n);
            int count = reads == 0 ? 0 : rng.nextInt(reads + 1);
            int from = rng.nextInt(reads - count + 1);
            boolean binary = rng.nextBoolean();
            byte down = (byte) (binary ? 0 : -1);
            byte[] out = new byte[count * n + rng.nextInt(5)];
            b.unpackRows(from, count, out, down, (byte) 1);
            for (int r = 0; r < count; r++) {
                for (int k = 0; k < n; k++) {
                    int s = b.spin(from + r, k);
                    assertThat(out[r * n + k]).as("read %d column %d", from + r, k).isEqualTo((byte) (s > 0 ? 1 : down));
                }
            }
        });
    }

    @Test
    void packThenUnpackIsTheIdentity() {
        Seeds.forEachCase(100, 7500, (rng, seed) -> {
            int n = width(rng);
            int reads = rng.nextInt(700);
            byte[] src = new byte[reads * n];
            for (int i = 0; i < src.length; i++) {
                src[i] = (byte) (rng.nextBoolean() ? 1 : -1);
            }
            assertThat(SampleBlock.fromSpins(src, reads, n).toSpins()).containsExactly(src);
        });
    }

    private static int width(UniformRandomProvider rng) {
        switch (rng.nextInt(4)) {
            case 0:
                return rng.nextInt(8);
            case 1:
                return 8 * (1 + rng.nextInt(6));
            default:
                return rng.nextInt(70);
        }
    }

    private static SampleBlock randomBlock(UniformRandomProvider rng, int reads, int n) {
        SampleBlock b = SampleBlock.allDown(reads, n);
        long[] w = b.words();
        for (int i = 0; i < w.length; i++) {
            w[i] = rng.nextLong();
        }
        for (int blk = 0; blk < b.blockCount(); blk++) {
            for (int k = 0; k < n; k++) {
                w[blk * n + k] &= b.validMask(blk);
            }
        }
        return b;
    }
}
