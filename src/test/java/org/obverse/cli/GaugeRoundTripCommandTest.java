package org.obverse.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.codec.GaugeManifest;
import org.obverse.io.codec.ManifestCodec;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.samples.SampleFiles;
import org.obverse.model.IsingProblem;
import org.obverse.samples.SampleBlock;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

/** gauge → raw samples → ungauge → audit through the command line, and what bad input gets. */
class GaugeRoundTripCommandTest extends CommandTestSupport {
    @TempDir
    Path dir;
    Path problem;
    Path device;
    Path chains;

    @BeforeEach
    void copyExamples() throws Exception {
        problem = copy("problem.json");
        device = copy("device.json");
        chains = copy("chains.json");
    }

    private Path copy(String name) throws Exception {
        Path target = dir.resolve(name);
        Files.copy(Path.of("examples", name), target, StandardCopyOption.REPLACE_EXISTING);
        return target;
    }

    private Run gauge(String out, String... extra) {
        String[] base = {"gauge", "--problem", problem.toString(), "--device", device.toString(), "--chains",
            chains.toString(), "--count", "8", "--seed", "11", "--out", dir.resolve(out).toString()};
        String[] all = java.util.Arrays.copyOf(base, base.length + extra.length);
        System.arraycopy(extra, 0, all, base.length, extra.length);
        return obverse(all);
    }

    /** Raw samples in the device frame, one file per gauge, with reported energies. */
    private Path writeRawSamples(Path gauges, int reads, long seed) throws Exception {
        Path raw = Files.createDirectories(dir.resolve("raw"));
        GaugeManifest m = ManifestCodec.read(gauges.resolve("manifest.json"));
        UniformRandomProvider rng = Seeds.rng(seed);
        for (GaugeManifest.Entry e : m.gauges()) {
            IsingProblem gp = ProblemCodec.read(gauges.resolve(e.problem())).spin();
            byte[] s = new byte[reads * gp.size()];
            double[] energies = new double[reads];
            for (int r = 0; r < reads; r++) {
                byte[] row = new byte[gp.size()];
                for (int k = 0; k < row.length; k++) {
                    row[k] = (byte) (rng.nextBoolean() ? 1 : -1);
                }
                System.arraycopy(row, 0, s, r * row.length, row.length);
                energies[r] = gp.energy(row);
            }
            SampleFiles.writeAll(raw.resolve(e.stem() + ".npy"), gp.variables(), false,
                    SampleBlock.fromSpins(s, reads, gp.size()));
            NpyVectors.writeFloat64(raw.resolve(e.stem() + ".energies.npy"), false, energies);
        }
        return raw;
    }

    @Test
    void roundTripUngaugesSamplesAndTheAuditHolds() throws Exception {
        Run g = gauge("g");
        assertThat(g.code()).as(g.err()).isZero();
        assertThat(g.out()).contains("3 free").contains("3 locked couplers").contains("8 drawn");
        Path raw = writeRawSamples(dir.resolve("g"), 130, 5);
        Run u = obverse("ungauge", "--manifest", dir.resolve("g/manifest.json").toString(), "--samples", raw.toString(),
                "--out", dir.resolve("u").toString());
        assertThat(u.code()).as(u.err()).isZero();
        assertThat(u.out()).contains("ungauged 8 gauges, 1040 reads");

        // Independent check: each un-gauged read's energy under the source equals the reported
        // energy of the raw read under its gauged problem.
        IsingProblem src = ProblemCodec.read(problem).spin();
        for (int i = 0; i < 8; i++) {
            String stem = String.format("g%04d", i);
            SampleBlock back = SampleFiles.readAll(dir.resolve("u/" + stem + ".npy"), src.variables());
            double[] rep = NpyVectors.readFloat64(raw.resolve(stem + ".energies.npy"), 130);
            byte[] rows = back.toSpins();
            for (int r = 0; r < 130; r++) {
                byte[] row = java.util.Arrays.copyOfRange(rows, r * src.size(), (r + 1) * src.size());
                assertThat(src.energy(row)).isEqualTo(rep[r]);
            }
        }
        // The device-frame moments, recomputed directly from the raw reads of gauge 5.
        SampleBlock raw5 = SampleFiles.readAll(raw.resolve("g0005.npy"), src.variables());
        long sumQubit0 = 0;
        long sumCoupler0 = 0;
        for (int r = 0; r < 130; r++) {
            sumQubit0 += raw5.spin(r, 0);
            sumCoupler0 += raw5.spin(r, src.edgeU(0)) * raw5.spin(r, src.edgeV(0));
        }
        GaugeManifest m = ManifestCodec.read(dir.resolve("g/manifest.json"));
        int sign0 = java.util.Arrays.binarySearch(m.gauges().get(5).flipped(), src.variables().id(0)) >= 0 ? -1 : 1;
        assertThat(Files.readAllLines(dir.resolve("u/magnetisation.csv")))
                .contains(src.variables().id(0) + ",5,130," + sumQubit0 + "," + sign0);
        String couplerRow = src.variables().id(src.edgeU(0)) + "," + src.variables().id(src.edgeV(0)) + ",5,130,"
                + sumCoupler0 + ",";
        assertThat(Files.readAllLines(dir.resolve("u/correlations.csv"))).anyMatch(l -> l.startsWith(couplerRow));

        Run a = obverse("audit", "--manifest", dir.resolve("g/manifest.json").toString(), "--samples", raw.toString());
        assertThat(a.code()).as(a.out()).isZero();
        assertThat(a.out()).contains("audit: all").doesNotContain("FAIL").contains("130 reads of g0003.npy")
                .contains("reported energies agree");
    }

