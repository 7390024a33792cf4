package org.obverse.cli;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The reproducers of issue 13, classes 2, 3 and 4, through the verbs: {@code --force} onto an
 * input, two runs writing one output, and runs killed while writing (in a child JVM running
 * {@code org.obverse.cli.Main} from the test class path).
 */
class OutputAttackTest extends CommandTestSupport {
    @TempDir
    Path dir;
    Path gauges;
    Path raw;

    @BeforeEach
    void campaign() {
        gauges = dir.resolve("gauges");
        raw = dir.resolve("raw");
        assertThat(obverse("gauge", "--problem", "examples/problem.json", "--device", "examples/device.json",
                "--chains", "examples/chains.json", "--count", "3", "--seed", "5", "--out", gauges.toString()).code())
                .isZero();
        assertThat(obverse("sample", "--manifest", gauges.resolve("manifest.json").toString(), "--reads", "64",
                "--seed", "2", "--out", raw.toString()).code()).isZero();
    }

    /** Every file under a folder with its bytes, to show nothing changed. */
    static Map<String, String> snapshot(Path root) throws IOException {
        Map<String, String> m = new TreeMap<>();
        try (Stream<Path> s = Files.walk(root)) {
            for (Path p : (Iterable<Path>) s::iterator) {
                if (Files.isRegularFile(p)) {
                    m.put(root.relativize(p).toString(), java.util.Base64.getEncoder().encodeToString(Files.readAllBytes(p)));
                }
            }
        }
        return m;
    }

    static List<String> leftovers(Path folder) throws IOException {
        try (Stream<Path> s = Files.walk(folder)) {
            return s.map(p -> p.getFileName().toString()).filter(n -> n.contains(".obverse-")).toList();
        }
    }

