package org.obverse.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.stream.Stream;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.testsupport.Seeds;
import org.obverse.testsupport.TrianglePlan;

/**
 * {@code obverse campaign}: the judged properties of a whole campaign, checked from outside the
 * library — the table's reads add up, every setting of the grid is there, run times come from
 * the schedules, every energy is recomputed from the decoded logical samples by a plain loop
 * over the problem file's JSON, ground energies by brute force, the same bytes on one or two
 * threads and after an interrupted run, raw files from another program collected, and bad
 * plans refused in one line with nothing written.
 */
class CampaignCommandTest extends CommandTestSupport {
    @TempDir
    Path dir;

    private Path plan(String text) throws IOException {
        return TrianglePlan.write(dir, text);
    }

    @Test
    void aCampaignRunLeavesOneTableWithEveryReadOfEverySetting() throws IOException {
        Path plan = plan(TrianglePlan.PLAN);
        Path out = dir.resolve("c");
        Run r = obverse("campaign", "run", plan.toString(), "--out", out.toString(), "--quiet");
        assertThat(r.code()).as(r.err()).isEqualTo(Main.DONE);
        assertThat(r.out()).contains("48 jobs").contains("collected 48 of 48 jobs").contains("every check holds");

        List<Map<String, String>> rows = csv(out.resolve("results.csv"));
        // Σ count = instances × chain couplings × schedules × (gauges × reads + the ungauged reference's gauges × reads).
        long total = rows.stream().mapToLong(m -> Long.parseLong(m.get("count"))).sum();
        assertThat(total).isEqualTo(2L * 2 * 3 * (3 * 40 + 3 * 40));
        Set<String> settings = new HashSet<>();
        for (Map<String, String> m : rows) {
            settings.add(m.get("chain_coupling") + "|" + m.get("pause_s") + "|" + m.get("pause_us") + "|" + m.get("gauged"));
            double anneal = Double.parseDouble(m.get("anneal_us"));
            double pause = m.get("pause_us").isEmpty() ? 0 : Double.parseDouble(m.get("pause_us"));
            assertThat(Double.parseDouble(m.get("run_us"))).as(m.toString()).isEqualTo(anneal + pause);
            assertThat(m.get("energy_frame")).isEqualTo("logical");
            assertThat(m.get("gauge").isEmpty()).isEqualTo(m.get("gauged").equals("no"));
        }
        Set<String> expected = new HashSet<>();
        for (String v : new String[] {"-1.2", "-1.8"}) {
            for (String p : new String[] {"||", "0.3|0.5", "0.6|0.5"}) {
                for (String g : new String[] {"yes", "no"}) {
                    expected.add(v + "|" + (p.equals("||") ? "|" : p) + "|" + g);
                }
            }
        }
        assertThat(settings).isEqualTo(expected);

        // Ground energies by brute force over the 8 assignments of each triangle (a plain loop).
        Map<String, String> ground = new HashMap<>();
        for (Map<String, String> m : csv(out.resolve("ground.csv"))) {
            ground.put(m.get("instance"), m.get("ground_energy"));
            assertThat(m.get("ground_source")).isEqualTo("exact");
        }
        for (String inst : new String[] {"tri-a", "tri-b"}) {
            Problem p = Problem.read(dir.resolve(inst + ".json"));
            double best = Double.POSITIVE_INFINITY;
            for (int x = 0; x < 8; x++) {
                best = Math.min(best, p.energy(new int[] {(x & 1) == 1 ? 1 : -1, (x & 2) == 2 ? 1 : -1, (x & 4) == 4 ? 1 : -1}));
            }
            assertThat(Double.parseDouble(ground.get(inst))).isCloseTo(best, org.assertj.core.data.Offset.offset(1e-12));
        }

        // Every row's energy, recomputed from the job's decoded logical samples.
        Map<String, Map<Double, Long>> perJob = new HashMap<>();
        for (Map<String, String> m : rows) {
            if (!m.get("energy").isEmpty()) {
                perJob.computeIfAbsent(m.get("job"), k -> new HashMap<>())
                        .merge(Double.parseDouble(m.get("energy")), Long.parseLong(m.get("count")), Long::sum);
            }
        }
        for (Map<String, String> job : csv(out.resolve("jobs.csv"))) {
            Problem p = Problem.read(dir.resolve(job.get("instance") + ".json"));
            byte[][] reads = npyInt8(out.resolve("decoded/" + job.get("job") + ".npy"), 3);
            Map<Double, Long> recomputed = new HashMap<>();
            for (byte[] read : reads) {
                int[] s = {read[0], read[1], read[2]};
                recomputed.merge(p.energy(s), 1L, Long::sum);
            }
            Map<Double, Long> table = perJob.getOrDefault(job.get("job"), Map.of());
            assertThat(table.values().stream().mapToLong(Long::longValue).sum()).isEqualTo(reads.length);
            for (Map.Entry<Double, Long> e : recomputed.entrySet()) {
                long inTable = table.entrySet().stream().filter(t -> Math.abs(t.getKey() - e.getKey()) <= 1e-12)
                        .mapToLong(Map.Entry::getValue).sum();
                assertThat(inTable).as(job.get("job") + " energy " + e.getKey()).isEqualTo(e.getValue());
            }
        }
    }

