package org.obverse.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import org.obverse.campaign.ScoreStep;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.table.ScoreFiles;
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

    @Mixin
    ForceOption force;

    @Override
    public Integer call() throws Exception {
        PrintWriter o = spec.commandLine().getOut();
        PrintWriter e = spec.commandLine().getErr();
        if (out != null) {
            AtomicOutput.checkTarget(out, force.on(), scoring.inputs());
        }
        ScoreStep.Result scored = scoring.score(e);
        ScoreFiles.Tables tables = ScoreFiles.tables(scored.scores());
        String jsonText = ScoreFiles.json(scored.scores(), tables);
        if (out != null) {
            AtomicOutput.writeDirectory(out, force.on(), scoring.inputs(), dir -> {
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
        o.printf(Locale.ROOT, "%d rows, %d instances (%s), %d settings; TTS target %s, %s over instances; "
                + "headline = median of %d bootstrap replicates (seed %d, resample %s)%n", scored.loaded().rows(),
                c.instanceCount(), given == c.instanceCount() ? "ground energies given"
                        : given == 0 ? "ground = best energy seen" : given + " ground energies given",
                c.settingCount(), fmt(opts.target()), opts.quantile() == 0.5 ? "median" : "quantile " + fmt(opts.quantile()),
                opts.replicates(), opts.seed(), opts.resampling().label());
        if (opts.resampling().drawsInstances() && c.instanceCount() < FEW_INSTANCES) {
            o.printf(Locale.ROOT, "note: only %d instances; an instance bootstrap of so few is coarse (its inner band may "
                    + "be one instance's value wide); --resample gauges-only shows how well these instances were "
                    + "measured%n", c.instanceCount());
        }
        String bandName = pct(opts.band()) + " band";
        String outerName = pct(opts.outerBand()) + " band";
        int w = Math.max(7, c.settings().stream().mapToInt(String::length).max().orElse(7));
        o.printf(Locale.ROOT, "%-" + w + "s  %9s  %6s  %12s  %-25s  %-25s  %8s%n", "setting", "instances", "solved",
                "TTS (us)", bandName + " (us)", outerName + " (us)", "p");
        for (Map<String, Object> r : t.settings()) {
            o.printf(Locale.ROOT, "%-" + w + "s  %9d  %6d  %12s  %-25s  %-25s  %8s%n", r.get("setting"),
                    (Long) r.get("instances"), (Long) r.get("solved_instances"), fmt((Double) r.get("tts_us")),
                    "[" + fmt((Double) r.get("tts_band_low_us")) + ", " + fmt((Double) r.get("tts_band_high_us")) + "]",
                    "[" + fmt((Double) r.get("tts_outer_low_us")) + ", " + fmt((Double) r.get("tts_outer_high_us")) + "]",
                    fmt((Double) r.get("p_success")));
        }
        for (List<Map<String, Object>> rows : List.of(t.comparisons(), t.baseline())) {
            for (Map<String, Object> r : rows) {
                o.printf(Locale.ROOT, "%s against %s: %d paired, %d faster, %d slower, %d tied (sign test p = %s); "
                        + "TTS saved %s us %s [%s, %s]; TTS ratio reference/setting %s [%s, %s]; "
                        + "fraction improved %s [%s, %s]%n", r.get("setting"), r.get("reference"),
                        (Long) r.get("paired"), (Long) r.get("setting_faster"), (Long) r.get("reference_faster"),
                        (Long) r.get("ties"), fmt((Double) r.get("sign_test_p")),
                        fmt((Double) r.get("tts_reference_minus_setting_us")), bandName,
                        fmt((Double) r.get("tts_reference_minus_setting_band_low_us")),
                        fmt((Double) r.get("tts_reference_minus_setting_band_high_us")),
                        fmt((Double) r.get("tts_ratio_reference_over_setting")),
                        fmt((Double) r.get("tts_ratio_reference_over_setting_band_low")),
                        fmt((Double) r.get("tts_ratio_reference_over_setting_band_high")),
                        fmt((Double) r.get("fraction_setting_faster")),
                        fmt((Double) r.get("fraction_setting_faster_band_low")),
                        fmt((Double) r.get("fraction_setting_faster_band_high")));
            }
        }
        for (String s : scored.withoutBaseline()) {
            o.printf(Locale.ROOT, "%s: no baseline matches it on the other setting columns%n", s);
        }
        for (Map<String, Object> r : t.sweep()) {
            o.printf(Locale.ROOT, "best over %s%s: %s (%s), least TTS %s us %s [%s, %s], best in %s of replicates%n",
                    r.get("swept"), ((String) r.get("group")).isEmpty() ? "" : " at " + r.get("group"),
                    r.get("best_setting"), r.get("best_values"), fmt((Double) r.get("least_tts_us")), bandName,
                    fmt((Double) r.get("least_tts_band_low_us")), fmt((Double) r.get("least_tts_band_high_us")),
                    fmt((Double) r.get("best_fraction")));
        }
    }

    /** Below this many instances the score notes that an instance bootstrap is coarse. */
    static final int FEW_INSTANCES = 8;

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
