package org.obverse.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.json.JsonFiles;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;

class SpectrumCommandTest extends CommandTestSupport {
    @TempDir
    Path tmp;

    private Path problem(String name, IsingProblem p) throws Exception {
        Path f = tmp.resolve(name);
        ProblemCodec.write(f, false, ProblemFile.of(p, null));
        return f;
    }

    /*
     * Two spins, J = -1, no fields, illustrative schedule: the reachable levels are
     * ±√((1 − s)² + s²/4) (derived in ClosedFormSpectrumTest), the relevant gap is twice that,
     * least at s = 0.8 where it is 2√0.2.
     */
    @Test
    void writesLevelsSummaryAndPlotsForOneProblem() throws Exception {
        Path p = problem("pair.json", IsingProblem.builder().coupling(0, 1, -1.0).build());
        Path out = tmp.resolve("spec");
        Run r = obverse("spectrum", "--problem", p.toString(), "--out", out.toString(), "--points", "41");
        assertThat(r.code()).as(r.err()).isZero();
        assertThat(r.out()).contains("illustrative").contains("not any device's schedule").contains("s* = 0.8")
                .contains("pause window");
        List<String> lines = Files.readAllLines(out.resolve("levels.csv"));
        assertThat(lines.get(0)).isEqualTo("s,E0,E1");
        assertThat(lines).hasSize(42);
        for (String line : lines.subList(1, lines.size())) {
            String[] f = line.split(",");
            double s = Double.parseDouble(f[0]);
            double root = Math.sqrt((1 - s) * (1 - s) + s * s / 4);
            assertThat(Double.parseDouble(f[1])).isCloseTo(-root, within(1e-10));
            assertThat(Double.parseDouble(f[2])).isCloseTo(root, within(1e-10));
        }
        ObjectNode summary = JsonFiles.read(out.resolve("summary.json"), "spectrum");
        assertThat(summary.get("s_star").asDouble()).isCloseTo(0.8, within(1e-5));
        assertThat(summary.get("gap_min").asDouble()).isCloseTo(2 * Math.sqrt(0.2), within(1e-9));
        assertThat(summary.get("schedule").asText()).contains("illustrative");
        assertThat(summary.get("schedule_illustrative").asBoolean()).isTrue();
        double from = summary.get("pause_from").asDouble();
        double to = summary.get("pause_to").asDouble();
        assertThat(from).isGreaterThan(0.8);
        // 2√((1 − s)² + s²/4) = 1.1 · 2√0.2 ⇔ (1 − s)² + s²/4 = 0.242 ⇔ 1.25 s² − 2 s + 0.758 = 0,
        // whose root above s* = 0.8 is s = (2 + √(4 − 5 · 0.758)) / 2.5 = (2 + √0.21) / 2.5 ≈ 0.98330.
        assertThat(from).isCloseTo((2 + Math.sqrt(0.21)) / 2.5, within(2e-4));
        // The gap reaches only 1 at s = 1, below 2·Δmin ≈ 1.789: the window is cut at the end.
        assertThat(to).isEqualTo(1.0);
        assertThat(summary.get("pause_to_capped").asBoolean()).isTrue();
        byte[] png = Files.readAllBytes(out.resolve("levels.png"));
        assertThat(png).startsWith((byte) 0x89, (byte) 'P', (byte) 'N', (byte) 'G');
        assertThat(out.resolve("gap.png")).exists();

        Run again = obverse("spectrum", "--problem", p.toString(), "--out", out.toString());
        assertThat(again.code()).isEqualTo(2);
        assertThat(again.err()).contains("already exists");
    }