    @Test
    void auditComparesAnnealSpectraOfSmallProblems() throws Exception {
        assertThat(gauge("g").code()).isZero();
        Run a = obverse("audit", "--manifest", dir.resolve("g/manifest.json").toString(), "--spectrum");
        assertThat(a.code()).as(a.out()).isZero();
        assertThat(a.out().lines().filter(l -> l.startsWith("ok    ") && l.contains("anneal spectrum equals"))).hasSize(8);
        // A gauged problem with one coupler changed is not unitarily equivalent any more.
        Path g3 = dir.resolve("g/g0003.json");
        Files.writeString(g3, Files.readString(g3).replace("0.5", "0.4"));
        Run t = obverse("audit", "--manifest", dir.resolve("g/manifest.json").toString(), "--spectrum");
        assertThat(t.code()).isEqualTo(1);
        assertThat(t.out()).contains("FAIL  gauge 3: anneal spectrum equals");
    }

    @Test
    void tamperedGaugedProblemFailsTheAudit() throws Exception {
        assertThat(gauge("g").code()).isZero();
        Path g3 = dir.resolve("g/g0003.json");
        String text = Files.readString(g3);
        Files.writeString(g3, text.replace("0.5", "0.4"));
        Run a = obverse("audit", "--manifest", dir.resolve("g/manifest.json").toString());
        assertThat(a.code()).isEqualTo(1);
        assertThat(a.out()).contains("FAIL  gauge 3: g0003.json matches its recorded hash")
                .contains("FAIL  gauge 3: g0003.json equals the source re-gauged");
    }

    @Test
    void changedSourceIsRefusedByUngaugeAndFailsTheAudit() throws Exception {
        assertThat(gauge("g").code()).isZero();
        Path raw = writeRawSamples(dir.resolve("g"), 10, 6);
        Files.writeString(problem, Files.readString(problem).replace("-0.75", "-0.7"));
        Run u = obverse("ungauge", "--manifest", dir.resolve("g/manifest.json").toString(), "--samples", raw.toString(),
                "--out", dir.resolve("u").toString());
        assertThat(u.code()).isEqualTo(2);
        assertThat(u.err().strip()).doesNotContain("\n").contains("problem.json").contains("changed since the gauges were made");
        assertThat(Files.exists(dir.resolve("u"))).isFalse();
        Run a = obverse("audit", "--manifest", dir.resolve("g/manifest.json").toString());
        assertThat(a.code()).isEqualTo(1);
        assertThat(a.out()).contains("FAIL  source problem: content hash matches");
    }

