package org.obverse.io.samples;

import org.obverse.io.BadInputException;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.samples.SampleCoding;
import org.obverse.io.samples.SampleFiles;
import org.obverse.io.samples.SampleFormat;
import org.obverse.io.samples.SampleReader;
import org.obverse.io.samples.SampleWriter;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;
import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.model.VariableIndex;
import org.obverse.samples.SampleBlock;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** Samples files through the façade: round trips, streaming in chunks, CSV rules, atomic writes. */
class SampleFilesTest extends QuietTest {
    @TempDir
    Path dir;

    private static SampleBlock randomBlock(UniformRandomProvider rng, int reads, int n) {
        byte[] s = new byte[reads * n];
        for (int i = 0; i < s.length; i++) {
            s[i] = (byte) (rng.nextBoolean() ? 1 : -1);
        }
        return SampleBlock.fromSpins(s, reads, n);
    }

    private static VariableIndex sparseIds(UniformRandomProvider rng, int n) {
        int[] ids = new int[n];
        int next = rng.nextInt(5);
        for (int k = 0; k < n; k++) {
            ids[k] = next;
            next += 1 + rng.nextInt(30);
        }
        return VariableIndex.of(ids);
    }

    @Test
    void roundTripsBothLayoutsAndCodings() {
        Seeds.forEachCase(40, 1000, (rng, seed) -> {
            int n = 1 + rng.nextInt(40);
            int reads = rng.nextInt(300); // includes 0 and counts that are not multiples of 64
            VariableIndex ids = sparseIds(rng, n);
            SampleBlock block = randomBlock(rng, reads, n);
            for (SampleFormat f : SampleFormat.values()) {
                for (SampleCoding c : SampleCoding.values()) {
                    Path p = dir.resolve("s" + seed + c + f.extension());
                    try (SampleWriter w = SampleFiles.create(p, ids, false, c)) {
                        w.writeBlock(block);
                        w.commit();
                    }
                    SampleBlock back;
                    try (SampleReader r = SampleFiles.open(p, ids, c)) {
                        back = r.readRemaining();
                        assertThat(r.readsDone()).isEqualTo(reads);
                        assertThat(r.reads()).isEqualTo(f == SampleFormat.NPY ? reads : -1);
                    }
                    assertThat(back.reads()).isEqualTo(reads);
                    assertThat(back.words()).as(f + " " + c).containsExactly(block.words());
                }
            }
        });
    }

    @Test
    void streamsMoreReadsThanOneChunk() throws IOException {
        UniformRandomProvider rng = Seeds.rng(77);
        int n = 13;
        int reads = 64 * 7 + 29;
        VariableIndex ids = sparseIds(rng, n);
        SampleBlock block = randomBlock(rng, reads, n);
        for (SampleFormat f : SampleFormat.values()) {
            Path p = dir.resolve("big" + f.extension());
            // Write in uneven row chunks, read back in chunks of 128 reads reusing the block.
            byte[] rows = block.toSpins();
            try (SampleWriter w = SampleFiles.create(p, ids, false)) {
                for (int at = 0; at < reads; at += 50) {
                    w.writeRows(rows, at, Math.min(50, reads - at));
                }
                assertThat(w.readsWritten()).isEqualTo(reads);
                w.commit();
            }
            int seen = 0;
            int chunks = 0;
            SampleBlock reuse = null;
            try (SampleReader r = SampleFiles.open(p, ids)) {
                for (SampleBlock b = r.nextBlock(128, reuse); b != null; b = r.nextBlock(128, reuse)) {
                    if (b.reads() == 128) {
                        if (reuse != null) {
                            assertThat(b).isSameAs(reuse);
                        }
                        reuse = b;
                    }
                    for (int i = 0; i < b.reads(); i++) {
                        for (int k = 0; k < n; k++) {
                            assertThat(b.spin(i, k)).isEqualTo(block.spin(seen + i, k));
                        }
                    }
                    for (int blk = 0; blk < b.blockCount(); blk++) {
                        for (int k = 0; k < n; k++) {
                            assertThat(b.word(blk, k) & ~b.validMask(blk)).isZero();
                        }
                    }
                    seen += b.reads();
                    chunks++;
                }
            }
            assertThat(seen).isEqualTo(reads);
            assertThat(chunks).isEqualTo(4);
        }
    }

    @Test
    void csvHeaderIsMatchedById() throws IOException {
        Path p = dir.resolve("perm.csv");
        // Columns named 30, 5, 12: position order is 5, 12, 30.
        Files.writeString(p, "30, 5,12\r\n1,-1,+1\r\n\r\n-1,1,-1\n\n", StandardCharsets.US_ASCII);
        SampleBlock b = SampleFiles.readAll(p, VariableIndex.of(5, 12, 30));
        assertThat(b.toSpins()).containsExactly(-1, 1, 1, 1, -1, -1);
        // Written back with ascending ids.
        Path out = dir.resolve("back.csv");
        SampleFiles.writeAll(out, VariableIndex.of(5, 12, 30), false, b);
        assertThat(Files.readString(out)).isEqualTo("5,12,30\n-1,1,1\n1,-1,-1\n");
        // Without a problem, columns go in ascending id order too.
        try (SampleReader r = SampleFiles.open(p, null)) {
            assertThat(r.readRemaining().toSpins()).containsExactly(-1, 1, 1, 1, -1, -1);
        }
    }