    /*
     * The case of issue 11: five spins whose two lowest problem energies differ by 0.01, so the
     * gap closes towards s = 1 (0.005 there, the global minimum), with a mid-anneal dip near
     * s = 0.457 (gap 0.3616; numpy's eigvalsh on 1,001 points while building the test, and
     * GapDipsTest against commons-math3). Before dips were reported the window was [1, 1].
     */
    @Test
    void listsEveryDipAndSuggestsTheWindowAfterTheInteriorOne() throws Exception {
        Path p = problem("merge.json", IsingProblem.builder().field(0, -0.2).field(1, -0.4).field(2, 0.1)
                .field(3, 0.6).field(4, 0.02).coupling(0, 1, 1.0).coupling(0, 3, -0.7).coupling(1, 2, -0.3)
                .coupling(1, 3, 0.9).coupling(2, 3, -0.5).coupling(0, 4, 0.015).build());
        Path out = tmp.resolve("merge");
        Run r = obverse("spectrum", "--problem", p.toString(), "--out", out.toString());
        assertThat(r.code()).as(r.err()).isZero();
        assertThat(r.out()).contains("dip 1: s = 0.45").contains("dip 2: s = 0.99").contains("at the end")
                .contains("after dip 1");
        ObjectNode summary = JsonFiles.read(out.resolve("summary.json"), "spectrum");
        // The global minimum keeps its keys: at the end of the anneal.
        assertThat(summary.get("s_star").asDouble()).isGreaterThan(0.999);
        assertThat(summary.get("gap_min").asDouble()).isCloseTo(0.005, within(1e-6));
        assertThat(summary.get("dips")).hasSize(2);
        ObjectNode interior = (ObjectNode) summary.get("dips").get(0);
        ObjectNode end = (ObjectNode) summary.get("dips").get(1);
        assertThat(interior.get("s").asDouble()).isCloseTo(0.4566, within(1e-3));
        assertThat(interior.get("gap").asDouble()).isCloseTo(0.3616, within(1e-3));
        assertThat(interior.get("depth").asDouble()).isGreaterThan(0.05);
        assertThat(interior.get("at_end").asBoolean()).isFalse();
        assertThat(end.get("at_end").asBoolean()).isTrue();
        assertThat(summary.get("suggested_dip").asInt()).isZero();
        double from = summary.get("pause_from").asDouble();
        double to = summary.get("pause_to").asDouble();
        assertThat(from).isEqualTo(interior.get("pause_from").asDouble()).isGreaterThan(0.4566);
        assertThat(to).isEqualTo(interior.get("pause_to").asDouble()).isGreaterThan(from).isLessThan(0.9);
        // gap.csv holds the dip: its grid values near s = 0.46 lie 0.05 and more below the crest after it.
        List<String> gap = Files.readAllLines(out.resolve("gap.csv"));
        assertThat(gap.get(0)).isEqualTo("s,gap");
        double atDip = Double.parseDouble(gap.get(1 + 46).split(",")[1]);
        assertThat(atDip).isCloseTo(interior.get("gap").asDouble(), within(1e-3));
        assertThat(out.resolve("gap.png")).exists();
    }

    @Test
    void readsAScheduleTableAndRefusesBadOnes() throws Exception {
        Path p = problem("tri.json", IsingProblem.builder().field(0, 0.3).coupling(0, 1, 1.0).coupling(1, 2, -0.5)
                .build());
        Path good = tmp.resolve("sched.csv");
        Files.writeString(good, "s,A,B\n0,4,0.2\n0.5,1,2\n1,0,4\n");
        Path out = tmp.resolve("a");
        Run r = obverse("spectrum", "--problem", p.toString(), "--energy-scales", good.toString(), "--energy-units",
                "GHz", "--out", out.toString(), "--points", "21");
        assertThat(r.code()).as(r.err()).isZero();
        ObjectNode summary = JsonFiles.read(out.resolve("summary.json"), "spectrum");
        assertThat(summary.get("schedule").asText()).isEqualTo("sched.csv");
        assertThat(summary.get("schedule_units").asText()).isEqualTo("GHz");
        assertThat(summary.get("schedule_illustrative").asBoolean()).isFalse();

        Path notMonotone = tmp.resolve("bad1.csv");
        Files.writeString(notMonotone, "s,A,B\n0,4,0.2\n0.6,1,2\n0.5,1,2\n1,0,4\n");
        Run bad = obverse("spectrum", "--problem", p.toString(), "--energy-scales", notMonotone.toString(), "--out",
                tmp.resolve("b").toString());
        assertThat(bad.code()).isEqualTo(2);
        assertThat(bad.err()).contains("bad1.csv: line 4").contains("increase strictly");
        assertThat(tmp.resolve("b")).doesNotExist();

        Path negative = tmp.resolve("bad2.csv");
        Files.writeString(negative, "s,A,B\n0,4,0.2\n0.5,-1,2\n1,0,4\n");
        Run neg = obverse("spectrum", "--problem", p.toString(), "--energy-scales", negative.toString(), "--out",
                tmp.resolve("c").toString());
        assertThat(neg.code()).isEqualTo(2);
        assertThat(neg.err()).contains("bad2.csv: line 3").contains("negative");
    }

