package org.obverse.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.samples.SampleFiles;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.samples.SampleBlock;

import static org.assertj.core.api.Assertions.assertThat;
import static org.obverse.testsupport.NpyBytes.matrix;
import static org.obverse.testsupport.NpyBytes.members;
import static org.obverse.testsupport.NpyBytes.vector;
import static org.obverse.testsupport.NpyBytes.zip;

/** The verbs take problems as NPY matrices and NPZ archives (built byte by byte, see NpyBytes). */
class NumpyProblemCommandTest extends CommandTestSupport {
    @TempDir
    Path tmp;

    @Test
    void energyReadsAQuboMatrix() throws Exception {
        // Q = [[-1, 2], [2, 3]] symmetric: E(x) = -x0 + 4 x0 x1 + 3 x1 by hand, so
        // E(0,0) = 0, E(1,0) = -1, E(0,1) = 3, E(1,1) = 6.
        Path q = tmp.resolve("q.npy");
        Files.write(q, matrix(new double[][] {{-1, 2}, {2, 3}}, false));
        Path s = tmp.resolve("s.npy");
        // Spins for x = (0,0), (1,0), (0,1), (1,1) under x = (1 + s) / 2.
        SampleFiles.writeAll(s, VariableIndex.of(0, 1), false,
                SampleBlock.fromSpins(new byte[] {-1, -1, 1, -1, -1, 1, 1, 1}, 4, 2));
        Path e = tmp.resolve("e.npy");
        Run r = obverse("energy", "--problem", q.toString(), "--samples", s.toString(), "--out", e.toString());
        assertThat(r.code()).as(r.err()).isZero();
        assertThat(NpyVectors.readFloat64(e, 4)).containsExactly(0, -1, 3, 6);

        Path bad = tmp.resolve("bad.npy");
        Files.write(bad, matrix(new double[][] {{-1, 2}, {1, 3}}, false));
        Run refused = obverse("energy", "--problem", bad.toString(), "--samples", s.toString());
        assertThat(refused.code()).isEqualTo(2);
        assertThat(refused.err()).contains("bad.npy: Q[1, 0]").contains("neither upper-triangular");
    }

    @Test
    void embedTakesAnArchiveAsItTakesTheSameProblemInJson() throws Exception {
        Path d = tmp.resolve("dev.json");
        Run dev = obverse("device", "lattice", "--rows", "2", "--cols", "2", "--shore", "4", "--out", d.toString());
        assertThat(dev.code()).as(dev.err()).isZero();
        // A 4-cycle with fields and an offset, J given as the upper triangle.
        double[] h = {0.5, 0, -0.25, 1};
        double[][] j = {{0, 1, 0, 0.5}, {0, 0, -0.5, 0}, {0, 0, 0, 0.75}, {0, 0, 0, 0}};
        Path npz = tmp.resolve("cycle.npz");
        Files.write(npz, zip(members("h.npy", vector(h), "J.npy", matrix(j, false), "offset.npy", vector(1.5)), true));
        IsingProblem same = IsingProblem.builder().field(0, 0.5).field(2, -0.25).field(3, 1).coupling(0, 1, 1)
                .coupling(0, 3, 0.5).coupling(1, 2, -0.5).coupling(2, 3, 0.75).variable(1).offset(1.5).build();
        Path json = tmp.resolve("cycle.json");
        ProblemCodec.write(json, false, ProblemFile.of(same, null));
        assertThat(ProblemCodec.read(npz).spin()).isEqualTo(same);

        Path fromNpz = tmp.resolve("a.json");
        Path fromJson = tmp.resolve("b.json");
        for (Path[] io : new Path[][] {{npz, fromNpz}, {json, fromJson}}) {
            Run r = obverse("embed", "--logical", io[0].toString(), "--device", d.toString(), "--chain-coupling", "-1.5",
                    "--seed", "4", "--out", io[1].toString());
            assertThat(r.code()).as(r.err()).isZero();
        }
        assertThat(ProblemCodec.read(fromNpz).spin()).isEqualTo(ProblemCodec.read(fromJson).spin());
        assertThat(Files.readString(tmp.resolve("a.chains.json"))).isEqualTo(Files.readString(tmp.resolve("b.chains.json")));
    }
}
