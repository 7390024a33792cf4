package org.obverse.io;

import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.json.JsonFiles;
import org.obverse.io.npy.NpyReader;
import org.obverse.io.samples.SampleFiles;
import org.obverse.io.table.CsvReader;
import org.obverse.io.table.MagnetisationTable;
import org.obverse.io.table.GroundTable;
import org.obverse.io.table.ResultsTable;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import org.obverse.stats.SuccessRule;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

/**
 * The reader layer (issue 13, classes 1 and 5): text is strict UTF-8 and a bad byte is bad
 * input naming the file and its line; only regular files are read.
 */
class StrictInputTest extends QuietTest {
    @TempDir
    Path dir;

    private Path withBadByte(String name, String text, int atLine) throws IOException {
        byte[] b = text.getBytes(StandardCharsets.UTF_8);
        int line = 1;
        int at = -1;
        for (int i = 0; i < b.length; i++) {
            if (line == atLine && b[i] != '\n') {
                at = i;
                break;
            }
            if (b[i] == '\n') {
                line++;
            }
        }
        b[at] = (byte) 0xC3; // a lead byte followed by ASCII: malformed (RFC 3629, section 3)
        Path f = dir.resolve(name);
        Files.write(f, b);
        return f;
    }

    @Test
    void theMalformedLineIsNamedWhereverItIs() throws Exception {
        Seeds.forEachCase(60, 13_100, (rng, seed) -> {
            int lines = 1 + rng.nextInt(20_000);
            StringBuilder s = new StringBuilder();
            for (int i = 0; i < lines; i++) {
                s.append("row ").append(i).append(",é").append(i % 7 == 0 ? "\r\n" : "\n");
            }
            int bad = 1 + rng.nextInt(lines);
            Path f = withBadByte("t" + seed + ".csv", s.toString(), bad);
            BadInputException e = catchThrowableOfType(() -> {
                try (TextInput in = TextInput.open(f)) {
                    while (in.readLine() != null) {
                        // read to the end
                    }
                }
            }, BadInputException.class);
            assertThat(e).isNotNull();
            assertThat(e.getMessage()).contains(f.toString()).contains("line " + bad + ",").contains("not UTF-8");
        });
    }

    @Test
    void linesAreSplitAsBeforeOnLfCrlfAndCr() throws Exception {
        Path f = dir.resolve("ends.txt");
        Files.write(f, "a\nb\r\nc\rd\n\ne".getBytes(StandardCharsets.UTF_8));
        try (TextInput in = TextInput.open(f)) {
            assertThat(in.readLine()).isEqualTo("a");
            assertThat(in.readLine()).isEqualTo("b");
            assertThat(in.readLine()).isEqualTo("c");
            assertThat(in.readLine()).isEqualTo("d");
            assertThat(in.readLine()).isEqualTo("");
            assertThat(in.readLine()).isEqualTo("e");
            assertThat(in.readLine()).isNull();
        }
    }

    /** Issue 13, class 1: every CSV table reader, one invalid byte each. */
    @Test
    void everyTableReaderNamesFileAndLine() throws Exception {
        Path ground = withBadByte("ground.csv", "instance,ground_energy\na,-1\nb,-2\n", 3);
        assertBad(() -> GroundTable.readEnergies(ground), "ground.csv", "line 3");
        Path results = withBadByte("results.csv", Files.readString(Path.of("examples/results.csv")), 2);
        assertBad(() -> ResultsTable.read(results, null, SuccessRule.DEFAULT), "results.csv", "line 2");
        Path mag = withBadByte("magnetisation.csv", "qubit,gauge,reads,sum_spin,sign\n0,0,4,2,1\n", 2);
        assertBad(() -> MagnetisationTable.read(mag), "magnetisation.csv", "line 2");
        Path cor = withBadByte("correlations.csv", "qubit_a,qubit_b,gauge,reads,sum_product,sign\n0,1,0,4,2,1\n", 1);
        assertBad(() -> MagnetisationTable.readCouplers(cor), "correlations.csv", "line 1");
        Path json = withBadByte("problem.json", Files.readString(Path.of("examples/problem.json")), 3);
        assertBad(() -> ProblemCodec.read(json), "problem.json", "line 3");
    }

    /** Issue 13, class 5: /dev/zero and other special files are refused at once. */
    @Test
    void specialFilesAreRefused() {
        Path zero = Path.of("/dev/zero");
        assumeTrue(Files.exists(zero));
        assertTimeoutPreemptively(Duration.ofSeconds(5), () -> {
            assertBad(() -> GroundTable.readEnergies(zero), "/dev/zero", "not a regular file");
            assertBad(() -> ProblemCodec.read(zero), "/dev/zero", "not a regular file");
            assertBad(() -> NpyReader.open(zero), "/dev/zero", "not a regular file");
            assertBad(() -> SampleFiles.open(Path.of("/dev/zero"), null), "zero", "");
        });
    }

    @Test
    void aFifoIsRefusedWithoutBlocking() throws Exception {
        Path fifo = dir.resolve("raw.npy");
        Process p;
        try {
            p = new ProcessBuilder("mkfifo", fifo.toString()).start();
        } catch (IOException e) {
            assumeTrue(false, "no mkfifo on this machine");
            return;
        }
        assumeTrue(p.waitFor() == 0 && Files.exists(fifo));
        assertTimeoutPreemptively(Duration.ofSeconds(5), () -> {
            assertBad(() -> SampleFiles.open(fifo, null), "raw.npy", "not a regular file");
            assertBad(() -> CsvReader.open(fifo), "raw.npy", "not a regular file");
            assertBad(() -> JsonFiles.read(fifo, "problem"), "raw.npy", "not a regular file");
        });
    }

    @Test
    void aFolderIsRefusedAsAFile() {
        assertBad(() -> CsvReader.open(dir), dir.toString(), "is a folder");
    }

    @Test
    void anOverlongLineIsRefusedNotRead() throws Exception {
        Path f = dir.resolve("long.csv");
        Files.writeString(f, "instance,ground_energy\na," + "1".repeat(TextInput.MAX_LINE + 10) + "\n");
        assertBad(() -> GroundTable.readEnergies(f), "long.csv", "line 2");
    }

    interface Action {
        void run() throws Exception;
    }

    static void assertBad(Action a, String... parts) {
        BadInputException e = catchThrowableOfType(a::run, BadInputException.class);
        assertThat(e).as("a BadInputException").isNotNull();
        for (String part : parts) {
            assertThat(e.getMessage()).contains(part);
        }
        assertThat(e.getMessage()).doesNotContain("\n");
    }
}
