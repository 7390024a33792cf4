package org.obverse.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.campaign.DecodeStep;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.samples.SampleFiles;
import org.obverse.model.IsingProblem;
import org.obverse.samples.SampleBlock;

import static org.assertj.core.api.Assertions.assertThat;

/** decode --manifest decodes every gauge in one call; the run time of results rows never has a default. */
class DecodeManifestCommandTest extends CommandTestSupport {
    @TempDir
    Path dir;

    @BeforeEach
    void copyExamples() throws Exception {
        for (String name : new String[] {"problem.json", "logical.json", "device.json", "chains.json"}) {
            Files.copy(Path.of("examples", name), dir.resolve(name), StandardCopyOption.REPLACE_EXISTING);
        }
        // Anneal to s = 0.5 in 1 us, pause 1 us, finish in 1 us: 3 us a read.
        Files.writeString(dir.resolve("pause3.json"), "{\"format\": \"obverse.schedule/1\", "
                + "\"points\": [[0, 0], [1, 0.5], [2, 0.5], [3, 1]]}");
    }

    private String p(String name) {
        return dir.resolve(name).toString();
    }

    private void gaugeSampleUngauge() {
        Run g = obverse("gauge", "--problem", p("problem.json"), "--device", p("device.json"), "--chains",
                p("chains.json"), "--lock", "range", "--count", "3", "--seed", "5", "--out", p("g"));
        assertThat(g.code()).as(g.err()).isZero();
        Run s = obverse("sample", "--manifest", p("g/manifest.json"), "--reads", "90", "--seed", "2", "--schedule",
                p("pause3.json"), "--sweeps-per-us", "30", "--out", p("raw"));
        assertThat(s.code()).as(s.err()).isZero();
        Run u = obverse("ungauge", "--manifest", p("g/manifest.json"), "--samples", p("raw"), "--out", p("src"));
        assertThat(u.code()).as(u.err()).isZero();
    }

    @Test
    void everyGaugeInOneCallWithTheRunTimeOfTheSchedule() throws Exception {
        gaugeSampleUngauge();
        Run d = obverse("decode", "--manifest", p("g/manifest.json"), "--samples", p("src"), "--logical",
                p("logical.json"), "--rule", "majority", "--seed", "8", "--out", p("dec"), "--instance", "ex",
                "--setting", "pause", "--schedule", p("pause3.json"), "--column", "gauged=yes");
        assertThat(d.code()).as(d.err()).isZero();
        assertThat(d.out()).contains("decoded 3 gauges (majority): 270 reads, 270 kept");
        List<String> rows = Files.readAllLines(dir.resolve("dec/results.csv"));
        long[] perGauge = new long[3];
        for (String row : rows.subList(1, rows.size())) {
            String[] f = row.split(",", -1);
            perGauge[Integer.parseInt(f[2])] += Long.parseLong(f[4]);
            assertThat(f[6]).as(row).isEqualTo("3"); // run_us: anneal 2 us plus the 1 us pause
            assertThat(f[7]).isEqualTo("logical");
            assertThat(f[8]).isEqualTo("yes");
        }
        assertThat(perGauge).containsExactly(90, 90, 90);

        // Each gauge's folder holds the logical reads; their energies recomputed here from the
        // logical problem (common practice, no source) are the ones written.
        IsingProblem q = ProblemCodec.read(dir.resolve("logical.json")).spin();
        for (String stem : new String[] {"g0000", "g0001", "g0002"}) {
            SampleBlock b = SampleFiles.readAll(dir.resolve("dec/" + stem + "/logical.npy"), q.variables());
            double[] e = NpyVectors.readFloat64(dir.resolve("dec/" + stem + "/energies.npy"), b.reads());
            byte[] row = new byte[q.size()];
            for (int r = 0; r < b.reads(); r++) {
                b.unpackRows(r, 1, row);
                assertThat(e[r]).isEqualTo(q.energy(row));
            }
        }

        // Gauge 1 alone, with the seed the manifest run derived for it, gives the same files and rows.
        Run one = obverse("decode", "--problem", p("problem.json"), "--logical", p("logical.json"), "--chains",
                p("chains.json"), "--samples", p("src/g0001.npy"), "--rule", "majority", "--seed",
                String.valueOf(DecodeStep.gaugeSeed(8, 1)), "--out", p("one"), "--instance", "ex", "--setting", "pause",
                "--gauge", "1", "--run-us", "3", "--column", "gauged=yes");
        assertThat(one.code()).as(one.err()).isZero();
        for (String f : new String[] {"logical.npy", "kept.npy", "broken.npy", "energies.npy", "chains.csv"}) {
            assertThat(Files.readAllBytes(dir.resolve("one/" + f))).isEqualTo(Files.readAllBytes(dir.resolve("dec/g0001/" + f)));
        }
        List<String> oneRows = Files.readAllLines(dir.resolve("one/results.csv"));
        List<String> gauge1 = new ArrayList<>();
        for (String row : rows.subList(1, rows.size())) {
            if (row.split(",", -1)[2].equals("1")) {
                gauge1.add(row);
            }
        }
        assertThat(oneRows.subList(1, oneRows.size())).isEqualTo(gauge1);
    }

