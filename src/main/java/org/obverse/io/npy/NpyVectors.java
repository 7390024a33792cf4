package org.obverse.io.npy;

import org.obverse.io.BadInputException;
import java.io.IOException;
import java.nio.file.Path;
import java.util.Arrays;

/**
 * Whole one-dimensional NPY arrays, one value per read: energies ({@code float64}), kept flags
 * ({@code bool}) and counts ({@code int32}). Written little-endian in C order through a
 * temporary file; read from any byte order the header names. For vectors too long for memory,
 * stream with {@link NpyWriter} and {@link NpyReader} directly.
 */
public final class NpyVectors {
    /** Reads any length. */
    public static final long ANY_LENGTH = -1;

    private NpyVectors() {
    }

    /** Writes a {@code float64} vector, shape {@code [values.length]}. */
    public static void writeFloat64(Path target, boolean force, double[] values) throws IOException {
        try (NpyWriter w = NpyWriter.create(target, force, NpyDtype.FLOAT64)) {
            w.writeDoubles(values, 0, values.length);
            w.commit();
        }
    }

    /** Writes an {@code int32} vector. */
    public static void writeInt32(Path target, boolean force, int[] values) throws IOException {
        try (NpyWriter w = NpyWriter.create(target, force, NpyDtype.INT32)) {
            w.writeInts(values, 0, values.length);
            w.commit();
        }
    }

    /** Writes a {@code bool} vector (one byte each, 0 or 1). */
    public static void writeBool(Path target, boolean force, boolean[] values) throws IOException {
        byte[] b = new byte[values.length];
        for (int i = 0; i < b.length; i++) {
            b[i] = (byte) (values[i] ? 1 : 0);
        }
        try (NpyWriter w = NpyWriter.create(target, force, NpyDtype.BOOL)) {
            w.writeBytes(b, 0, b.length);
            w.commit();
        }
    }

    /**
     * Reads a 1-D float vector ({@code float64} or {@code float32}, either byte order).
     *
     * @param expectedLength the length it must have (e.g. the reads of its samples), or {@link #ANY_LENGTH}
     */
    public static double[] readFloat64(Path file, long expectedLength) throws IOException {
        try (NpyReader r = openVector(file, expectedLength, "float64")) {
            if (r.header().dtype().kind() != 'f') {
                throw wrongType(file, r, "float64");
            }
            double[] out = new double[(int) r.remaining()];
            r.readDoubles(out, 0, out.length);
            checkFinite(file, r, out);
            return out;
        }
    }

    /** Reads a 1-D integer vector (int32, or any integer type up to 32 bits, either byte order). */
    public static int[] readInt32(Path file, long expectedLength) throws IOException {
        try (NpyReader r = openVector(file, expectedLength, "int32")) {
            char k = r.header().dtype().kind();
            if (k != 'i' && k != 'u') {
                throw wrongType(file, r, "int32");
            }
            int[] out = new int[(int) r.remaining()];
            r.readInts(out, 0, out.length);
            return out;
        }
    }

    /** Reads a 1-D bool vector; every byte must be 0 or 1. */
    public static boolean[] readBool(Path file, long expectedLength) throws IOException {
        try (NpyReader r = openVector(file, expectedLength, "bool")) {
            if (r.header().dtype().kind() != 'b') {
                throw wrongType(file, r, "bool");
            }
            byte[] b = new byte[(int) r.remaining()];
            r.readBytes(b, 0, b.length);
            boolean[] out = new boolean[b.length];
            for (int i = 0; i < b.length; i++) {
                if (b[i] != 0 && b[i] != 1) {
                    throw BadInputException.at(file, "element " + i + " (byte offset " + r.byteOffsetOf(i) + ")",
                            "holds " + b[i] + "; a bool must be 0 or 1", "write the file again");
                }
                out[i] = b[i] == 1;
            }
            return out;
        }
    }

    private static NpyReader openVector(Path file, long expectedLength, String what) throws IOException {
        NpyReader r = NpyReader.open(file);
        try {
            NpyHeader h = r.header();
            if (h.ndim() != 1) {
                throw BadInputException.at(file, "header", "shape " + Arrays.toString(h.shape()) + " has " + h.ndim()
                        + " axes, not 1", "give a " + what + " vector with one value per read");
            }
            if (expectedLength != ANY_LENGTH && h.axis(0) != expectedLength) {
                throw BadInputException.at(file, "header", "holds " + h.axis(0) + " values where " + expectedLength
                        + " are expected", "give one value per read of the samples it belongs to");
            }
            if (h.axis(0) > Integer.MAX_VALUE - 8) {
                throw BadInputException.at(file, "header", h.axis(0) + " values are too many to read at once",
                        "stream it with NpyReader");
            }
            return r;
        } catch (RuntimeException e) {
            r.close();
            throw e;
        }
    }

    private static BadInputException wrongType(Path file, NpyReader r, String what) {
        return BadInputException.at(file, "header", "dtype is " + r.header().dtype().describe() + " ('"
                + r.header().dtype().descr() + "'), not " + what, "give a " + what + " vector");
    }

    private static void checkFinite(Path file, NpyReader r, double[] v) {
        for (int i = 0; i < v.length; i++) {
            if (!Double.isFinite(v[i])) {
                throw BadInputException.at(file, "element " + i + " (byte offset " + r.byteOffsetOf(i) + ")",
                        "holds " + v[i] + ", not a finite number", "write the file again");
            }
        }
    }
}
