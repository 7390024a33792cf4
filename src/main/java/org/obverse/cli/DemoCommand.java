package org.obverse.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import org.obverse.io.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.ProblemCodec;
import org.obverse.io.ProblemFile;
import org.obverse.model.BinaryProblem;
import org.obverse.problems.DegreeBoundedSpanningTree;
import org.obverse.problems.WindArray;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/**
 * {@code obverse demo}: the whole job on built-in data, as a sequence of the same verbs a user
 * types, each logged with its output in {@code DIR/log.txt}.
 */
@Command(name = "demo", mixinStandardHelpOptions = true,
        description = {"Runs the whole job on built-in data: a small offshore wind array's cable tree (invented "
                + "numbers) as a degree-bounded spanning-tree QUBO, embedded on a grid of K4,4 cells with missing "
                + "qubits, gauged range-aware (chains in the extended negative range), sampled by the reference "
                + "sampler with control errors, un-gauged, audited, decoded and scored against the exact ground state, "
                + "for a sweep of chain couplings, with and without gauges.",
            "Every intermediate file, the scores and an HTML report go to DIR; DIR/log.txt lists each command run."})
public final class DemoCommand implements Callable<Integer> {
    /** Chain couplings swept: all in the extended negative range of [-2, +1], so the chains are locked. */
    static final double[] CHAIN_COUPLINGS = {-1.2, -1.6, -2.0};
    static final int GAUGES = 8;
    static final int READS_PER_GAUGE = 100;
    static final double RUN_US = 1.0;

    @Spec
    CommandSpec spec;

    @Option(names = "--out", defaultValue = "obverse-demo", paramLabel = "DIR",
            description = "output folder (default: ${DEFAULT-VALUE}; must not exist)")
    Path out;

    @Option(names = "--force", description = "replace an existing output folder")
    boolean force;

    private PrintWriter say;
    private Writer log;
    private Path dir;
    private int step;
    private static final int STEPS = 5 + CHAIN_COUPLINGS.length;

    @Override
    public Integer call() throws Exception {
        say = spec.commandLine().getOut();
        AtomicOutput.checkTarget(out, force, List.of());
        long start = System.nanoTime();
        AtomicOutput.writeDirectory(out, force, List.of(), d -> {
            dir = d;
            try (Writer l = Files.newBufferedWriter(d.resolve("log.txt"), StandardCharsets.UTF_8)) {
                log = l;
                run();
            }
        });
        say.printf(Locale.ROOT, "done in %.1f s; everything is in %s (log.txt lists every command; open %s)%n",
                (System.nanoTime() - start) / 1e9, out, out.resolve("report/report.html"));
        return Main.DONE;
    }

    /** The demo's instances: one cable graph, three invented turbine layouts (so one set of chains serves all). */
    static List<Map.Entry<String, WindArray>> instances() {
        WindArray a = WindArray.demo();
        WindArray b = new WindArray(a.sites(), new double[] {0.0, 1.1, 0.8, 1.9}, new double[] {0.0, 0.4, -0.7, -0.2},
                a.cables(), a.bays(), a.maxString());
        WindArray c = new WindArray(a.sites(), new double[] {0.0, 0.9, 1.0, 2.1}, new double[] {0.0, 0.2, -0.9, 0.3},
                a.cables(), a.bays(), a.maxString());
        return List.of(Map.entry("layout-a", a), Map.entry("layout-b", b), Map.entry("layout-c", c));
    }

