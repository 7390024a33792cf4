package org.obverse.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import org.obverse.io.BadInputException;
import org.obverse.io.ResultsTable;
import org.obverse.stats.Campaign;
import org.obverse.stats.CampaignSummary;
import org.obverse.stats.SuccessRule;
import org.obverse.stats.SummaryOptions;
import picocli.CommandLine.Option;

/** The options shared by {@code score} and {@code report}: what to read and how to score it. */
final class ScoringOptions {
    @Option(names = "--results", required = true, paramLabel = "R", description = "results table (CSV, spec/results.md)")
    Path results;

    @Option(names = "--ground", paramLabel = "G",
            description = "ground energies (CSV instance,ground_energy); without it the best energy seen is used and marked best_seen")
    Path ground;

    @Option(names = "--target", defaultValue = "0.99", description = "TTS target probability (default ${DEFAULT-VALUE})")
    double target;

    @Option(names = "--confidence", defaultValue = "0.95",
            description = "confidence of the binomial intervals (default ${DEFAULT-VALUE})")
    double confidence;

    @Option(names = "--quantile", defaultValue = "0.5",
            description = "quantile over instances that is reported and bootstrapped (default ${DEFAULT-VALUE}, the median)")
    double quantile;

    @Option(names = "--band", split = ",", defaultValue = "0.35,0.65", paramLabel = "LO,HI",
            description = "inner bootstrap band as fractions (default ${DEFAULT-VALUE})")
    double[] band;

    @Option(names = "--outer-band", split = ",", defaultValue = "0.05,0.95", paramLabel = "LO,HI",
            description = "outer bootstrap band as fractions (default ${DEFAULT-VALUE})")
    double[] outerBand;

    @Option(names = "--replicates", defaultValue = "1000", description = "bootstrap replicates (default ${DEFAULT-VALUE})")
    int replicates;

    @Option(names = "--seed", defaultValue = "1", description = "bootstrap seed (default ${DEFAULT-VALUE})")
    long seed;

    @Option(names = "--threads", defaultValue = "2", description = "worker threads; results do not depend on it (default ${DEFAULT-VALUE})")
    int threads;

    @Option(names = "--compare", arity = "2", paramLabel = "SETTING",
            description = "compare setting A against setting B instance by instance (repeatable: --compare A B)")
    List<String> compare = new ArrayList<>();

    @Option(names = "--sweep", paramLabel = "NAME",
            description = "swept parameter: an extra numeric column of the results table, or NAME=value in the setting labels")
    String sweep;

    @Option(names = "--abs-tol", defaultValue = "1e-9", description = "absolute success tolerance (default ${DEFAULT-VALUE})")
    double absoluteTolerance;

    @Option(names = "--rel-tol", defaultValue = "1e-9", description = "relative success tolerance (default ${DEFAULT-VALUE})")
    double relativeTolerance;

    /** How deep the bootstrap resamples. */
    enum Depth { instances, gauges, reads }

    @Option(names = "--resample", defaultValue = "reads",
            description = "deepest level the bootstrap resamples: instances, gauges (and instances) or reads "
                    + "(and gauges and instances; the default)")
    Depth resample;

    @Option(names = "--quiet", description = "no progress lines")
    boolean quiet;

    /** A scored campaign. */
    record Scored(ResultsTable.Loaded loaded, CampaignSummary summary, SuccessRule rule, String sweepName,
            double[] sweepValueBySetting) {
    }

    Scored score(PrintWriter err) throws IOException {
        SuccessRule rule;
        try {
            rule = new SuccessRule(absoluteTolerance, relativeTolerance);
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--abs-tol/--rel-tol: " + e.getMessage());
        }
        Map<String, Double> g = ground == null ? null : ResultsTable.readGround(ground);
        ResultsTable.Loaded loaded = ResultsTable.read(results, g, ground, rule);
        Campaign c = loaded.campaign();
        List<int[]> pairs = new ArrayList<>();
        for (int k = 0; k + 1 < compare.size(); k += 2) {
            pairs.add(new int[] {settingIndex(c, compare.get(k)), settingIndex(c, compare.get(k + 1))});
        }
        int[] order = null;
        double[] values = null;
        double[] bySetting = null;
        if (sweep != null) {
            bySetting = sweepValues(loaded, sweep);
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
            options = new SummaryOptions(target, confidence, quantile, band, outerBand, seed, replicates, threads,
                    resample != Depth.instances, resample == Depth.reads, pairs, order, values);
            options.plan();
        } catch (IllegalArgumentException e) {
            throw new BadInputException("options: " + e.getMessage() + " (see --help)");
        }
        long work = (long) replicates * c.gaugeSlots();
        Progress progress = Progress.of(err, "bootstrap", replicates, work, quiet);
        CampaignSummary summary = CampaignSummary.of(c, options, progress);
        return new Scored(loaded, summary, rule, sweep, bySetting);
    }

    private int settingIndex(Campaign c, String label) {
        int s = c.settings().indexOf(label);
        if (s < 0) {
            throw BadInputException.at(results, "", "has no setting '" + label + "' (--compare)",
                    "use one of: " + String.join(", ", c.settings()));
        }
        return s;
    }

    private double[] sweepValues(ResultsTable.Loaded loaded, String name) {
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