    @Test
    void theSameBytesOnOneOrTwoThreadsAndAfterAnInterruptedRun() throws IOException {
        Path plan = plan(TrianglePlan.PLAN);
        Path one = dir.resolve("one");
        Path two = dir.resolve("two");
        assertThat(obverse("campaign", "run", plan.toString(), "--out", one.toString(), "--threads", "1", "--quiet").code())
                .isEqualTo(Main.DONE);
        assertThat(obverse("campaign", "run", plan.toString(), "--out", two.toString(), "--threads", "2", "--quiet").code())
                .isEqualTo(Main.DONE);
        assertThat(Files.readAllBytes(two.resolve("results.csv"))).isEqualTo(Files.readAllBytes(one.resolve("results.csv")));
        assertThat(Files.readAllBytes(two.resolve("jobs.csv"))).isEqualTo(Files.readAllBytes(one.resolve("jobs.csv")));

        // A run stopped half-way: half the raw files gone, one write left as a temporary file.
        UniformRandomProvider rng = Seeds.rng(20261202L);
        List<Path> raw;
        try (Stream<Path> s = Files.list(two.resolve("raw"))) {
            raw = s.filter(p -> p.getFileName().toString().matches("j\\d+\\.npy")).sorted().toList();
        }
        for (Path p : raw) {
            if (rng.nextBoolean()) {
                Files.delete(p);
            }
        }
        Files.writeString(two.resolve("raw/.j00003.npy.12345.part"), "half a file");
        Files.delete(two.resolve("results.csv"));
        Run again = obverse("campaign", "run", plan.toString(), "--out", two.toString(), "--quiet");
        assertThat(again.code()).as(again.err()).isEqualTo(Main.DONE);
        assertThat(again.out()).contains("already had raw samples");
        assertThat(Files.exists(two.resolve("raw/.j00003.npy.12345.part"))).isFalse();
        assertThat(Files.readAllBytes(two.resolve("results.csv"))).isEqualTo(Files.readAllBytes(one.resolve("results.csv")));
        // Collecting again changes nothing.
        assertThat(obverse("campaign", "collect", two.toString(), "--quiet").code()).isEqualTo(Main.DONE);
        assertThat(Files.readAllBytes(two.resolve("results.csv"))).isEqualTo(Files.readAllBytes(one.resolve("results.csv")));
    }

