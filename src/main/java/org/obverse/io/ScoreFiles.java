package org.obverse.io;

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
            "p_success", "tts_us", "gauges", "p_wilson_low", "p_wilson_high", "p_cp_low", "p_cp_high", "tts_low_us",
            "tts_high_us", "run_us", "ground_energy", "ground_source", "residual_mean", "min_energy", "broken_mean",
            "p_gauge_min", "p_gauge_q1", "p_gauge_median", "p_gauge_q3", "p_gauge_max", "p_gauge_mean",
            "tts_gauge_median_us");

    /** The columns of settings.csv, in order (sweep_value and best_fraction only with a sweep). */
    public static final List<String> SETTING_COLUMNS = List.of("setting", "instances", "median_tts_us",
            "band_low_us", "band_high_us", "band_outer_low_us", "band_outer_high_us", "median_p_success",
            "p_band_low", "p_band_high", "p_band_outer_low", "p_band_outer_high", "solved_instances", "quantile");

    /** The columns of comparisons.csv, in order. */
    public static final List<String> COMPARISON_COLUMNS = List.of("setting_a", "setting_b", "paired", "faster",
            "slower", "ties", "fraction_improved", "sign_test_p", "median_ratio", "ratio_band_low", "ratio_band_high",
            "ratio_band_outer_low", "ratio_band_outer_high", "median_difference_us", "difference_band_low_us",
            "difference_band_high_us", "improved_band_low", "improved_band_high");

    /** The columns of sweep.csv, in order. */
    public static final List<String> SWEEP_COLUMNS = List.of("parameter", "best_setting", "best_value",
            "best_tts_us", "band_low_us", "band_high_us", "band_outer_low_us", "band_outer_high_us", "best_fraction");

    private ScoreFiles() {
    }

    /** Rows of each output file as ordered maps (column → text), shared by CSV, JSON and the report. */
    public record Tables(List<Map<String, Object>> instances, List<Map<String, Object>> settings,
            List<Map<String, Object>> comparisons, List<Map<String, Object>> sweep) {
    }

    /** Builds the tables; sweepName (may be null) names the swept parameter. */
    public static Tables tables(CampaignSummary summary, String sweepName) {
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
            m.put("tts_low_us", s.ttsLow());
            m.put("tts_high_us", s.ttsHigh());
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
        int[] order = o.sweepOrder();
        double[] sweepValue = new double[c.settingCount()];
        double[] bestFraction = new double[c.settingCount()];
        java.util.Arrays.fill(sweepValue, Double.NaN);
        java.util.Arrays.fill(bestFraction, Double.NaN);
        if (order != null) {
            for (int k = 0; k < order.length; k++) {
                sweepValue[order[k]] = o.sweepValues()[k];
                bestFraction[order[k]] = summary.sweep().bestFraction()[k];
            }
        }
        List<Map<String, Object>> set = new ArrayList<>();
        for (CampaignSummary.SettingRow r : summary.settings()) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("setting", c.settings().get(r.setting()));
            m.put("instances", (long) r.instances());
            m.put("median_tts_us", r.tts());
            m.put("band_low_us", r.ttsBand()[0]);
            m.put("band_high_us", r.ttsBand()[1]);
            m.put("band_outer_low_us", r.ttsOuter()[0]);
            m.put("band_outer_high_us", r.ttsOuter()[1]);
            m.put("median_p_success", r.p());
            m.put("p_band_low", r.pBand()[0]);
            m.put("p_band_high", r.pBand()[1]);
            m.put("p_band_outer_low", r.pOuter()[0]);
            m.put("p_band_outer_high", r.pOuter()[1]);
            m.put("solved_instances", (long) r.solved());
            m.put("quantile", o.quantile());
            if (order != null) {
                m.put("sweep_value", sweepValue[r.setting()]);
                m.put("best_fraction", bestFraction[r.setting()]);
            }
            set.add(m);
        }
        List<Map<String, Object>> cmp = new ArrayList<>();
        for (CampaignSummary.ComparisonRow r : summary.comparisons()) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("setting_a", c.settings().get(r.a()));
            m.put("setting_b", c.settings().get(r.b()));
            m.put("paired", (long) r.counts().paired());
            m.put("faster", (long) r.counts().faster());
            m.put("slower", (long) r.counts().slower());
            m.put("ties", (long) r.counts().ties());
            m.put("fraction_improved", r.counts().fractionImproved());
            m.put("sign_test_p", r.counts().signTestP());
            m.put("median_ratio", r.ratio());
            m.put("ratio_band_low", r.ratioBand()[0]);
            m.put("ratio_band_high", r.ratioBand()[1]);
            m.put("ratio_band_outer_low", r.ratioOuter()[0]);
            m.put("ratio_band_outer_high", r.ratioOuter()[1]);
            m.put("median_difference_us", r.difference());
            m.put("difference_band_low_us", r.differenceBand()[0]);
            m.put("difference_band_high_us", r.differenceBand()[1]);
            m.put("improved_band_low", r.improvedBand()[0]);
            m.put("improved_band_high", r.improvedBand()[1]);
            cmp.add(m);
        }
        List<Map<String, Object>> sweep = new ArrayList<>();
        if (order != null) {
            BootstrapResult.Sweep in = summary.sweep();
            BootstrapResult.Sweep out = summary.sweepOuter();
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("parameter", sweepName == null ? "" : sweepName);
            m.put("best_setting", in.best() < 0 ? "" : c.settings().get(in.best()));
            m.put("best_value", in.best() < 0 ? Double.NaN : sweepValue[in.best()]);
            m.put("best_tts_us", in.tts());
            m.put("band_low_us", in.bandLow());
            m.put("band_high_us", in.bandHigh());
            m.put("band_outer_low_us", out.bandLow());
            m.put("band_outer_high_us", out.bandHigh());
            m.put("best_fraction", in.best() < 0 ? Double.NaN : bestFraction[in.best()]);
            sweep.add(m);
        }
        return new Tables(inst, set, cmp, sweep);
    }

    /** Writes the CSV files into a directory (which the caller creates atomically). */
    public static void writeCsv(Path dir, Tables t) throws IOException {
        writeCsv(dir.resolve("instances.csv"), t.instances(), INSTANCE_COLUMNS);
        writeCsv(dir.resolve("settings.csv"), t.settings(), SETTING_COLUMNS);
        if (!t.comparisons().isEmpty()) {
            writeCsv(dir.resolve("comparisons.csv"), t.comparisons(), COMPARISON_COLUMNS);
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
    public static String json(CampaignSummary summary, Tables t, SuccessRule rule, String results, String ground,
            String sweepName) throws IOException {
        ObjectMapper mapper = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = mapper.createObjectNode();
        root.put("format", "obverse.scores/1");
        root.put("results", results);
        if (ground == null) {
            root.putNull("ground");
        } else {
            root.put("ground", ground);
        }
        SummaryOptions o = summary.options();
        root.put("target", o.target());
        root.put("confidence", o.confidence());
        root.put("quantile", o.quantile());
        ObjectNode tol = root.putObject("success_tolerance");
        tol.put("absolute", rule.absolute());
        tol.put("relative", rule.relative());
        ObjectNode boot = root.putObject("bootstrap");
        boot.put("scheme", !o.resampleGauges() && !o.resampleReads() ? "instances"
                : o.resampleReads() && o.resampleGauges() ? "instances, then gauges within an instance, then reads within a gauge (binomial)"
                : o.resampleGauges() ? "instances, then gauges within an instance" : "instances, then reads within a gauge (binomial)");
        boot.put("generator", "XO_RO_SHI_RO_128_PP");
        boot.put("seed", o.seed());
        boot.put("replicates", o.replicates());
        ArrayNode bands = boot.putArray("bands");
        bands.addArray().add(o.band()[0]).add(o.band()[1]);
        bands.addArray().add(o.outerBand()[0]).add(o.outerBand()[1]);
        root.put("quantile_definition", "Hyndman-Fan type 7");
        if (sweepName != null) {
            root.put("sweep", sweepName);
        }
        put(root.putArray("instances"), t.instances());
        put(root.putArray("settings"), t.settings());
        put(root.putArray("comparisons"), t.comparisons());
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
