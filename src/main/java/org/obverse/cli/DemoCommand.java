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
import java.util.TreeMap;
import java.util.concurrent.Callable;
import org.obverse.io.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.NpyVectors;
import org.obverse.io.ProblemCodec;
import org.obverse.io.ProblemFile;
import org.obverse.io.ResultsTable;
import org.obverse.io.SampleFiles;
import org.obverse.io.SampleReader;
import org.obverse.model.BinaryProblem;
import org.obverse.problems.DegreeBoundedSpanningTree;
import org.obverse.problems.WindArray;
import org.obverse.samples.SampleBlock;
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
    static final int READS_PER_GAUGE = 250;
    static final String INSTANCE = "wind-array";
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
        AtomicOutput.checkTarget(out, force);
        long start = System.nanoTime();
        AtomicOutput.writeDirectory(out, force, d -> {
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

    private void run() throws IOException {
        WindArray array = WindArray.demo();
        DegreeBoundedSpanningTree tree = array.problem();
        BinaryProblem qubo = tree.qubo();
        DegreeBoundedSpanningTree.Tree best = tree.exactBest().orElseThrow();
        Files.createDirectories(dir.resolve("inputs"));
        ProblemCodec.write(dir.resolve("inputs/logical.json"), false, ProblemFile.of(qubo, null));
        Files.writeString(dir.resolve("inputs/ground.csv"), "instance,ground_energy\n" + INSTANCE + ","
                + best.quboEnergy() + "\n");
        Files.writeString(dir.resolve("inputs/errors.json"), "{\n  \"format\": \"obverse.errors/1\",\n"
                + "  \"seed\": 20261201,\n  \"field_sigma\": 0.05,\n  \"coupling_sigma\": 0.03,\n"
                + "  \"read_field_sigma\": 0.01,\n  \"read_coupling_sigma\": 0.0\n}\n");
        headline("the problem");
        say.printf(Locale.ROOT, "  wind array: substation and %d turbines, %d candidate cables, %d cable bays each "
                + "(invented numbers; a real layout follows the electrical codes and a licensed engineer)%n",
                array.sites().size() - 1, array.cables().length, array.bays()[1]);
        say.printf(Locale.ROOT, "  degree-bounded spanning tree as a QUBO: %d variables, %d pair terms; exact best "
                + "layout %s, QUBO energy %.6f%n", qubo.size(), qubo.edgeCount(), array.describe(best.edges()),
                best.quboEnergy());

        headline("the device: 3 x 3 cells of K4,4, two qubits missing, couplings in [-2, +1]");
        verb("device", "lattice", "--rows", "3", "--cols", "3", "--shore", "4", "--remove-qubits", "5,40",
                "--field", "-2,2", "--coupling", "-2,1", "--out", p("device.json"));

        headline("embedding: chains found once, then re-embedded at each chain coupling");
        Files.createDirectories(dir.resolve("embedding"));
        String found = verb("embed", "--logical", p("inputs/logical.json"), "--device", p("device.json"),
                "--chain-coupling", "-1.6", "--seed", "3", "--out", p("embedding/found.json"),
                "--chains-out", p("chains.json"));
        echo(found, "embedded");

        List<String> settings = new ArrayList<>();
        Path results = dir.resolve("results.csv");
        try (Writer rw = Files.newBufferedWriter(results, StandardCharsets.UTF_8)) {
            ResultsTable.RowWriter rows = ResultsTable.RowWriter.start(rw, List.of("chain_coupling", "gauged"));
            for (double v : CHAIN_COUPLINGS) {
                String tag = String.format(Locale.ROOT, "V%+.1f", v);
                String vs = String.format(Locale.ROOT, "%.1f", v);
                headline("chain coupling " + vs + ": embed, gauge, sample, un-gauge, audit, decode");
                Path base = Files.createDirectories(dir.resolve(tag));
                String physical = base.resolve("physical.json").toString();
                verb("embed", "--logical", p("inputs/logical.json"), "--device", p("device.json"), "--chains",
                        p("chains.json"), "--chain-coupling", vs, "--out", physical);
                echo(verb("gauge", "--problem", physical, "--device", p("device.json"), "--lock", "range",
                        "--count", String.valueOf(GAUGES), "--design", "balanced", "--seed", "17",
                        "--out", base.resolve("gauges").toString()), "locks");
                verb("sample", "--manifest", base.resolve("gauges/manifest.json").toString(), "--reads",
                        String.valueOf(READS_PER_GAUGE), "--seed", "29", "--errors", p("inputs/errors.json"),
                        "--out", base.resolve("raw").toString());
                verb("ungauge", "--manifest", base.resolve("gauges/manifest.json").toString(), "--samples",
                        base.resolve("raw").toString(), "--out", base.resolve("source").toString());
                echo(verb("audit", "--manifest", base.resolve("gauges/manifest.json").toString(), "--samples",
                        base.resolve("raw").toString()), "audit:");
                String gauged = "V=" + vs + " gauged";
                String direct = "V=" + vs + " no gauge";
                settings.add(gauged);
                settings.add(direct);
                for (int g = 0; g < GAUGES; g++) {
                    String stem = String.format(Locale.ROOT, "g%04d", g);
                    Path decoded = base.resolve("decoded/" + stem);
                    verb("decode", "--problem", physical, "--logical", p("inputs/logical.json"), "--chains",
                            p("chains.json"), "--samples", base.resolve("source/" + stem + ".npy").toString(),
                            "--rule", "majority", "--out", decoded.toString());
                    addRows(rows, decoded, gauged, g, vs, "yes");
                }
                // The same number of reads on the problem as embedded, without any gauge.
                Files.createDirectories(base.resolve("direct"));
                verb("sample", "--problem", physical, "--reads", String.valueOf(GAUGES * READS_PER_GAUGE), "--seed",
                        "31", "--errors", p("inputs/errors.json"), "--out", base.resolve("direct/raw.npy").toString());
                verb("decode", "--problem", physical, "--logical", p("inputs/logical.json"), "--chains",
                        p("chains.json"), "--samples", base.resolve("direct/raw.npy").toString(), "--rule", "majority",
                        "--out", base.resolve("direct/decoded").toString());
                addRows(rows, base.resolve("direct/decoded"), direct, -1, vs, "no");
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
        String middle = String.format(Locale.ROOT, "V%+.1f", CHAIN_COUPLINGS[CHAIN_COUPLINGS.length / 2]);
        r1.addAll(List.of("--magnetisation", p(middle + "/source/magnetisation.csv"), "--correlations",
                p(middle + "/source/correlations.csv"), "--balanced-gauges", "--out", p("report")));
        verb(r1.toArray(new String[0]));
        say.println("  wrote report/report.html");
    }

    /** Aggregates a decoded folder into results rows: one row per distinct (energy, broken chains). */
    private static void addRows(ResultsTable.RowWriter rows, Path decoded, String setting, int gauge, String v,
                                String gauged) throws IOException {
        double[] energies = NpyVectors.readFloat64(decoded.resolve("energies.npy"), NpyVectors.ANY_LENGTH);
        int[] broken = NpyVectors.readInt32(decoded.resolve("broken.npy"), energies.length);
        Map<String, long[]> counts = new TreeMap<>();
        Map<String, double[]> keys = new TreeMap<>();
        for (int r = 0; r < energies.length; r++) {
            String k = Double.doubleToLongBits(energies[r]) + "/" + broken[r];
            counts.computeIfAbsent(k, x -> new long[1])[0]++;
            keys.putIfAbsent(k, new double[] {energies[r], broken[r]});
        }
        for (Map.Entry<String, long[]> e : counts.entrySet()) {
            double[] k = keys.get(e.getKey());
            rows.row(INSTANCE, setting, gauge, k[0], e.getValue()[0], (long) k[1], RUN_US, v, gauged);
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
        String shown = String.join(" ", args).replace(dir.toString() + "/", "").replace(dir.toString(), ".");
        log.write("$ obverse " + shown + "\n" + o + e + "\n");
        log.flush();
        if (code != Main.DONE) {
            throw new BadInputException("demo step failed (exit " + code + "): obverse " + shown + ": " + e.toString().strip());
        }
        return o.toString().replace(dir.toString() + "/", "").replace(dir.toString(), ".");
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
