package org.obverse.io.npy;

import org.obverse.io.BadInputException;
import org.obverse.io.npy.NpyDtype;
import org.obverse.io.npy.NpyReader;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.samples.SampleCoding;
import org.obverse.io.samples.SampleFiles;
import org.obverse.io.samples.SampleReader;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import org.obverse.model.VariableIndex;
import org.obverse.samples.SampleBlock;
import org.obverse.testsupport.QuietTest;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * NPY files assembled byte by byte from the format's description (NumPy NEP 1, "A simple
 * file format for NumPy arrays", and the numpy.lib.format module documentation): the magic
 * string \x93NUMPY, major and minor version bytes, a little-endian header length (2 bytes in
 * version 1.0, 4 bytes in 2.0 and 3.0), a Python dict literal padded with spaces and a final
 * newline so the data starts at a multiple of 64, then the raw elements in C order.
 */
class NpyFormatTest extends QuietTest {
    @TempDir
    Path dir;

    private static final byte[] MAGIC = {(byte) 0x93, 'N', 'U', 'M', 'P', 'Y'};

    /** Magic, version, length field for the given total header size, dict, spaces, newline, data. */
    private static byte[] npy(int major, String dict, int total, byte[] data) {
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        b.writeBytes(MAGIC);
        b.write(major);
        b.write(0);
        int prefix = major == 1 ? 10 : 12;
        int len = total - prefix;
        b.write(len & 0xff);
        b.write(len >>> 8);
        if (major > 1) {
            b.write(len >>> 16);
            b.write(len >>> 24);
        }
        byte[] d = dict.getBytes(major >= 3 ? StandardCharsets.UTF_8 : StandardCharsets.ISO_8859_1);
        b.writeBytes(d);
        for (int i = prefix + d.length; i < total - 1; i++) {
            b.write(' ');
        }
        b.write('\n');
        b.writeBytes(data);
        return b.toByteArray();
    }

    private Path file(String name, byte[] bytes) throws IOException {
        Path p = dir.resolve(name);
        Files.write(p, bytes);
        return p;
    }

    private static final String DICT_2X3 = "{'descr': '|i1', 'fortran_order': False, 'shape': (2, 3), }";
    private static final byte[] DATA_2X3 = {1, -1, 1, -1, -1, 1};

    @Test
    void readsVersionOneHeaderWrittenByHand() throws IOException {
        // Every byte literal: magic, version 1.0, HEADER_LEN = 118 = 0x76 (10 + 118 = 128 = 2·64),
        // the 59-character dict, 58 spaces, '\n', then 2·3 int8 values in C order.
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        b.writeBytes(new byte[] {(byte) 0x93, 0x4E, 0x55, 0x4D, 0x50, 0x59, 0x01, 0x00, 0x76, 0x00});
        b.writeBytes(DICT_2X3.getBytes(StandardCharsets.US_ASCII));
        b.writeBytes(" ".repeat(58).getBytes(StandardCharsets.US_ASCII));
        b.write('\n');
        b.writeBytes(DATA_2X3);
        byte[] bytes = b.toByteArray();
        assertThat(bytes).hasSize(128 + 6);
        Path p = file("v1.npy", bytes);

        try (NpyReader r = NpyReader.open(p)) {
            assertThat(r.header().majorVersion()).isEqualTo(1);
            assertThat(r.header().dataOffset()).isEqualTo(128);
            assertThat(r.header().shape()).containsExactly(2, 3);
            assertThat(r.header().dtype()).isEqualTo(NpyDtype.INT8);
        }
        SampleBlock s = SampleFiles.readAll(p, VariableIndex.of(4, 7, 9));
        assertThat(s.reads()).isEqualTo(2);
        assertThat(s.toSpins()).containsExactly(DATA_2X3);
    }

    @Test
    void readsVersionTwoAndThreeHeaders() throws IOException {
        // Version 2.0: a 4-byte length field; 12 + 116 = 128.
        byte[] v2 = npy(2, DICT_2X3, 128, DATA_2X3);
        assertThat(Arrays.copyOfRange(v2, 6, 12)).containsExactly(2, 0, 0x74, 0, 0, 0);
        Path p2 = file("v2.npy", v2);
        try (NpyReader r = NpyReader.open(p2)) {
            assertThat(r.header().majorVersion()).isEqualTo(2);
            assertThat(r.header().dataOffset()).isEqualTo(128);
        }
        assertThat(SampleFiles.readAll(p2, VariableIndex.of(0, 1, 2)).toSpins()).containsExactly(DATA_2X3);

        // Version 3.0: the same with a UTF-8 dict.
        Path p3 = file("v3.npy", npy(3, DICT_2X3, 192, DATA_2X3));
        assertThat(SampleFiles.readAll(p3, VariableIndex.of(0, 1, 2)).toSpins()).containsExactly(DATA_2X3);
    }

