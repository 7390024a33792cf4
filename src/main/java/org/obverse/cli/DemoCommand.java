package org.obverse.cli;

import java.io.IOException;
import java.io.InputStream;
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
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.model.BinaryProblem;
import org.obverse.problems.DegreeBoundedSpanningTree;
import org.obverse.problems.WindArray;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/**
 * {@code obverse demo}: the whole job on built-in data. The wind-array campaign plan that ships
 * in {@code examples/wind-array} (and inside the jar) is run with {@code campaign run}, then
 * scored and reported, each as the same command a user types, in this process; every command
 * is logged with its output in {@code DIR/log.txt}, ready to paste.
 */
@Command(name = "demo", mixinStandardHelpOptions = true,
        description = {"Runs the whole job on built-in data: a small offshore wind array's cable tree (invented "
                + "numbers) as a degree-bounded spanning-tree QUBO for three turbine layouts, embedded on a grid of K4,4 "
                + "cells with missing qubits, gauged range-aware (chains in the extended negative range), sampled by the "
                + "reference sampler with control errors, un-gauged, audited, decoded and scored against the exact ground "
                + "state, over three chain couplings x (a pause grid of two locations x two durations + the no-pause "
                + "baseline), with and without gauges: one campaign plan (examples/wind-array/plan.json).",
            "Every intermediate file, the scores and an HTML report go to DIR; DIR/log.txt lists each command run."})
public final class DemoCommand implements Callable<Integer> {
    /** Where the plan and its files sit inside the jar (copied from examples/wind-array by the build). */
    static final String PLAN_RESOURCES = "/org/obverse/demo/wind-array/";
    static final String[] PLAN_FILES = {"plan.json", "layout-a.json", "layout-b.json", "layout-c.json", "device.json",
        "errors.json"};

    @Spec
    CommandSpec spec;

    @Option(names = "--out", defaultValue = "obverse-demo", paramLabel = "DIR",
            description = "output folder (default: ${DEFAULT-VALUE}; must not exist)")
    Path out;

    @Mixin
    ForceOption force;

    private PrintWriter say;
    private Writer log;
    private Path dir;
    private int step;
    private static final int STEPS = 4;

    @Override
    public Integer call() throws Exception {
        say = spec.commandLine().getOut();
        AtomicOutput.checkTarget(out, force.on(), List.of());
        long start = System.nanoTime();
        AtomicOutput.writeDirectory(out, force.on(), List.of(), d -> {
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
        Path planDir = Files.createDirectories(dir.resolve("plan"));
        for (String f : PLAN_FILES) {
            try (InputStream in = DemoCommand.class.getResourceAsStream(PLAN_RESOURCES + f)) {
                if (in == null) {
                    throw new IOException("the demo's plan file " + f + " is missing from the jar; rebuild it");
                }
                Files.copy(in, planDir.resolve(f));
            }
        }
        headline("the problem: " + instances().size() + " layouts of a small wind array's cable tree");
        for (Map.Entry<String, WindArray> inst : instances()) {
            WindArray array = inst.getValue();
            DegreeBoundedSpanningTree tree = array.problem();
            BinaryProblem qubo = tree.qubo();
            DegreeBoundedSpanningTree.Tree best = tree.exactBest().orElseThrow();
            say.printf(Locale.ROOT, "  %s: %d variables, %d pair terms; best cable tree %s, by enumerating spanning "
                    + "trees%n", inst.getKey(), qubo.size(), qubo.edgeCount(), array.describe(best.edges()));
        }
        WindArray first = instances().get(0).getValue();
        say.printf(Locale.ROOT, "  (substation and %d turbines, %d candidate cables, %d cable bays each, as a "
                + "degree-bounded spanning-tree QUBO; invented numbers: a real cable layout follows the electrical "
                + "codes and a licensed engineer)%n", first.sites().size() - 1, first.cables().length, first.bays()[1]);

        headline("the campaign: plan/plan.json (the same as examples/wind-array/plan.json)");
        String ran = verb("campaign", "run", "plan/plan.json", "--out", "campaign", "--quiet");
        say.print(indent(ran));

        headline("scores: success probability, time-to-solution, bootstrap bands, each pause against no pause");
        // Three layouts are too few to resample instances: the bands come from the gauges and their reads.
        List<String> score = new ArrayList<>(List.of("campaign", "--baseline", "pause_s=", "--sweep", "chain_coupling",
                "--replicates", "500", "--seed", "5", "--resample", "gauges-only", "--quiet"));
        List<String> s1 = new ArrayList<>(score);
        s1.add(0, "score");
        s1.addAll(List.of("--out", "scores"));
        say.print(indent(verb(s1.toArray(new String[0]))));

        headline("report: plots and tables in one HTML page");
        List<String> r1 = new ArrayList<>(score);
        r1.add(0, "report");
        r1.addAll(List.of("--out", "report"));
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

    private void headline(String what) {
        step++;
        say.printf(Locale.ROOT, "[%d/%d] %s%n", step, STEPS, what);
        say.flush();
    }

    /**
     * Runs one verb in-process with paths relative to the demo folder, logs the command (as a
     * user would type it inside that folder) and its output, and fails the demo where it fails.
     */
    private String verb(String... args) throws IOException {
        String[] absolute = new String[args.length];
        for (int k = 0; k < args.length; k++) {
            boolean path = k > 0 && (args[k - 1].equals("--out") || args[k - 1].equals("--results")
                    || args[k - 1].equals("--ground") || args[k].startsWith("plan/") || args[k].equals("campaign"));
            absolute[k] = path ? dir.resolve(args[k]).toString() : args[k];
        }
        StringWriter o = new StringWriter();
        StringWriter e = new StringWriter();
        int code = Main.run(absolute, new PrintWriter(o, true), new PrintWriter(e, true));
        StringBuilder shown = new StringBuilder("obverse");
        for (String a : args) {
            shown.append(' ').append(a.matches("[A-Za-z0-9_./=,:+-]+") ? a : "'" + a + "'");
        }
        log.write("$ " + shown + "\n" + relative(o.toString()) + relative(e.toString()) + "\n");
        log.flush();
        if (code != Main.DONE) {
            throw new BadInputException("demo step failed (exit " + code + "): " + shown + ": " + e.toString().strip());
        }
        return relative(o.toString());
    }

    /** Text with the working folder's paths shown relative to it. */
    private String relative(String text) {
        return text.replace(dir.toString() + "/", "").replace(dir.toString(), ".");
    }

    private static String indent(String text) {
        StringBuilder s = new StringBuilder();
        text.lines().forEach(l -> s.append("  ").append(l).append('\n'));
        return s.toString();
    }
}