    @Test
    void wrongWidthMissingGaugeAndBadValuesAreRefusedWithoutOutput() throws Exception {
        assertThat(gauge("g").code()).isZero();
        Path raw = writeRawSamples(dir.resolve("g"), 10, 8);
        String manifest = dir.resolve("g/manifest.json").toString();
        // A file of the wrong width for gauge 2.
        IsingProblem wide = IsingProblem.builder().variable(0).variable(1).variable(2).build();
        Files.delete(raw.resolve("g0002.npy"));
        SampleFiles.writeAll(raw.resolve("g0002.npy"), wide.variables(), false, SampleBlock.allDown(4, 3));
        Run u = obverse("ungauge", "--manifest", manifest, "--samples", raw.toString(), "--out", dir.resolve("u").toString());
        assertThat(u.code()).isEqualTo(2);
        assertThat(u.err()).contains("g0002.npy");
        assertThat(Files.exists(dir.resolve("u"))).isFalse();

        Files.delete(raw.resolve("g0002.npy"));
        Run missing = obverse("ungauge", "--manifest", manifest, "--samples", raw.toString(), "--out",
                dir.resolve("u").toString());
        assertThat(missing.code()).isEqualTo(2);
        assertThat(missing.err()).contains("no samples for gauge 2").contains("--allow-missing");
        Run allowed = obverse("ungauge", "--manifest", manifest, "--samples", raw.toString(), "--out",
                dir.resolve("u").toString(), "--allow-missing");
        assertThat(allowed.code()).as(allowed.err()).isZero();
        assertThat(allowed.out()).contains("skipped 1 gauges");
        Run again = obverse("ungauge", "--manifest", manifest, "--samples", raw.toString(), "--out",
                dir.resolve("u").toString(), "--allow-missing");
        assertThat(again.code()).isEqualTo(2);
        assertThat(again.err()).contains("already exists").contains("--force");
    }

    @Test
    void malformedInputsGetOneLineAndExitTwo() throws Exception {
        Files.writeString(problem, "{\"format\": \"obverse.problem/1\", \"domain\": \"spin\", \"J\": [[0, 1, ]]}");
        Run g = gauge("g");
        assertThat(g.code()).isEqualTo(2);
        assertThat(g.err().strip().lines().count()).isEqualTo(1);
        assertThat(g.err()).contains("problem.json").contains("not valid JSON");
        assertThat(Files.exists(dir.resolve("g"))).isFalse();

        Run usage = obverse("gauge", "--problem", problem.toString());
        assertThat(usage.code()).isEqualTo(2);
        assertThat(usage.err()).contains("Missing required option");
    }

    @Test
    void chainCouplerOutsideTheRangeIsRefusedBeforeGauging() throws Exception {
        Files.writeString(problem, Files.readString(problem).replace("[2, 3, -1.6]", "[2, 3, -2.5]"));
        Run g = gauge("g");
        assertThat(g.code()).isEqualTo(2);
        assertThat(g.err()).contains("coupling (2, 3)").contains("-2.5").contains("outside the coupling range");
    }

    @Test
    void chainsThatDoNotFitTheProblemAreRefusedUnderEitherPolicy() throws Exception {
        Files.writeString(chains, "{\"format\": \"obverse.chains/1\", \"chains\": [[0, [0, 1]], [1, [2, 9]]]}");
        for (String lock : new String[] {"range", "chains"}) {
            Run g = gauge("g-" + lock, "--lock", lock);
            assertThat(g.code()).as(lock).isEqualTo(2);
            assertThat(g.err()).contains("chains.json").contains("qubit 9").contains("does not use");
            assertThat(Files.exists(dir.resolve("g-" + lock))).isFalse();
        }
    }

    @Test
    void theShippedExampleManifestStillAudits() {
        Run a = obverse("audit", "--manifest", "examples/gauges/manifest.json", "--spectrum");
        assertThat(a.code()).as(a.out()).isZero();
        assertThat(a.out()).contains("audit: all");
    }

    @Test
    void everyVerbHasHelp() {
        for (String verb : new String[] {"gauge", "ungauge", "audit", "energy"}) {
            Run h = obverse(verb, "--help");
            assertThat(h.code()).isZero();
            assertThat(h.out()).contains("Usage: obverse " + verb);
        }
    }
}
