package org.obverse.campaign;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import org.obverse.io.BadInputException;
import org.obverse.io.ResultsTable;
import org.obverse.stats.Campaign;
import org.obverse.stats.CampaignSummary;
import org.obverse.stats.SuccessRule;
import org.obverse.stats.SummaryOptions;

/**
 * Scores a results table: reads it (with the ground energies when given) under a success rule,
 * resolves the compared settings and the swept parameter, and runs the campaign summary
 * (success, TTS, hierarchical bootstrap). Reads files, writes none.
 */
public final class ScoreStep {
    /** The name of the bootstrap phase as reported to {@link StepProgress}. */
    public static final String BOOTSTRAP = "bootstrap";

    private ScoreStep() {
    }

    /** How deep the bootstrap resamples: instances only, gauges and instances, or reads too. */
    public enum Depth { INSTANCES, GAUGES, READS }

    /** Setting a compared against setting b, by label. */
    public record Comparison(String a, String b) {
    }

    /**
     * What to score and how. ground and sweep may be null (no ground energies: the best energy
     * seen is used; no swept parameter). band and outerBand are {low, high} fractions.
     */
    public record Request(Path results, Path ground, double target, double confidence, double quantile,
                          double[] band, double[] outerBand, int replicates, long seed, int threads,
                          List<Comparison> compare, String sweep, double absoluteTolerance,
                          double relativeTolerance, Depth resample, StepProgress progress) {
        public Request {
            Objects.requireNonNull(results, "results");
            compare = List.copyOf(compare);
            Objects.requireNonNull(resample, "resample");
            progress = progress == null ? StepProgress.NONE : progress;
        }
    }

    /**
     * A scored campaign: the table as read, its summary, the rule that decided success, and the
     * swept parameter's name and value for each setting (both null without a sweep).
     */
    public record Result(ResultsTable.Loaded loaded, CampaignSummary summary, SuccessRule rule, String sweepName,
                         double[] sweepValueBySetting) {
    }

    /** Reads and scores the table; bad input (a file, an option, a label) is a BadInputException. */
    public static Result run(Request r) throws IOException {
        SuccessRule rule;
        try {
            rule = new SuccessRule(r.absoluteTolerance(), r.relativeTolerance());
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--abs-tol/--rel-tol: " + e.getMessage());
        }
        Map<String, Double> g = r.ground() == null ? null : ResultsTable.readGround(r.ground());
        ResultsTable.Loaded loaded = ResultsTable.read(r.results(), g, r.ground(), rule);
        Campaign c = loaded.campaign();
        List<int[]> pairs = new ArrayList<>();
        for (Comparison k : r.compare()) {
            pairs.add(new int[] {settingIndex(r.results(), c, k.a()), settingIndex(r.results(), c, k.b())});
        }
        int[] order = null;
        double[] values = null;
        double[] bySetting = null;
        if (r.sweep() != null) {
            bySetting = sweepValues(r.results(), loaded, r.sweep());
            Integer[] idx = new Integer[c.settingCount()];
            for (int s = 0; s < idx.length; s++) {
                idx[s] = s;
            }
            double[] v = bySetting;
            Arrays.sort(idx, (a, b) -> Double.compare(v[a], v[b]));
            order = Arrays.stream(idx).mapToInt(Integer::intValue).toArray();
            values = Arrays.stream(order).mapToDouble(s -> v[s]).toArray();
        }
        SummaryOptions options;
        try {
            options = new SummaryOptions(r.target(), r.confidence(), r.quantile(), r.band(), r.outerBand(), r.seed(),
                    r.replicates(), r.threads(), r.resample() != Depth.INSTANCES, r.resample() == Depth.READS, pairs,
                    order, values);
            options.plan();
        } catch (IllegalArgumentException e) {
            throw new BadInputException("options: " + e.getMessage() + " (see --help)");
        }
        long work = (long) r.replicates() * c.gaugeSlots();
        CampaignSummary summary = CampaignSummary.of(c, options,
                r.progress().start(BOOTSTRAP, r.replicates(), work));
        return new Result(loaded, summary, rule, r.sweep(), bySetting);
    }

    private static int settingIndex(Path results, Campaign c, String label) {
        int s = c.settings().indexOf(label);
        if (s < 0) {
            throw BadInputException.at(results, "", "has no setting '" + label + "' (--compare)",
                    "use one of: " + String.join(", ", c.settings()));
        }
        return s;
    }

    /** The swept parameter's value for each setting: from an extra column, else from NAME=value in the label. */
    private static double[] sweepValues(Path results, ResultsTable.Loaded loaded, String name) {
        Campaign c = loaded.campaign();
        double[] out = new double[c.settingCount()];
        Map<String, String> column = loaded.settingValues().get(name);
        for (int s = 0; s < out.length; s++) {
            String label = c.settings().get(s);
            String text;
            if (column != null) {
                text = column.get(label);
                if (text == null) {
                    throw BadInputException.at(results, "column " + name, "takes more than one value under setting '"
                            + label + "'", "a swept parameter is constant within a setting");
                }
            } else {
                text = fromLabel(label, name);
                if (text == null) {
                    throw BadInputException.at(results, "setting '" + label + "'", "names no value of " + name
                            + " (no column " + name + ", no '" + name + "=value' in the label)",
                            "add a column " + name + " or label settings like '" + name + "=20'");
                }
            }
            try {
                out[s] = Double.parseDouble(text.trim());
            } catch (NumberFormatException e) {
                throw BadInputException.at(results, "setting '" + label + "'", "value '" + text + "' of " + name
                        + " is not a number", "a swept parameter is numeric");
            }
            if (!Double.isFinite(out[s])) {
                throw BadInputException.at(results, "setting '" + label + "'", "value '" + text + "' of " + name
                        + " is not finite", "a swept parameter is a finite number");
            }
        }
        return out;
    }

    private static String fromLabel(String label, String name) {
        for (String token : label.split("[,; ]+")) {
            int eq = token.indexOf('=');
            if (eq > 0 && token.substring(0, eq).equals(name)) {
                return token.substring(eq + 1);
            }
        }
        return null;
    }
}