    @Test
    void refusesAProblemTooLargeForTheSolver() throws Exception {
        IsingBuilder b = IsingProblem.builder();
        for (int k = 0; k < 13; k++) {
            b.field(k, 0.1);
            if (k > 0) {
                b.coupling(k - 1, k, -1.0);
            }
        }
        Path p = problem("big.json", b.build());
        Run r = obverse("spectrum", "--problem", p.toString(), "--solver", "dense", "--out", tmp.resolve("o").toString());
        assertThat(r.code()).isEqualTo(2);
        assertThat(r.err()).contains("13 spins").contains("at most 2^12").contains("GiB").contains("--solver lanczos");
        assertThat(r.err().lines().count()).isEqualTo(1);
    }

    /* Re-embedding a triangle in one K4,4 cell with chains of two: s* moves earlier as the chains grow stronger. */
    @Test
    void sweepsTheChainCoupling() throws Exception {
        Path device = tmp.resolve("dev.json");
        Run d = obverse("device", "lattice", "--rows", "1", "--cols", "1", "--shore", "4", "--out", device.toString());
        assertThat(d.code()).as(d.err()).isZero();
        Path logical = problem("logical.json", IsingProblem.builder().field(0, 0.3).field(1, -0.2).field(2, 0.1)
                .coupling(0, 1, 1.0).coupling(0, 2, 0.6).coupling(1, 2, -0.8).build());
        Path chains = tmp.resolve("chains.json");
        Files.writeString(chains, "{\"format\": \"obverse.chains/1\", \"chains\": [[0, [0, 4]], [1, [1, 5]], [2, [2, 6]]]}");
        Path out = tmp.resolve("sweep");
        Run r = obverse("spectrum", "--logical", logical.toString(), "--chains", chains.toString(), "--device",
                device.toString(), "--chain-couplings=-0.5,-1,-2", "--scale", "1", "--points", "41", "--out",
                out.toString());
        assertThat(r.code()).as(r.err()).isZero();
        List<String> lines = Files.readAllLines(out.resolve("chain_scan.csv"));
        assertThat(lines.get(0)).startsWith("chain_coupling,spins,s_star");
        assertThat(lines).hasSize(4);
        double previous = 2;
        for (String line : lines.subList(1, 4)) {
            String[] f = line.split(",");
            assertThat(Integer.parseInt(f[1])).isEqualTo(6);
            double sStar = Double.parseDouble(f[2]);
            assertThat(sStar).isLessThan(previous).isBetween(0.05, 0.95);
            previous = sStar;
        }
        ObjectNode summary = JsonFiles.read(out.resolve("summary.json"), "spectrum");
        assertThat(summary.get("chain_scan")).hasSize(3);
        assertThat(out.resolve("chain_scan.png")).exists();

        Run outside = obverse("spectrum", "--logical", logical.toString(), "--chains", chains.toString(), "--device",
                device.toString(), "--chain-couplings=-3", "--scale", "1", "--out", tmp.resolve("x").toString());
        assertThat(outside.code()).isEqualTo(2);
        assertThat(outside.err()).contains("chain coupling -3.0");
    }
}
