package org.obverse.io.codec;

import org.obverse.io.BadInputException;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.model.BinaryProblem;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;
import static org.obverse.testsupport.NpyBytes.f4;
import static org.obverse.testsupport.NpyBytes.f8;
import static org.obverse.testsupport.NpyBytes.matrix;
import static org.obverse.testsupport.NpyBytes.members;
import static org.obverse.testsupport.NpyBytes.npy;
import static org.obverse.testsupport.NpyBytes.vector;
import static org.obverse.testsupport.NpyBytes.zip;

/**
 * Problems read from NPY matrices and NPZ archives built byte by byte (NumPy NEP 1 and the
 * numpy.lib.format / numpy.savez documentation, see {@code testsupport.NpyBytes}); energies are
 * checked against a direct evaluation of xᵀQx (binary) and offset + hᵀs + sᵀJs (spin) over
 * every assignment — the definitions in spec/formats.md, common practice, no source.
 */
class NpyProblemTest extends QuietTest {
    @TempDir
    Path dir;

    private Path file(String name, byte[] bytes) throws IOException {
        Path p = dir.resolve(name);
        Files.write(p, bytes);
        return p;
    }

    @Test
    void readsAHandWrittenMatrix() throws IOException {
        // Magic, version 1.0, HEADER_LEN 0x76 = 118 (10 + 118 = 128), the 59-character dict, 58
        // spaces, '\n', then Q = [[-1, 2], [0, 3]] as '<f8' in C order:
        // -1.0 = 0xBFF0000000000000, 2.0 = 0x4000000000000000, 3.0 = 0x4008000000000000.
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        b.writeBytes(new byte[] {(byte) 0x93, 0x4E, 0x55, 0x4D, 0x50, 0x59, 0x01, 0x00, 0x76, 0x00});
        String dict = "{'descr': '<f8', 'fortran_order': False, 'shape': (2, 2), }";
        assertThat(dict).hasSize(59);
        b.writeBytes(dict.getBytes(StandardCharsets.US_ASCII));
        b.writeBytes(" ".repeat(58).getBytes(StandardCharsets.US_ASCII));
        b.write('\n');
        b.writeBytes(new byte[] {0, 0, 0, 0, 0, 0, (byte) 0xF0, (byte) 0xBF});
        b.writeBytes(new byte[] {0, 0, 0, 0, 0, 0, 0, 0x40});
        b.writeBytes(new byte[8]);
        b.writeBytes(new byte[] {0, 0, 0, 0, 0, 0, 0x08, 0x40});
        Path p = file("q.npy", b.toByteArray());

        ProblemFile pf = ProblemCodec.read(p);
        assertThat(pf.domain()).isEqualTo("binary");
        BinaryProblem q = pf.binary();
        assertThat(q.variables()).isEqualTo(VariableIndex.of(0, 1));
        assertThat(q.linear(0)).isEqualTo(-1.0);
        assertThat(q.linear(1)).isEqualTo(3.0);
        assertThat(q.edgeCount()).isEqualTo(1);
        assertThat(q.quadratic(0)).isEqualTo(2.0);
        // E(1, 1) = -1 + 2 + 3 = 4 by hand.
        assertThat(q.energy(new byte[] {1, 1})).isEqualTo(4.0);
        assertThat(pf.meta()).isNull();
    }

