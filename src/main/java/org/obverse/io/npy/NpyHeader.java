package org.obverse.io.npy;

import org.obverse.io.BadInputException;
import org.obverse.io.Messages;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * The header of an NPY file (NumPy NEP 1 / numpy.lib.format documentation): the magic string
 * {@code \x93NUMPY}, a major and minor version byte, the header length (2 bytes little-endian
 * in version 1.0, 4 bytes in 2.0 and 3.0), then a Python dict literal with the keys
 * {@code descr}, {@code fortran_order} and {@code shape}, padded with spaces and ended by a
 * newline so that the data starts at a multiple of 64 bytes. Version 3.0 differs from 2.0 only
 * in that the dict is UTF-8 rather than Latin-1. Immutable.
 */
public final class NpyHeader {
    /** The six magic bytes every NPY file starts with. */
    static final byte[] MAGIC = {(byte) 0x93, 'N', 'U', 'M', 'P', 'Y'};
    /** Alignment of the data start that the format asks writers for. */
    static final int ALIGN = 64;
    /** Decimal digits reserved for the first axis so a streaming writer can rewrite it in place. */
    static final int GROWTH_DIGITS = 21;

    private final int major;
    private final NpyDtype dtype;
    private final boolean fortranOrder;
    private final long[] shape;
    private final long dataOffset;

    private NpyHeader(int major, NpyDtype dtype, boolean fortranOrder, long[] shape, long dataOffset) {
        this.major = major;
        this.dtype = dtype;
        this.fortranOrder = fortranOrder;
        this.shape = shape;
        this.dataOffset = dataOffset;
    }

    /** A header to write, in C order. */
    public static NpyHeader of(NpyDtype dtype, long... shape) {
        for (long d : shape) {
            if (d < 0) {
                throw new IllegalArgumentException("shape " + Arrays.toString(shape) + " has a negative axis");
            }
        }
        return new NpyHeader(1, dtype, false, shape.clone(), -1);
    }

    /** The format's major version (1, 2 or 3) as read; 1 for a header to write. */
    public int majorVersion() {
        return major;
    }

    public NpyDtype dtype() {
        return dtype;
    }

    public boolean fortranOrder() {
        return fortranOrder;
    }

    /** The shape (a copy). */
    public long[] shape() {
        return shape.clone();
    }

    /** Number of axes. */
    public int ndim() {
        return shape.length;
    }

    /** Length of axis d. */
    public long axis(int d) {
        return shape[d];
    }

    /** Number of elements: the product of the shape (1 for a 0-d array). */
    public long elementCount() {
        long c = 1;
        for (long d : shape) {
            c = Math.multiplyExact(c, d);
        }
        return c;
    }

    /** Byte offset of the first data byte in the file that was read (-1 for a header to write). */
    public long dataOffset() {
        return dataOffset;
    }

    /** The dict as Python would print it: {@code {'descr': '|i1', 'fortran_order': False, 'shape': (3, 4), }}. */
    String dictText() {
        StringBuilder s = new StringBuilder("{'descr': '").append(dtype.descr()).append("', 'fortran_order': ")
                .append(fortranOrder ? "True" : "False").append(", 'shape': (");
        for (int d = 0; d < shape.length; d++) {
            if (d > 0) {
                s.append(", ");
            }
            s.append(shape[d]);
        }
        if (shape.length == 1) {
            s.append(',');
        }
        return s.append("), }").toString();
    }

