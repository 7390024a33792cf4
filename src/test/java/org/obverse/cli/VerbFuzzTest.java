package org.obverse.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.stream.Stream;
import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.Messages;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;

/**
 * The verb half of the attack harness (issue 13): one input file of a valid campaign is
 * mutated and a verb run through {@link Main#run}. A clean outcome is exit 0, or exit 2 with
 * exactly one line on stderr ({@code audit} may also say 1, a check failed); the inputs are
 * unchanged byte for byte; no temporary folder or lock is left; no run takes over 5 s. The
 * counts go to {@code target/fuzz-verbs.txt}.
 */
class VerbFuzzTest extends QuietTest {
    /** Cases in {@code mvn verify}; {@code -Pfuzz} multiplies them (obverse.fuzz.scale). */
    static final int CASES = 200;

    @TempDir
    Path dir;
    Path template;

    /** A verb, the template files it reads (one is mutated) and its arguments, given the case folder. */
    record Scenario(String verb, List<String> inputs, java.util.function.Function<Path, List<String>> args) {
    }

    static List<Scenario> scenarios() {
        List<Scenario> s = new ArrayList<>();
        s.add(new Scenario("energy", List.of("problem.json", "samples.csv"), d -> List.of("energy", "--problem",
                d.resolve("problem.json").toString(), "--samples", d.resolve("samples.csv").toString(), "--out",
                d.resolve("e.npy").toString())));
        s.add(new Scenario("energy-npy", List.of("gauges/g0000.json", "raw/g0000.npy"), d -> List.of("energy",
                "--problem", d.resolve("gauges/g0000.json").toString(), "--samples", d.resolve("raw/g0000.npy").toString())));
        s.add(new Scenario("score", List.of("results.csv", "ground.csv"), d -> List.of("score", "--results",
                d.resolve("results.csv").toString(), "--ground", d.resolve("ground.csv").toString(), "--replicates", "20",
                "--quiet", "--out", d.resolve("scores").toString())));
        List<String> campaign = List.of("gauges/manifest.json", "gauges/g0000.json", "gauges/g0001.json",
                "raw/g0000.npy", "raw/g0001.npy", "raw/g0000.energies.npy", "problem.json", "device.json", "chains.json");
        s.add(new Scenario("audit", campaign, d -> List.of("audit", "--manifest", d.resolve("gauges/manifest.json")
                .toString(), "--samples", d.resolve("raw").toString())));
        s.add(new Scenario("ungauge", campaign, d -> List.of("ungauge", "--manifest", d.resolve("gauges/manifest.json")
                .toString(), "--samples", d.resolve("raw").toString(), "--out", d.resolve("source").toString())));
        s.add(new Scenario("sample", List.of("problem.json", "schedule-pause.json", "errors.json"), d -> List.of("sample",
                "--problem", d.resolve("problem.json").toString(), "--reads", "8", "--seed", "1", "--schedule",
                d.resolve("schedule-pause.json").toString(), "--errors", d.resolve("errors.json").toString(),
                "--sweeps-per-us", "20", "--out", d.resolve("s.npy").toString())));
        s.add(new Scenario("decode", List.of("problem.json", "logical.json", "chains.json", "samples.csv"), d -> List.of(
                "decode", "--problem", d.resolve("problem.json").toString(), "--logical", d.resolve("logical.json").toString(),
                "--chains", d.resolve("chains.json").toString(), "--samples", d.resolve("samples.csv").toString(), "--rule",
                "majority", "--out", d.resolve("decoded").toString())));
        s.add(new Scenario("embed", List.of("logical.json", "chains.json", "device.json"), d -> List.of("embed",
                "--logical", d.resolve("logical.json").toString(), "--chains", d.resolve("chains.json").toString(),
                "--device", d.resolve("device.json").toString(), "--chain-coupling", "-1.6", "--out",
                d.resolve("p.json").toString())));
        s.add(new Scenario("gauge", List.of("problem.json", "device.json", "chains.json"), d -> List.of("gauge",
                "--problem", d.resolve("problem.json").toString(), "--device", d.resolve("device.json").toString(),
                "--chains", d.resolve("chains.json").toString(), "--count", "2", "--seed", "4", "--out",
                d.resolve("g").toString())));
        return s;
    }

    @BeforeEach
    void campaign() throws IOException {
        template = Files.createDirectories(dir.resolve("template"));
        for (String n : new String[] {"problem.json", "logical.json", "device.json", "chains.json", "errors.json",
            "schedule-pause.json", "results.csv", "ground.csv", "samples.csv"}) {
            Files.copy(Path.of("examples", n), template.resolve(n));
        }
        String p = template.resolve("problem.json").toString();
        assertThat(run(List.of("gauge", "--problem", p, "--device", template.resolve("device.json").toString(), "--chains",
                template.resolve("chains.json").toString(), "--count", "2", "--seed", "5", "--out",
                template.resolve("gauges").toString()))[0]).isEqualTo("0");
        assertThat(run(List.of("sample", "--manifest", template.resolve("gauges/manifest.json").toString(), "--reads",
                "16", "--seed", "2", "--sweeps-per-us", "20", "--out", template.resolve("raw").toString()))[0])
                .isEqualTo("0");
    }