    @Test
    void acceptsOtherWritersDictSpelling() throws IOException {
        // Keys in another order, double quotes, no trailing comma, '<i1' for a one-byte type,
        // and a Python 2 long suffix: all valid Python literals the format permits.
        String dict = "{\"shape\": (2L, 3L), \"fortran_order\": False, \"descr\": \"<i1\"}";
        Path p = file("other.npy", npy(1, dict, 128, DATA_2X3));
        assertThat(SampleFiles.readAll(p, VariableIndex.of(0, 1, 2)).toSpins()).containsExactly(DATA_2X3);
    }

    @Test
    void readsBigAndLittleEndianVectors() throws IOException {
        // '>i4' [1, -2, 65536] and '>f8' [1.0, -2.5] as IEEE 754 big-endian bytes;
        // '<f8' [0.5] little-endian: 0.5 = 0x3FE0000000000000.
        Path i4 = file("i4.npy", npy(1, "{'descr': '>i4', 'fortran_order': False, 'shape': (3,), }", 128,
                new byte[] {0, 0, 0, 1, (byte) 0xFF, (byte) 0xFF, (byte) 0xFF, (byte) 0xFE, 0, 1, 0, 0}));
        assertThat(NpyVectors.readInt32(i4, 3)).containsExactly(1, -2, 65536);
        Path li4 = file("li4.npy", npy(1, "{'descr': '<i4', 'fortran_order': False, 'shape': (2,), }", 128,
                new byte[] {1, 0, 0, 0, (byte) 0xFE, (byte) 0xFF, (byte) 0xFF, (byte) 0xFF}));
        assertThat(NpyVectors.readInt32(li4, NpyVectors.ANY_LENGTH)).containsExactly(1, -2);
        Path f8 = file("f8.npy", npy(1, "{'descr': '>f8', 'fortran_order': False, 'shape': (2,), }", 128,
                new byte[] {0x3F, (byte) 0xF0, 0, 0, 0, 0, 0, 0, (byte) 0xC0, 0x04, 0, 0, 0, 0, 0, 0}));
        assertThat(NpyVectors.readFloat64(f8, 2)).containsExactly(1.0, -2.5);
        Path lf8 = file("lf8.npy", npy(1, "{'descr': '<f8', 'fortran_order': False, 'shape': (1,), }", 128,
                new byte[] {0, 0, 0, 0, 0, 0, (byte) 0xE0, 0x3F}));
        assertThat(NpyVectors.readFloat64(lf8, 1)).containsExactly(0.5);
        Path b1 = file("b1.npy", npy(1, "{'descr': '|b1', 'fortran_order': False, 'shape': (3,), }", 128,
                new byte[] {1, 0, 1}));
        assertThat(NpyVectors.readBool(b1, 3)).containsExactly(true, false, true);
    }

    @Test
    void writesHeadersTheFormatAsksFor() throws IOException {
        Path p = dir.resolve("w.npy");
        SampleFiles.writeAll(p, VariableIndex.of(1, 2, 3), false, SampleBlock.fromSpins(DATA_2X3, 2, 3));
        byte[] bytes = Files.readAllBytes(p);
        assertThat(Arrays.copyOf(bytes, 8)).containsExactly((byte) 0x93, 'N', 'U', 'M', 'P', 'Y', 1, 0);
        int total = 10 + ((bytes[8] & 0xff) | (bytes[9] & 0xff) << 8);
        assertThat(total % 64).isZero();
        assertThat(bytes[total - 1]).isEqualTo((byte) '\n');
        String dict = new String(bytes, 10, total - 10, StandardCharsets.ISO_8859_1).trim();
        assertThat(dict).isEqualTo(DICT_2X3);
        assertThat(Arrays.copyOfRange(bytes, total, bytes.length)).containsExactly(DATA_2X3);

        Path e = dir.resolve("e.npy");
        NpyVectors.writeFloat64(e, false, new double[] {1.0, -2.5});
        byte[] eb = Files.readAllBytes(e);
        int et = 10 + ((eb[8] & 0xff) | (eb[9] & 0xff) << 8);
        assertThat(new String(eb, 10, et - 10, StandardCharsets.ISO_8859_1).trim())
                .isEqualTo("{'descr': '<f8', 'fortran_order': False, 'shape': (2,), }");
        // Little-endian IEEE 754: 1.0 = 0x3FF0000000000000.
        assertThat(Arrays.copyOfRange(eb, et, et + 8)).containsExactly(0, 0, 0, 0, 0, 0, (byte) 0xF0, 0x3F);
    }

