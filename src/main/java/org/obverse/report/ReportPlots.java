package org.obverse.report;

import java.awt.BasicStroke;
import java.awt.Color;
import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYChartBuilder;
import org.knowm.xchart.XYSeries;
import org.knowm.xchart.style.Styler;
import org.knowm.xchart.style.markers.SeriesMarkers;
import org.obverse.device.CellLattice;
import org.obverse.io.table.ScoreFiles;
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
        List<double[]> all = new ArrayList<>();
        for (CampaignSummary.SettingRow r : rows) {
            all.add(new double[] {r.tts().headline(), r.tts().outer()[0], r.tts().outer()[1]});
        }
        Charts.yRange(chart, all, true);
        boolean log = chart.getStyler().isYAxisLogarithmic();
        int missing = addBanded(chart, axis, rows.size(), s -> rows.get(s).tts().headline(), s -> rows.get(s).tts().band(),
                s -> rows.get(s).tts().outer(), log, band(summary.options().band()), band(summary.options().outerBand()));
        String note = missing > 0 ? " " + missing + " point(s) are infinite or undefined and not drawn." : "";
        return Figure.render("tts", "TTS at the " + pct(summary.options().target()) + " target, the " + label(q)
                + " over instances of the pooled TTS (headline: median of the bootstrap replicates), with the "
                + band(summary.options().band()) + " (darker) and " + band(summary.options().outerBand())
                + " (lighter) bootstrap bands shaded. " + Charts.counts(summary) + note, chart);
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
                + " over instances of the pooled estimate (headline: median of the bootstrap replicates), with the "
                + band(summary.options().band()) + " (darker) and " + band(summary.options().outerBand())
                + " (lighter) bootstrap bands shaded. " + Charts.counts(summary), chart);
    }

    /**
     * Per-gauge success by setting as a strip plot: every gauge of every instance a dot (spread
     * sideways by its rank so equal values stay visible), the median over gauges a bar, the
     * quartiles a vertical line. Legible with many settings, unlike side-by-side boxes.
     */
    public static Figure gaugeSpread(CampaignSummary summary) throws IOException {
        Campaign c = summary.campaign();
        int n = c.settingCount();
        double[] x = new double[n];
        String[] labels = new String[n];
        for (int s = 0; s < n; s++) {
            x[s] = s + 1;
            labels[s] = c.settings().get(s);
        }
        XYChart chart = base("Per-gauge success probability by setting", new Axis("setting", x, labels, false),
                "success probability of one gauge");
        chart.getStyler().setDefaultSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Scatter);
        chart.getStyler().setMarkerSize(5);
        List<Double> dx = new ArrayList<>();
        List<Double> dy = new ArrayList<>();
        List<Double> mx = new ArrayList<>();
        List<Double> my = new ArrayList<>();
        double top = 0;
        for (int s = 0; s < n; s++) {
            double[] v = CampaignScoring.gaugeSuccess(c, s);
            if (v.length == 0) {
                continue;
            }
            double[] sorted = v.clone();
            java.util.Arrays.sort(sorted);
            for (int k = 0; k < sorted.length; k++) {
                dx.add(s + 1 + 0.5 * ((k + 0.5) / sorted.length - 0.5));
                dy.add(sorted[k]);
                top = Math.max(top, sorted[k]);
            }
            double[] q = org.obverse.stats.Quantiles.of(v, 0.25, 0.5, 0.75);
            XYSeries iqr = chart.addSeries("quartiles " + s, new double[] {s + 1, s + 1}, new double[] {q[0], q[2]});
            iqr.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Line);
            iqr.setMarker(SeriesMarkers.NONE);
            iqr.setLineColor(new Color(0, 0, 0, 110));
            iqr.setLineStyle(new BasicStroke(3f));
            iqr.setShowInLegend(false);
            mx.add((double) s + 1);
            my.add(q[1]);
        }
        if (!dx.isEmpty()) {
            XYSeries dots = chart.addSeries("one gauge", dx, dy);
            dots.setMarker(SeriesMarkers.CIRCLE);
            dots.setMarkerColor(Charts.translucent(INNER, 120));
            XYSeries med = chart.addSeries("median over gauges", mx, my);
            med.setMarker(SeriesMarkers.DIAMOND);
            med.setMarkerColor(FLAG);
        }
        chart.getStyler().setYAxisMin(0.0);
        chart.getStyler().setYAxisMax(top > 0 ? Math.min(1.0, 1.08 * top) : 1.0);
        return Figure.render("gauges", "Success probability of single gauges (every gauge of every instance, one dot "
                + "each) per setting; diamond: median over gauges; grey line: first to third quartile. A pooled figure "
                + "far above the median means a few lucky gauges carry it. Settings are numbered as in the settings table. "
                + Charts.counts(summary), chart);
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
        XYChart chart = new XYChartBuilder().width(760).height(660).title("TTS per instance")
                .xAxisTitle("TTS, " + b + " (µs)").yAxisTitle("TTS, " + a + " (µs)").build();
        style(chart);
        chart.getStyler().setLegendPosition(Styler.LegendPosition.InsideNW);
        chart.getStyler().setXAxisLogarithmic(true);
        chart.getStyler().setYAxisLogarithmic(true);
        if (lo <= hi) {
            // Whole decades on both axes, so each axis has at least two labelled ticks.
            double d0 = Math.pow(10, Math.floor(Math.log10(lo)));
            double d1 = Math.pow(10, Math.max(Math.ceil(Math.log10(hi)), Math.log10(d0) + 1));
            chart.getStyler().setXAxisMin(d0);
            chart.getStyler().setXAxisMax(d1);
            chart.getStyler().setYAxisMin(d0);
            chart.getStyler().setYAxisMax(d1);
            chart.getStyler().setXAxisDecimalPattern("#,##0.###");
            chart.getStyler().setYAxisDecimalPattern("#,##0.###");
        }
        chart.getStyler().setDefaultSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Scatter);
        if (!xs.isEmpty()) {
            double d0 = Math.pow(10, Math.floor(Math.log10(lo)));
            double d1 = Math.pow(10, Math.max(Math.ceil(Math.log10(hi)), Math.log10(d0) + 1));
            XYSeries diag = chart.addSeries("equal TTS", new double[] {d0, d1}, new double[] {d0, d1});
            diag.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Line);
            diag.setMarker(SeriesMarkers.NONE);
            diag.setLineColor(Color.GRAY);
            diag.setLineStyle(DASHED);
            XYSeries pts = chart.addSeries("instances", xs, ys);
            pts.setMarkerColor(MAIN);
            pts.setMarker(SeriesMarkers.CIRCLE);
        }
        String note = undrawn > 0 ? " " + undrawn + " instance(s) with an infinite TTS are not drawn." : "";
        return Figure.render("compare-" + (index + 1), "TTS per instance, " + a + " (y) against " + b + " (x), "
                + "log axes. Each point is one instance; below the diagonal " + a
                + " is faster. " + row.counts().faster() + " of " + row.counts().paired() + " instances improved, "
                + row.counts().ties() + " tied; two-sided sign test p = " + String.format(Locale.ROOT, "%.3g",
                row.counts().signTestP()) + ". " + Charts.counts(summary) + note, chart);
    }

    /** The bias map: z-score of each qubit's gauge-averaged device-frame magnetisation. */
    public static Figure biasMap(BiasDiagnostics.Result result, List<Integer> qubitIds) throws IOException {
        return biasMap(result, qubitIds, false);
    }

    /**
     * The bias map on a cell lattice: each qubit at its cell-grid position (cell column and row;
     * inside a cell the vertical side's qubits left, the horizontal side's right), tested qubits
     * coloured by the sign of z and sized by |z|, flagged ones marked, never-flipped ones grey.
     */
    public static Figure biasGrid(BiasDiagnostics.Result result, List<Integer> qubitIds, CellLattice lattice)
            throws IOException {
        int t = lattice.shore();
        int width = Math.max(WIDTH, 80 + lattice.cols() * (2 * t + 1) * 22);
        int height = Math.max(420, 120 + lattice.rows() * 70);
        XYChart chart = new XYChartBuilder().width(width).height(height)
                .title("Device-frame magnetisation averaged over gauges, by cell").xAxisTitle("cell column")
                .yAxisTitle("− cell row (row 0 at the top)").build();
        style(chart);
        chart.getStyler().setDefaultSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Scatter);
        List<List<Double>> xs = new ArrayList<>();
        List<List<Double>> ys = new ArrayList<>();
        String[] names = {"z > 0", "z < 0", "flagged", "never flipped, not tested"};
        for (int k = 0; k < names.length; k++) {
            xs.add(new ArrayList<>());
            ys.add(new ArrayList<>());
        }
        int outside = 0;
        for (BiasDiagnostics.Item it : result.items()) {
            int q = qubitIds.get(it.item());
            if (q < 0 || q >= lattice.qubitCount()) {
                outside++;
                continue;
            }
            // Cell (row, col) spans [col, col + 0.8]; its 2t qubits spread evenly inside.
            double x = lattice.colOf(q) + 0.8 * (lattice.sideOf(q) * t + lattice.indexOf(q)) / Math.max(1, 2 * t - 1);
            double y = -lattice.rowOf(q) - 0.15 * lattice.sideOf(q);
            int k = !it.flipped() ? 3 : it.flagged() ? 2 : it.z() >= 0 ? 0 : 1;
            xs.get(k).add(x);
            ys.get(k).add(y);
        }
        Color[] colors = {MAIN, new Color(0xe0, 0x86, 0x3c), FLAG, Color.GRAY};
        for (int k = 0; k < names.length; k++) {
            if (!xs.get(k).isEmpty()) {
                XYSeries s = chart.addSeries(names[k], xs.get(k), ys.get(k));
                s.setMarkerColor(colors[k]);
                s.setMarker(k == 2 ? SeriesMarkers.DIAMOND : k == 3 ? SeriesMarkers.TRIANGLE_UP : SeriesMarkers.CIRCLE);
            }
        }
        chart.getStyler().setXAxisMin(-0.3);
        chart.getStyler().setXAxisMax(lattice.cols() + 0.1);
        chart.getStyler().setYAxisMin(-lattice.rows() + 0.5);
        chart.getStyler().setYAxisMax(0.5);
        chart.getStyler().setXAxisDecimalPattern("0");
        chart.getStyler().setYAxisDecimalPattern("0");
        long untested = result.items().stream().filter(i -> !i.flipped()).count();
        return Figure.render("bias", "Each point is a qubit at its place in the " + lattice.rows() + " × "
                + lattice.cols() + " cell lattice (within a cell: the vertical side's " + t + " qubits on the upper "
                + "row, the horizontal side's on the lower, left to right), coloured by the sign of z = bias / standard "
                + "error of its gauge-averaged device-frame magnetisation. " + result.flagged().size() + " qubit(s) "
                + "flagged at |z| > " + String.format(Locale.ROOT, "%.2f", result.threshold()) + " (Bonferroni, "
                + "family-wise false-positive rate " + result.alpha() + "); " + untested + " qubit(s) that no gauge "
                + "flipped (pinned) are left out of the test (grey)." + (outside > 0 ? " " + outside
                + " qubit id(s) outside the lattice are not drawn." : ""), chart);
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
        List<Double> ux = new ArrayList<>();
        List<Double> uz = new ArrayList<>();
        for (BiasDiagnostics.Item it : result.items()) {
            double z = Double.isFinite(it.z()) ? it.z() : Math.copySign(1e3, it.z());
            if (!it.flipped()) {
                // Never flipped by a gauge (locked coupler, pinned qubit): not tested, drawn on the axis.
                ux.add((double) qubitIds.get(it.item()));
                uz.add(0.0);
                continue;
            }
            zMax = Math.max(zMax, Math.abs(z));
            (it.flagged() ? fx : qx).add((double) qubitIds.get(it.item()));
            (it.flagged() ? fz : qz).add(z);
        }
        if (!ux.isEmpty()) {
            XYSeries s = chart.addSeries("never flipped, not tested", ux, uz);
            s.setMarker(SeriesMarkers.TRIANGLE_UP);
            s.setMarkerColor(Color.GRAY);
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
                + result.flagged().size() + (couplers ? " coupler(s)" : " qubit(s)") + " flagged. " + ux.size()
                + (couplers ? " coupler(s)" : " qubit(s)") + " that no gauge flipped (locked chain couplers, pinned "
                + "qubits) are left out of the test and of the Bonferroni count: their logical part never changes "
                + "sign, so it cannot be told from a device bias (grey triangles on the axis).", chart);
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
            shade(chart, prefix + outerName, axis, order, outer, log, Charts.translucent(c[1], 45));
            shade(chart, prefix + innerName, axis, order, inner, log, Charts.translucent(c[1], 95));
            series(chart, prefix + "estimate", axis, order, mid, log, c[0], new BasicStroke(2.4f), true, true);
        }
        return missing;
    }

    private static void shade(XYChart chart, String name, Axis axis, Integer[] order, Pair band, boolean log,
            Color fill) {
        List<Double> xs = new ArrayList<>();
        List<double[]> ys = new ArrayList<>();
        for (int s : order) {
            xs.add(axis.x()[s]);
            ys.add(new double[] {Double.NaN, band.at(s)[0], band.at(s)[1]});
        }
        Charts.band(chart, name, xs, ys, log, fill);
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
        boolean categories = axis.title().equals("setting");
        // Settings are numbered 1 … S on a plain numeric axis (its ticks are always labelled); the
        // key is the # column of the settings table and the caption.
        XYChart chart = new XYChartBuilder().width(WIDTH + 120).height(HEIGHT).title(title)
                .xAxisTitle(categories ? "setting number (key: the # column of the settings table)" : axis.title())
                .yAxisTitle(yTitle).build();
        style(chart);
        chart.getStyler().setXAxisLogarithmic(axis.logarithmic());
        double lo = java.util.Arrays.stream(axis.x()).min().orElse(0);
        double hi = java.util.Arrays.stream(axis.x()).max().orElse(1);
        if (categories) {
            chart.getStyler().setXAxisDecimalPattern("0");
            chart.getStyler().setXAxisMin(0.0);
            chart.getStyler().setXAxisMax(axis.labels().length + 1.0);
        } else if (!axis.logarithmic()) {
            double pad = hi > lo ? 0.08 * (hi - lo) : 0.5;
            chart.getStyler().setXAxisMin(lo - pad);
            chart.getStyler().setXAxisMax(hi + pad);
        }
        return chart;
    }

    private static void style(XYChart chart) {
        Charts.style(chart);
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
