package org.obverse.report;

import java.awt.BasicStroke;
import java.awt.Color;
import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.knowm.xchart.BoxChart;
import org.knowm.xchart.BoxChartBuilder;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYChartBuilder;
import org.knowm.xchart.XYSeries;
import org.knowm.xchart.style.BoxStyler;
import org.knowm.xchart.style.Styler;
import org.knowm.xchart.style.markers.SeriesMarkers;
import org.obverse.io.ScoreFiles;
import org.obverse.stats.BiasDiagnostics;
import org.obverse.stats.Campaign;
import org.obverse.stats.CampaignScoring;
import org.obverse.stats.CampaignSummary;
import org.obverse.stats.CellScore;

/**
 * The report's plots. Points that cannot be drawn (an infinite TTS, an undefined band) are
 * left out of their line and the caption says how many; nothing is clipped silently.
 */
public final class ReportPlots {
    private static final int WIDTH = 860;
    private static final int HEIGHT = 480;
    private static final BasicStroke DASHED = new BasicStroke(1.2f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER,
            10f, new float[] {6f, 4f}, 0f);
    private static final BasicStroke THIN = new BasicStroke(1.4f);
    private static final Color MAIN = new Color(0x1f, 0x4e, 0x99);
    private static final Color INNER = new Color(0x3a, 0x8f, 0xd6);
    private static final Color OUTER = new Color(0x9a, 0xb8, 0xd8);
    private static final Color FLAG = new Color(0xc0, 0x30, 0x20);

    private ReportPlots() {
    }

    /** The x axis of the setting plots: the swept value, or the settings in order. */
    public record Axis(String title, double[] x, String[] labels, boolean logarithmic, String[] groups) {
        /** An axis with one line through all settings. */
        public Axis(String title, double[] x, String[] labels, boolean logarithmic) {
            this(title, x, labels, logarithmic, null);
        }

        /**
         * The same axis with the settings drawn as separate lines, one per group (e.g. the value of
         * another column of the table: "gauged = yes" and "gauged = no"); groups[s] names setting s's line.
         */
        public Axis withGroups(String[] groupOfSetting) {
            return new Axis(title, x, labels, logarithmic, groupOfSetting.clone());
        }

        /** Positions 1 … S labelled by setting, or the first swept column's values when all are numbers. */
        public static Axis of(ScoreFiles.Scored scored) {
            CampaignSummary summary = scored.summary();
            Campaign c = summary.campaign();
            String sweepName = scored.sweep().isEmpty() ? null : scored.sweep().get(0);
            double[] v = scored.sweepValueBySetting();
            int n = c.settingCount();
            double[] x = new double[n];
            String[] labels = new String[n];
            if (v == null || java.util.Arrays.stream(v).anyMatch(Double::isNaN)) {
                for (int s = 0; s < n; s++) {
                    x[s] = s + 1;
                    labels[s] = c.settings().get(s);
                }
                return new Axis("setting", x, labels, false);
            }
            boolean positive = true;
            for (int k = 0; k < n; k++) {
                x[k] = v[k];
                labels[k] = c.settings().get(k);
                positive &= v[k] > 0;
            }
            double lo = java.util.Arrays.stream(v).min().orElse(1);
            double hi = java.util.Arrays.stream(v).max().orElse(1);
            return new Axis(sweepName, x, labels, positive && hi / lo >= 100);
        }
    }