    @Test
    void thePathIntegralSamplerRunsACampaignWithTheSameBytesOnAnyThreadCount() throws IOException {
        Path plan = plan(TrianglePlan.PLAN.replace("{\"kind\": \"sa\", \"sweeps_per_us\": 60, \"errors\": \"errors.json\"}",
                "{\"kind\": \"sqa\", \"sweeps_per_us\": 40, \"temperature\": 0.1, \"slices\": 8}"));
        Path one = dir.resolve("sqa1");
        Path two = dir.resolve("sqa2");
        Run r = obverse("campaign", "run", plan.toString(), "--out", one.toString(), "--threads", "1", "--quiet");
        assertThat(r.code()).as(r.err()).isEqualTo(Main.DONE);
        assertThat(obverse("campaign", "run", plan.toString(), "--out", two.toString(), "--threads", "2", "--quiet")
                .code()).isEqualTo(Main.DONE);
        assertThat(Files.readAllBytes(two.resolve("results.csv"))).isEqualTo(Files.readAllBytes(one.resolve("results.csv")));
        long total = csv(one.resolve("results.csv")).stream().mapToLong(m -> Long.parseLong(m.get("count"))).sum();
        assertThat(total).isEqualTo(2L * 2 * 3 * (3 * 40 + 3 * 40));
        Path bad = plan(TrianglePlan.PLAN.replace("{\"kind\": \"sa\", \"sweeps_per_us\": 60, \"errors\": \"errors.json\"}",
                "{\"kind\": \"sqa\", \"temperature\": 0, \"slices\": 8}"));
        Run refused = obverse("campaign", "prepare", bad.toString(), "--out", dir.resolve("no").toString());
        assertThat(refused.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(refused.err()).contains("sampler.temperature: 0.0 is not positive");
    }

    @Test
    void rawSamplesFromAnotherProgramAreCollectedAndATamperedJobIsListed() throws IOException {
        Path plan = plan(TrianglePlan.PLAN.replace("{\"kind\": \"sa\", \"sweeps_per_us\": 60, \"errors\": \"errors.json\"}",
                "\"external\""));
        Path out = dir.resolve("ext");
        Run p = obverse("campaign", "prepare", plan.toString(), "--out", out.toString(), "--quiet");
        assertThat(p.code()).as(p.err()).isEqualTo(Main.DONE);
        Run refused = obverse("campaign", "run", out.toString());
        assertThat(refused.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(refused.err()).contains("sampler: is external");

        // A "device": seeded random spins for the first 10 jobs, written as NPY by hand (NEP 1 layout).
        ObjectMapper json = new ObjectMapper();
        List<Map<String, String>> jobs = csv(out.resolve("jobs.csv"));
        UniformRandomProvider rng = Seeds.rng(77L);
        for (Map<String, String> j : jobs.subList(0, 10)) {
            JsonNode problem = json.readTree(out.resolve(j.get("problem")).toFile());
            Set<Integer> ids = new HashSet<>();
            problem.path("h").forEach(t -> ids.add(t.get(0).asInt()));
            problem.path("J").forEach(t -> {
                ids.add(t.get(0).asInt());
                ids.add(t.get(1).asInt());
            });
            problem.path("variables").forEach(t -> ids.add(t.asInt()));
            int n = ids.size();
            int reads = Integer.parseInt(j.get("reads"));
            byte[] spins = new byte[reads * n];
            for (int k = 0; k < spins.length; k++) {
                spins[k] = (byte) (rng.nextBoolean() ? 1 : -1);
            }
            Files.write(out.resolve(j.get("raw")), npy(spins, reads, n));
        }
        // A reported energy that no sample has: that job fails, the others are collected.
        Files.write(out.resolve("raw/j00004.energies.npy"), npyFloat64(new double[40], 40));
        Run c = obverse("campaign", "collect", out.toString(), "--quiet");
        assertThat(c.code()).isEqualTo(Main.CHECK_FAILED);
        assertThat(c.out()).contains("collected 9 of 48 jobs (38 without raw samples)").contains("FAILED j00004: read 0 reports");
        long total = csv(out.resolve("results.csv")).stream().mapToLong(m -> Long.parseLong(m.get("count"))).sum();
        long expected = jobs.subList(0, 10).stream().filter(j -> !j.get("job").equals("j00004"))
                .mapToLong(j -> Long.parseLong(j.get("reads"))).sum();
        assertThat(total).isEqualTo(expected);
        assertThat(Files.readString(out.resolve("audit.txt"))).contains("FAILED j00004");
    }

    @Test
    void badPlansAreRefusedInOneLineNamingTheKeyAndNothingIsWritten() throws IOException {
        String[][] cases = {
            {"[0.3, 0.6]", "[0.3, 1.6]", "schedules.pause_s[1]: 1.6 is outside (0, 1)"},
            {"\"pause_us\": [0.5]", "\"pause_us\": [-1]", "schedules.pause_us[0]: -1.0 is negative"},
            {"[-1.2, -1.8]", "[-1.2, -2.5]", "chain_couplings[1]: -2.5 is outside the device's coupling range"},
            {"\"tri-b.json\"", "\"tri-x.json\"", "instances[1].problem: no such file"},
            {"\"reads\": 40,", "", "reads: is missing"},
            {"\"reads\": 40,", "\"reads\": 40, \"read\": 4,", "read: is not a key of a campaign plan"},
        };
        for (String[] c : cases) {
            Path plan = plan(TrianglePlan.PLAN.replace(c[0], c[1]));
            Path out = dir.resolve("bad");
            for (String verb : new String[] {"prepare", "run"}) {
                Run r = obverse("campaign", verb, plan.toString(), "--out", out.toString(), "--quiet");
                assertThat(r.code()).as(c[2]).isEqualTo(Main.BAD_INPUT);
                assertThat(r.err()).contains(c[2]).contains("plan.json");
                assertThat(r.err().strip().lines().count()).isEqualTo(1);
                assertThat(Files.exists(out)).isFalse();
            }
        }
        // A folder prepared from another plan is not resumed by this one.
        Path plan = plan(TrianglePlan.PLAN);
        Path out = dir.resolve("prep");
        assertThat(obverse("campaign", "prepare", plan.toString(), "--out", out.toString(), "--quiet").code()).isEqualTo(0);
        Path other = plan(TrianglePlan.PLAN.replace("\"reads\": 40", "\"reads\": 41"));
        Run r = obverse("campaign", "run", other.toString(), "--out", out.toString(), "--quiet");
        assertThat(r.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(r.err()).contains("was prepared from another plan");
    }

    // --- plain readers, independent of the library --------------------------------------------

    /** A spin problem read straight from its JSON, energy by a plain loop (DESIGN.md's formula). */
    private record Problem(Map<Integer, Double> h, List<double[]> j, double offset) {
        static Problem read(Path file) throws IOException {
            JsonNode root = new ObjectMapper().readTree(file.toFile());
            Map<Integer, Double> h = new HashMap<>();
            root.get("h").forEach(t -> h.put(t.get(0).asInt(), t.get(1).asDouble()));
            List<double[]> j = new ArrayList<>();
            root.get("J").forEach(t -> j.add(new double[] {t.get(0).asInt(), t.get(1).asInt(), t.get(2).asDouble()}));
            return new Problem(h, j, root.get("offset").asDouble());
        }

        double energy(int[] s) {
            double e = offset;
            for (Map.Entry<Integer, Double> f : h.entrySet()) {
                e += f.getValue() * s[f.getKey()];
            }
            for (double[] t : j) {
                e += t[2] * s[(int) t[0]] * s[(int) t[1]];
            }
            return e;
        }
    }

    private static List<Map<String, String>> csv(Path file) throws IOException {
        List<String> lines = Files.readAllLines(file);
        String[] header = lines.get(0).split(",", -1);
        List<Map<String, String>> out = new ArrayList<>();
        for (String line : lines.subList(1, lines.size())) {
            String[] f = line.split(",", -1);
            Map<String, String> m = new HashMap<>();
            for (int k = 0; k < header.length; k++) {
                m.put(header[k], f[k]);
            }
            out.add(m);
        }
        return out;
    }

    /** int8 rows of an NPY v1 file (NumPy's format description, NEP 1): magic, version, header length, header, data. */
    private static byte[][] npyInt8(Path file, int width) throws IOException {
        byte[] b = Files.readAllBytes(file);
        int headerLength = (b[8] & 0xff) | (b[9] & 0xff) << 8;
        String header = new String(b, 10, headerLength, StandardCharsets.ISO_8859_1);
        assertThat(header).contains("'descr': '|i1'");
        int data = 10 + headerLength;
        int reads = (b.length - data) / width;
        byte[][] rows = new byte[reads][width];
        for (int r = 0; r < reads; r++) {
            System.arraycopy(b, data + r * width, rows[r], 0, width);
        }
        return rows;
    }

    private static byte[] npy(byte[] data, int rows, int cols) {
        return npyBytes("|i1", "(" + rows + ", " + cols + ")", data);
    }

    private static byte[] npyFloat64(double[] values, int n) {
        ByteBuffer b = ByteBuffer.allocate(8 * n).order(ByteOrder.LITTLE_ENDIAN);
        for (double v : values) {
            b.putDouble(v);
        }
        return npyBytes("<f8", "(" + n + ",)", b.array());
    }

    private static byte[] npyBytes(String descr, String shape, byte[] data) {
        String dict = "{'descr': '" + descr + "', 'fortran_order': False, 'shape': " + shape + ", }";
        int total = 10 + dict.length() + 1;
        int pad = (64 - total % 64) % 64;
        String header = dict + " ".repeat(pad) + "\n";
        ByteBuffer out = ByteBuffer.allocate(10 + header.length() + data.length).order(ByteOrder.LITTLE_ENDIAN);
        out.put((byte) 0x93).put("NUMPY".getBytes(StandardCharsets.US_ASCII)).put((byte) 1).put((byte) 0);
        out.putShort((short) header.length()).put(header.getBytes(StandardCharsets.US_ASCII)).put(data);
        return out.array();
    }
}
