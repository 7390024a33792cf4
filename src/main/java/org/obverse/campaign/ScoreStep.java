package org.obverse.campaign;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import org.obverse.io.BadInputException;
import org.obverse.io.table.GroundTable;
import org.obverse.io.table.ResultsTable;
import org.obverse.io.table.ScoreFiles;
import org.obverse.stats.Campaign;
import org.obverse.stats.CampaignSummary;
import org.obverse.stats.Resampling;
import org.obverse.stats.SuccessRule;
import org.obverse.stats.SummaryOptions;

/**
 * Scores one or more results tables (or a campaign folder holding {@code results.csv} and
 * {@code ground.csv}): reads them under a success rule, resolves compared settings, the
 * baseline pairs and the sweep groups from the setting columns, and runs the campaign summary
 * (success, TTS, bootstrap). Reads files, writes none.
 */
public final class ScoreStep {
    /** The name of the bootstrap phase as reported to {@link StepProgress}. */
    public static final String BOOTSTRAP = "bootstrap";
    /** A campaign folder's results table. */
    public static final String RESULTS_FILE = "results.csv";
    /** A campaign folder's ground energies. */
    public static final String GROUND_FILE = "ground.csv";

    private ScoreStep() {
    }

    /** A setting compared against a reference setting, by label. */
    public record Comparison(String setting, String reference) {
    }

    /**
     * What to score and how. results holds results tables or campaign folders (a folder gives
     * its results.csv, and its ground.csv when ground is null). ground, baseline may be null;
     * baseline is "COLUMN=VALUE" (an empty value: rows where the column is empty); sweep lists
     * the swept columns (empty: no sweep). band and outerBand are {low, high} fractions.
     */
    public record Request(List<Path> results, Path ground, double target, double confidence, double quantile,
                          double[] band, double[] outerBand, int replicates, long seed, int threads,
                          List<Comparison> compare, String baseline, List<String> sweep, double absoluteTolerance,
                          double relativeTolerance, Resampling resample, StepProgress progress) {
        public Request {
            results = List.copyOf(results);
            if (results.isEmpty()) {
                throw new IllegalArgumentException("no results table");
            }
            compare = List.copyOf(compare);
            sweep = List.copyOf(sweep);
            Objects.requireNonNull(resample, "resample");
            progress = progress == null ? StepProgress.NONE : progress;
        }
    }

    /** One sweep group: the fixed values that define it, and its settings. */
    public record SweepGroup(String fixed, int[] settings) {
    }

    /**
     * A scored campaign: the tables as read (resolved file names), their summary, the rule that
     * decided success, the setting columns (per setting, column → value), the swept columns with
     * the first one's numeric value per setting (NaN where empty; null without a sweep), the
     * sweep groups, how many of the summary's comparisons came from --compare (the rest are
     * baseline pairs), the baseline ("COLUMN=VALUE" or null) and the settings without a matching
     * baseline.
     */
    public record Result(ResultsTable.Loaded loaded, CampaignSummary summary, SuccessRule rule, List<Path> results,
                         Path ground, List<Map<String, String>> settingColumns, List<String> sweep,
                         double[] sweepValueBySetting, List<SweepGroup> sweepGroups, int compareCount,
                         String baseline, List<String> withoutBaseline) {
        /** The first swept column, or null. */
        public String sweepName() {
            return sweep.isEmpty() ? null : sweep.get(0);
        }

        /** What the score files need. */
        public ScoreFiles.Scored scores() {
            return new ScoreFiles.Scored(summary, rule, results, ground, settingColumns, sweep, sweepValueBySetting,
                    sweepGroups.stream().map(SweepGroup::fixed).toList(), compareCount, baseline, withoutBaseline);
        }
    }