    /** Exit code and stderr of one in-process run. */
    static String[] run(List<String> args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(args.toArray(new String[0]), new PrintWriter(out, true), new PrintWriter(err, true));
        return new String[] {String.valueOf(code), err.toString()};
    }

    static Map<String, String> snapshot(Path root) throws IOException {
        return OutputAttackTest.snapshot(root);
    }

    @Test
    void mutatedInputsGiveExitZeroOrOneLineRefusals() throws Exception {
        List<Scenario> scenarios = scenarios();
        // Unmutated, every scenario runs clean: the refusals below come from the mutations.
        for (Scenario sc : scenarios) {
            Path caseDir = dir.resolve("baseline-" + sc.verb());
            copyTree(template, caseDir);
            String[] r = run(sc.args().apply(caseDir));
            assertThat(r[0]).as(sc.verb() + ": " + r[1]).isEqualTo("0");
            AtomicOutput.deleteTree(caseDir);
        }
        int cases = CASES * FuzzCorpus.SCALE;
        long base = 13_500_000L;
        Map<String, int[]> tally = new TreeMap<>();
        List<String> findings = new ArrayList<>();
        long[] current = {0};
        assertTimeoutPreemptively(Duration.ofSeconds(5).multipliedBy(Math.max(12, cases / 10)), () -> {
            for (int c = 0; c < cases; c++) {
                long seed = base + c;
                current[0] = seed;
                UniformRandomProvider rng = Seeds.rng(seed);
                Scenario sc = scenarios.get(rng.nextInt(scenarios.size()));
                Path caseDir = dir.resolve("case" + c);
                copyTree(template, caseDir);
                String victim = sc.inputs().get(rng.nextInt(sc.inputs().size()));
                Path v = caseDir.resolve(victim);
                Files.write(v, FuzzCorpus.mutate(Files.readAllBytes(v), rng));
                Map<String, String> before = snapshot(caseDir);
                long start = System.nanoTime();
                String[] r = run(sc.args().apply(caseDir));
                long ms = (System.nanoTime() - start) / 1_000_000;
                int code = Integer.parseInt(r[0]);
                String err = r[1].strip();
                int[] t = tally.computeIfAbsent(sc.verb(), k -> new int[4]);
                String problem = null;
                if (code == 0 || code == 1 && sc.verb().equals("audit")) {
                    t[code]++;
                } else if (code == 2 && err.lines().count() == 1 && err.length() <= Messages.MAX_MESSAGE + 40) {
                    t[2]++;
                } else {
                    t[3]++;
                    problem = "exit " + code + ": " + Messages.oneLine(err, 300);
                }
                Map<String, String> after = snapshot(caseDir);
                after.keySet().retainAll(before.keySet());
                if (!after.equals(before)) {
                    problem = "an input changed";
                }
                List<String> left = leftovers(caseDir);
                if (!left.isEmpty()) {
                    problem = "left behind " + left;
                }
                if (ms > 5000) {
                    problem = "took " + ms + " ms";
                }
                if (problem != null && findings.size() < 20) {
                    findings.add("seed " + seed + " (" + sc.verb() + ", " + victim + "): " + problem);
                }
                AtomicOutput.deleteTree(caseDir);
            }
        }, () -> "the verb fuzz did not finish; the case running was seed " + current[0]);
        StringBuilder s = new StringBuilder("cases " + cases + "\nverb exit0 exit1 exit2 unclean\n");
        tally.forEach((k, t) -> s.append(k).append(' ').append(t[0]).append(' ').append(t[1]).append(' ').append(t[2])
                .append(' ').append(t[3]).append('\n'));
        Files.createDirectories(Path.of("target"));
        Files.writeString(Path.of("target", "fuzz-verbs.txt"), s);
        assertThat(findings).as("unclean outcomes; replay with Seeds.rng(seed)").isEmpty();
    }

    static List<String> leftovers(Path root) throws IOException {
        try (Stream<Path> s = Files.walk(root)) {
            return s.map(p -> p.getFileName().toString()).filter(n -> n.contains(".obverse-")).toList();
        }
    }

    static void copyTree(Path from, Path to) throws IOException {
        try (Stream<Path> s = Files.walk(from)) {
            for (Path p : (Iterable<Path>) s::iterator) {
                Path q = to.resolve(from.relativize(p).toString());
                if (Files.isDirectory(p)) {
                    Files.createDirectories(q);
                } else {
                    Files.copy(p, q);
                }
            }
        }
    }
}