    @Test
    void refusesTruncatedAndMalformedFiles() throws IOException {
        VariableIndex three = VariableIndex.of(0, 1, 2);
        byte[] good = npy(1, DICT_2X3, 128, DATA_2X3);

        Path cut = file("cut.npy", Arrays.copyOf(good, good.length - 1));
        assertThatThrownBy(() -> SampleFiles.readAll(cut, three)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("cut.npy").hasMessageContaining("truncated").hasMessageContaining("needs 6");

        Path cutHeader = file("cuthead.npy", Arrays.copyOf(good, 40));
        assertThatThrownBy(() -> SampleFiles.readAll(cutHeader, three)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("header").hasMessageContaining("truncated");

        Path tiny = file("tiny.npy", Arrays.copyOf(good, 5));
        assertThatThrownBy(() -> SampleFiles.readAll(tiny, three)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("too short");

        byte[] magic = good.clone();
        magic[1] = 'X';
        Path badMagic = file("magic.npy", magic);
        assertThatThrownBy(() -> SampleFiles.readAll(badMagic, three)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("byte offset 1").hasMessageContaining("magic");

        byte[] v4 = good.clone();
        v4[6] = 4;
        Path version = file("v4.npy", v4);
        assertThatThrownBy(() -> SampleFiles.readAll(version, three)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("version 4.0");

        byte[] longer = Arrays.copyOf(good, good.length + 2);
        Path trailing = file("trailing.npy", longer);
        assertThatThrownBy(() -> SampleFiles.readAll(trailing, three)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("byte offset 134").hasMessageContaining("2 bytes follow");

        Path f8 = file("f8.npy", npy(1, "{'descr': '<f8', 'fortran_order': False, 'shape': (1, 3), }", 128,
                new byte[24]));
        assertThatThrownBy(() -> SampleFiles.readAll(f8, three)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("float64").hasMessageContaining("not int8");

        Path oneD = file("oned.npy", npy(1, "{'descr': '|i1', 'fortran_order': False, 'shape': (6,), }", 128,
                DATA_2X3));
        assertThatThrownBy(() -> SampleFiles.readAll(oneD, three)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("1 axes, not 2");

        Path fortran = file("f.npy", npy(1, "{'descr': '|i1', 'fortran_order': True, 'shape': (2, 3), }", 128,
                DATA_2X3));
        assertThatThrownBy(() -> SampleFiles.readAll(fortran, three)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("fortran_order is True").hasMessageContaining("ascontiguousarray");

        Path wide = file("wide.npy", good);
        assertThatThrownBy(() -> SampleFiles.readAll(wide, VariableIndex.of(0, 1, 2, 3)))
                .isInstanceOf(BadInputException.class).hasMessageContaining("3 columns but the problem has 4");

        Path structured = file("s.npy", npy(1, "{'descr': [('a', '<i4')], 'fortran_order': False, 'shape': (1,), }",
                128, new byte[4]));
        assertThatThrownBy(() -> SampleFiles.readAll(structured, three)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("structured");

        Path noKey = file("nokey.npy", npy(1, "{'descr': '|i1', 'shape': (2, 3), }", 128, DATA_2X3));
        assertThatThrownBy(() -> SampleFiles.readAll(noKey, three)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("keys descr, fortran_order and shape");

        Path garbage = file("garbage.npy", npy(1, "{'descr': '|i1', 'fortran_order': False, 'shape': (2, x), }",
                128, DATA_2X3));
        assertThatThrownBy(() -> SampleFiles.readAll(garbage, three)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("header").hasMessageContaining("shape must be a tuple");

        Path unsupported = file("c16.npy", npy(1, "{'descr': '<c16', 'fortran_order': False, 'shape': (1, 3), }",
                128, new byte[48]));
        assertThatThrownBy(() -> SampleFiles.readAll(unsupported, three)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("'<c16' is not supported");
    }

    @Test
    void namesReadColumnAndByteOfABadValue() throws IOException {
        byte[] data = DATA_2X3.clone();
        data[5] = 2; // read 1, column 2, byte 128 + 5
        Path p = file("bad.npy", npy(1, DICT_2X3, 128, data));
        assertThatThrownBy(() -> SampleFiles.readAll(p, VariableIndex.of(0, 1, 2)))
                .isInstanceOf(BadInputException.class)
                .hasMessageContaining("bad.npy: read 1, column 2 (byte offset 133): holds 2; spins must be -1 or +1");

        Path zero = file("zero.npy", npy(1, DICT_2X3, 128, new byte[] {1, 0, 1, 0, 0, 1}));
        try (SampleReader r = SampleFiles.open(zero, VariableIndex.of(0, 1, 2), SampleCoding.BINARY)) {
            assertThat(r.readRemaining().toSpins()).containsExactly(1, -1, 1, -1, -1, 1);
        }
        assertThatThrownBy(() -> SampleFiles.readAll(zero, VariableIndex.of(0, 1, 2)))
                .isInstanceOf(BadInputException.class).hasMessageContaining("read 0, column 1");
        Path spins = file("spins.npy", npy(1, DICT_2X3, 128, DATA_2X3));
        assertThatThrownBy(() -> {
            try (SampleReader r = SampleFiles.open(spins, VariableIndex.of(0, 1, 2), SampleCoding.BINARY)) {
                r.readRemaining();
            }
        }).isInstanceOf(BadInputException.class).hasMessageContaining("read 0, column 1")
                .hasMessageContaining("binary values must be 0 or 1");

        Path bool = file("flag.npy", npy(1, "{'descr': '|b1', 'fortran_order': False, 'shape': (2,), }", 128,
                new byte[] {1, 2}));
        assertThatThrownBy(() -> NpyVectors.readBool(bool, 2)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("element 1 (byte offset 129)");
    }
}
