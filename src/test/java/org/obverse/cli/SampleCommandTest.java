package org.obverse.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.codec.GaugeManifest;
import org.obverse.io.codec.ManifestCodec;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.samples.SampleFiles;
import org.obverse.model.IsingProblem;
import org.obverse.problems.WindArray;
import org.obverse.samples.SampleBlock;

import static org.assertj.core.api.Assertions.assertThat;

class SampleCommandTest extends CommandTestSupport {
    @TempDir
    Path dir;
    Path problem;

    @BeforeEach
    void copyExamples() throws Exception {
        for (String name : new String[] {"problem.json", "device.json", "chains.json", "schedule-pause.json", "errors.json"}) {
            Files.copy(Path.of("examples", name), dir.resolve(name), StandardCopyOption.REPLACE_EXISTING);
        }
        problem = dir.resolve("problem.json");
    }

    private static void assertEnergiesMatch(IsingProblem p, Path samples, Path energies, int reads) throws Exception {
        SampleBlock b = SampleFiles.readAll(samples, p.variables());
        double[] e = NpyVectors.readFloat64(energies, reads);
        assertThat(b.reads()).isEqualTo(reads);
        byte[] row = new byte[p.size()];
        for (int r = 0; r < reads; r++) {
            b.unpackRows(r, 1, row);
            assertThat(e[r]).isEqualTo(p.energy(row));
        }
    }

