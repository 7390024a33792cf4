package org.obverse.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.samples.SampleFiles;
import org.obverse.model.IsingProblem;
import org.obverse.samples.SampleBlock;

import static org.assertj.core.api.Assertions.assertThat;

/** {@code sample --sampler sqa}: options, output, and one line with exit 2 for each bad input. */
class SamplePathIntegralCommandTest extends CommandTestSupport {
    @TempDir
    Path dir;
    Path problem;
    Path schedule;
    Path table;

    @BeforeEach
    void copyExamples() throws Exception {
        for (String name : new String[] {"problem.json", "schedule-pause-quench.json", "schedule-table.csv"}) {
            Files.copy(Path.of("examples", name), dir.resolve(name), StandardCopyOption.REPLACE_EXISTING);
        }
        problem = dir.resolve("problem.json");
        schedule = dir.resolve("schedule-pause-quench.json");
        table = dir.resolve("schedule-table.csv");
    }

    private Run sqa(String out, String... more) {
        String[] base = {"sample", "--problem", problem.toString(), "--reads", "70", "--seed", "5", "--sampler", "sqa",
            "--schedule", schedule.toString(), "--sweeps-per-us", "10", "--out", dir.resolve(out).toString()};
        String[] args = new String[base.length + more.length];
        System.arraycopy(base, 0, args, 0, base.length);
        System.arraycopy(more, 0, args, base.length, more.length);
        return obverse(args);
    }

    @Test
    void samplesWithThePathIntegralSamplerAndSaysWhatRan() throws Exception {
        Run r = sqa("run.npy", "--temperature", "0.1", "--slices", "8");
        assertThat(r.code()).as(r.err()).isZero();
        assertThat(r.out()).contains("sampler: simulated quantum annealing (path integral), 8 slices, k_B T = 0.1")
                .contains("illustrative linear schedule").contains("not any device's schedule")
                .contains("sampled 70 reads of 6 variables (103 sweeps, 10.38 us a read)");
        IsingProblem p = ProblemCodec.read(problem).spin();
        SampleBlock b = SampleFiles.readAll(dir.resolve("run.npy"), p.variables());
        double[] e = NpyVectors.readFloat64(dir.resolve("run.energies.npy"), 70);
        byte[] row = new byte[p.size()];
        for (int k = 0; k < 70; k++) {
            b.unpackRows(k, 1, row);
            assertThat(e[k]).isEqualTo(p.energy(row));
        }
        // One thread: the same bytes.
        Run again = sqa("again.npy", "--temperature", "0.1", "--slices", "8", "--threads", "1");
        assertThat(again.code()).as(again.err()).isZero();
        assertThat(Files.readAllBytes(dir.resolve("again.npy"))).isEqualTo(Files.readAllBytes(dir.resolve("run.npy")));
        // A table with its units is named in the output; the default slice count is 32.
        Run t = sqa("table.npy", "--temperature", "0.05", "--energy-scales", table.toString(), "--energy-units", "GHz");
        assertThat(t.code()).as(t.err()).isZero();
        assertThat(t.out()).contains("32 slices, k_B T = 0.05 GHz, energy scales: schedule-table.csv");
        // Simulated annealing prints no sampler line (its output is unchanged).
        Run sa = obverse("sample", "--problem", problem.toString(), "--reads", "7", "--seed", "5", "--out",
                dir.resolve("sa.npy").toString());
        assertThat(sa.code()).as(sa.err()).isZero();
        assertThat(sa.out()).doesNotContain("sampler:");
    }

    @Test
    void badInputGetsOneLineAndExitTwo() throws Exception {
        Path notMonotone = dir.resolve("not-monotone.csv");
        Files.writeString(notMonotone, "s,A,B\n0,1,0\n0.6,0.5,0.5\n0.4,0.6,0.4\n1,0,1\n");
        Path negative = dir.resolve("negative.csv");
        Files.writeString(negative, "s,A,B\n0,1,0\n0.5,-0.1,0.5\n1,0,1\n");
        String[][] bad = {
            {"--temperature", "0"},
            {"--temperature", "-0.2"},
            {"--temperature", "NaN"},
            {},
            {"--temperature", "0.1", "--slices", "0"},
            {"--temperature", "0.1", "--slices", "-4"},
            {"--temperature", "0.1", "--energy-scales", notMonotone.toString()},
            {"--temperature", "0.1", "--energy-scales", negative.toString()},
            {"--temperature", "0.1", "--energy-units", "GHz"},
            {"--temperature", "0.1", "--kernel", "multi-spin"},
        };
        String[] expected = {"--temperature 0.0", "--temperature -0.2", "--temperature NaN", "needs --temperature",
            "--slices 0", "--slices -4", "line 4", "negative value", "--energy-units goes with", "multi-spin"};
        for (int i = 0; i < bad.length; i++) {
            Run r = sqa("bad" + i + ".npy", bad[i]);
            assertThat(r.code()).as("case %d: %s", i, r.err()).isEqualTo(Main.BAD_INPUT);
            assertThat(r.err()).as("case %d", i).contains(expected[i]);
            assertThat(r.err().trim().lines().count()).as("case %d: one line", i).isEqualTo(1);
            assertThat(Files.exists(dir.resolve("bad" + i + ".npy"))).isFalse();
        }
        Run unknown = obverse("sample", "--problem", problem.toString(), "--reads", "5", "--seed", "1", "--sampler",
                "qmc", "--out", dir.resolve("u.npy").toString());
        assertThat(unknown.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(unknown.err()).contains("--sampler qmc").contains("use sa or sqa");
        Run saWithTemperature = obverse("sample", "--problem", problem.toString(), "--reads", "5", "--seed", "1",
                "--temperature", "0.1", "--out", dir.resolve("v.npy").toString());
        assertThat(saWithTemperature.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(saWithTemperature.err()).contains("apply to --sampler sqa only");
        // A schedule every segment of which is shorter than one sweep.
        Run noSweep = obverse("sample", "--problem", problem.toString(), "--reads", "5", "--seed", "1", "--sampler",
                "sqa", "--temperature", "0.1", "--sweeps-per-us", "0.01", "--out", dir.resolve("w.npy").toString());
        assertThat(noSweep.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(noSweep.err()).contains("no sweep");
    }
}
