package org.obverse.testsupport;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.zip.CRC32;
import java.util.zip.ZipEntry;
import java.util.zip.ZipOutputStream;

/**
 * NPY and NPZ files assembled byte by byte from the formats' descriptions, independent of the
 * project's writer. NPY: NumPy NEP 1, "A simple file format for NumPy arrays", and the
 * numpy.lib.format documentation — magic \x93NUMPY, version 1.0, a 2-byte little-endian header
 * length, a Python dict literal with descr, fortran_order and shape, padded with spaces and a
 * final newline so the data starts at a multiple of 64, then the raw elements (C order, or
 * column-major where fortran_order is True). NPZ: the numpy.savez documentation — a zip archive
 * with one {@code name.npy} member per keyword argument (savez stores them, savez_compressed
 * deflates them).
 */
public final class NpyBytes {
    private NpyBytes() {
    }

    /** A version 1.0 NPY file: header for descr, order and shape, then the data bytes as given. */
    public static byte[] npy(String descr, boolean fortran, long[] shape, byte[] data) {
        StringBuilder dict = new StringBuilder("{'descr': '").append(descr).append("', 'fortran_order': ")
                .append(fortran ? "True" : "False").append(", 'shape': (");
        for (int d = 0; d < shape.length; d++) {
            dict.append(d > 0 ? ", " : "").append(shape[d]);
        }
        dict.append(shape.length == 1 ? ",), }" : "), }");
        byte[] text = dict.toString().getBytes(StandardCharsets.ISO_8859_1);
        int total = (10 + text.length + 1 + 63) / 64 * 64;
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        b.writeBytes(new byte[] {(byte) 0x93, 'N', 'U', 'M', 'P', 'Y', 1, 0});
        int len = total - 10;
        b.write(len & 0xff);
        b.write(len >>> 8);
        b.writeBytes(text);
        for (int i = 10 + text.length; i < total - 1; i++) {
            b.write(' ');
        }
        b.write('\n');
        b.writeBytes(data);
        return b.toByteArray();
    }

    /** IEEE 754 binary64 values in the given byte order. */
    public static byte[] f8(ByteOrder order, double... v) {
        ByteBuffer b = ByteBuffer.allocate(8 * v.length).order(order);
        for (double x : v) {
            b.putDouble(x);
        }
        return b.array();
    }

    /** IEEE 754 binary32 values, little-endian. */
    public static byte[] f4(float... v) {
        ByteBuffer b = ByteBuffer.allocate(4 * v.length).order(ByteOrder.LITTLE_ENDIAN);
        for (float x : v) {
            b.putFloat(x);
        }
        return b.array();
    }

    /** A square matrix as a little-endian float64 NPY file, in C or Fortran order. */
    public static byte[] matrix(double[][] m, boolean fortran) {
        int n = m.length;
        double[] flat = new double[n * n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                flat[fortran ? j * n + i : i * n + j] = m[i][j];
            }
        }
        return npy("<f8", fortran, new long[] {n, n}, f8(ByteOrder.LITTLE_ENDIAN, flat));
    }

    /** A vector as a little-endian float64 NPY file. */
    public static byte[] vector(double... v) {
        return npy("<f8", false, new long[] {v.length}, f8(ByteOrder.LITTLE_ENDIAN, v));
    }

    /** A zip of the members in the given order, stored (as numpy.savez) or deflated (as numpy.savez_compressed). */
    public static byte[] zip(Map<String, byte[]> members, boolean deflate) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try (ZipOutputStream z = new ZipOutputStream(out)) {
            for (Map.Entry<String, byte[]> m : members.entrySet()) {
                ZipEntry e = new ZipEntry(m.getKey());
                if (!deflate) {
                    // A stored entry carries its sizes and CRC-32 in the local header.
                    CRC32 crc = new CRC32();
                    crc.update(m.getValue());
                    e.setMethod(ZipEntry.STORED);
                    e.setSize(m.getValue().length);
                    e.setCompressedSize(m.getValue().length);
                    e.setCrc(crc.getValue());
                }
                z.putNextEntry(e);
                z.write(m.getValue());
                z.closeEntry();
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return out.toByteArray();
    }

    /** Members in insertion order, for {@link #zip}. */
    public static Map<String, byte[]> members(Object... nameThenBytes) {
        Map<String, byte[]> m = new LinkedHashMap<>();
        for (int i = 0; i < nameThenBytes.length; i += 2) {
            m.put((String) nameThenBytes[i], (byte[]) nameThenBytes[i + 1]);
        }
        return m;
    }
}