    /** Issue 13, class 2: --force onto an input deleted it. */
    @Test
    void forceNeverTouchesAnInput() throws Exception {
        Map<String, String> before = snapshot(dir);
        String manifest = gauges.resolve("manifest.json").toString();
        for (Path out : List.of(raw, gauges, dir, raw.resolve("inside"), gauges.resolve("manifest.json"))) {
            Run r = obverse("ungauge", "--manifest", manifest, "--samples", raw.toString(), "--out", out.toString(),
                    "--force");
            assertThat(r.code()).as(out.toString()).isEqualTo(Main.BAD_INPUT);
            assertThat(r.err().strip().lines().count()).isEqualTo(1);
            assertThat(r.err()).contains("input");
        }
        Path samples = raw.resolve("g0000.npy");
        Run e = obverse("energy", "--problem", gauges.resolve("g0000.json").toString(), "--samples", samples.toString(),
                "--out", samples.toString(), "--force");
        assertThat(e.code()).isEqualTo(Main.BAD_INPUT);
        Run s = obverse("sample", "--manifest", manifest, "--reads", "8", "--out", gauges.toString(), "--force");
        assertThat(s.code()).isEqualTo(Main.BAD_INPUT);
        Run sc = obverse("score", "--results", "examples/results.csv", "--ground", "examples/ground.csv", "--out",
                "examples", "--force");
        assertThat(sc.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(snapshot(dir)).isEqualTo(before);
        assertThat(leftovers(dir)).isEmpty();
    }

    /** Issue 13, class 3: two runs writing one --out at once both exited 0, one output silently replaced. */
    @Test
    void twoConcurrentVerbsNeverBothSucceed() throws Exception {
        String manifest = gauges.resolve("manifest.json").toString();
        ExecutorService pool = Executors.newFixedThreadPool(2);
        try {
            for (int trial = 0; trial < 10; trial++) {
                Path out = dir.resolve("source" + trial);
                List<Future<Run>> runs = new ArrayList<>();
                for (int w = 0; w < 2; w++) {
                    runs.add(pool.submit(() -> obverse("ungauge", "--manifest", manifest, "--samples", raw.toString(),
                            "--out", out.toString())));
                }
                int ok = 0;
                for (Future<Run> f : runs) {
                    Run r = f.get(30, TimeUnit.SECONDS);
                    if (r.code() == 0) {
                        ok++;
                    } else {
                        assertThat(r.code()).isEqualTo(Main.BAD_INPUT);
                        assertThat(r.err()).containsAnyOf("being written by another obverse run", "already exists");
                    }
                }
                assertThat(ok).isEqualTo(1);
            }
            assertThat(leftovers(dir)).isEmpty();
        } finally {
            pool.shutdownNow();
        }
    }

    private Process child(Path log, String... args) throws IOException {
        List<String> cmd = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-cp", System.getProperty("java.class.path"), "org.obverse.cli.Main"));
        cmd.addAll(List.of(args));
        return new ProcessBuilder(cmd).redirectErrorStream(true).redirectOutput(log.toFile()).start();
    }

    /** Waits until the child has made its temporary folder beside target. */
    private static void awaitTemporary(Process p, Path target) throws Exception {
        long until = System.nanoTime() + TimeUnit.SECONDS.toNanos(30);
        String prefix = "." + target.getFileName() + ".obverse-tmp-";
        while (System.nanoTime() < until) {
            try (Stream<Path> s = Files.list(target.getParent())) {
                // The owner marker is written after the folder is registered for cleanup.
                if (s.anyMatch(q -> q.getFileName().toString().startsWith(prefix) && Files.exists(q.resolve("owner")))) {
                    Thread.sleep(200); // let it start writing
                    return;
                }
            }
            assertThat(p.isAlive()).as("the child ended before writing").isTrue();
            Thread.sleep(20);
        }
        throw new AssertionError("no temporary folder appeared for " + target);
    }

    private String[] longSample(Path out) {
        return new String[] {"sample", "--manifest", gauges.resolve("manifest.json").toString(), "--reads", "4000000",
            "--seed", "9", "--out", out.toString()};
    }

    /** Issue 13, class 4: SIGTERM left the temporary folder; the shutdown hook removes it. */
    @Test
    void sigtermLeavesNoTemporaryFolder() throws Exception {
        Path out = dir.resolve("killed");
        Process p = child(dir.resolve("term.log"), longSample(out));
        try {
            awaitTemporary(p, out);
            assertThat(p.isAlive()).isTrue();
            p.destroy(); // SIGTERM
            assertThat(p.waitFor(30, TimeUnit.SECONDS)).isTrue();
        } finally {
            p.destroyForcibly();
        }
        assertThat(out).doesNotExist();
        assertThat(leftovers(dir)).isEmpty();
    }

    /** Issue 13, class 4: kill -9 left the temporary folder for ever; the next run removes it. */
    @Test
    void afterKillNineTheRerunCleansUp() throws Exception {
        Path out = dir.resolve("killed");
        Process p = child(dir.resolve("kill.log"), longSample(out));
        try {
            awaitTemporary(p, out);
            assertThat(p.isAlive()).isTrue();
            p.destroyForcibly(); // SIGKILL: no hook runs
            assertThat(p.waitFor(30, TimeUnit.SECONDS)).isTrue();
        } finally {
            p.destroyForcibly();
        }
        assertThat(leftovers(dir)).isNotEmpty();
        Run again = obverse("sample", "--manifest", gauges.resolve("manifest.json").toString(), "--reads", "16",
                "--seed", "9", "--out", out.toString());
        assertThat(again.code()).as(again.err()).isZero();
        assertThat(out.resolve("g0000.npy")).exists();
        assertThat(leftovers(dir)).isEmpty();
    }

    /** Two JVMs racing for one output: at most one succeeds, the other is refused in one line. */
    @Test
    void twoProcessesNeverBothSucceed() throws Exception {
        for (int trial = 0; trial < 2; trial++) {
            Path out = dir.resolve("race" + trial);
            String[] args = {"sample", "--manifest", gauges.resolve("manifest.json").toString(), "--reads", "300",
                "--seed", "3", "--out", out.toString()};
            Process a = child(dir.resolve("a" + trial + ".log"), args);
            Process b = child(dir.resolve("b" + trial + ".log"), args);
            assertThat(a.waitFor(60, TimeUnit.SECONDS)).isTrue();
            assertThat(b.waitFor(60, TimeUnit.SECONDS)).isTrue();
            assertThat(List.of(a.exitValue(), b.exitValue())).containsExactlyInAnyOrder(0, Main.BAD_INPUT);
            String refused = Files.readString(dir.resolve((a.exitValue() == 0 ? "b" : "a") + trial + ".log"));
            assertThat(refused.strip().lines().count()).isEqualTo(1);
        }
        assertThat(leftovers(dir)).isEmpty();
    }
}
