package org.obverse.io.codec;

import org.obverse.io.BadInputException;
import org.obverse.io.InputFiles;
import org.obverse.io.npy.NpyHeader;
import org.obverse.io.npy.NpyReader;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Enumeration;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.zip.ZipEntry;
import java.util.zip.ZipException;
import java.util.zip.ZipFile;
import org.obverse.model.BinaryProblem;
import org.obverse.model.InvalidProblemException;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;

/**
 * Problems as NumPy users keep them (spec/formats.md, "Problems as NumPy arrays"):
 * <ul>
 * <li>an {@code .npy} square matrix Q → the binary problem E(x) = xᵀQx on ids 0..n−1;</li>
 * <li>an {@code .npz} archive (a zip of {@code .npy} members, as {@code numpy.savez} writes it)
 * with members {@code h} [n] and {@code J} [n, n] and optionally {@code offset} (0-d or [1]) →
 * the spin problem E(s) = offset + hᵀs + sᵀJs on ids 0..n−1.</li>
 * </ul>
 * A matrix must be upper-triangular (strict lower triangle all zero; pair weight Q_ij) or
 * exactly symmetric (pair weight Q_ij + Q_ji); anything else is refused, naming the first entry
 * of the strict lower triangle that breaks both (a nonzero one where there is one). Elements
 * are float64 or float32 in either byte order, C or Fortran order; every value finite. Headers
 * are parsed by {@link NpyHeader}.
 */
public final class NpyProblemCodec {
    /** Member names of a spin archive, as {@code numpy.savez(path, h=..., J=..., offset=...)} writes them. */
    static final List<String> MEMBERS = List.of("h.npy", "J.npy", "offset.npy");

    /** Largest n accepted: n² elements must fit one Java array. */
    static final int MAX_SIDE = 46_340;
    /** The largest archive member unpacked, in bytes. */
    static final int MAX_MEMBER_BYTES = 1 << 30;

    private NpyProblemCodec() {
    }

    /** Reads an {@code .npy} Q matrix as a binary problem. */
    public static ProblemFile readMatrix(Path file) {
        Array a;
        try (NpyReader r = NpyReader.open(file)) {
            Where w = new Where(file, null, "Q");
            NpyHeader h = r.header();
            checkSquare(w, h);
            checkFloat(w, h);
            double[] v = new double[(int) r.remaining()];
            r.readDoubles(v, 0, v.length);
            a = new Array(w, h, v);
        } catch (NoSuchFileException e) {
            throw BadInputException.at(file, "", "no such file", "check the path");
        } catch (IOException e) {
            throw BadInputException.at(file, "", "cannot be read (" + e.getMessage() + ")", "check the path and permissions");
        }
        return ProblemFile.of(qubo(a), null);
    }

    /** Reads an {@code .npz} archive with {@code h}, {@code J} and optionally {@code offset} as a spin problem. */
    public static ProblemFile readArchive(Path file) {
        Map<String, Array> members = new HashMap<>();
        InputFiles.requireRegular(file);
        try (ZipFile zip = new ZipFile(file.toFile())) {
            Enumeration<? extends ZipEntry> en = zip.entries();
            while (en.hasMoreElements()) {
                ZipEntry e = en.nextElement();
                String name = e.getName();
                if (!MEMBERS.contains(name)) {
                    throw BadInputException.at(file, "member " + name, "is not one of h.npy, J.npy, offset.npy",
                            "save the archive as numpy.savez(path, h=h, J=J) with an optional offset=..., and nothing else");
                }
                if (members.containsKey(name)) {
                    throw BadInputException.at(file, "member " + name, "is in the archive twice", "write the archive again");
                }
                byte[] bytes;
                try (InputStream in = zip.getInputStream(e)) {
                    // Bounded: a small archive may inflate to far more than memory.
                    bytes = in.readNBytes(MAX_MEMBER_BYTES + 1);
                    if (bytes.length > MAX_MEMBER_BYTES) {
                        throw BadInputException.at(file, "member " + name, "unpacks to more than " + MAX_MEMBER_BYTES
                                + " bytes", "give a smaller problem");
                    }
                } catch (ZipException | java.io.EOFException ex) {
                    throw BadInputException.at(file, "member " + name, "cannot be unpacked (" + ex.getMessage() + ")",
                            "the archive is damaged or truncated: write it again");
                }
                String array = name.substring(0, name.length() - 4);
                members.put(name, fromBytes(new Where(file, name, array), bytes));
            }
        } catch (NoSuchFileException e) {
            throw BadInputException.at(file, "", "no such file", "check the path");
        } catch (ZipException e) {
            throw BadInputException.at(file, "", "is not a readable zip archive (" + e.getMessage() + ")",
                    "give an .npz written by numpy.savez; a truncated file must be written again");
        } catch (IOException e) {
            if (!java.nio.file.Files.exists(file)) {
                throw BadInputException.at(file, "", "no such file", "check the path");
            }
            throw BadInputException.at(file, "", "cannot be read (" + e.getMessage() + ")", "check the path and permissions");
        }
        for (String need : List.of("h.npy", "J.npy")) {
            if (!members.containsKey(need)) {
                throw BadInputException.at(file, "", "has no member " + need + " (members: "
                        + String.join(", ", new java.util.TreeSet<>(members.keySet())) + ")",
                        "save it as numpy.savez(path, h=h, J=J)");
            }
        }
        return ProblemFile.of(ising(members.get("h.npy"), members.get("J.npy"), members.get("offset.npy")), null);
    }

