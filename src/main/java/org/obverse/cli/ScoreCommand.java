package org.obverse.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import org.obverse.campaign.ScoreStep;
import org.obverse.io.AtomicOutput;
import org.obverse.io.ScoreFiles;
import org.obverse.stats.Campaign;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code obverse score}: success probability, TTS and bootstrap bands of a campaign. */
@Command(name = "score", mixinStandardHelpOptions = true,
        description = {"Scores a campaign's results table: per instance and setting the success probability "
                + "(Wilson and Clopper-Pearson intervals), TTS pooled and as the median over gauges; per setting the "
                + "median TTS over instances with hierarchical bootstrap bands; comparisons and sweeps.",
            "Writes DIR/instances.csv, DIR/settings.csv (and comparisons.csv, sweep.csv when asked); "
                + "--json prints the same as JSON. Formats: spec/results.md."})
public final class ScoreCommand implements Callable<Integer> {
    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Mixin
    ScoringOptions scoring;

    @Option(names = "--out", paramLabel = "DIR", description = "output directory")
    Path out;

    @Option(names = "--json", description = "print the scores as JSON instead of a table")
    boolean json;

    @Option(names = "--force", description = "replace an existing output directory")
    boolean force;

    @Override
    public Integer call() throws Exception {
        PrintWriter o = spec.commandLine().getOut();
        PrintWriter e = spec.commandLine().getErr();
        if (out != null) {
            AtomicOutput.checkTarget(out, force, AtomicOutput.inputs(scoring.results, scoring.ground));
        }
        ScoreStep.Result scored = scoring.score(e);
        ScoreFiles.Tables tables = ScoreFiles.tables(scored.summary(), scored.sweepName());
        String jsonText = ScoreFiles.json(scored.summary(), tables, scored.rule(), scoring.results.toString(),
                scoring.ground == null ? null : scoring.ground.toString(), scored.sweepName());
        if (out != null) {
            AtomicOutput.writeDirectory(out, force, AtomicOutput.inputs(scoring.results, scoring.ground), dir -> {
                ScoreFiles.writeCsv(dir, tables);
                java.nio.file.Files.writeString(dir.resolve("scores.json"), jsonText);
            });
        }
        if (json) {
            o.print(jsonText);
        } else {
            printTable(o, scored, tables);
        }
        o.flush();
        return Main.DONE;
    }

    private static void printTable(PrintWriter o, ScoreStep.Result scored, ScoreFiles.Tables t) {
        Campaign c = scored.summary().campaign();
        long given = 0;
        for (int i = 0; i < c.instanceCount(); i++) {
            given += c.groundGiven(i) ? 1 : 0;
        }
        var opts = scored.summary().options();
        o.printf(Locale.ROOT, "%d rows, %d instances (%s), %d settings; TTS target %s, quantile %s over instances, "
                + "%d bootstrap replicates (seed %d)%n", scored.loaded().rows(), c.instanceCount(),
                given == c.instanceCount() ? "ground energies given"
                        : given == 0 ? "ground = best energy seen" : given + " ground energies given",
                c.settingCount(), fmt(opts.target()), fmt(opts.quantile()), opts.replicates(), opts.seed());
        String bandName = pct(opts.band()) + " band";
        String outerName = pct(opts.outerBand()) + " band";
        int w = Math.max(7, c.settings().stream().mapToInt(String::length).max().orElse(7));
        o.printf(Locale.ROOT, "%-" + w + "s  %9s  %6s  %12s  %-25s  %-25s  %8s%n", "setting", "instances", "solved",
                "median TTS", bandName + " (us)", outerName + " (us)", "median p");
        for (Map<String, Object> r : t.settings()) {
            o.printf(Locale.ROOT, "%-" + w + "s  %9d  %6d  %12s  %-25s  %-25s  %8s%n", r.get("setting"),
                    (Long) r.get("instances"), (Long) r.get("solved_instances"), fmt((Double) r.get("median_tts_us")),
                    "[" + fmt((Double) r.get("band_low_us")) + ", " + fmt((Double) r.get("band_high_us")) + "]",
                    "[" + fmt((Double) r.get("band_outer_low_us")) + ", " + fmt((Double) r.get("band_outer_high_us")) + "]",
                    fmt((Double) r.get("median_p_success")));
        }
        for (Map<String, Object> r : t.comparisons()) {
            o.printf(Locale.ROOT, "%s vs %s: %d paired, %d faster, %d slower, %d tied (fraction improved %s, sign test "
                    + "p = %s); median TTS ratio %s %s [%s, %s]%n", r.get("setting_a"), r.get("setting_b"),
                    (Long) r.get("paired"), (Long) r.get("faster"), (Long) r.get("slower"), (Long) r.get("ties"),
                    fmt((Double) r.get("fraction_improved")), fmt((Double) r.get("sign_test_p")),
                    fmt((Double) r.get("median_ratio")), bandName, fmt((Double) r.get("ratio_band_low")),
                    fmt((Double) r.get("ratio_band_high")));
        }
        for (Map<String, Object> r : t.sweep()) {
            o.printf(Locale.ROOT, "sweep over %s: best %s (%s = %s), median TTS %s us, %s of the least [%s, %s] us, "
                    + "best in %s of replicates%n", r.get("parameter"), r.get("best_setting"), r.get("parameter"),
                    fmt((Double) r.get("best_value")), fmt((Double) r.get("best_tts_us")), bandName,
                    fmt((Double) r.get("band_low_us")), fmt((Double) r.get("band_high_us")),
                    fmt((Double) r.get("best_fraction")));
        }
    }

    private static String pct(double[] b) {
        return fmt(100 * b[0]) + "-" + fmt(100 * b[1]) + " %";
    }

    static String fmt(double v) {
        if (Double.isNaN(v)) {
            return "-";
        }
        if (Double.isInfinite(v)) {
            return v > 0 ? "inf" : "-inf";
        }
        if (v == Math.rint(v) && Math.abs(v) < 1e9) {
            return String.format(Locale.ROOT, "%d", (long) v);
        }
        String t = String.format(Locale.ROOT, "%.4g", v);
        if (t.contains("e") || !t.contains(".")) {
            return t;
        }
        t = t.replaceAll("0+$", "");
        return t.endsWith(".") ? t.substring(0, t.length() - 1) : t;
    }
}