    @Test
    void samplesOneProblemWithScheduleAndErrors() throws Exception {
        Path out = dir.resolve("run.npy");
        Run r = obverse("sample", "--problem", problem.toString(), "--reads", "70", "--seed", "5", "--schedule",
                dir.resolve("schedule-pause.json").toString(), "--errors", dir.resolve("errors.json").toString(),
                "--sweeps-per-us", "200", "--out", out.toString());
        assertThat(r.code()).as(r.err()).isZero();
        assertThat(r.out()).contains("sampled 70 reads of 6 variables (400 sweeps, 2.0 us a read)");
        IsingProblem p = ProblemCodec.read(problem).spin();
        assertEnergiesMatch(p, out, dir.resolve("run.energies.npy"), 70);

        // Same seed, one thread: the same bytes.
        Path again = dir.resolve("again.npy");
        Run r2 = obverse("sample", "--problem", problem.toString(), "--reads", "70", "--seed", "5", "--schedule",
                dir.resolve("schedule-pause.json").toString(), "--errors", dir.resolve("errors.json").toString(),
                "--sweeps-per-us", "200", "--threads", "1", "--out", again.toString());
        assertThat(r2.code()).as(r2.err()).isZero();
        assertThat(Files.readAllBytes(again)).isEqualTo(Files.readAllBytes(out));
        assertThat(Files.readAllBytes(dir.resolve("again.energies.npy")))
                .isEqualTo(Files.readAllBytes(dir.resolve("run.energies.npy")));

        // An existing output is kept without --force.
        Run r3 = obverse("sample", "--problem", problem.toString(), "--reads", "7", "--seed", "6", "--out", out.toString());
        assertThat(r3.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(r3.err()).contains("already exists");
    }

    @Test
    void binaryProblemsGetBinaryEnergies() throws Exception {
        Path q = dir.resolve("wind.json");
        ProblemCodec.write(q, false, ProblemFile.of(WindArray.demo().problem().qubo(), null));
        Path out = dir.resolve("wind.csv");
        Run r = obverse("sample", "--problem", q.toString(), "--reads", "20", "--seed", "1", "--out", out.toString());
        assertThat(r.code()).as(r.err()).isZero();
        double best = WindArray.demo().problem().exactBest().orElseThrow().quboEnergy();
        double[] e = NpyVectors.readFloat64(dir.resolve("wind.energies.npy"), 20);
        for (double v : e) {
            assertThat(v).isGreaterThanOrEqualTo(best - 1e-9);
        }
        assertEnergiesMatch(ProblemCodec.read(q).spin(), out, dir.resolve("wind.energies.npy"), 20);
    }

    @Test
    void samplesEveryGaugeOfAManifestAndUngaugeTakesThem() throws Exception {
        Run g = obverse("gauge", "--problem", problem.toString(), "--device", dir.resolve("device.json").toString(),
                "--chains", dir.resolve("chains.json").toString(), "--count", "4", "--seed", "3", "--out",
                dir.resolve("g").toString());
        assertThat(g.code()).as(g.err()).isZero();
        Path raw = dir.resolve("raw");
        Run s = obverse("sample", "--manifest", dir.resolve("g/manifest.json").toString(), "--reads", "65", "--seed", "9",
                "--errors", dir.resolve("errors.json").toString(), "--sweeps-per-us", "100", "--out", raw.toString());
        assertThat(s.code()).as(s.err()).isZero();
        assertThat(s.out()).contains("sampled 4 gauges, 65 reads each");
        GaugeManifest m = ManifestCodec.read(dir.resolve("g/manifest.json"));
        for (GaugeManifest.Entry e : m.gauges()) {
            IsingProblem gp = ProblemCodec.read(dir.resolve("g").resolve(e.problem())).spin();
            assertEnergiesMatch(gp, raw.resolve(e.stem() + ".npy"), raw.resolve(e.stem() + ".energies.npy"), 65);
        }
        Run u = obverse("ungauge", "--manifest", dir.resolve("g/manifest.json").toString(), "--samples", raw.toString(),
                "--out", dir.resolve("source").toString());
        assertThat(u.code()).as(u.err()).isZero();
        // Energies do not change under a gauge: the un-gauged samples have them under the source problem.
        IsingProblem source = ProblemCodec.read(problem).spin();
        for (GaugeManifest.Entry e : m.gauges()) {
            assertEnergiesMatch(source, dir.resolve("source").resolve(e.stem() + ".npy"),
                    raw.resolve(e.stem() + ".energies.npy"), 65);
        }
    }

    @Test
    void steadyMultiSpinKernelSamplesAPlusMinusOneGlass() throws Exception {
        IsingProblem p = org.obverse.problems.SpinGlasses.cellGrid(2, 2,
                org.obverse.problems.SpinGlasses.Couplings.PLUS_MINUS_ONE, org.obverse.testsupport.Seeds.rng(31));
        Path glass = dir.resolve("glass.json");
        ProblemCodec.write(glass, false, ProblemFile.of(p, null));
        Path out = dir.resolve("steady.npy");
        Run r = obverse("sample", "--problem", glass.toString(), "--reads", "300", "--seed", "8", "--kernel",
                "multi-spin-steady", "--out", out.toString());
        assertThat(r.code()).as(r.err()).isZero();
        assertEnergiesMatch(p, out, dir.resolve("steady.energies.npy"), 300);
        // One thread: the same bytes; the first multi-spin kernel: other reads (other draws).
        Path one = dir.resolve("one.npy");
        Run r1 = obverse("sample", "--problem", glass.toString(), "--reads", "300", "--seed", "8", "--kernel",
                "multi-spin-steady", "--threads", "1", "--out", one.toString());
        assertThat(r1.code()).as(r1.err()).isZero();
        assertThat(Files.readAllBytes(one)).isEqualTo(Files.readAllBytes(out));
        Path first = dir.resolve("first.npy");
        Run r2 = obverse("sample", "--problem", glass.toString(), "--reads", "300", "--seed", "8", "--kernel",
                "multi-spin", "--out", first.toString());
        assertThat(r2.code()).as(r2.err()).isZero();
        assertThat(Files.readAllBytes(first)).isNotEqualTo(Files.readAllBytes(out));

        Run bad = obverse("sample", "--problem", problem.toString(), "--reads", "5", "--seed", "1", "--kernel",
                "multi-spin-steady", "--out", dir.resolve("v.npy").toString());
        assertThat(bad.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(bad.err()).contains("multi-spin coding needs every coupling");
        Run unknown = obverse("sample", "--problem", glass.toString(), "--reads", "5", "--seed", "1", "--kernel",
                "fast", "--out", dir.resolve("u.npy").toString());
        assertThat(unknown.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(unknown.err()).contains("--kernel fast: unknown kernel; use exact, multi-spin or multi-spin-steady");
        assertThat(Files.exists(dir.resolve("v.npy"))).isFalse();
    }

    @Test
    void badInputGetsOneLineAndExitTwo() throws Exception {
        Path badSchedule = dir.resolve("bad-schedule.json");
        Files.writeString(badSchedule, "{\"format\": \"obverse.schedule/1\", \"points\": [[0, 0], [1, 0.5], [2, 0.4], [3, 1]]}");
        Run r = obverse("sample", "--problem", problem.toString(), "--reads", "5", "--seed", "1", "--schedule",
                badSchedule.toString(), "--out", dir.resolve("x.npy").toString());
        assertThat(r.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(r.err()).contains("bad-schedule.json").contains("falls from 0.5 to 0.4");
        assertThat(r.err().trim().lines().count()).isEqualTo(1);

        Path badErrors = dir.resolve("bad-errors.json");
        Files.writeString(badErrors, "{\"format\": \"obverse.errors/1\", \"seed\": 1, \"field_sigma\": -1, \"coupling_sigma\": 0}");
        Run e = obverse("sample", "--problem", problem.toString(), "--reads", "5", "--seed", "1", "--errors",
                badErrors.toString(), "--out", dir.resolve("y.npy").toString());
        assertThat(e.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(e.err()).contains("bad-errors.json").contains("\"field_sigma\"").contains("negative width");

        Run k = obverse("sample", "--problem", problem.toString(), "--reads", "5", "--seed", "1", "--kernel",
                "multi-spin", "--out", dir.resolve("z.npy").toString());
        assertThat(k.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(k.err()).contains("multi-spin coding needs every coupling");

        Run both = obverse("sample", "--problem", problem.toString(), "--manifest", "m.json", "--reads", "5", "--seed",
                "1", "--out", dir.resolve("w.npy").toString());
        assertThat(both.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(Files.exists(dir.resolve("x.npy"))).isFalse();
        assertThat(Files.exists(dir.resolve("z.npy"))).isFalse();
    }
}