    /**
     * The header bytes, version 1.0 where the dict fits 65535 bytes (else 2.0), padded with
     * spaces so that the total length is a multiple of 64, at least {@code minLength}, and
     * leaving room for the first axis to grow to {@value #GROWTH_DIGITS} digits.
     */
    public byte[] encode(int minLength) {
        byte[] dict = dictText().getBytes(StandardCharsets.ISO_8859_1);
        int growth = shape.length == 0 ? 0 : Math.max(0, GROWTH_DIGITS - Long.toString(shape[0]).length());
        int version = 1;
        int prefix = MAGIC.length + 2 + 2;
        int unpadded = prefix + dict.length + growth + 1;
        if (unpadded - prefix > 65535) {
            version = 2;
            prefix += 2;
            unpadded += 2;
        }
        int total = Math.max(minLength, (unpadded + ALIGN - 1) / ALIGN * ALIGN);
        if (total % ALIGN != 0) {
            throw new IllegalArgumentException("header length " + total + " is not a multiple of " + ALIGN);
        }
        byte[] out = new byte[total];
        System.arraycopy(MAGIC, 0, out, 0, MAGIC.length);
        out[6] = (byte) version;
        out[7] = 0;
        int headerLen = total - prefix;
        if (version == 1) {
            out[8] = (byte) headerLen;
            out[9] = (byte) (headerLen >>> 8);
        } else {
            for (int i = 0; i < 4; i++) {
                out[8 + i] = (byte) (headerLen >>> (8 * i));
            }
        }
        System.arraycopy(dict, 0, out, prefix, dict.length);
        Arrays.fill(out, prefix + dict.length, total - 1, (byte) ' ');
        out[total - 1] = '\n';
        return out;
    }

    /**
     * Parses a header whose first bytes are in {@code head}; {@code head} must hold at least the
     * whole header when {@link #headerLength(byte[], Path)} says how long it is.
     *
     * @param file named in error messages
     * @throws BadInputException naming the file and what is wrong
     */
    public static NpyHeader parse(byte[] head, int length, Path file) {
        int prefix = prefixLength(head, length, file);
        long total = headerLength(head, length, file);
        if (total > length) {
            throw BadInputException.at(file, "header", "the file ends inside the NPY header (" + length
                    + " bytes, header needs " + total + ")", "the file is truncated: write it again");
        }
        int major = head[6] & 0xff;
        String text = new String(head, prefix, (int) total - prefix,
                major >= 3 ? StandardCharsets.UTF_8 : StandardCharsets.ISO_8859_1);
        DictParser p = new DictParser(text, file);
        return p.header(major, total);
    }

    /** Bytes before the dict: magic, version and the length field; checks magic and version. */
    static int prefixLength(byte[] head, int length, Path file) {
        if (length < 10) {
            throw BadInputException.at(file, "header", "is " + length + " bytes long, too short for an NPY file",
                    "give a .npy file written by numpy.save or by this program");
        }
        for (int i = 0; i < MAGIC.length; i++) {
            if (head[i] != MAGIC[i]) {
                throw BadInputException.at(file, "byte offset " + i, "does not start with the NPY magic string \\x93NUMPY",
                        "give a .npy file written by numpy.save or by this program");
            }
        }
        int major = head[6] & 0xff;
        int minor = head[7] & 0xff;
        if (major < 1 || major > 3 || minor != 0) {
            throw BadInputException.at(file, "header", "NPY format version " + major + "." + minor
                    + " is not supported (1.0, 2.0, 3.0 are)", "save it again with numpy.save");
        }
        return major == 1 ? 10 : 12;
    }

    /** Total header length (data offset) from the length field. */
    public static long headerLength(byte[] head, int length, Path file) {
        int prefix = prefixLength(head, length, file);
        if (length < prefix) {
            throw BadInputException.at(file, "header", "the file ends inside the NPY header length field",
                    "the file is truncated: write it again");
        }
        long len;
        if (prefix == 10) {
            len = (head[8] & 0xff) | (head[9] & 0xff) << 8;
        } else {
            len = (head[8] & 0xffL) | (head[9] & 0xffL) << 8 | (head[10] & 0xffL) << 16 | (head[11] & 0xffL) << 24;
        }
        return prefix + len;
    }

    /** A small parser for the one Python dict literal the format allows. */
    private static final class DictParser {
        private final String s;
        private final Path file;
        private int p;

        DictParser(String s, Path file) {
            this.s = s;
            this.file = file;
        }

        private BadInputException bad(String what) {
            return BadInputException.at(file, "header", what + " in " + quote(s.trim()),
                    "save it again with numpy.save (a plain C-order array)");
        }