    private void run() throws IOException {
        Files.createDirectories(dir.resolve("inputs"));
        StringBuilder ground = new StringBuilder("instance,ground_energy\n");
        headline("the problem: " + instances().size() + " layouts of a small wind array's cable tree");
        for (Map.Entry<String, WindArray> inst : instances()) {
            WindArray array = inst.getValue();
            DegreeBoundedSpanningTree tree = array.problem();
            BinaryProblem qubo = tree.qubo();
            DegreeBoundedSpanningTree.Tree best = tree.exactBest().orElseThrow();
            ProblemCodec.write(dir.resolve("inputs/" + inst.getKey() + ".json"), false, ProblemFile.of(qubo, null));
            ground.append(inst.getKey()).append(',').append(best.quboEnergy()).append('\n');
            say.printf(Locale.ROOT, "  %s: %d variables, %d pair terms; exact best layout %s, QUBO energy %.6f%n",
                    inst.getKey(), qubo.size(), qubo.edgeCount(), array.describe(best.edges()), best.quboEnergy());
        }
        WindArray first = instances().get(0).getValue();
        say.printf(Locale.ROOT, "  (substation and %d turbines, %d candidate cables, %d cable bays each, as a "
                + "degree-bounded spanning-tree QUBO; invented numbers: a real cable layout follows the electrical "
                + "codes and a licensed engineer)%n", first.sites().size() - 1, first.cables().length, first.bays()[1]);
        Files.writeString(dir.resolve("inputs/ground.csv"), ground);
        Files.writeString(dir.resolve("inputs/errors.json"), "{\n  \"format\": \"obverse.errors/1\",\n"
                + "  \"seed\": 20261201,\n  \"field_sigma\": 0.05,\n  \"coupling_sigma\": 0.03,\n"
                + "  \"read_field_sigma\": 0.01,\n  \"read_coupling_sigma\": 0.0\n}\n");

        headline("the device: 3 x 3 cells of K4,4, two qubits missing, couplings in [-2, +1]");
        verb("device", "lattice", "--rows", "3", "--cols", "3", "--shore", "4", "--remove-qubits", "5,40",
                "--field", "-2,2", "--coupling", "-2,1", "--out", p("device.json"));

        headline("embedding: chains found once (the layouts share one QUBO structure), re-embedded at each coupling");
        Files.createDirectories(dir.resolve("embedding"));
        String found = verb("embed", "--logical", p("inputs/layout-a.json"), "--device", p("device.json"),
                "--chain-coupling", "-1.6", "--seed", "3", "--out", p("embedding/found.json"),
                "--chains-out", p("chains.json"));
        echo(found, "embedded");

        Path results = dir.resolve("results.csv");
        try (Writer rows = Files.newBufferedWriter(results, StandardCharsets.UTF_8)) {
            rows.write("instance,setting,gauge,energy,count,broken,run_us,chain_coupling,gauged\n");
            for (double v : CHAIN_COUPLINGS) {
                String vs = String.format(Locale.ROOT, "%.1f", v);
                headline("chain coupling " + vs + ": embed, gauge, sample, un-gauge, audit, decode");
                String gauged = "V=" + vs + " gauged";
                String direct = "V=" + vs + " no gauge";
                boolean firstInstance = true;
                for (Map.Entry<String, WindArray> inst : instances()) {
                    String name = inst.getKey();
                    String logical = p("inputs/" + name + ".json");
                    Path base = Files.createDirectories(dir.resolve(String.format(Locale.ROOT, "V%+.1f", v)).resolve(name));
                    String physical = base.resolve("physical.json").toString();
                    verb("embed", "--logical", logical, "--device", p("device.json"), "--chains", p("chains.json"),
                            "--chain-coupling", vs, "--out", physical);
                    String locks = verb("gauge", "--problem", physical, "--device", p("device.json"), "--lock", "range",
                            "--count", String.valueOf(GAUGES), "--design", "balanced", "--seed", "17",
                            "--out", base.resolve("gauges").toString());
                    if (firstInstance) {
                        echo(locks, "locks");
                        firstInstance = false;
                    }
                    verb("sample", "--manifest", base.resolve("gauges/manifest.json").toString(), "--reads",
                            String.valueOf(READS_PER_GAUGE), "--seed", "29", "--errors", p("inputs/errors.json"),
                            "--out", base.resolve("raw").toString());
                    verb("ungauge", "--manifest", base.resolve("gauges/manifest.json").toString(), "--samples",
                            base.resolve("raw").toString(), "--out", base.resolve("source").toString());
                    String audit = verb("audit", "--manifest", base.resolve("gauges/manifest.json").toString(),
                            "--samples", base.resolve("raw").toString());
                    audit.lines().filter(l -> l.startsWith("audit:")).forEach(l -> say.println("  " + name + " " + l));
                    for (int g = 0; g < GAUGES; g++) {
                        String stem = String.format(Locale.ROOT, "g%04d", g);
                        Path decoded = base.resolve("decoded/" + stem);
                        verb("decode", "--problem", physical, "--logical", logical, "--chains", p("chains.json"),
                                "--samples", base.resolve("source/" + stem + ".npy").toString(), "--rule", "majority",
                                "--out", decoded.toString(), "--instance", name, "--setting", gauged, "--gauge",
                                String.valueOf(g), "--run-us", String.valueOf(RUN_US), "--column", "chain_coupling=" + vs,
                                "--column", "gauged=yes");
                        appendRows(rows, decoded.resolve("results.csv"));
                    }
                    // The same number of reads on the problem as embedded, without any gauge.
                    Files.createDirectories(base.resolve("direct"));
                    verb("sample", "--problem", physical, "--reads", String.valueOf(GAUGES * READS_PER_GAUGE),
                            "--seed", "31", "--errors", p("inputs/errors.json"), "--out",
                            base.resolve("direct/raw.npy").toString());
                    verb("decode", "--problem", physical, "--logical", logical, "--chains", p("chains.json"),
                            "--samples", base.resolve("direct/raw.npy").toString(), "--rule", "majority",
                            "--out", base.resolve("direct/decoded").toString(), "--instance", name, "--setting", direct,
                            "--run-us", String.valueOf(RUN_US), "--column", "chain_coupling=" + vs,
                            "--column", "gauged=no");
                    appendRows(rows, base.resolve("direct/decoded/results.csv"));
                }
            }
        }

        headline("scores: success probability, time-to-solution, bootstrap bands");
        List<String> score = new ArrayList<>(List.of("--results", p("results.csv"), "--ground", p("inputs/ground.csv"),
                "--sweep", "chain_coupling", "--replicates", "500", "--seed", "5", "--quiet"));
        for (double v : CHAIN_COUPLINGS) {
            String vs = String.format(Locale.ROOT, "%.1f", v);
            score.addAll(List.of("--compare", "V=" + vs + " gauged", "V=" + vs + " no gauge"));
        }
        List<String> s1 = new ArrayList<>(score);
        s1.add(0, "score");
        s1.addAll(List.of("--out", p("scores")));
        say.print(indent(verb(s1.toArray(new String[0]))));
        headline("report: plots and tables in one HTML page");
        List<String> r1 = new ArrayList<>(score);
        r1.add(0, "report");
        // The bias map: device-frame moments tallied by ungauge at the middle chain coupling.
        String middle = String.format(Locale.ROOT, "V%+.1f", CHAIN_COUPLINGS[CHAIN_COUPLINGS.length / 2]) + "/layout-a";
        r1.addAll(List.of("--magnetisation", p(middle + "/source/magnetisation.csv"), "--correlations",
                p(middle + "/source/correlations.csv"), "--balanced-gauges", "--series", "gauged", "--out", p("report")));
        verb(r1.toArray(new String[0]));
        // The steps ran in a temporary folder that is renamed at the end: name the final one instead.
        String finalDir = out.toAbsolutePath().normalize().toString();
        for (String f : new String[] {"report/report.html", "report/scores.json", "scores/scores.json"}) {
            Path file = dir.resolve(f);
            if (Files.exists(file)) {
                Files.writeString(file, Files.readString(file).replace(dir.toString(), finalDir));
            }
        }
        say.println("  wrote report/report.html");
    }

