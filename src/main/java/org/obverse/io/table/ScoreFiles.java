package org.obverse.io.table;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.obverse.stats.BootstrapResult;
import org.obverse.stats.Campaign;
import org.obverse.stats.CampaignSummary;
import org.obverse.stats.CellScore;
import org.obverse.stats.SuccessRule;
import org.obverse.stats.SummaryOptions;

/**
 * The score outputs of spec/results.md: {@code instances.csv} (one row per instance and
 * setting), {@code settings.csv} (one row per setting), {@code comparisons.csv} (one row per
 * compared pair, when asked), {@code sweep.csv} (when a sweep is asked), and the same content
 * as one JSON document ({@code "format": "obverse.scores/1"}). Numbers are written as the
 * shortest decimal that reads back to the same double; +∞ is written {@code inf} (a JSON
 * string "inf"), an undefined value is an empty CSV field (JSON null).
 */
public final class ScoreFiles {
    /** The columns of instances.csv, in order. */
    public static final List<String> INSTANCE_COLUMNS = List.of("instance", "setting", "reads", "successes",
            "p_success", "tts_us", "gauges", "p_wilson_low", "p_wilson_high", "p_cp_low", "p_cp_high",
            "tts_at_p_cp_high_us", "tts_at_p_cp_low_us", "run_us", "ground_energy", "ground_source", "residual_mean",
            "min_energy", "broken_mean", "p_gauge_min", "p_gauge_q1", "p_gauge_median", "p_gauge_q3", "p_gauge_max",
            "p_gauge_mean", "tts_gauge_median_us");

    /** The columns of settings.csv, in order (sweep_group, sweep_value and best_fraction only with a sweep). */
    public static final List<String> SETTING_COLUMNS = List.of("setting", "instances", "solved_instances",
            "instance_quantile", "tts_us", "tts_band_low_us", "tts_band_high_us", "tts_outer_low_us",
            "tts_outer_high_us", "observed_tts_us", "p_success", "p_success_band_low", "p_success_band_high",
            "p_success_outer_low", "p_success_outer_high", "observed_p_success");

    /** The columns of comparisons.csv and baseline.csv, in order. */
    public static final List<String> COMPARISON_COLUMNS = banded(List.of("setting", "reference", "paired",
            "setting_faster", "reference_faster", "ties", "sign_test_p", "instance_quantile"),
            "tts_ratio_reference_over_setting", "", "tts_reference_minus_setting", "_us", "fraction_setting_faster", "");

    /** The columns of sweep.csv, in order. */
    public static final List<String> SWEEP_COLUMNS = banded(List.of("swept", "group", "candidates", "best_setting",
            "best_values", "best_fraction"), "least_tts", "_us");

    private ScoreFiles() {
    }

    /** Fixed columns then, per (name, unit) pair, name, its bands and observed_name. */
    private static List<String> banded(List<String> fixed, String... nameUnit) {
        List<String> out = new ArrayList<>(fixed);
        for (int k = 0; k < nameUnit.length; k += 2) {
            String n = nameUnit[k];
            String u = nameUnit[k + 1];
            out.addAll(List.of(n + u, n + "_band_low" + u, n + "_band_high" + u, n + "_outer_low" + u,
                    n + "_outer_high" + u, "observed_" + n + u));
        }
        return List.copyOf(out);
    }

    private static void put(Map<String, Object> m, String name, String unit, CampaignSummary.Banded v) {
        m.put(name + unit, v.headline());
        m.put(name + "_band_low" + unit, v.band()[0]);
        m.put(name + "_band_high" + unit, v.band()[1]);
        m.put(name + "_outer_low" + unit, v.outer()[0]);
        m.put(name + "_outer_high" + unit, v.outer()[1]);
        m.put("observed_" + name + unit, v.observed());
    }

    /**
     * Rows of each output file as ordered maps (column → value), shared by CSV, JSON and the
     * report: comparisons from --compare and from the baseline are separate lists.
     */
    public record Tables(List<Map<String, Object>> instances, List<Map<String, Object>> settings,
            List<Map<String, Object>> comparisons, List<Map<String, Object>> baseline,
            List<Map<String, Object>> sweep) {
    }

    /**
     * A scored campaign as the outputs need it: the summary, the success rule, the tables read
     * and the ground file (may be null), per setting its setting columns, the swept columns
     * (empty without a sweep) with the first one's numeric value per setting (NaN where empty;
     * null without a sweep), a name per sweep group (the fixed column values), how many of the
     * summary's comparisons are from --compare (the rest are baseline pairs), the baseline
     * (COLUMN=VALUE, or null) and the settings that found no baseline.
     */
    public record Scored(CampaignSummary summary, SuccessRule rule, List<Path> results, Path ground,
            List<Map<String, String>> settingColumns, List<String> sweep, double[] sweepValueBySetting,
            List<String> sweepGroupNames, int compareCount, String baseline, List<String> withoutBaseline) {
    }

