package org.obverse.io.samples;

import org.obverse.io.BadInputException;
import org.obverse.io.npy.NpyDtype;
import org.obverse.io.npy.NpyWriter;
import org.obverse.io.samples.SampleCoding;
import org.obverse.io.samples.SampleFiles;
import org.obverse.io.samples.SampleReader;
import org.obverse.io.samples.SampleWriter;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.model.VariableIndex;
import org.obverse.samples.SampleBlock;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

/**
 * The branch-free NPY paths against the plain definitions (common practice, no source): the
 * bytes the writer stores are the spins (or 0/1) of the block in row order, the blocks the
 * reader packs hold the file's values, and a bad value is named by its first occurrence in
 * file order — the same read, column and byte offset through {@code nextBlock} and
 * {@code readRows}, whatever the chunk size.
 */
class SampleStreamPropertyTest extends QuietTest {
    @TempDir
    Path dir;

    @Test
    void writtenBytesAreThePlainEncodingAndReadBack() {
        Seeds.forEachCase(60, 8100, (rng, seed) -> {
            int n = rng.nextInt(4) == 0 ? 1 + rng.nextInt(8) : 1 + rng.nextInt(70); // width 0 stores no reads
            int reads = rng.nextInt(400);
            byte[] spins = new byte[reads * n];
            for (int i = 0; i < spins.length; i++) {
                spins[i] = (byte) (rng.nextBoolean() ? 1 : -1);
            }
            SampleBlock block = SampleBlock.fromSpins(spins, reads, n);
            VariableIndex ids = VariableIndex.of(java.util.stream.IntStream.range(0, n).toArray());
            for (SampleCoding c : SampleCoding.values()) {
                Path p = dir.resolve("w" + seed + c + ".npy");
                try (SampleWriter w = SampleFiles.create(p, ids, false, c)) {
                    w.writeBlock(block);
                    w.commit();
                }
                byte[] file = Files.readAllBytes(p);
                byte[] data = Arrays.copyOfRange(file, file.length - spins.length, file.length);
                for (int i = 0; i < spins.length; i++) {
                    assertThat(data[i]).isEqualTo(c.encode(spins[i]));
                }
                int chunk = 1 + rng.nextInt(200);
                try (SampleReader r = SampleFiles.open(p, ids, c)) {
                    int at = 0;
                    for (SampleBlock b = r.nextBlock(chunk, null); b != null; b = r.nextBlock(chunk, b)) {
                        assertThat(b.toSpins()).containsExactly(Arrays.copyOfRange(spins, at * n, (at + b.reads()) * n));
                        at += b.reads();
                    }
                    assertThat(at).isEqualTo(reads);
                }
            }
        });
    }

    /** Blocks large enough that their chunks are written behind on a helper thread, mixed with plain rows. */
    @Test
    void largeBlocksWrittenBehindKeepTheirOrder() {
        Seeds.forEachCase(4, 8300, (rng, seed) -> {
            int n = 300 + rng.nextInt(900);
            int reads = 2000 + rng.nextInt(3000);
            byte[] spins = new byte[reads * n];
            for (int i = 0; i < spins.length; i++) {
                spins[i] = (byte) (rng.nextBoolean() ? 1 : -1);
            }
            SampleBlock block = SampleBlock.fromSpins(spins, reads, n);
            VariableIndex ids = VariableIndex.of(java.util.stream.IntStream.range(0, n).toArray());
            SampleCoding c = seed % 2 == 0 ? SampleCoding.SPIN : SampleCoding.BINARY;
            Path p = dir.resolve("big" + seed + ".npy");
            try (SampleWriter w = SampleFiles.create(p, ids, false, c)) {
                w.writeBlock(block);
                w.writeRows(spins, 0, 3);
                w.writeBlock(block);
                assertThat(w.readsWritten()).isEqualTo(2L * reads + 3);
                w.commit();
            }
            byte[] file = Files.readAllBytes(p);
            int data = file.length - (2 * reads + 3) * n;
            for (int i = 0; i < (2 * reads + 3) * n; i++) {
                int r = i / n;
                int src = r < reads ? i : r < reads + 3 ? i - reads * n : i - (reads + 3) * n;
                if (file[data + i] != c.encode(spins[src])) {
                    throw new AssertionError("byte " + i + " is " + file[data + i]);
                }
            }
        });
    }

    @Test
    void firstBadValueIsNamedAlikeByBothReadPaths() {
        Seeds.forEachCase(80, 8200, (rng, seed) -> {
            int n = 1 + rng.nextInt(70);
            int reads = 1 + rng.nextInt(300);
            SampleCoding c = rng.nextBoolean() ? SampleCoding.SPIN : SampleCoding.BINARY;
            byte[] stored = new byte[reads * n];
            for (int i = 0; i < stored.length; i++) {
                stored[i] = c.encode(rng.nextBoolean() ? 1 : -1);
            }
            int first = Integer.MAX_VALUE;
            for (int p = 0; p < 1 + rng.nextInt(3); p++) {
                int at = rng.nextInt(stored.length);
                stored[at] = (byte) (c == SampleCoding.SPIN ? 0 : -1 - rng.nextInt(100));
                first = Math.min(first, at);
            }
            Path p = dir.resolve("b" + seed + ".npy");
            VariableIndex ids = VariableIndex.of(java.util.stream.IntStream.range(0, n).toArray());
            try (NpyWriter w = NpyWriter.create(p, false, NpyDtype.INT8, n)) {
                w.writeBytes(stored, 0, stored.length);
                w.commit();
            }
            long dataOffset = Files.size(p) - stored.length;
            String expected = p.getFileName() + ": read " + first / n + ", column " + first % n + " (byte offset "
                    + (dataOffset + first) + "): holds " + stored[first] + "; " + c.rule();
            int chunk = 1 + rng.nextInt(150);
            assertThatThrownBy(() -> {
                try (SampleReader r = SampleFiles.open(p, ids, c)) {
                    for (SampleBlock b = r.nextBlock(chunk, null); b != null; b = r.nextBlock(chunk, b)) {
                        assertThat(b.reads()).isPositive();
                    }
                }
            }).isInstanceOf(BadInputException.class).hasMessageContaining(expected);
            assertThatThrownBy(() -> {
                try (SampleReader r = SampleFiles.open(p, ids, c)) {
                    byte[] rows = new byte[chunk * n];
                    while (r.readRows(rows, chunk) > 0) {
                        assertThat(rows[0]).isIn((byte) -1, (byte) 1);
                    }
                }
            }).isInstanceOf(BadInputException.class).hasMessageContaining(expected);
        });
    }

    @Test
    void readRowsGivesSpinsForBothCodings() throws IOException {
        Path p = dir.resolve("bin.npy");
        byte[] stored = {1, 0, 0, 1, 1, 1, 0, 0, 0, 1, 1, 0};
        try (NpyWriter w = NpyWriter.create(p, false, NpyDtype.INT8, 3)) {
            w.writeBytes(stored, 0, stored.length);
            w.commit();
        }
        try (SampleReader r = SampleFiles.open(p, VariableIndex.of(0, 1, 2), SampleCoding.BINARY)) {
            byte[] rows = new byte[12];
            assertThat(r.readRows(rows, 4)).isEqualTo(4);
            assertThat(rows).containsExactly(1, -1, -1, 1, 1, 1, -1, -1, -1, 1, 1, -1);
        }
    }
}