        private static String quote(String t) {
            return "\"" + Messages.excerpt(t) + "\"";
        }

        // Python's white space between the dict's tokens (a line break is allowed inside braces).
        private void space() {
            while (p < s.length() && " \t\n\r".indexOf(s.charAt(p)) >= 0) {
                p++;
            }
        }

        private boolean take(char c) {
            space();
            if (p < s.length() && s.charAt(p) == c) {
                p++;
                return true;
            }
            return false;
        }

        private void expect(char c) {
            if (!take(c)) {
                throw bad("expected '" + c + "' at character " + p);
            }
        }

        private String string() {
            space();
            if (p >= s.length() || (s.charAt(p) != '\'' && s.charAt(p) != '"')) {
                throw bad("expected a quoted string at character " + p);
            }
            char q = s.charAt(p++);
            int end = s.indexOf(q, p);
            if (end < 0) {
                throw bad("unterminated string at character " + p);
            }
            String v = s.substring(p, end);
            p = end + 1;
            return v;
        }

        private boolean bool() {
            space();
            if (s.startsWith("True", p)) {
                p += 4;
                return true;
            }
            if (s.startsWith("False", p)) {
                p += 5;
                return false;
            }
            throw bad("fortran_order must be True or False at character " + p);
        }

        private long[] tuple() {
            expect('(');
            List<Long> dims = new ArrayList<>();
            while (!take(')')) {
                space();
                int start = p;
                while (p < s.length() && Character.isDigit(s.charAt(p))) {
                    p++;
                }
                if (start == p) {
                    throw bad("shape must be a tuple of non-negative integers (character " + p + ")");
                }
                long d;
                try {
                    d = Long.parseLong(s.substring(start, p));
                } catch (NumberFormatException e) {
                    throw bad("shape axis " + s.substring(start, p) + " is too large");
                }
                take('L'); // Python 2 wrote long integers with an L suffix.
                dims.add(d);
                if (!take(',')) {
                    expect(')');
                    break;
                }
            }
            long[] out = new long[dims.size()];
            for (int i = 0; i < out.length; i++) {
                out[i] = dims.get(i);
            }
            return out;
        }

        NpyHeader header(int major, long total) {
            expect('{');
            String descr = null;
            Boolean fortran = null;
            long[] shape = null;
            while (!take('}')) {
                String key = string();
                expect(':');
                switch (key) {
                    case "descr":
                        space();
                        if (p < s.length() && s.charAt(p) == '[') {
                            throw bad("structured dtypes are not supported; samples are a plain int8 array");
                        }
                        descr = string();
                        break;
                    case "fortran_order":
                        fortran = bool();
                        break;
                    case "shape":
                        shape = tuple();
                        break;
                    default:
                        throw bad("unknown key '" + Messages.excerpt(key) + "'");
                }
                if (!take(',')) {
                    expect('}');
                    break;
                }
            }
            // After the dict: padding of spaces only, and the final newline (numpy.lib.format).
            while (p < s.length() - 1 && s.charAt(p) == ' ') {
                p++;
            }
            if (p != s.length() - 1 || s.charAt(p) != '\n') {
                throw bad(p < s.length() - 1 || p == s.length() ? "the header must be padded with spaces and end with a "
                        + "newline; found " + Messages.excerpt(s.substring(Math.min(p, s.length()), Math.min(p + 1, s.length())))
                        + " at character " + p : "the header must end with a newline");
            }
            if (descr == null || fortran == null || shape == null) {
                throw bad("the dict must have the keys descr, fortran_order and shape");
            }
            NpyDtype dtype = NpyDtype.parse(descr);
            if (dtype == null) {
                throw BadInputException.at(file, "header", "dtype '" + Messages.excerpt(descr) + "' is not supported",
                        "use a plain little- or big-endian integer, bool or float dtype");
            }
            return new NpyHeader(major, dtype, fortran, shape, total);
        }
    }

    @Override
    public String toString() {
        return "NPY " + major + ".0 " + dictText();
    }
}
