package org.obverse.cli;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.Map;
import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.io.samples.SampleFiles;
import org.obverse.io.npy.NpyVectors;
import org.obverse.model.VariableIndex;
import org.obverse.samples.SampleBlock;

/**
 * The attack harness's material: valid seed files of every format obverse reads (the examples,
 * plus a few written here), and a seeded mutator in the manner of byte-level fuzzers (bit flips,
 * random bytes, inserted boundary tokens, deleted, duplicated and truncated ranges). Common
 * practice, no source.
 */
final class FuzzCorpus {
    /** How many times the default case counts to run: 1 in {@code mvn verify}, more with {@code -Pfuzz}. */
    static final int SCALE = Integer.getInteger("obverse.fuzz.scale", 1);

    private static final String[] TOKENS = {
        "\u0000", "\r", "\n", "\r\n", ",", "\"", "'", "[", "]", "{", "}", "(", ")", ":", "-", " ", "\t", "L",
        "1e999", "-1e999", "1e-400", "99999999999999999999", "2147483648", "-2147483649", "9223372036854775808",
        "NaN", "Infinity", "null", "true", "False", "0x1f", "\u001b[2J", "\ufeff", "é", "-0", "0.5", "4294967296",
        "{\"a\":", "[[", "]]", "\"format\"", "\"meta\"", "\"J\"", "\"shape\"", "'shape': (", "'descr': '<f8'",
        "'descr': '|b1'", "'fortran_order': True", "2147483648, 0", ", ", "\u00ff", "\u0093NUMPY",
    };
    private static final byte[][] RAW = {{(byte) 0xC3}, {(byte) 0xFF}, {(byte) 0xED, (byte) 0xA0, (byte) 0x80},
        {(byte) 0xF4, (byte) 0x90, (byte) 0x80, (byte) 0x80}, {(byte) 0x80}, {0x1f}, {0x7f}};

    private FuzzCorpus() {
    }

    /** The seed files by name, read from examples/ and written into dir. */
    static Map<String, byte[]> seeds(Path dir) throws IOException {
        Map<String, byte[]> m = new LinkedHashMap<>();
        for (String name : new String[] {"problem.json", "logical.json", "device.json", "chains.json", "errors.json",
            "schedule-pause.json", "results.csv", "ground.csv", "samples.csv", "schedule-table.csv"}) {
            m.put(name, Files.readAllBytes(Path.of("examples", name)));
        }
        m.put("manifest.json", Files.readAllBytes(Path.of("examples/gauges/manifest.json")));
        m.put("g0000.json", Files.readAllBytes(Path.of("examples/gauges/g0000.json")));
        Path npy = dir.resolve("seed-samples.npy");
        SampleBlock b = SampleBlock.allDown(5, 6);
        b.setSpin(1, 2, 1);
        b.setSpin(3, 0, 1);
        SampleFiles.writeAll(npy, VariableIndex.of(0, 1, 2, 3, 4, 5), true, b);
        m.put("samples.npy", Files.readAllBytes(npy));
        Path energies = dir.resolve("seed-energies.npy");
        NpyVectors.writeFloat64(energies, true, new double[] {-1.5, 2, 0});
        m.put("energies.npy", Files.readAllBytes(energies));
        m.put("magnetisation.csv", ("qubit,gauge,reads,sum_spin,sign\n0,0,4,2,1\n1,0,4,-2,-1\n0,1,4,0,1\n1,1,4,4,1\n")
                .getBytes(StandardCharsets.UTF_8));
        m.put("correlations.csv", ("qubit_a,qubit_b,gauge,reads,sum_product,sign\n0,1,0,4,2,1\n0,1,1,4,-4,-1\n")
                .getBytes(StandardCharsets.UTF_8));
        Files.delete(npy);
        Files.delete(energies);
        return m;
    }

    /** One to four mutations of a seed file. */
    static byte[] mutate(byte[] seed, UniformRandomProvider rng) {
        byte[] b = seed.clone();
        int ops = 1 + rng.nextInt(4);
        for (int k = 0; k < ops; k++) {
            int at = b.length == 0 ? 0 : rng.nextInt(b.length + 1);
            switch (rng.nextInt(7)) {
                case 0:
                    if (b.length > 0) {
                        int i = Math.min(at, b.length - 1);
                        b[i] ^= (byte) (1 << rng.nextInt(8));
                    }
                    break;
                case 1:
                    if (b.length > 0) {
                        b[Math.min(at, b.length - 1)] = (byte) rng.nextInt(256);
                    }
                    break;
                case 2:
                    b = insert(b, at, TOKENS[rng.nextInt(TOKENS.length)].getBytes(StandardCharsets.UTF_8));
                    break;
                case 3:
                    b = insert(b, at, RAW[rng.nextInt(RAW.length)]);
                    break;
                case 4: {
                    int len = Math.min(b.length - at, 1 + rng.nextInt(16));
                    byte[] c = new byte[b.length - len];
                    System.arraycopy(b, 0, c, 0, at);
                    System.arraycopy(b, at + len, c, at, b.length - at - len);
                    b = c;
                    break;
                }
                case 5: {
                    int len = Math.min(b.length - at, 1 + rng.nextInt(32));
                    b = insert(b, at, Arrays.copyOfRange(b, at, at + len));
                    break;
                }
                default:
                    b = Arrays.copyOf(b, at);
                    break;
            }
        }
        return b;
    }

    private static byte[] insert(byte[] b, int at, byte[] piece) {
        byte[] c = new byte[b.length + piece.length];
        System.arraycopy(b, 0, c, 0, at);
        System.arraycopy(piece, 0, c, at, piece.length);
        System.arraycopy(b, at, c, at + piece.length, b.length - at);
        return c;
    }
}
