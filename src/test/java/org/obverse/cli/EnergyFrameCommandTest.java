package org.obverse.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.List;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.model.IsingProblem;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The trap of issue 9: sample --instance on an embedded problem writes physical energies; score
 * and report refuse them against logical ground energies, and decode gives the logical rows.
 */
class EnergyFrameCommandTest extends CommandTestSupport {
    @TempDir
    Path dir;

    @BeforeEach
    void copyExamples() throws Exception {
        for (String name : new String[] {"logical.json", "device.json", "chains.json"}) {
            Files.copy(Path.of("examples", name), dir.resolve(name), StandardCopyOption.REPLACE_EXISTING);
        }
    }

    private String p(String name) {
        return dir.resolve(name).toString();
    }

    /** The least energy of the logical problem by enumerating every state (brute force, common practice). */
    private double groundByEnumeration() {
        IsingProblem q = ProblemCodec.read(dir.resolve("logical.json")).spin();
        double best = Double.POSITIVE_INFINITY;
        for (int mask = 0; mask < 1 << q.size(); mask++) {
            byte[] s = new byte[q.size()];
            for (int v = 0; v < s.length; v++) {
                s[v] = (byte) ((mask >> v & 1) == 1 ? 1 : -1);
            }
            best = Math.min(best, q.energy(s));
        }
        return best;
    }

    @Test
    void physicalRowsScoredAgainstLogicalGroundEnergiesAreRefused() throws Exception {
        Run e = obverse("embed", "--logical", p("logical.json"), "--chains", p("chains.json"), "--device",
                p("device.json"), "--chain-coupling", "-1.6", "--out", p("phys.json"));
        assertThat(e.code()).as(e.err()).isZero();
        Run s = obverse("sample", "--problem", p("phys.json"), "--reads", "200", "--seed", "3", "--sweeps-per-us", "50",
                "--out", p("run.npy"), "--instance", "q", "--setting", "V=-1.6");
        assertThat(s.code()).as(s.err()).isZero();
        assertThat(s.out()).contains("physical energies");
        List<String> rows = Files.readAllLines(dir.resolve("run.results.csv"));
        for (String row : rows.subList(1, rows.size())) {
            assertThat(row.split(",", -1)[7]).isEqualTo("physical");
        }
        Files.writeString(dir.resolve("ground.csv"), "instance,ground_energy\nq," + groundByEnumeration() + "\n");

        Run score = obverse("score", "--results", p("run.results.csv"), "--ground", p("ground.csv"), "--out",
                p("scores"), "--replicates", "20", "--quiet");
        assertThat(score.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(score.err().lines().count()).isEqualTo(1);
        assertThat(score.err()).contains("run.results.csv").contains("line 2").contains("physical")
                .contains("logical").contains("ground.csv").contains("decode");
        assertThat(dir.resolve("scores")).doesNotExist();
        Run report = obverse("report", "--results", p("run.results.csv"), "--ground", p("ground.csv"), "--out",
                p("report"), "--replicates", "20", "--quiet");
        assertThat(report.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(report.err().lines().count()).isEqualTo(1);
        assertThat(dir.resolve("report")).doesNotExist();

        // Decoded with their chains, the same reads are logical and score.
        Run d = obverse("decode", "--problem", p("phys.json"), "--logical", p("logical.json"), "--chains",
                p("chains.json"), "--samples", p("run.npy"), "--rule", "majority", "--out", p("dec"), "--instance", "q",
                "--setting", "V=-1.6", "--run-us", "1");
        assertThat(d.code()).as(d.err()).isZero();
        Run ok = obverse("score", "--results", p("dec/results.csv"), "--ground", p("ground.csv"), "--out", p("scores"),
                "--replicates", "20", "--quiet");
        assertThat(ok.code()).as(ok.err()).isZero();

        // Without ground energies the physical table scores against its own best seen.
        Run best = obverse("score", "--results", p("run.results.csv"), "--out", p("best"), "--replicates", "20",
                "--quiet");
        assertThat(best.code()).as(best.err()).isZero();
    }

    @Test
    void gaugesOfAnEmbeddedProblemKeepThePhysicalFrame() throws Exception {
        Run e = obverse("embed", "--logical", p("logical.json"), "--chains", p("chains.json"), "--device",
                p("device.json"), "--chain-coupling", "-1.6", "--out", p("phys.json"));
        assertThat(e.code()).as(e.err()).isZero();
        Run g = obverse("gauge", "--problem", p("phys.json"), "--device", p("device.json"), "--count", "2", "--seed",
                "1", "--out", p("g"));
        assertThat(g.code()).as(g.err()).isZero();
        Run s = obverse("sample", "--manifest", p("g/manifest.json"), "--reads", "40", "--seed", "3", "--sweeps-per-us",
                "50", "--out", p("raw"), "--instance", "q", "--setting", "V=-1.6");
        assertThat(s.code()).as(s.err()).isZero();
        List<String> rows = Files.readAllLines(dir.resolve("raw/results.csv"));
        assertThat(rows.get(0)).isEqualTo("instance,setting,gauge,energy,count,broken,run_us,energy_frame");
        for (String row : rows.subList(1, rows.size())) {
            assertThat(row.split(",", -1)[7]).isEqualTo("physical");
        }
    }
}