    /** Builds the tables of a scored campaign. */
    public static Tables tables(Scored scored) {
        CampaignSummary summary = scored.summary();
        Campaign c = summary.campaign();
        List<Map<String, Object>> inst = new ArrayList<>();
        for (CellScore s : summary.cells()) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("instance", c.instances().get(s.instance()));
            m.put("setting", c.settings().get(s.setting()));
            m.put("reads", s.reads());
            m.put("successes", s.successes());
            m.put("p_success", s.pSuccess());
            m.put("tts_us", s.tts());
            m.put("gauges", (long) s.gauges());
            m.put("p_wilson_low", s.wilson().lower());
            m.put("p_wilson_high", s.wilson().upper());
            m.put("p_cp_low", s.clopperPearson().lower());
            m.put("p_cp_high", s.clopperPearson().upper());
            m.put("tts_at_p_cp_high_us", s.ttsLow());
            m.put("tts_at_p_cp_low_us", s.ttsHigh());
            m.put("run_us", s.runTime());
            m.put("ground_energy", c.ground(s.instance()));
            m.put("ground_source", c.groundGiven(s.instance()) ? "file" : "best_seen");
            m.put("residual_mean", s.residualMean());
            m.put("min_energy", s.minEnergy());
            m.put("broken_mean", s.brokenMean());
            m.put("p_gauge_min", s.gaugeP()[0]);
            m.put("p_gauge_q1", s.gaugeP()[1]);
            m.put("p_gauge_median", s.gaugeP()[2]);
            m.put("p_gauge_q3", s.gaugeP()[3]);
            m.put("p_gauge_max", s.gaugeP()[4]);
            m.put("p_gauge_mean", s.gaugePMean());
            m.put("tts_gauge_median_us", s.gaugeTtsMedian());
            inst.add(m);
        }
        SummaryOptions o = summary.options();
        int nS = c.settingCount();
        String[] groupOf = new String[nS];
        double[] bestFraction = new double[nS];
        java.util.Arrays.fill(bestFraction, Double.NaN);
        List<int[]> groups = o.sweepGroups();
        for (int k = 0; k < groups.size(); k++) {
            int[] members = groups.get(k);
            for (int j = 0; j < members.length; j++) {
                groupOf[members[j]] = scored.sweepGroupNames().get(k);
                bestFraction[members[j]] = summary.sweeps().get(k).bestFraction()[j];
            }
        }
        boolean sweep = !groups.isEmpty();
        List<Map<String, Object>> set = new ArrayList<>();
        for (CampaignSummary.SettingRow r : summary.settings()) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("setting", c.settings().get(r.setting()));
            m.put("instances", (long) r.instances());
            m.put("solved_instances", (long) r.solved());
            m.put("instance_quantile", o.quantile());
            put(m, "tts", "_us", r.tts());
            put(m, "p_success", "", r.p());
            if (sweep) {
                m.put("sweep_group", groupOf[r.setting()]);
                m.put("sweep_value", scored.sweepValueBySetting()[r.setting()]);
                m.put("best_fraction", bestFraction[r.setting()]);
            }
            set.add(m);
        }
        List<Map<String, Object>> cmp = new ArrayList<>();
        List<Map<String, Object>> base = new ArrayList<>();
        for (int k = 0; k < summary.comparisons().size(); k++) {
            CampaignSummary.ComparisonRow r = summary.comparisons().get(k);
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("setting", c.settings().get(r.setting()));
            m.put("reference", c.settings().get(r.reference()));
            m.put("paired", (long) r.counts().paired());
            m.put("setting_faster", (long) r.counts().faster());
            m.put("reference_faster", (long) r.counts().slower());
            m.put("ties", (long) r.counts().ties());
            m.put("sign_test_p", r.counts().signTestP());
            m.put("instance_quantile", o.quantile());
            put(m, "tts_ratio_reference_over_setting", "", r.ratio());
            put(m, "tts_reference_minus_setting", "_us", r.saved());
            put(m, "fraction_setting_faster", "", r.improved());
            (k < scored.compareCount() ? cmp : base).add(m);
        }
        List<Map<String, Object>> sw = new ArrayList<>();
        for (int k = 0; k < groups.size(); k++) {
            BootstrapResult.Sweep in = summary.sweeps().get(k);
            BootstrapResult.Sweep out = summary.sweepsOuter().get(k);
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("swept", String.join("+", scored.sweep()));
            m.put("group", scored.sweepGroupNames().get(k));
            m.put("candidates", (long) groups.get(k).length);
            m.put("best_setting", in.best() < 0 ? "" : c.settings().get(in.best()));
            List<String> values = new ArrayList<>();
            if (in.best() >= 0) {
                for (String n : scored.sweep()) {
                    values.add(n + "=" + scored.settingColumns().get(in.best()).get(n));
                }
            }
            m.put("best_values", String.join(", ", values));
            m.put("best_fraction", in.best() < 0 ? Double.NaN : bestFraction[in.best()]);
            put(m, "least_tts", "_us", new CampaignSummary.Banded(in.leastTts(), new double[] {in.bandLow(),
                in.bandHigh()}, new double[] {out.bandLow(), out.bandHigh()}, in.observedLeast()));
            sw.add(m);
        }
        return new Tables(inst, set, cmp, base, sw);
    }

    /** Writes the CSV files into a directory (which the caller creates atomically). */
    public static void writeCsv(Path dir, Tables t) throws IOException {
        writeCsv(dir.resolve("instances.csv"), t.instances(), INSTANCE_COLUMNS);
        writeCsv(dir.resolve("settings.csv"), t.settings(), SETTING_COLUMNS);
        if (!t.comparisons().isEmpty()) {
            writeCsv(dir.resolve("comparisons.csv"), t.comparisons(), COMPARISON_COLUMNS);
        }
        if (!t.baseline().isEmpty()) {
            writeCsv(dir.resolve("baseline.csv"), t.baseline(), COMPARISON_COLUMNS);
        }
        if (!t.sweep().isEmpty()) {
            writeCsv(dir.resolve("sweep.csv"), t.sweep(), SWEEP_COLUMNS);
        }
    }

    private static void writeCsv(Path file, List<Map<String, Object>> rows, List<String> columns) throws IOException {
        List<String> cols = rows.isEmpty() ? columns : new ArrayList<>(rows.get(0).keySet());
        StringBuilder s = new StringBuilder();
        s.append(String.join(",", cols)).append('\n');
        for (Map<String, Object> r : rows) {
            for (int i = 0; i < cols.size(); i++) {
                if (i > 0) {
                    s.append(',');
                }
                s.append(csvField(r.get(cols.get(i))));
            }
            s.append('\n');
        }
        java.nio.file.Files.write(file, s.toString().getBytes(StandardCharsets.UTF_8));
    }

    /** One value as CSV text. */
    public static String csvField(Object v) {
        if (v instanceof Double d) {
            return number(d);
        }
        if (v instanceof String str) {
            return CsvReader.quote(str);
        }
        return String.valueOf(v);
    }

    /** A double as text: shortest round-trip decimal, "inf"/"-inf", "" for NaN. */
    public static String number(double d) {
        if (Double.isNaN(d)) {
            return "";
        }
        if (d == Double.POSITIVE_INFINITY) {
            return "inf";
        }
        if (d == Double.NEGATIVE_INFINITY) {
            return "-inf";
        }
        return Double.toString(d);
    }

    /** The JSON document. */
    public static String json(Scored scored, Tables t) throws IOException {
        CampaignSummary summary = scored.summary();
        SuccessRule rule = scored.rule();
        ObjectMapper mapper = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = mapper.createObjectNode();
        root.put("format", "obverse.scores/2");
        ArrayNode res = root.putArray("results");
        scored.results().forEach(p -> res.add(p.toString()));
        if (scored.ground() == null) {
            root.putNull("ground");
        } else {
            root.put("ground", scored.ground().toString());
        }
        SummaryOptions o = summary.options();
        root.put("target", o.target());
        root.put("confidence", o.confidence());
        root.put("quantile", o.quantile());
        ObjectNode tol = root.putObject("success_tolerance");
        tol.put("absolute", rule.absolute());
        tol.put("relative", rule.relative());
        ObjectNode boot = root.putObject("bootstrap");
        boot.put("resample", o.resampling().label());
        boot.put("scheme", o.resampling().description());
        boot.put("headline", "median of the replicates");
        boot.put("generator", "XO_RO_SHI_RO_128_PP");
        boot.put("seed", o.seed());
        boot.put("replicates", o.replicates());
        ArrayNode bands = boot.putArray("bands");
        bands.addArray().add(o.band()[0]).add(o.band()[1]);
        bands.addArray().add(o.outerBand()[0]).add(o.outerBand()[1]);
        root.put("quantile_definition", "Hyndman-Fan type 7");
        ArrayNode swept = root.putArray("sweep");
        scored.sweep().forEach(swept::add);
        if (scored.baseline() == null) {
            root.putNull("baseline");
        } else {
            root.put("baseline", scored.baseline());
        }
        ArrayNode without = root.putArray("without_baseline");
        scored.withoutBaseline().forEach(without::add);
        put(root.putArray("instances"), t.instances());
        put(root.putArray("settings"), t.settings());
        put(root.putArray("comparisons"), t.comparisons());
        put(root.putArray("baseline_comparisons"), t.baseline());
        put(root.putArray("best_of_sweep"), t.sweep());
        return mapper.writeValueAsString(root) + "\n";
    }

    private static void put(ArrayNode array, List<Map<String, Object>> rows) {
        for (Map<String, Object> r : rows) {
            ObjectNode n = array.addObject();
            for (Map.Entry<String, Object> e : r.entrySet()) {
                Object v = e.getValue();
                if (v instanceof Double d) {
                    if (Double.isNaN(d)) {
                        n.putNull(e.getKey());
                    } else if (Double.isInfinite(d)) {
                        n.put(e.getKey(), d > 0 ? "inf" : "-inf");
                    } else {
                        n.put(e.getKey(), d);
                    }
                } else if (v instanceof Long l) {
                    n.put(e.getKey(), l);
                } else {
                    n.put(e.getKey(), String.valueOf(v));
                }
            }
        }
    }
}
