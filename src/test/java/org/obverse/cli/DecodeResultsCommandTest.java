package org.obverse.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.samples.SampleFiles;
import org.obverse.model.IsingProblem;
import org.obverse.samples.SampleBlock;

import static org.assertj.core.api.Assertions.assertThat;

/** decode --instance writes the results table; discarded reads count as failed reads when scored. */
class DecodeResultsCommandTest extends CommandTestSupport {
    @TempDir
    Path dir;

    @Test
    void decodedReadsBecomeResultRowsAndDiscardedOnesFail() throws Exception {
        // Logical: E = s_a s_b (ground -1 at opposite spins). Chains a = {0, 1}, b = {2, 3}; chain
        // couplers -2 inside chains, the logical coupler on qubits 1-2 (scale 1 on [-1, 1]).
        IsingProblem logical = IsingProblem.builder().coupling(0, 1, 1.0).build();
        Path q = dir.resolve("q.json");
        ProblemCodec.write(q, false, ProblemFile.of(logical, null));
        Files.writeString(dir.resolve("dev.json"), "{\"format\": \"obverse.device/1\", \"field\": [-1, 1], "
                + "\"coupling\": [-2, 1], \"qubits\": [0, 1, 2, 3], \"couplers\": [[0, 1], [1, 2], [2, 3]]}");
        Files.writeString(dir.resolve("chains.json"), "{\"format\": \"obverse.chains/1\", "
                + "\"chains\": [[0, [0, 1]], [1, [2, 3]]]}");
        Path p = dir.resolve("p.json");
        Run e = obverse("embed", "--logical", q.toString(), "--chains", dir.resolve("chains.json").toString(),
                "--device", dir.resolve("dev.json").toString(), "--chain-coupling", "-2", "--out", p.toString());
        assertThat(e.code()).as(e.err()).isZero();
        IsingProblem phys = ProblemCodec.read(p).spin();
        // Reads: (+ + - -) ground; (+ + + +) excited; (+ - - -) broken chain a; (+ - + -) two broken.
        byte[] s = {1, 1, -1, -1, 1, 1, 1, 1, 1, -1, -1, -1, 1, -1, 1, -1};
        Path samples = dir.resolve("s.npy");
        SampleFiles.writeAll(samples, phys.variables(), false, SampleBlock.fromSpins(s, 4, 4));
        Path out = dir.resolve("dec");
        Run d = obverse("decode", "--problem", p.toString(), "--logical", q.toString(), "--chains",
                dir.resolve("chains.json").toString(), "--samples", samples.toString(), "--rule", "discard",
                "--out", out.toString(), "--instance", "tiny", "--setting", "V=-2", "--gauge", "3", "--run-us", "2.5",
                "--column", "chain_coupling=-2");
        assertThat(d.code()).as(d.err()).isZero();
        List<String> rows = Files.readAllLines(out.resolve("results.csv"));
        assertThat(rows.get(0)).isEqualTo("instance,setting,gauge,energy,count,broken,run_us,energy_frame,chain_coupling");
        assertThat(rows.subList(1, rows.size())).containsExactlyInAnyOrder(
                "tiny,V=-2,3,-1,1,0,2.5,logical,-2", "tiny,V=-2,3,1,1,0,2.5,logical,-2",
                "tiny,V=-2,3,,1,1,2.5,logical,-2", "tiny,V=-2,3,,1,2,2.5,logical,-2");

        // Scored against the ground -1: one success in four reads (the two discarded reads fail).
        Files.writeString(dir.resolve("ground.csv"), "instance,ground_energy\ntiny,-1\n");
        Run sc = obverse("score", "--results", out.resolve("results.csv").toString(), "--ground",
                dir.resolve("ground.csv").toString(), "--out", dir.resolve("scores").toString(), "--quiet",
                "--replicates", "20");
        assertThat(sc.code()).as(sc.err()).isZero();
        String inst = Files.readString(dir.resolve("scores/instances.csv"));
        assertThat(inst.lines().skip(1).findFirst().orElseThrow()).startsWith("tiny,V=-2,4,1,0.25,");

        Run bad = obverse("decode", "--problem", p.toString(), "--logical", q.toString(), "--chains",
                dir.resolve("chains.json").toString(), "--samples", samples.toString(), "--rule", "discard",
                "--out", dir.resolve("dec2").toString(), "--instance", "tiny");
        assertThat(bad.code()).isEqualTo(2);
        assertThat(bad.err()).contains("--setting");
        assertThat(dir.resolve("dec2")).doesNotExist();
    }
}