    /** Reads and scores the tables; bad input (a file, an option, a label) is a BadInputException. */
    public static Result run(Request r) throws IOException {
        SuccessRule rule;
        try {
            rule = new SuccessRule(r.absoluteTolerance(), r.relativeTolerance());
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--abs-tol/--rel-tol: " + e.getMessage());
        }
        List<Path> files = new ArrayList<>();
        Path groundFile = r.ground();
        List<Path> folderGround = new ArrayList<>();
        for (Path p : r.results()) {
            if (Files.isDirectory(p)) {
                Path table = p.resolve(RESULTS_FILE);
                if (!Files.isRegularFile(table)) {
                    throw BadInputException.at(p, "", "is a folder without " + RESULTS_FILE,
                            "give a campaign folder that has been collected, or a results table");
                }
                files.add(table);
                if (Files.isRegularFile(p.resolve(GROUND_FILE))) {
                    folderGround.add(p.resolve(GROUND_FILE));
                }
            } else {
                files.add(p);
            }
        }
        if (groundFile == null && folderGround.size() == 1) {
            groundFile = folderGround.get(0);
        } else if (groundFile == null && folderGround.size() > 1) {
            throw BadInputException.at(folderGround.get(1), "", "is one of several campaign ground-energy files",
                    "name the ground energies to use with --ground");
        }
        GroundTable.Energies g = groundFile == null ? null : GroundTable.readEnergies(groundFile);
        ResultsTable.Loaded loaded = ResultsTable.read(files, g, rule);
        Campaign c = loaded.campaign();
        Path where = files.get(0);
        Set<String> requested = new LinkedHashSet<>(r.sweep());
        if (r.baseline() != null && r.baseline().indexOf('=') > 0) {
            requested.add(r.baseline().substring(0, r.baseline().indexOf('=')).trim());
        }
        List<Map<String, String>> columns = settingColumns(loaded, requested);
        List<int[]> pairs = new ArrayList<>();
        for (Comparison k : r.compare()) {
            pairs.add(new int[] {settingIndex(where, c, k.setting()), settingIndex(where, c, k.reference())});
        }
        int compareCount = pairs.size();
        List<String> without = new ArrayList<>();
        if (r.baseline() != null) {
            baselinePairs(where, c, columns, r.baseline(), pairs, without);
        }
        List<SweepGroup> groups = new ArrayList<>();
        double[] bySetting = null;
        if (!r.sweep().isEmpty()) {
            for (String name : r.sweep()) {
                for (int s = 0; s < c.settingCount(); s++) {
                    if (!columns.get(s).containsKey(name)) {
                        throw BadInputException.at(where, "setting '" + c.settings().get(s) + "'", "names no value of "
                                + name + " (no column " + name + " constant within the setting, no '" + name
                                + "=value' in the label)", "add a column " + name + " or label settings like '"
                                + name + "=20'");
                    }
                }
            }
            bySetting = numericValues(c, columns, r.sweep().get(0));
            groups = sweepGroups(c, columns, r.sweep(), bySetting);
        }
        SummaryOptions options;
        try {
            options = new SummaryOptions(r.target(), r.confidence(), r.quantile(), r.band(), r.outerBand(), r.seed(),
                    r.replicates(), r.threads(), r.resample(), pairs,
                    groups.stream().map(SweepGroup::settings).toList());
            options.plan();
        } catch (IllegalArgumentException e) {
            throw new BadInputException("options: " + e.getMessage() + " (see --help)");
        }
        long work = (long) r.replicates() * c.gaugeSlots();
        CampaignSummary summary = CampaignSummary.of(c, options,
                r.progress().start(BOOTSTRAP, r.replicates(), work));
        return new Result(loaded, summary, rule, List.copyOf(files), groundFile, columns, r.sweep(), bySetting,
                groups, compareCount, r.baseline(), without);
    }

    /**
     * Per setting, the columns that describe it: every extra column of the table that is
     * constant within every setting; a requested name that is no such column is taken from the
     * NAME=value tokens of the label (tokens separated by spaces, commas or semicolons).
     */
    static List<Map<String, String>> settingColumns(ResultsTable.Loaded loaded, Set<String> requested) {
        Campaign c = loaded.campaign();
        List<Map<String, String>> out = new ArrayList<>();
        for (String label : c.settings()) {
            Map<String, String> m = new LinkedHashMap<>();
            for (Map.Entry<String, Map<String, String>> e : loaded.settingValues().entrySet()) {
                // A setting column is constant within every setting.
                if (c.settings().stream().allMatch(l -> e.getValue().get(l) != null)) {
                    m.put(e.getKey(), e.getValue().get(label).trim());
                }
            }
            for (String token : label.split("[,; ]+")) {
                int eq = token.indexOf('=');
                if (eq > 0 && requested.contains(token.substring(0, eq)) && !m.containsKey(token.substring(0, eq))) {
                    m.putIfAbsent(token.substring(0, eq), token.substring(eq + 1).trim());
                }
            }
            out.add(m);
        }
        return out;
    }

