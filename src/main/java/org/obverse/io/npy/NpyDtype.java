package org.obverse.io.npy;

import java.nio.ByteOrder;

/**
 * An NPY element type: the {@code descr} string of an NPY header for a plain (non-structured)
 * number type, such as {@code '|i1'}, {@code '<i4'}, {@code '>f8'} or {@code '|b1'}. The first
 * character is the byte order ({@code <} little, {@code >} big, {@code |} not applicable), then
 * the kind ({@code i} signed integer, {@code u} unsigned, {@code b} boolean, {@code f} float)
 * and the size in bytes (NumPy NEP 1 / numpy.lib.format documentation). Immutable.
 */
public final class NpyDtype {
    /** {@code int8}: samples (−1/+1, or 0/1 where binary). */
    public static final NpyDtype INT8 = new NpyDtype('i', 1, false);
    /** {@code bool}: one byte, 0 or 1. */
    public static final NpyDtype BOOL = new NpyDtype('b', 1, false);
    /** {@code int32}, little-endian. */
    public static final NpyDtype INT32 = new NpyDtype('i', 4, false);
    /** {@code int64}, little-endian. */
    public static final NpyDtype INT64 = new NpyDtype('i', 8, false);
    /** {@code float64}, little-endian: energies. */
    public static final NpyDtype FLOAT64 = new NpyDtype('f', 8, false);

    private final char kind;
    private final int size;
    private final boolean bigEndian;

    private NpyDtype(char kind, int size, boolean bigEndian) {
        this.kind = kind;
        this.size = size;
        this.bigEndian = bigEndian;
    }

    /**
     * Parses a {@code descr} such as {@code <i4}. Supported: kinds i (sizes 1, 2, 4, 8), u (1, 2,
     * 4, 8), b (1) and f (4, 8); order {@code <}, {@code >}, or {@code |} for one-byte types.
     *
     * @return the type, or null where the descr is not one of these (the caller names the file)
     */
    public static NpyDtype parse(String descr) {
        if (descr.length() < 3) {
            return null;
        }
        char order = descr.charAt(0);
        char kind = descr.charAt(1);
        int size;
        try {
            size = Integer.parseInt(descr.substring(2));
        } catch (NumberFormatException e) {
            return null;
        }
        boolean sizeOk;
        switch (kind) {
            case 'i':
            case 'u':
                sizeOk = size == 1 || size == 2 || size == 4 || size == 8;
                break;
            case 'b':
                sizeOk = size == 1;
                break;
            case 'f':
                sizeOk = size == 4 || size == 8;
                break;
            default:
                return null;
        }
        if (!sizeOk) {
            return null;
        }
        if (order == '|') {
            // "not applicable" is only meaningful for one-byte types.
            return size == 1 ? new NpyDtype(kind, size, false) : null;
        }
        if (order != '<' && order != '>') {
            return null;
        }
        return new NpyDtype(kind, size, order == '>' && size > 1);
    }

    /** The descr as this library writes it: {@code |} for one-byte types, else {@code <} or {@code >}. */
    public String descr() {
        char order = size == 1 ? '|' : bigEndian ? '>' : '<';
        return "" + order + kind + size;
    }

    /** The kind character: i, u, b or f. */
    public char kind() {
        return kind;
    }

    /** Bytes per element. */
    public int size() {
        return size;
    }

    /** The byte order of multi-byte elements. */
    public ByteOrder order() {
        return bigEndian ? ByteOrder.BIG_ENDIAN : ByteOrder.LITTLE_ENDIAN;
    }

    /** Same kind and size, whatever the byte order. */
    public boolean sameKind(NpyDtype other) {
        return kind == other.kind && size == other.size;
    }

    /** A person's name for the type: int8, int32, uint8, bool, float64, ... */
    public String describe() {
        switch (kind) {
            case 'b':
                return "bool";
            case 'f':
                return "float" + 8 * size;
            case 'u':
                return "uint" + 8 * size;
            default:
                return "int" + 8 * size;
        }
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof NpyDtype && ((NpyDtype) o).kind == kind && ((NpyDtype) o).size == size
                && ((NpyDtype) o).bigEndian == bigEndian;
    }

    @Override
    public int hashCode() {
        return kind * 31 + size * 2 + (bigEndian ? 1 : 0);
    }

    @Override
    public String toString() {
        return descr();
    }
}
