package org.obverse.io.output;

import org.obverse.io.BadInputException;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import org.obverse.testsupport.QuietTest;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * The output layer (issue 13, classes 2, 3, 4 and 8): inputs are never an output, one writer
 * per target, publication only of complete outputs, and no temporary folder left behind.
 */
class AtomicOutputTest extends QuietTest {
    @TempDir
    Path dir;

    static List<String> leftovers(Path folder) throws IOException {
        try (Stream<Path> s = Files.list(folder)) {
            return s.map(p -> p.getFileName().toString()).filter(n -> n.contains(".obverse-")).toList();
        }
    }

    @Test
    void anOutputThatIsHoldsOrLiesInsideAnInputIsRefused() throws Exception {
        Path raw = Files.createDirectories(dir.resolve("work/raw"));
        Path sample = Files.writeString(raw.resolve("g0.npy"), "x");
        Path manifest = Files.writeString(dir.resolve("work/manifest.json"), "{}");
        List<Path> inputs = List.of(raw, manifest);
        for (Path target : List.of(raw, dir.resolve("work"), dir, raw.resolve("out"), manifest, sample)) {
            assertThatThrownBy(() -> AtomicOutput.writeDirectory(target, true, inputs, d -> { }))
                    .isInstanceOf(BadInputException.class).hasMessageContaining("the output ")
                    .hasMessageContaining("input");
        }
        // A link to an input is the input.
        Path link = Files.createSymbolicLink(dir.resolve("alias"), dir.resolve("work"));
        assertThatThrownBy(() -> AtomicOutput.writeText(link.resolve("manifest.json"), true, inputs, "y"))
                .isInstanceOf(BadInputException.class).hasMessageContaining("is the input");
        assertThat(Files.readString(manifest)).isEqualTo("{}");
        assertThat(Files.readString(sample)).isEqualTo("x");
        // Beside an input is fine.
        AtomicOutput.writeText(dir.resolve("work/other.json"), false, inputs, "z");
        assertThat(leftovers(dir.resolve("work"))).isEmpty();
    }

    @Test
    void twoWritersOfOneTargetNeverBothSucceed() throws Exception {
        ExecutorService pool = Executors.newFixedThreadPool(2);
        try {
            for (int trial = 0; trial < 10; trial++) {
                Path target = dir.resolve("out" + trial);
                CountDownLatch bothStarted = new CountDownLatch(2);
                List<Future<String>> runs = new ArrayList<>();
                for (int w = 0; w < 2; w++) {
                    String mark = "writer" + w;
                    runs.add(pool.submit(() -> {
                        try {
                            AtomicOutput.writeDirectory(target, false, List.of(), d -> {
                                bothStarted.countDown();
                                Files.writeString(d.resolve("who"), mark);
                                sleep(50);
                            });
                            return mark;
                        } catch (BadInputException e) {
                            bothStarted.countDown();
                            return "refused: " + e.getMessage();
                        }
                    }));
                }
                List<String> outcomes = new ArrayList<>();
                for (Future<String> f : runs) {
                    outcomes.add(f.get(10, TimeUnit.SECONDS));
                }
                assertThat(outcomes.stream().filter(o -> o.startsWith("writer"))).hasSize(1);
                assertThat(outcomes.stream().filter(o -> o.startsWith("refused")).findFirst().orElseThrow())
                        .containsAnyOf("being written by another obverse run", "already exists");
                assertThat(Files.readString(target.resolve("who"))).isIn("writer0", "writer1");
                assertThat(leftovers(dir)).isEmpty();
            }
        } finally {
            pool.shutdownNow();
        }
    }