    /** Appends the rows of one decoded results table (its header is the campaign's) to the campaign's. */
    private static void appendRows(Writer rows, Path table) throws IOException {
        List<String> lines = Files.readAllLines(table, StandardCharsets.UTF_8);
        for (String line : lines.subList(1, lines.size())) {
            rows.write(line + "\n");
        }
    }

    private void headline(String what) {
        step++;
        say.printf(Locale.ROOT, "[%d/%d] %s%n", step, STEPS, what);
        say.flush();
    }

    /** Runs one verb in-process, logs the command and its output, and fails the demo where it fails. */
    private String verb(String... args) throws IOException {
        StringWriter o = new StringWriter();
        StringWriter e = new StringWriter();
        int code = Main.run(args, new PrintWriter(o, true), new PrintWriter(e, true));
        String shown = relative(String.join(" ", args));
        log.write("$ obverse " + shown + "\n" + relative(o.toString()) + relative(e.toString()) + "\n");
        log.flush();
        if (code != Main.DONE) {
            throw new BadInputException("demo step failed (exit " + code + "): obverse " + shown + ": " + e.toString().strip());
        }
        return relative(o.toString());
    }

    /** Text with the working folder's paths shown relative to it. */
    private String relative(String text) {
        return text.replace(dir.toString() + "/", "").replace(dir.toString(), ".");
    }

    private void echo(String output, String startsWith) {
        output.lines().filter(l -> l.startsWith(startsWith)).forEach(l -> say.println("  " + l));
    }

    private static String indent(String text) {
        StringBuilder s = new StringBuilder();
        text.lines().forEach(l -> s.append("  ").append(l).append('\n'));
        return s.toString();
    }

    private String p(String relative) {
        return dir.resolve(relative).toString();
    }
}