    /** Median TTS over instances against the setting, with the inner and outer bootstrap bands. */
    public static Figure tts(CampaignSummary summary, Axis axis) throws IOException {
        List<CampaignSummary.SettingRow> rows = summary.settings();
        double q = summary.options().quantile();
        XYChart chart = base("TTS (" + label(q) + " over instances) against " + axis.title(), axis, "TTS (µs)");
        // A log axis labels only decades: use it only when the values span more than one and a half.
        double lo = Double.POSITIVE_INFINITY;
        double hi = 0;
        for (CampaignSummary.SettingRow r : rows) {
            for (double v : new double[] {r.tts().headline(), r.tts().outer()[0], r.tts().outer()[1]}) {
                if (Double.isFinite(v) && v > 0) {
                    lo = Math.min(lo, v);
                    hi = Math.max(hi, v);
                }
            }
        }
        boolean log = hi / lo > 30;
        chart.getStyler().setYAxisLogarithmic(log);
        if (!log && hi > 0) {
            chart.getStyler().setYAxisMin(0.0);
        }
        int missing = addBanded(chart, axis, rows.size(), s -> rows.get(s).tts().headline(), s -> rows.get(s).tts().band(),
                s -> rows.get(s).tts().outer(), log, band(summary.options().band()), band(summary.options().outerBand()));
        String note = missing > 0 ? " " + missing + " point(s) are infinite or undefined and not drawn." : "";
        return Figure.render("tts", "TTS at the " + pct(summary.options().target()) + " target, the " + label(q)
                + " over instances of the pooled TTS, with the " + band(summary.options().band()) + " (solid) and "
                + band(summary.options().outerBand()) + " (dashed) hierarchical bootstrap bands." + note, chart);
    }

    /** Median success probability over instances against the setting, with bands. */
    public static Figure success(CampaignSummary summary, Axis axis) throws IOException {
        List<CampaignSummary.SettingRow> rows = summary.settings();
        double q = summary.options().quantile();
        XYChart chart = base("Success probability (" + label(q) + " over instances) against " + axis.title(), axis,
                "success probability");
        chart.getStyler().setYAxisMin(0.0);
        // Rare success would be a flat line on [0, 1]: fit the axis to the largest upper band.
        double top = 0;
        for (CampaignSummary.SettingRow r : rows) {
            for (double v : new double[] {r.p().headline(), r.p().outer()[1]}) {
                if (Double.isFinite(v)) {
                    top = Math.max(top, v);
                }
            }
        }
        chart.getStyler().setYAxisMax(top > 0 && top < 0.5 ? Math.min(1.0, 1.15 * top) : 1.0);
        addBanded(chart, axis, rows.size(), s -> rows.get(s).p().headline(), s -> rows.get(s).p().band(),
                s -> rows.get(s).p().outer(), false, band(summary.options().band()), band(summary.options().outerBand()));
        return Figure.render("success", "Success probability per read, the " + label(q)
                + " over instances of the pooled estimate, with the " + band(summary.options().band()) + " (solid) and "
                + band(summary.options().outerBand()) + " (dashed) bootstrap bands.", chart);
    }

    /** Box plot of per-gauge success (every gauge of every instance) for each setting. */
    public static Figure gaugeSpread(CampaignSummary summary) throws IOException {
        Campaign c = summary.campaign();
        BoxChart chart = new BoxChartBuilder().width(WIDTH).height(HEIGHT)
                .title("Per-gauge success probability by setting").xAxisTitle("setting")
                .yAxisTitle("success probability of one gauge").build();
        BoxStyler st = chart.getStyler();
        st.setBoxplotCalCulationMethod(BoxStyler.BoxplotCalCulationMethod.N_LESS_1_PLUS_1);
        st.setLegendVisible(false);
        st.setChartBackgroundColor(Color.WHITE);
        st.setToolTipsEnabled(false);
        st.setYAxisMin(0.0);
        st.setYAxisMax(1.0);
        st.setSeriesColors(new Color[] {INNER});
        for (int s = 0; s < c.settingCount(); s++) {
            double[] v = CampaignScoring.gaugeSuccess(c, s);
            if (v.length > 0) {
                chart.addSeries(c.settings().get(s), v);
            }
        }
        return Figure.render("gauges", "Distribution of the success probability of single gauges (all gauges of all "
                + "instances) per setting: box from the first to the third quartile, line at the median, whiskers to "
                + "1.5 interquartile ranges. A pooled mean far above the median means a few lucky gauges carry it.",
                chart);
    }