    @Test
    void csvErrorsNameLineReadAndColumn() throws IOException {
        VariableIndex ids = VariableIndex.of(1, 2, 3);
        String[][] cases = {
            {"1,2,3\n1,-1,1\n1,0,1\n", "line 3 (read 1), column 1 (id 2): holds '0'; spins must be -1 or +1"},
            {"1,2,3\n1,-1\n", "line 2 (read 0): has 2 values; the header has 3"},
            {"1,2,3\n1,-1,1,1\n", "line 2 (read 0), column 3: the line has more than the header's 3 values"},
            {"1,2,3\n1,x,1\n", "column 1 (id 2): holds 'x'"},
            {"1,2,3\n1,11,1\n", "holds '11'"},
            {"1,2,4\n", "line 1, column 2: variable id 4 is not a variable of the problem"},
            {"1,2,2\n", "variable id 2 is given twice"},
            {"1,2\n", "the header lacks variable id 3"},
            {"a,2,3\n", "line 1, column 0: header value 'a' is not a variable id"},
            {"", "the file is empty"},
        };
        for (String[] c : cases) {
            Path p = dir.resolve("bad.csv");
            Files.writeString(p, c[0], StandardCharsets.US_ASCII);
            assertThatThrownBy(() -> SampleFiles.readAll(p, ids)).as(c[0]).isInstanceOf(BadInputException.class)
                    .hasMessageContaining("bad.csv").hasMessageContaining(c[1]);
        }
        Path binary = dir.resolve("binary.csv");
        Files.writeString(binary, "1,2,3\n1,0,1\n0,0,-1\n", StandardCharsets.US_ASCII);
        assertThatThrownBy(() -> {
            try (SampleReader r = SampleFiles.open(binary, ids, SampleCoding.BINARY)) {
                r.readRemaining();
            }
        }).isInstanceOf(BadInputException.class).hasMessageContaining("line 3 (read 1), column 2 (id 3): holds '-1'");
    }

    @Test
    void writesAtomicallyAndRefusesExistingOutputs() throws IOException {
        VariableIndex ids = VariableIndex.of(0, 1);
        SampleBlock b = SampleBlock.fromSpins(new byte[] {1, -1}, 1, 2);
        Path p = dir.resolve("out.npy");
        try (SampleWriter w = SampleFiles.create(p, ids, false)) {
            w.writeBlock(b);
            // Not committed: an exception on the way leaves nothing behind.
        }
        assertThat(p).doesNotExist();
        try (Stream<Path> s = Files.list(dir)) {
            assertThat(s).isEmpty();
        }
        SampleFiles.writeAll(p, ids, false, b);
        assertThatThrownBy(() -> SampleFiles.writeAll(p, ids, false, b)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("already exists").hasMessageContaining("--force");
        SampleFiles.writeAll(p, ids, true, SampleBlock.fromSpins(new byte[] {-1, -1}, 1, 2));
        assertThat(SampleFiles.readAll(p, ids).toSpins()).containsExactly(-1, -1);
        assertThatThrownBy(() -> SampleFiles.create(dir.resolve("x.txt"), ids, false))
                .isInstanceOf(BadInputException.class).hasMessageContaining("must end in .npy or .csv");
        assertThat(SampleFiles.sameLayout(dir.resolve("raw/g0007.CSV"), dir, "g0007"))
                .isEqualTo(dir.resolve("g0007.csv"));
        assertThatThrownBy(() -> {
            try (SampleWriter w = SampleFiles.create(dir.resolve("bad.npy"), ids, false)) {
                w.writeRows(new byte[] {1, 0}, 0, 1);
            }
        }).isInstanceOf(IllegalArgumentException.class).hasMessageContaining("not a spin");
        assertThat(dir.resolve("bad.npy")).doesNotExist();
    }

    @Test
    void vectorsRoundTrip() throws IOException {
        Seeds.forEachCase(10, 2000, (rng, seed) -> {
            int len = rng.nextInt(5000);
            double[] e = new double[len];
            int[] k = new int[len];
            boolean[] f = new boolean[len];
            for (int i = 0; i < len; i++) {
                e[i] = rng.nextDouble() * 200 - 100;
                k[i] = rng.nextInt() >> rng.nextInt(32);
                f[i] = rng.nextBoolean();
            }
            NpyVectors.writeFloat64(dir.resolve("e" + seed + ".npy"), false, e);
            NpyVectors.writeInt32(dir.resolve("k" + seed + ".npy"), false, k);
            NpyVectors.writeBool(dir.resolve("f" + seed + ".npy"), false, f);
            assertThat(NpyVectors.readFloat64(dir.resolve("e" + seed + ".npy"), len)).containsExactly(e);
            assertThat(NpyVectors.readInt32(dir.resolve("k" + seed + ".npy"), len)).containsExactly(k);
            assertThat(NpyVectors.readBool(dir.resolve("f" + seed + ".npy"), len)).containsExactly(f);
        });
        Path e = dir.resolve("short.npy");
        NpyVectors.writeFloat64(e, false, new double[] {1, 2});
        assertThatThrownBy(() -> NpyVectors.readFloat64(e, 3)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("holds 2 values where 3 are expected");
        assertThatThrownBy(() -> NpyVectors.readBool(e, 2)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("not bool");
        Path nan = dir.resolve("nan.npy");
        NpyVectors.writeFloat64(nan, false, new double[] {1, Double.NaN});
        assertThatThrownBy(() -> NpyVectors.readFloat64(nan, 2)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("element 1").hasMessageContaining("not a finite number");
    }
}