    /** Where a value came from: the file, the archive member (or null) and the array's name for messages. */
    private record Where(Path file, String member, String array) {
        BadInputException bad(String place, String problem, String remedy) {
            String p = member == null ? place : place.isEmpty() ? member : member + ", " + place;
            return BadInputException.at(file, p, problem, remedy);
        }

        String entry(int i, int j) {
            return array + "[" + i + ", " + j + "]";
        }
    }

    /** A whole array in memory, elements in file order. */
    private record Array(Where where, NpyHeader header, double[] values) {
        /** Element (i, j) of a square matrix of side n, whatever the storage order. */
        double at(int n, int i, int j) {
            return header.fortranOrder() ? values[j * n + i] : values[i * n + j];
        }
    }

    /** An array from the bytes of an archive member, checked as {@link NpyReader#open} checks a file. */
    private static Array fromBytes(Where w, byte[] b) {
        NpyHeader h;
        try {
            long total = NpyHeader.headerLength(b, b.length, Path.of(w.member()));
            h = NpyHeader.parse(b, (int) Math.min(b.length, total), Path.of(w.member()));
        } catch (BadInputException e) {
            // The header parser names the member as its file; put the archive in front.
            throw new BadInputException(w.file() + ": " + e.getMessage(), e);
        }
        if (w.array().equals("J")) {
            checkSquare(w, h);
        }
        checkFloat(w, h);
        long count = h.elementCount();
        long need = count * h.dtype().size();
        long data = b.length - h.dataOffset();
        if (data != need) {
            throw w.bad("", "holds " + data + " data bytes where its shape " + Arrays.toString(h.shape()) + " of "
                    + h.dtype().describe() + " needs " + need, "the archive is damaged or truncated: write it again");
        }
        ByteBuffer buf = ByteBuffer.wrap(b, (int) h.dataOffset(), (int) need).order(h.dtype().order());
        double[] v = new double[(int) count];
        boolean wide = h.dtype().size() == 8;
        for (int k = 0; k < v.length; k++) {
            v[k] = wide ? buf.getDouble() : buf.getFloat();
        }
        return new Array(w, h, v);
    }

    private static void checkSquare(Where w, NpyHeader h) {
        if (h.ndim() != 2) {
            throw w.bad("header", "shape " + Arrays.toString(h.shape()) + " has " + h.ndim() + " axes; " + w.array()
                    + " must be a 2-D square matrix", "save the n × n matrix itself");
        }
        if (h.axis(0) != h.axis(1)) {
            throw w.bad("header", "shape " + Arrays.toString(h.shape()) + " is not square", "save an n × n matrix");
        }
        if (h.axis(0) > MAX_SIDE) {
            throw w.bad("header", "a " + h.axis(0) + " × " + h.axis(0) + " matrix is too large (at most " + MAX_SIDE
                    + " variables)", "write the problem as obverse.problem/1 JSON with its nonzero terms");
        }
    }

    private static void checkFloat(Where w, NpyHeader h) {
        if (h.dtype().kind() != 'f') {
            throw w.bad("header", "dtype is " + h.dtype().describe() + " ('" + h.dtype().descr()
                    + "'), not float64 or float32", "save it as float64, e.g. " + w.array() + ".astype(numpy.float64)");
        }
    }