    /** Instance-wise TTS of A against B on log axes, with the diagonal. */
    public static Figure comparison(CampaignSummary summary, int index) throws IOException {
        CampaignSummary.ComparisonRow row = summary.comparisons().get(index);
        Campaign c = summary.campaign();
        String a = c.settings().get(row.setting());
        String b = c.settings().get(row.reference());
        double[] ta = new double[c.instanceCount()];
        double[] tb = new double[c.instanceCount()];
        java.util.Arrays.fill(ta, Double.NaN);
        java.util.Arrays.fill(tb, Double.NaN);
        for (CellScore cs : summary.cells()) {
            if (cs.setting() == row.setting()) {
                ta[cs.instance()] = cs.tts();
            } else if (cs.setting() == row.reference()) {
                tb[cs.instance()] = cs.tts();
            }
        }
        List<Double> xs = new ArrayList<>();
        List<Double> ys = new ArrayList<>();
        int undrawn = 0;
        double lo = Double.POSITIVE_INFINITY;
        double hi = 0;
        for (int i = 0; i < ta.length; i++) {
            if (Double.isNaN(ta[i]) || Double.isNaN(tb[i])) {
                continue;
            }
            if (!Double.isFinite(ta[i]) || !Double.isFinite(tb[i]) || ta[i] <= 0 || tb[i] <= 0) {
                undrawn++;
                continue;
            }
            xs.add(tb[i]);
            ys.add(ta[i]);
            lo = Math.min(lo, Math.min(ta[i], tb[i]));
            hi = Math.max(hi, Math.max(ta[i], tb[i]));
        }
        XYChart chart = new XYChartBuilder().width(640).height(560).title("TTS per instance: " + a + " against " + b)
                .xAxisTitle("TTS under " + b + " (µs)").yAxisTitle("TTS under " + a + " (µs)").build();
        style(chart);
        chart.getStyler().setXAxisLogarithmic(true);
        chart.getStyler().setYAxisLogarithmic(true);
        chart.getStyler().setDefaultSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Scatter);
        if (!xs.isEmpty()) {
            XYSeries diag = chart.addSeries("equal TTS", new double[] {lo / 1.2, hi * 1.2}, new double[] {lo / 1.2, hi * 1.2});
            diag.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Line);
            diag.setMarker(SeriesMarkers.NONE);
            diag.setLineColor(Color.GRAY);
            diag.setLineStyle(DASHED);
            XYSeries pts = chart.addSeries("instances", xs, ys);
            pts.setMarkerColor(MAIN);
            pts.setMarker(SeriesMarkers.CIRCLE);
        }
        String note = undrawn > 0 ? " " + undrawn + " instance(s) with an infinite TTS are not drawn." : "";
        return Figure.render("compare-" + (index + 1), "Each point is one instance; below the diagonal " + a
                + " is faster. " + row.counts().faster() + " of " + row.counts().paired() + " instances improved, "
                + row.counts().ties() + " tied; two-sided sign test p = " + String.format(Locale.ROOT, "%.3g",
                row.counts().signTestP()) + "." + note, chart);
    }

    /** The bias map: z-score of each qubit's gauge-averaged device-frame magnetisation. */
    public static Figure biasMap(BiasDiagnostics.Result result, List<Integer> qubitIds) throws IOException {
        return biasMap(result, qubitIds, false);
    }

    /** The coupler map: z-score of each coupler's gauge-averaged device-frame correlation (x: coupler number). */
    public static Figure couplerMap(BiasDiagnostics.Result result, int couplers) throws IOException {
        List<Integer> x = new ArrayList<>();
        for (int k = 0; k < couplers; k++) {
            x.add(k + 1);
        }
        return biasMap(result, x, true);
    }

    private static Figure biasMap(BiasDiagnostics.Result result, List<Integer> qubitIds, boolean couplers)
            throws IOException {
        XYChart chart = new XYChartBuilder().width(WIDTH).height(HEIGHT)
                .title(couplers ? "Device-frame correlation averaged over gauges: z-score per coupler"
                        : "Device-frame magnetisation averaged over gauges: z-score per qubit")
                .xAxisTitle(couplers ? "coupler (numbered in order of its qubit ids)" : "qubit id")
                .yAxisTitle("z = bias / standard error").build();
        style(chart);
        chart.getStyler().setDefaultSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Scatter);
        List<Double> qx = new ArrayList<>();
        List<Double> qz = new ArrayList<>();
        List<Double> fx = new ArrayList<>();
        List<Double> fz = new ArrayList<>();
        double zMax = result.threshold();
        for (BiasDiagnostics.Item it : result.items()) {
            double z = Double.isFinite(it.z()) ? it.z() : Math.copySign(1e3, it.z());
            zMax = Math.max(zMax, Math.abs(z));
            (it.flagged() ? fx : qx).add((double) qubitIds.get(it.item()));
            (it.flagged() ? fz : qz).add(z);
        }
        double x0 = qubitIds.isEmpty() ? 0 : qubitIds.get(0);
        double x1 = qubitIds.isEmpty() ? 1 : qubitIds.get(qubitIds.size() - 1);
        for (double sign : new double[] {1, -1}) {
            XYSeries t = chart.addSeries(sign > 0 ? "threshold" : "-threshold", new double[] {x0, x1},
                    new double[] {sign * result.threshold(), sign * result.threshold()});
            t.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Line);
            t.setMarker(SeriesMarkers.NONE);
            t.setLineColor(FLAG);
            t.setLineStyle(DASHED);
            t.setShowInLegend(sign > 0);
        }
        if (!qx.isEmpty()) {
            XYSeries s = chart.addSeries(couplers ? "couplers" : "qubits", qx, qz);
            s.setMarker(SeriesMarkers.CIRCLE);
            s.setMarkerColor(MAIN);
        }
        if (!fx.isEmpty()) {
            XYSeries s = chart.addSeries("flagged", fx, fz);
            s.setMarker(SeriesMarkers.DIAMOND);
            s.setMarkerColor(FLAG);
        }
        chart.getStyler().setYAxisMin(-zMax * 1.1);
        chart.getStyler().setYAxisMax(zMax * 1.1);
        String what = couplers ? "a coupler: its device-frame correlation s_a s_b" : "a qubit: its device-frame magnetisation";
        return Figure.render(couplers ? "coupler-bias" : "bias", "Each point is " + what + " averaged over gauges "
                + "(the logical part flips sign with the gauge and cancels, a device bias does not), divided by its "
                + "standard error. Dashed lines: |z| = " + String.format(Locale.ROOT, "%.2f", result.threshold())
                + ", the Bonferroni threshold for a family-wise false-positive rate of " + result.alpha() + ". "
                + result.flagged().size() + (couplers ? " coupler(s)" : " qubit(s)") + " flagged.", chart);
    }

    private interface Value {
        double at(int s);
    }

    private interface Pair {
        double[] at(int s);
    }

    // Line colours of grouped plots: estimate, inner band, outer band per group.
    private static final Color[][] GROUP_COLORS = {
        {MAIN, INNER, OUTER},
        {new Color(0xb0, 0x4a, 0x10), new Color(0xe0, 0x86, 0x3c), new Color(0xee, 0xc0, 0x98)},
        {new Color(0x2a, 0x7a, 0x3a), new Color(0x5c, 0xb0, 0x6a), new Color(0xa8, 0xd8, 0xb0)},
        {new Color(0x6a, 0x3a, 0x9a), new Color(0x9c, 0x6c, 0xc8), new Color(0xcc, 0xb4, 0xe4)},
    };

    private static int addBanded(XYChart chart, Axis axis, int n, Value mid, Pair inner, Pair outer, boolean log,
            String innerName, String outerName) {
        int missing = 0;
        for (int s = 0; s < n; s++) {
            if (!drawable(mid.at(s), log)) {
                missing++;
            }
        }
        List<String> groups = new ArrayList<>();
        for (int s = 0; s < n; s++) {
            String g = axis.groups() == null ? "" : axis.groups()[s];
            if (!groups.contains(g)) {
                groups.add(g);
            }
        }
        for (int gi = 0; gi < groups.size(); gi++) {
            String g = groups.get(gi);
            List<Integer> members = new ArrayList<>();
            for (int s = 0; s < n; s++) {
                if ((axis.groups() == null ? "" : axis.groups()[s]).equals(g)) {
                    members.add(s);
                }
            }
            Integer[] order = members.toArray(new Integer[0]);
            java.util.Arrays.sort(order, (a, b) -> Double.compare(axis.x()[a], axis.x()[b]));
            Color[] c = GROUP_COLORS[gi % GROUP_COLORS.length];
            String prefix = g.isEmpty() ? "" : g + ": ";
            series(chart, prefix + outerName, axis, order, s -> outer.at(s)[0], log, c[2], DASHED, false, true);
            series(chart, prefix + outerName + " ", axis, order, s -> outer.at(s)[1], log, c[2], DASHED, false, false);
            series(chart, prefix + innerName, axis, order, s -> inner.at(s)[0], log, c[1], THIN, false, true);
            series(chart, prefix + innerName + " ", axis, order, s -> inner.at(s)[1], log, c[1], THIN, false, false);
            series(chart, prefix + "estimate", axis, order, mid, log, c[0], new BasicStroke(2.4f), true, true);
        }
        return missing;
    }

    private static void series(XYChart chart, String name, Axis axis, Integer[] order, Value v, boolean log,
            Color color, BasicStroke stroke, boolean markers, boolean legend) {
        List<Double> xs = new ArrayList<>();
        List<Double> ys = new ArrayList<>();
        for (int s : order) {
            double y = v.at(s);
            if (drawable(y, log)) {
                xs.add(axis.x()[s]);
                ys.add(y);
            }
        }
        if (xs.isEmpty()) {
            return;
        }
        XYSeries series = chart.addSeries(name, xs, ys);
        series.setLineColor(color);
        series.setLineStyle(stroke);
        series.setMarker(markers ? SeriesMarkers.CIRCLE : SeriesMarkers.NONE);
        series.setMarkerColor(color);
        series.setShowInLegend(legend);
    }

    private static boolean drawable(double y, boolean log) {
        return Double.isFinite(y) && (!log || y > 0);
    }

    private static XYChart base(String title, Axis axis, String yTitle) {
        XYChart chart = new XYChartBuilder().width(WIDTH).height(HEIGHT).title(title).xAxisTitle(axis.title())
                .yAxisTitle(yTitle).build();
        style(chart);
        chart.getStyler().setXAxisLogarithmic(axis.logarithmic());
        double lo = java.util.Arrays.stream(axis.x()).min().orElse(0);
        double hi = java.util.Arrays.stream(axis.x()).max().orElse(1);
        if (!axis.logarithmic()) {
            double pad = hi > lo ? 0.08 * (hi - lo) : 0.5;
            chart.getStyler().setXAxisMin(lo - pad);
            chart.getStyler().setXAxisMax(hi + pad);
        }
        if (axis.title().equals("setting")) {
            String[] labels = axis.labels();
            chart.setCustomXAxisTickLabelsFormatter(x -> {
                long k = Math.round(x);
                return Math.abs(x - k) < 1e-9 && k >= 1 && k <= labels.length ? labels[(int) k - 1] : "";
            });
        }
        return chart;
    }

    private static void style(XYChart chart) {
        org.knowm.xchart.style.XYStyler st = chart.getStyler();
        st.setChartBackgroundColor(Color.WHITE);
        st.setLegendPosition(Styler.LegendPosition.OutsideE);
        st.setToolTipsEnabled(false);
        st.setPlotGridLinesColor(new Color(0xdd, 0xdd, 0xdd));
        chart.getStyler().setDefaultSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Line);
    }

    private static String label(double q) {
        return q == 0.5 ? "median" : pct(q) + " quantile";
    }

    private static String pct(double f) {
        String t = String.format(Locale.ROOT, "%.4g", 100 * f).replaceAll("\\.?0+$", "");
        return t + " %";
    }

    private static String band(double[] b) {
        return pct(b[0]).replace(" %", "") + "–" + pct(b[1]) + " band";
    }
}
