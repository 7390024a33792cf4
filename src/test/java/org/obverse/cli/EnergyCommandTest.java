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
import org.obverse.samples.SampleBlock;

import static org.assertj.core.api.Assertions.assertThat;

class EnergyCommandTest extends CommandTestSupport {
    @TempDir
    Path dir;

    /**
     * Hand-computed: E(s) = 0.5 + 0.25 s0 − s1 + 1.5 s0 s1. For (+1, +1): 0.5 + 0.25 − 1 + 1.5 =
     * 1.25; (−1, +1): 0.5 − 0.25 − 1 − 1.5 = −2.25; (+1, −1): 0.5 + 0.25 + 1 − 1.5 = 0.25.
     */
    @Test
    void energiesOfHandComputedReads() throws Exception {
        IsingProblem p = IsingProblem.builder().field(3, 0.25).field(8, -1).coupling(3, 8, 1.5).offset(0.5).build();
        Path pf = dir.resolve("p.json");
        ProblemCodec.write(pf, false, ProblemFile.of(p, null));
        Path s = dir.resolve("s.npy");
        SampleFiles.writeAll(s, p.variables(), false, SampleBlock.fromSpins(new byte[] {1, 1, -1, 1, 1, -1}, 3, 2));
        Run summary = obverse("energy", "--problem", pf.toString(), "--samples", s.toString());
        assertThat(summary.code()).as(summary.err()).isZero();
        assertThat(summary.out()).contains("count 3").contains("min -2.25").contains("max 1.25");
        Path e = dir.resolve("e.npy");
        Run written = obverse("energy", "--problem", pf.toString(), "--samples", s.toString(), "--out", e.toString());
        assertThat(written.code()).isZero();
        assertThat(NpyVectors.readFloat64(e, 3)).containsExactly(1.25, -2.25, 0.25);
        Run again = obverse("energy", "--problem", pf.toString(), "--samples", s.toString(), "--out", e.toString());
        assertThat(again.code()).isEqualTo(2);
        assertThat(again.err()).contains("already exists");

        Path csv = dir.resolve("s.csv");
        Files.writeString(csv, "3,8\n1,1\n-1,2\n");
        Run bad = obverse("energy", "--problem", pf.toString(), "--samples", csv.toString());
        assertThat(bad.code()).isEqualTo(2);
        assertThat(bad.err()).contains("s.csv").contains("2");
    }

    /** The fast kernel on request: within its printed bound of the exact energies (here exact: halves are exact sums). */
    @Test
    void fastKernelOnRequestAndUnknownKernelRefused() throws Exception {
        IsingProblem p = IsingProblem.builder().field(3, 0.1).field(8, -1).coupling(3, 8, 1.7).offset(0.3).build();
        Path pf = dir.resolve("p.json");
        ProblemCodec.write(pf, false, ProblemFile.of(p, null));
        Path s = dir.resolve("s.npy");
        byte[] spins = {1, 1, -1, 1, 1, -1, -1, -1};
        SampleFiles.writeAll(s, p.variables(), false, SampleBlock.fromSpins(spins, 4, 2));
        Path e = dir.resolve("e.npy");
        Run fast = obverse("energy", "--problem", pf.toString(), "--samples", s.toString(), "--out", e.toString(),
                "--kernel", "fast");
        assertThat(fast.code()).as(fast.err()).isZero();
        assertThat(fast.out()).contains("fast kernel: each energy within");
        double bound = org.obverse.samples.EnergyKernel.of(p).tolerance();
        double[] got = NpyVectors.readFloat64(e, 4);
        for (int r = 0; r < 4; r++) {
            double exact = p.energy(new byte[] {spins[2 * r], spins[2 * r + 1]});
            assertThat(Math.abs(got[r] - exact)).isLessThanOrEqualTo(bound);
        }
        Run bad = obverse("energy", "--problem", pf.toString(), "--samples", s.toString(), "--kernel", "quick");
        assertThat(bad.code()).isEqualTo(2);
        assertThat(bad.err()).contains("--kernel quick");
    }
}
