package org.obverse.cli;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

/** Issue 13, classes 1 and 5, through the verbs: bad bytes and special files are exit 2 in one line, at once. */
class SpecialInputCommandTest extends CommandTestSupport {
    @TempDir
    Path dir;

    /** One invalid UTF-8 byte in a CSV table gave exit 3 with no file name. */
    @Test
    void anInvalidByteInATableIsExitTwoNamingFileAndLine() throws Exception {
        byte[] b = Files.readAllBytes(Path.of("examples/results.csv"));
        int line = 1;
        for (int i = 0; i < b.length; i++) {
            if (b[i] == '\n' && ++line == 3) {
                b[i + 1] = (byte) 0xFF;
                break;
            }
        }
        Path results = Files.write(dir.resolve("results.csv"), b);
        Run r = obverse("score", "--results", results.toString(), "--ground", "examples/ground.csv", "--quiet");
        assertThat(r.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(r.err()).contains("results.csv").contains("line 3").contains("UTF-8");
        assertThat(r.err().strip().lines().count()).isEqualTo(1);
    }

    private Path campaign() {
        Path g = dir.resolve("gauges");
        assertThat(obverse("gauge", "--problem", "examples/problem.json", "--device", "examples/device.json",
                "--chains", "examples/chains.json", "--count", "2", "--seed", "5", "--out", g.toString()).code()).isZero();
        Path raw = dir.resolve("raw");
        assertThat(obverse("sample", "--manifest", g.resolve("manifest.json").toString(), "--reads", "8", "--seed", "2",
                "--sweeps-per-us", "20", "--out", raw.toString()).code()).isZero();
        return raw;
    }

    /** The endless zero device as an energies file made ungauge copy until the disk was full. */
    @Test
    void aDeviceAsAnEnergiesFileIsRefused() throws Exception {
        assumeTrue(Files.exists(Path.of("/dev/zero")));
        Path raw = campaign();
        Files.delete(raw.resolve("g0000.energies.npy"));
        Files.createSymbolicLink(raw.resolve("g0000.energies.npy"), Path.of("/dev/zero"));
        Run r = assertTimeoutPreemptively(Duration.ofSeconds(5), () -> obverse("ungauge", "--manifest",
                dir.resolve("gauges/manifest.json").toString(), "--samples", raw.toString(), "--out",
                dir.resolve("source").toString()));
        assertThat(r.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(r.err()).contains("g0000.energies.npy").contains("not a regular file");
        assertThat(dir.resolve("source")).doesNotExist();
    }

    /** A FIFO as a samples file hung audit and ungauge for ever. */
    @Test
    void aFifoAsASamplesFileIsRefusedAtOnce() throws Exception {
        Path raw = campaign();
        Path fifo = raw.resolve("g0001.npy");
        Files.delete(fifo);
        Process p;
        try {
            p = new ProcessBuilder("mkfifo", fifo.toString()).start();
        } catch (IOException e) {
            assumeTrue(false, "no mkfifo here");
            return;
        }
        assumeTrue(p.waitFor() == 0);
        for (String verb : new String[] {"audit", "ungauge"}) {
            Run r = assertTimeoutPreemptively(Duration.ofSeconds(5), () -> verb.equals("audit")
                    ? obverse("audit", "--manifest", dir.resolve("gauges/manifest.json").toString(), "--samples",
                            raw.toString())
                    : obverse("ungauge", "--manifest", dir.resolve("gauges/manifest.json").toString(), "--samples",
                            raw.toString(), "--out", dir.resolve("source").toString()));
            assertThat(r.code()).as(verb + ": " + r.err()).isEqualTo(Main.BAD_INPUT);
            assertThat(r.err()).contains("g0001.npy").contains("not a regular file");
        }
    }
}