    @Test
    void resultsRowsWithoutARunTimeAreRefused() throws Exception {
        gaugeSampleUngauge();
        Run none = obverse("decode", "--manifest", p("g/manifest.json"), "--samples", p("src"), "--logical",
                p("logical.json"), "--rule", "discard", "--out", p("dec"), "--instance", "ex", "--setting", "s");
        assertThat(none.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(none.err().lines().count()).isEqualTo(1);
        assertThat(none.err()).contains("--run-us").contains("--schedule").contains("no default");
        assertThat(dir.resolve("dec")).doesNotExist();

        Run both = obverse("decode", "--problem", p("problem.json"), "--logical", p("logical.json"), "--chains",
                p("chains.json"), "--samples", p("src/g0000.npy"), "--rule", "discard", "--out", p("dec"), "--instance",
                "ex", "--setting", "s", "--run-us", "3", "--schedule", p("pause3.json"));
        assertThat(both.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(both.err()).contains("not both");
        assertThat(dir.resolve("dec")).doesNotExist();

        // A gauge without reads is refused unless allowed, and then named.
        Files.delete(dir.resolve("src/g0002.npy"));
        Run missing = obverse("decode", "--manifest", p("g/manifest.json"), "--samples", p("src"), "--logical",
                p("logical.json"), "--rule", "discard", "--out", p("dec"));
        assertThat(missing.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(missing.err()).contains("gauge 2").contains("g0002.npy");
        assertThat(dir.resolve("dec")).doesNotExist();
        Run allowed = obverse("decode", "--manifest", p("g/manifest.json"), "--samples", p("src"), "--logical",
                p("logical.json"), "--rule", "discard", "--out", p("dec"), "--allow-missing");
        assertThat(allowed.code()).as(allowed.err()).isZero();
        assertThat(allowed.out()).contains("decoded 2 gauges").contains("skipped gauges without reads: [2]");
        assertThat(dir.resolve("dec/results.csv")).doesNotExist();
    }

    @Test
    void sampleRowsTakeTheRunTimeOfTheScheduleInUse() throws Exception {
        Run r = obverse("sample", "--problem", p("problem.json"), "--reads", "50", "--seed", "1", "--schedule",
                p("pause3.json"), "--sweeps-per-us", "30", "--out", p("run.npy"), "--instance", "ex", "--setting", "s");
        assertThat(r.code()).as(r.err()).isZero();
        List<String> rows = Files.readAllLines(dir.resolve("run.results.csv"));
        assertThat(rows.size()).isGreaterThan(1);
        for (String row : rows.subList(1, rows.size())) {
            assertThat(row.split(",", -1)[6]).isEqualTo("3");
        }
    }
}