    /** Pairs every non-baseline setting with the baseline that agrees with it on every other setting column the baseline fills. */
    private static void baselinePairs(Path where, Campaign c, List<Map<String, String>> columns, String spec,
            List<int[]> pairs, List<String> without) {
        int eq = spec.indexOf('=');
        if (eq <= 0) {
            throw new BadInputException("--baseline '" + spec + "' is not COLUMN=VALUE; write e.g. pause_s= for the "
                    + "rows with an empty pause_s");
        }
        String key = spec.substring(0, eq).trim();
        String value = spec.substring(eq + 1).trim();
        List<Integer> base = new ArrayList<>();
        boolean known = false;
        for (int s = 0; s < c.settingCount(); s++) {
            known |= columns.get(s).containsKey(key);
            if (value.equals(columns.get(s).getOrDefault(key, ""))) {
                base.add(s);
            }
        }
        if (!known) {
            throw BadInputException.at(where, "", "has no setting column " + key + " (--baseline)",
                    "name a column that is constant within each setting");
        }
        if (base.isEmpty()) {
            throw BadInputException.at(where, "column " + key, "has no setting with value '" + value + "' (--baseline)",
                    "name the baseline's value, e.g. " + key + "= for the empty one");
        }
        Set<String> names = new LinkedHashSet<>();
        columns.forEach(m -> names.addAll(m.keySet()));
        names.remove(key);
        // A column whose baseline values and other values have nothing in common (a schedule's name)
        // describes the treatment, as the baseline column does: it is not matched.
        names.removeIf(n -> {
            Set<String> inBase = new java.util.HashSet<>();
            Set<String> inOthers = new java.util.HashSet<>();
            for (int s = 0; s < c.settingCount(); s++) {
                (base.contains(s) ? inBase : inOthers).add(columns.get(s).getOrDefault(n, ""));
            }
            inBase.retainAll(inOthers);
            return inBase.isEmpty();
        });
        for (int s = 0; s < c.settingCount(); s++) {
            if (base.contains(s)) {
                continue;
            }
            int match = -1;
            for (int b : base) {
                boolean same = true;
                for (String n : names) {
                    // A column the baseline leaves empty (pause_us of a no-pause run) describes the treatment.
                    String bv = columns.get(b).getOrDefault(n, "");
                    same &= bv.isEmpty() || columns.get(s).getOrDefault(n, "").equals(bv);
                }
                if (same) {
                    if (match >= 0) {
                        throw BadInputException.at(where, "setting '" + c.settings().get(s) + "'", "matches two baselines, '"
                                + c.settings().get(match) + "' and '" + c.settings().get(b) + "' (--baseline " + spec + ")",
                                "add a column that tells the baselines apart");
                    }
                    match = b;
                }
            }
            if (match < 0) {
                without.add(c.settings().get(s));
            } else {
                pairs.add(new int[] {s, match});
            }
        }
    }

    /** The swept column's numeric value per setting; NaN where empty or not a finite number. */
    private static double[] numericValues(Campaign c, List<Map<String, String>> columns, String name) {
        double[] out = new double[c.settingCount()];
        for (int s = 0; s < out.length; s++) {
            try {
                out[s] = Double.parseDouble(columns.get(s).get(name));
            } catch (NumberFormatException e) {
                out[s] = Double.NaN;
            }
            if (!Double.isFinite(out[s])) {
                out[s] = Double.NaN;
            }
        }
        return out;
    }

    /**
     * Settings grouped by the values of the setting columns that are not swept, that vary
     * between settings and that the swept values do not determine; each group's settings in
     * ascending first swept value (empty first).
     */
    private static List<SweepGroup> sweepGroups(Campaign c, List<Map<String, String>> columns, List<String> sweep,
            double[] firstValue) {
        Set<String> fixed = new LinkedHashSet<>();
        columns.forEach(m -> fixed.addAll(m.keySet()));
        fixed.removeAll(sweep);
        fixed.removeIf(n -> columns.stream().map(m -> m.getOrDefault(n, "")).distinct().count() < 2);
        // A column that the swept values determine (a schedule's name) describes the swept setting, not a group.
        fixed.removeIf(n -> {
            Map<List<String>, String> seen = new java.util.HashMap<>();
            for (Map<String, String> m : columns) {
                List<String> key = sweep.stream().map(w -> m.getOrDefault(w, "")).toList();
                String prev = seen.putIfAbsent(key, m.getOrDefault(n, ""));
                if (prev != null && !prev.equals(m.getOrDefault(n, ""))) {
                    return false;
                }
            }
            return true;
        });
        Map<String, List<Integer>> byKey = new LinkedHashMap<>();
        for (int s = 0; s < c.settingCount(); s++) {
            List<String> parts = new ArrayList<>();
            for (String n : fixed) {
                parts.add(n + "=" + columns.get(s).getOrDefault(n, ""));
            }
            byKey.computeIfAbsent(String.join(", ", parts), k -> new ArrayList<>()).add(s);
        }
        List<SweepGroup> out = new ArrayList<>();
        for (Map.Entry<String, List<Integer>> e : byKey.entrySet()) {
            int[] order = e.getValue().stream().sorted((a, b) -> Double.compare(
                    Double.isNaN(firstValue[a]) ? Double.NEGATIVE_INFINITY : firstValue[a],
                    Double.isNaN(firstValue[b]) ? Double.NEGATIVE_INFINITY : firstValue[b]))
                    .mapToInt(Integer::intValue).toArray();
            out.add(new SweepGroup(e.getKey(), order));
        }
        return out;
    }

    private static int settingIndex(Path results, Campaign c, String label) {
        int s = c.settings().indexOf(label);
        if (s < 0) {
            throw BadInputException.at(results, "", "has no setting '" + label + "' (--compare)",
                    "use one of: " + String.join(", ", c.settings()));
        }
        return s;
    }
}