    /** A random upper-triangular matrix with about a third of its entries zero. */
    private static double[][] randomUpper(UniformRandomProvider rng, int n, boolean zeroDiagonal) {
        double[][] u = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = i; j < n; j++) {
                if ((i == j && zeroDiagonal) || rng.nextInt(3) == 0) {
                    continue;
                }
                u[i][j] = rng.nextDouble() * 4 - 2;
            }
        }
        return u;
    }

    /** The symmetric matrix with the same xᵀMx: halves of each pair weight in both triangles (exact for normal doubles). */
    private static double[][] symmetric(double[][] u) {
        int n = u.length;
        double[][] s = new double[n][n];
        for (int i = 0; i < n; i++) {
            s[i][i] = u[i][i];
            for (int j = i + 1; j < n; j++) {
                s[i][j] = u[i][j] / 2;
                s[j][i] = u[i][j] / 2;
            }
        }
        return s;
    }

    private static double quadraticForm(double[][] m, byte[] x) {
        double sum = 0;
        for (int i = 0; i < m.length; i++) {
            for (int j = 0; j < m.length; j++) {
                sum += m[i][j] * x[i] * x[j];
            }
        }
        return sum;
    }

    @Test
    void matrixEnergiesEqualTheQuadraticFormAndBothLayoutsGiveOneProblem() {
        Seeds.forEachCase(200, 5100, (rng, seed) -> {
            int n = 1 + rng.nextInt(8);
            double[][] upper = randomUpper(rng, n, false);
            double[][] sym = symmetric(upper);
            Path pu = file("u" + seed + ".npy", matrix(upper, rng.nextBoolean()));
            Path ps = file("s" + seed + ".npy", matrix(sym, rng.nextBoolean()));
            BinaryProblem fromUpper = ProblemCodec.read(pu).binary();
            BinaryProblem fromSym = ProblemCodec.read(ps).binary();
            assertThat(fromSym).isEqualTo(fromUpper);
            assertThat(ProblemCodec.contentHash(ProblemCodec.read(ps))).isEqualTo(ProblemCodec.contentHash(ProblemCodec.read(pu)));
            // Every id 0..n-1 exists, even a variable with no term.
            assertThat(fromUpper.variables().size()).isEqualTo(n);
            double scale = 0;
            for (double[] row : upper) {
                for (double v : row) {
                    scale += Math.abs(v);
                }
            }
            byte[] x = new byte[n];
            for (int mask = 0; mask < 1 << n; mask++) {
                for (int k = 0; k < n; k++) {
                    x[k] = (byte) ((mask >> k) & 1);
                }
                double e = fromUpper.energy(x);
                assertThat(e).isCloseTo(quadraticForm(upper, x), within(1e-12 * (1 + scale)));
                assertThat(e).isCloseTo(quadraticForm(sym, x), within(1e-12 * (1 + scale)));
            }
        });
    }

    @Test
    void archiveEnergiesEqualTheDirectSumAndLayoutsAgree() {
        Seeds.forEachCase(150, 5300, (rng, seed) -> {
            int n = 1 + rng.nextInt(7);
            double[] h = new double[n];
            for (int i = 0; i < n; i++) {
                h[i] = rng.nextInt(4) == 0 ? 0 : rng.nextDouble() * 2 - 1;
            }
            double[][] upper = randomUpper(rng, n, true);
            double[][] sym = symmetric(upper);
            double offset = rng.nextDouble() * 10 - 5;
            int offsetForm = rng.nextInt(3); // absent, 0-d, shape (1,)
            byte[] off = offsetForm == 1 ? npy("<f8", false, new long[0], f8(ByteOrder.LITTLE_ENDIAN, offset))
                    : vector(offset);
            boolean deflate = rng.nextBoolean();
            byte[] a = zip(offsetForm == 0 ? members("h.npy", vector(h), "J.npy", matrix(upper, rng.nextBoolean()))
                    : members("J.npy", matrix(upper, false), "offset.npy", off, "h.npy", vector(h)), deflate);
            byte[] b = zip(offsetForm == 0 ? members("J.npy", matrix(sym, rng.nextBoolean()), "h.npy", vector(h))
                    : members("h.npy", vector(h), "offset.npy", off, "J.npy", matrix(sym, true)), !deflate);
            IsingProblem pa = ProblemCodec.read(file("a" + seed + ".npz", a)).spin();
            IsingProblem pb = ProblemCodec.read(file("b" + seed + ".npz", b)).spin();
            assertThat(pb).isEqualTo(pa);
            assertThat(pa.size()).isEqualTo(n);
            double c = offsetForm == 0 ? 0 : offset;
            assertThat(pa.offset()).isEqualTo(c);
            byte[] s = new byte[n];
            for (int mask = 0; mask < 1 << n; mask++) {
                double direct = c;
                for (int k = 0; k < n; k++) {
                    s[k] = (byte) (((mask >> k) & 1) == 1 ? 1 : -1);
                    direct += h[k] * s[k];
                }
                direct += quadraticForm(upper, s);
                assertThat(pa.energy(s)).isCloseTo(direct, within(1e-11));
                assertThat(pa.energy(s)).isCloseTo(c + dot(h, s) + quadraticForm(sym, s), within(1e-11));
            }
        });
    }

    private static double dot(double[] h, byte[] s) {
        double sum = 0;
        for (int i = 0; i < h.length; i++) {
            sum += h[i] * s[i];
        }
        return sum;
    }

    @Test
    void otherFloatTypesAndByteOrders() throws IOException {
        // Q = [[0.5, -1.5], [0, 0.25]]: big-endian float64, then float32 (each value exact in binary32).
        Path be = file("be.npy", npy(">f8", false, new long[] {2, 2}, f8(ByteOrder.BIG_ENDIAN, 0.5, -1.5, 0, 0.25)));
        Path f32 = file("f4.npy", npy("<f4", false, new long[] {2, 2}, f4(0.5f, -1.5f, 0f, 0.25f)));
        Path le = file("le.npy", matrix(new double[][] {{0.5, -1.5}, {0, 0.25}}, false));
        BinaryProblem expected = ProblemCodec.read(le).binary();
        assertThat(ProblemCodec.read(be).binary()).isEqualTo(expected);
        assertThat(ProblemCodec.read(f32).binary()).isEqualTo(expected);
        assertThat(expected.quadratic(0)).isEqualTo(-1.5);
    }

    @Test
    void hashIsTheHashOfTheDecodedProblem() throws IOException {
        Path q = file("q.npy", matrix(new double[][] {{-1, 2, 0}, {0, -1, 2}, {0, 0, -1}}, false));
        ProblemFile fromNpy = ProblemCodec.read(q);
        Path json = dir.resolve("q.json");
        ProblemCodec.write(json, false, fromNpy);
        assertThat(ProblemCodec.contentHash(ProblemCodec.read(json))).isEqualTo(ProblemCodec.contentHash(fromNpy));
        // The same QUBO as examples/logical.json (whose meta is left out of the comparison).
        assertThat(fromNpy.binary()).isEqualTo(ProblemCodec.read(Path.of("examples/logical.json")).binary());
    }

    @Test
    void isolatedVariablesAndZeroEntriesAreKept() throws IOException {
        // Variable 2 has no term; -0.0 is zero and gives no term.
        BinaryProblem q = ProblemCodec.read(file("iso.npy", matrix(new double[][] {{1, -0.0, 0}, {0, 0, 3}, {0, 0, 0}},
                false))).binary();
        assertThat(q.variables()).isEqualTo(VariableIndex.of(0, 1, 2));
        assertThat(q.edgeCount()).isEqualTo(1);
        assertThat(q.linear(1)).isEqualTo(0.0);
        assertThat(Double.doubleToRawLongBits(q.linear(1))).isZero();
    }

    private void refused(Path p, String... parts) {
        assertThatThrownBy(() -> ProblemCodec.read(p)).isInstanceOf(BadInputException.class)
                .satisfies(e -> assertThat(e.getMessage()).doesNotContain("\n").startsWith(p.toString())
                        .contains(parts));
    }

    @Test
    void badMatricesAreRefusedInOneLine() throws IOException {
        refused(file("int.npy", npy("<i8", false, new long[] {1, 1}, new byte[8])), "int64", "not float64", "astype");
        refused(file("rect.npy", npy("<f8", false, new long[] {2, 3}, new byte[48])), "[2, 3]", "not square");
        refused(file("vec.npy", vector(1, 2, 3)), "[3]", "1 axes", "2-D");
        refused(file("cube.npy", npy("<f8", false, new long[] {1, 1, 1}, new byte[8])), "3 axes");
        refused(file("mixed.npy", matrix(new double[][] {{1, 2, 0}, {0, 1, 0}, {0, 5, 1}}, false)),
                "Q[2, 1]", "is 5.0 but Q[1, 2] is 0.0", "neither upper-triangular", "numpy.triu");
        // Only zero lower entries differ from their mirrors: the first of them is named.
        refused(file("upper-gap.npy", matrix(new double[][] {{1, 2, 3}, {2, 1, 0}, {0, 0, 1}}, false)),
                "Q[2, 0]", "is 0.0 but Q[0, 2] is 3.0");
        refused(file("asym.npy", matrix(new double[][] {{1, 2}, {3, 1}}, false)), "Q[1, 0]", "is 3.0 but Q[0, 1] is 2.0");
        refused(file("nan.npy", matrix(new double[][] {{1, 0, 0}, {0, 1, Double.NaN}, {0, 0, 1}}, false)),
                "Q[1, 2]", "NaN", "not a finite number");
        refused(file("inf.npy", matrix(new double[][] {{1, 0}, {Double.NEGATIVE_INFINITY, 1}}, true)), "Q[1, 0]",
                "-Infinity");
        byte[] whole = matrix(new double[][] {{1, 2}, {0, 3}}, false);
        refused(file("cut.npy", Arrays.copyOf(whole, whole.length - 3)), "truncated");
        refused(file("cuthead.npy", Arrays.copyOf(whole, 40)), "truncated");
        refused(file("notnpy.npy", "{\"format\": \"obverse.problem/1\"}".getBytes(StandardCharsets.UTF_8)),
                "magic");
        refused(dir.resolve("missing.npy"), "no such file");
    }

    @Test
    void badArchivesAreRefusedInOneLine() throws IOException {
        byte[] h = vector(0.5, -0.5);
        byte[] j = matrix(new double[][] {{0, 1}, {0, 0}}, false);
        refused(file("extra.npz", zip(members("h.npy", h, "J.npy", j, "Q.npy", j), false)), "member Q.npy",
                "not one of h.npy, J.npy, offset.npy");
        refused(file("positional.npz", zip(members("arr_0.npy", h, "arr_1.npy", j), true)), "arr_0.npy", "h=h, J=J");
        refused(file("noj.npz", zip(members("h.npy", h), false)), "no member J.npy");
        refused(file("diag.npz", zip(members("h.npy", h, "J.npy", matrix(new double[][] {{0, 1}, {0, 2}}, false)),
                false)), "J.npy, J[1, 1]", "is 2.0", "set the diagonal to zero");
        refused(file("hlen.npz", zip(members("h.npy", vector(1, 2, 3), "J.npy", j), false)), "h.npy", "[3]", "2 × 2");
        refused(file("jmixed.npz", zip(members("h.npy", h, "J.npy", matrix(new double[][] {{0, 1}, {2, 0}}, false)),
                true)), "J.npy, J[1, 0]", "neither upper-triangular");
        refused(file("jint.npz", zip(members("h.npy", h, "J.npy", npy("<i4", false, new long[] {2, 2}, new byte[16])),
                false)), "J.npy", "int32");
        refused(file("hnan.npz", zip(members("h.npy", vector(0, Double.NaN), "J.npy", j), false)), "h[1]", "NaN");
        refused(file("off.npz", zip(members("h.npy", h, "J.npy", j, "offset.npy", vector(1, 2)), false)),
                "offset.npy", "[2]", "one number");
        refused(file("jvec.npz", zip(members("h.npy", h, "J.npy", h), false)), "J.npy", "2-D");
        // A member whose data is cut short inside an intact archive.
        byte[] cutMember = Arrays.copyOf(j, j.length - 8);
        refused(file("cutmember.npz", zip(members("h.npy", h, "J.npy", cutMember), false)), "J.npy", "truncated");
        // A member whose header is damaged: the header parser's message, with the archive in front.
        byte[] badMagic = j.clone();
        badMagic[1] = 'X';
        refused(file("magic.npz", zip(members("h.npy", h, "J.npy", badMagic), false)), "J.npy", "magic");
        // The archive itself cut short.
        byte[] whole = zip(members("h.npy", h, "J.npy", j), true);
        refused(file("cut.npz", Arrays.copyOf(whole, whole.length - 30)), "zip", "truncated");
        refused(file("notzip.npz", j), "zip");
    }
}