    private static void sleep(long ms) {
        try {
            Thread.sleep(ms);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    @Test
    void aTargetThatAppearsWhileWritingIsNotReplacedWithoutForce() throws Exception {
        Path target = dir.resolve("t");
        assertThatThrownBy(() -> AtomicOutput.writeDirectory(target, false, List.of(), d -> {
            Files.createDirectory(target);
            Files.writeString(target.resolve("theirs"), "theirs");
        })).isInstanceOf(BadInputException.class).hasMessageContaining("appeared while");
        assertThat(Files.readString(target.resolve("theirs"))).isEqualTo("theirs");
        Path file = dir.resolve("f.txt");
        assertThatThrownBy(() -> AtomicOutput.writeFile(file, false, List.of(), out -> {
            Files.writeString(file, "theirs");
            out.write('m');
        })).isInstanceOf(BadInputException.class).hasMessageContaining("appeared while");
        assertThat(Files.readString(file)).isEqualTo("theirs");
        assertThat(leftovers(dir)).isEmpty();
    }

    /** Issue 13, class 8: a multi-file output is published as one unit or not at all. */
    @Test
    void severalFilesArePublishedTogetherOrNotAtAll() throws Exception {
        Path a = dir.resolve("s.npy");
        Path b = dir.resolve("s.energies.npy");
        assertThatThrownBy(() -> AtomicOutput.writeFiles(List.of(a, b), false, List.of(), files -> {
            Files.writeString(files.get(0), "samples");
            throw new IOException("No space left on device");
        })).isInstanceOf(IOException.class).hasMessageContaining("No space left on device")
                .hasMessageContaining(dir.toString());
        assertThat(a).doesNotExist();
        assertThat(b).doesNotExist();
        assertThat(leftovers(dir)).isEmpty();
        AtomicOutput.writeFiles(List.of(a, b), false, List.of(), files -> {
            assertThat(files.get(0).getFileName().toString()).isEqualTo("s.npy");
            Files.writeString(files.get(0), "samples");
            Files.writeString(files.get(1), "energies");
        });
        assertThat(Files.readString(a)).isEqualTo("samples");
        assertThat(Files.readString(b)).isEqualTo("energies");
        assertThat(leftovers(dir)).isEmpty();
    }

    /** A process that has ended: its pid names no live process of the same start. */
    private static long deadPid() throws Exception {
        Process p = new ProcessBuilder("java", "-version").redirectErrorStream(true)
                .redirectOutput(ProcessBuilder.Redirect.DISCARD).start();
        p.waitFor();
        return p.pid();
    }

    @Test
    void staleTemporaryFoldersOfDeadRunsAreRemovedAndAnOldOutputPutBack() throws Exception {
        long dead = deadPid();
        Path stale = Files.createDirectories(dir.resolve(".out.obverse-tmp-123/new/out"));
        Files.writeString(dir.resolve(".out.obverse-tmp-123/owner"), dead + " 1\nout\n");
        Path other = Files.createDirectories(dir.resolve(".x.obverse-tmp-9/new"));
        Files.writeString(other.getParent().resolve("owner"), dead + " 1\nx\n");
        Path live = Files.createDirectories(dir.resolve(".y.obverse-tmp-7"));
        Files.writeString(live.resolve("owner"), ProcessHandle.current().pid() + " -1\ny\n");
        // A --force replacement killed after moving the old output aside.
        Path aside = Files.createDirectories(dir.resolve(".kept.obverse-tmp-5/old/kept"));
        Files.writeString(aside.resolve("data"), "old output");
        Files.writeString(dir.resolve(".kept.obverse-tmp-5/owner"), dead + " 1\nkept\n");

        AtomicOutput.writeDirectory(dir.resolve("out"), false, List.of(), d -> Files.writeString(d.resolve("a"), "a"));
        assertThat(stale.getParent().getParent()).doesNotExist();
        assertThat(other).doesNotExist();
        assertThat(live).exists();
        assertThat(aside).exists(); // another target's old output waits for a run on that target

        assertThatThrownBy(() -> AtomicOutput.writeDirectory(dir.resolve("kept"), false, List.of(), d -> { }))
                .isInstanceOf(BadInputException.class).hasMessageContaining("already exists");
        assertThat(Files.readString(dir.resolve("kept/data"))).isEqualTo("old output");
        assertThat(leftovers(dir)).containsExactly(".y.obverse-tmp-7");
    }

    @Test
    void forceReplacesAFolderAndAFileWithoutAGap() throws Exception {
        Path d = dir.resolve("d");
        AtomicOutput.writeDirectory(d, false, List.of(), t -> Files.writeString(t.resolve("v"), "1"));
        AtomicOutput.writeDirectory(d, true, List.of(), t -> Files.writeString(t.resolve("v"), "2"));
        assertThat(Files.readString(d.resolve("v"))).isEqualTo("2");
        Path f = dir.resolve("f");
        AtomicOutput.writeText(f, false, List.of(), "1");
        AtomicOutput.writeText(f, true, List.of(), "2");
        assertThat(Files.readString(f)).isEqualTo("2");
        // A folder replaced by a file and back.
        AtomicOutput.writeText(d, true, List.of(), "file now");
        assertThat(Files.readString(d)).isEqualTo("file now");
        assertThat(leftovers(dir)).isEmpty();
    }
}