    /** Checks every element is finite, naming the first that is not in row-major (i, j) order. */
    private static void checkFinite(Array a, int n) {
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double v = a.at(n, i, j);
                if (!Double.isFinite(v)) {
                    throw a.where().bad(a.where().entry(i, j), "is " + v + ", not a finite number",
                            "replace it with a finite value");
                }
            }
        }
    }

    /**
     * The layout rule: true (upper-triangular, pair weight Q_ij) where the strict lower triangle
     * is all zero; false (symmetric, pair weight Q_ij + Q_ji) where Q is exactly symmetric;
     * otherwise refused, naming the first lower entry (row-major) that differs from its mirror.
     */
    private static boolean upperLayout(Array a, int n) {
        boolean lowerZero = true;
        for (int i = 1; i < n && lowerZero; i++) {
            for (int j = 0; j < i; j++) {
                if (a.at(n, i, j) != 0.0) {
                    lowerZero = false;
                    break;
                }
            }
        }
        if (lowerZero) {
            return true;
        }
        // Name a stray lower entry first (the likely slip in an upper-triangular file), else any asymmetry.
        for (boolean strayOnly : new boolean[] {true, false}) {
            for (int i = 1; i < n; i++) {
                for (int j = 0; j < i; j++) {
                    double lower = a.at(n, i, j);
                    double upper = a.at(n, j, i);
                    if (upper != lower && (lower != 0.0 || !strayOnly)) {
                        throw notALayout(a.where(), i, j, lower, upper);
                    }
                }
            }
        }
        for (int i = 1; i < n; i++) {
            for (int j = 0; j < i; j++) {
                if (!Double.isFinite(a.at(n, i, j) + a.at(n, j, i))) {
                    throw a.where().bad(a.where().entry(j, i), "the pair weight " + a.where().entry(j, i) + " + "
                            + a.where().entry(i, j) + " overflows", "scale the matrix down");
                }
            }
        }
        return false;
    }

    private static BadInputException notALayout(Where w, int i, int j, double lower, double upper) {
        String m = w.array();
        return w.bad(w.entry(i, j), "is " + lower + " but " + w.entry(j, i) + " is " + upper
                + ": the matrix is neither upper-triangular (strict lower triangle all zero) nor symmetric",
                "save the upper triangle, e.g. numpy.triu(" + m + " + " + m + ".T) - numpy.diag(numpy.diag(" + m
                        + ")), which keeps the same x\u1d40" + m + "x, or a symmetric matrix");
    }

    private static BinaryProblem qubo(Array a) {
        int n = (int) a.header().axis(0);
        checkFinite(a, n);
        boolean upper = upperLayout(a, n);
        double[] linear = new double[n];
        for (int i = 0; i < n; i++) {
            linear[i] = a.at(n, i, i) + 0.0; // + 0.0 turns −0.0 into 0.0: a zero gives no term
        }
        Edges e = edges(a, n, upper);
        try {
            return BinaryProblem.of(range(n), linear, e.u, e.v, e.weight, 0.0);
        } catch (InvalidProblemException ex) {
            throw a.where().bad("", ex.getMessage(), "fix the matrix");
        }
    }

    private static IsingProblem ising(Array h, Array j, Array offset) {
        int n = (int) j.header().axis(0);
        if (h.header().ndim() != 1 || h.header().axis(0) != n) {
            throw h.where().bad("header", "shape " + Arrays.toString(h.header().shape()) + " does not match J's "
                    + n + " × " + n, "give h as a vector of " + n + " fields, one per variable");
        }
        checkFinite(j, n);
        for (int i = 0; i < n; i++) {
            if (j.at(n, i, i) != 0.0) {
                throw j.where().bad(j.where().entry(i, i), "is " + j.at(n, i, i) + "; J couples distinct variables and"
                        + " s_i·s_i = 1 is a constant", "set the diagonal to zero and add its sum to offset");
            }
        }
        double[] fields = new double[n];
        for (int i = 0; i < n; i++) {
            double v = h.values()[i];
            if (!Double.isFinite(v)) {
                throw h.where().bad("h[" + i + "]", "is " + v + ", not a finite number", "replace it with a finite value");
            }
            fields[i] = v + 0.0;
        }
        double off = 0.0;
        if (offset != null) {
            NpyHeader oh = offset.header();
            if (!(oh.ndim() == 0 || (oh.ndim() == 1 && oh.axis(0) == 1))) {
                throw offset.where().bad("header", "shape " + Arrays.toString(oh.shape()) + " is not a single number",
                        "save offset as one number (0-d or shape (1,))");
            }
            off = offset.values()[0];
            if (!Double.isFinite(off)) {
                throw offset.where().bad("offset", "is " + off + ", not a finite number", "give a finite offset");
            }
            off += 0.0;
        }
        Edges e = edges(j, n, upperLayout(j, n));
        try {
            return IsingProblem.of(range(n), fields, e.u, e.v, e.weight, off);
        } catch (InvalidProblemException ex) {
            throw j.where().bad("", ex.getMessage(), "fix the arrays");
        }
    }

    /** Nonzero pair weights (i &lt; j) in ascending (i, j) order. */
    private record Edges(int[] u, int[] v, double[] weight) {
    }

    private static Edges edges(Array a, int n, boolean upper) {
        int count = 0;
        for (int i = 0; i < n; i++) {
            for (int j = i + 1; j < n; j++) {
                if (weight(a, n, upper, i, j) != 0.0) {
                    count++;
                }
            }
        }
        int[] u = new int[count];
        int[] v = new int[count];
        double[] q = new double[count];
        int e = 0;
        for (int i = 0; i < n; i++) {
            for (int j = i + 1; j < n; j++) {
                double x = weight(a, n, upper, i, j);
                if (x != 0.0) {
                    u[e] = i;
                    v[e] = j;
                    q[e++] = x;
                }
            }
        }
        return new Edges(u, v, q);
    }

    /** Pair weight of (i, j), i &lt; j, under the layout. */
    private static double weight(Array a, int n, boolean upper, int i, int j) {
        return upper ? a.at(n, i, j) : a.at(n, i, j) + a.at(n, j, i);
    }

    private static VariableIndex range(int n) {
        int[] ids = new int[n];
        for (int i = 0; i < n; i++) {
            ids[i] = i;
        }
        return VariableIndex.of(ids);
    }
}
