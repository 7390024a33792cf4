package org.obverse.report;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.function.IntFunction;
import java.util.Locale;
import java.util.Map;
import java.util.TreeSet;
import org.knowm.xchart.HeatMapChart;
import org.knowm.xchart.HeatMapChartBuilder;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYChartBuilder;
import org.knowm.xchart.XYSeries;
import org.knowm.xchart.style.Styler;
import org.knowm.xchart.style.markers.SeriesMarkers;
import org.obverse.io.table.ScoreFiles;
import org.obverse.stats.Campaign;
import org.obverse.stats.CampaignSummary;
import org.obverse.stats.CellScore;

/**
 * The report's figures of a pause and chain-coupling campaign, drawn from the setting columns
 * {@code chain_coupling}, {@code pause_s}, {@code pause_us} and {@code gauged} (spec/results.md):
 * success and TTS against the pause location (a line per pause duration, the no-pause
 * baseline as a reference line), ΔTTS against the baseline, heat maps over chain coupling ×
 * pause location, and TTS, success, broken chains and residual energy against chain coupling.
 * A figure whose columns are missing or take a single value is left out.
 */
public final class CampaignPlots {
    static final String COUPLING = "chain_coupling";
    static final String PAUSE_S = "pause_s";
    static final String PAUSE_US = "pause_us";
    static final String GAUGED = "gauged";
    private static final int WIDTH = 980;
    private static final int HEIGHT = 540;
    private static final Color[] LINE = {new Color(0x1f, 0x4e, 0x99), new Color(0xb0, 0x4a, 0x10),
        new Color(0x2a, 0x7a, 0x3a), new Color(0x6a, 0x3a, 0x9a), new Color(0x99, 0x1f, 0x5e),
        new Color(0x4a, 0x4a, 0x4a)};
    private static final BasicStroke SOLID = new BasicStroke(2.2f);
    private static final BasicStroke DASHED = new BasicStroke(2.2f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10f,
            new float[] {7f, 5f}, 0f);
    private static final BasicStroke REFERENCE = new BasicStroke(1.6f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER,
            10f, new float[] {2f, 4f}, 0f);

    private CampaignPlots() {
    }

    /** Every campaign figure the setting columns allow. */
    public static List<Figure> all(ScoreFiles.Scored scored, ScoreFiles.Tables tables) throws IOException {
        Layout l = new Layout(scored);
        List<Figure> out = new ArrayList<>();
        if (l.pauses.size() >= 2) {
            for (int k = 0; k < l.couplings.size(); k++) {
                out.add(pauseLines(l, k, true));
                out.add(pauseLines(l, k, false));
                if (!tables.baseline().isEmpty()) {
                    out.add(delta(l, tables, k));
                }
            }
            if (l.couplings.size() >= 2) {
                for (String d : l.durations) {
                    out.add(heat(l, d, false));
                    out.add(heat(l, d, true));
                }
            }
        }
        if (l.couplings.size() >= 2) {
            out.add(coupling(l, "coupling-tts", true));
            out.add(coupling(l, "coupling-success", false));
            out.add(couplingCells(l, "coupling-broken", true));
            out.add(couplingCells(l, "coupling-residual", false));
        }
        return out;
    }

    /** The campaign's setting columns, sorted into the grid. */
    static final class Layout {
        final ScoreFiles.Scored scored;
        final CampaignSummary summary;
        final List<Map<String, String>> cols;
        final List<String> couplings;
        final List<String> pauses;
        final List<String> durations;
        final List<String> gauged;

        Layout(ScoreFiles.Scored scored) {
            this.scored = scored;
            this.summary = scored.summary();
            this.cols = scored.settingColumns();
            this.couplings = values(COUPLING);
            this.pauses = values(PAUSE_S);
            this.durations = values(PAUSE_US);
            List<String> g = new ArrayList<>();
            for (Map<String, String> m : cols) {
                String v = m.getOrDefault(GAUGED, "");
                if (!g.contains(v)) {
                    g.add(v);
                }
            }
            g.sort((a, b) -> a.equals("yes") ? -1 : b.equals("yes") ? 1 : a.compareTo(b));
            this.gauged = g;
        }

        /** Distinct non-empty values of a column in numeric order (text order for non-numbers). */
        private List<String> values(String name) {
            TreeSet<String> set = new TreeSet<>((a, b) -> {
                try {
                    return Double.compare(Double.parseDouble(a), Double.parseDouble(b));
                } catch (NumberFormatException e) {
                    return a.compareTo(b);
                }
            });
            for (Map<String, String> m : cols) {
                String v = m.getOrDefault(name, "");
                if (!v.isEmpty()) {
                    set.add(v);
                }
            }
            List<String> out = new ArrayList<>(set);
            if (out.isEmpty()) {
                out.add("");
            }
            return out;
        }

        String get(int s, String name) {
            return cols.get(s).getOrDefault(name, "");
        }

        /** The setting with these values (null: any), or −1. */
        int find(String coupling, String pauseS, String pauseUs, String gauge) {
            for (int s = 0; s < cols.size(); s++) {
                if ((coupling == null || get(s, COUPLING).equals(coupling)) && (pauseS == null || get(s, PAUSE_S).equals(pauseS))
                        && (pauseUs == null || get(s, PAUSE_US).equals(pauseUs)) && (gauge == null || get(s, GAUGED).equals(gauge))) {
                    return s;
                }
            }
            return -1;
        }

        String gaugeName(String g) {
            return g.equals("yes") ? "gauged" : g.equals("no") ? "ungauged" : g.isEmpty() ? "" : GAUGED + " = " + g;
        }
    }

    private static XYChart chart(String title, String x, String y) {
        XYChart c = new XYChartBuilder().width(WIDTH).height(HEIGHT).title(title).xAxisTitle(x).yAxisTitle(y).build();
        Charts.style(c);
        return c;
    }

    private static Figure pauseLines(Layout l, int k, boolean tts) throws IOException {
        String cc = l.couplings.get(k);
        String what = tts ? "TTS" : "success probability";
        XYChart c = chart((tts ? "TTS" : "Success probability") + (cc.isEmpty() ? "" : " at chain coupling " + cc) + " against the pause location",
                "pause location s_p", tts ? "TTS (µs)" : "success probability per read");
        List<double[]> all = new ArrayList<>();
        int undrawn = 0;
        double x0 = Double.parseDouble(l.pauses.get(0));
        double x1 = Double.parseDouble(l.pauses.get(l.pauses.size() - 1));
        List<Runnable> later = new ArrayList<>();
        for (int gi = 0; gi < l.gauged.size(); gi++) {
            String g = l.gauged.get(gi);
            for (int di = 0; di < l.durations.size(); di++) {
                String d = l.durations.get(di);
                List<Double> xs = new ArrayList<>();
                List<double[]> ys = new ArrayList<>();
                for (String p : l.pauses) {
                    int s = l.find(cc, p, d, g);
                    if (s < 0) {
                        continue;
                    }
                    CampaignSummary.Banded b = banded(l, s, tts);
                    if (!drawable(b.headline(), tts)) {
                        undrawn++;
                        continue;
                    }
                    xs.add(Double.parseDouble(p));
                    ys.add(new double[] {b.headline(), b.band()[0], b.band()[1]});
                    all.add(new double[] {b.headline(), b.band()[0], b.band()[1]});
                }
                if (xs.isEmpty()) {
                    continue;
                }
                Color color = LINE[di % LINE.length];
                String name = "pause " + d + " µs" + (l.gauged.size() > 1 ? ", " + l.gaugeName(g) : "");
                Charts.band(c, name + " band", xs, ys, tts, Charts.translucent(color, gi == 0 ? 60 : 35));
                XYSeries line = c.addSeries(name, xs, ys.stream().map(v -> v[0]).toList());
                line.setLineColor(color);
                line.setMarkerColor(color);
                line.setLineStyle(gi == 0 ? SOLID : DASHED);
                line.setMarker(gi == 0 ? SeriesMarkers.CIRCLE : SeriesMarkers.SQUARE);
            }
            int base = l.find(cc, "", null, g);
            if (base >= 0) {
                CampaignSummary.Banded b = banded(l, base, tts);
                if (drawable(b.headline(), tts)) {
                    all.add(new double[] {b.headline(), b.headline(), b.headline()});
                    XYSeries ref = c.addSeries("no pause" + (l.gauged.size() > 1 ? ", " + l.gaugeName(g) : ""),
                            new double[] {x0, x1}, new double[] {b.headline(), b.headline()});
                    ref.setMarker(SeriesMarkers.NONE);
                    ref.setLineColor(gi == 0 ? Color.BLACK : Color.GRAY);
                    ref.setLineStyle(REFERENCE);
                }
            }
        }
        Charts.yRange(c, all, tts);
        if (!tts) {
            c.getStyler().setYAxisDecimalPattern("0.###");
        }
        double pad = 0.05 * (x1 - x0);
        c.getStyler().setXAxisMin(x0 - pad);
        c.getStyler().setXAxisMax(x1 + pad);
        String note = undrawn > 0 ? " " + undrawn + " point(s) infinite or undefined, not drawn." : "";
        return Figure.render((tts ? "pause-tts" : "pause-success") + suffix(l, k), (tts ? "TTS at the "
                + pct(l.summary.options().target()) + " target" : "Success probability per read") + ", the "
                + quantile(l) + " over instances, against the pause location" + (cc.isEmpty() ? "" : " at chain coupling "
                + cc) + ": one line per pause duration" + (l.gauged.size() > 1 ? " (solid: gauged, dashed: ungauged)" : "")
                + "; dotted horizontal lines: the no-pause baseline. Points: headline (median of the bootstrap replicates); "
                + "shaded: its " + bandName(l.summary.options().band()) + ". " + Charts.counts(l.summary) + note, c);
    }

    private static Figure delta(Layout l, ScoreFiles.Tables tables, int k) throws IOException {
        String cc = l.couplings.get(k);
        XYChart c = chart("ΔTTS = TTS(no pause) − TTS(pause)" + (cc.isEmpty() ? "" : " at chain coupling " + cc),
                "pause location s_p (points of a series staggered sideways for readability)",
                "ΔTTS (µs), positive: the pause is faster");
        c.getStyler().setDefaultSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Scatter);
        double x0 = Double.parseDouble(l.pauses.get(0));
        double x1 = Double.parseDouble(l.pauses.get(l.pauses.size() - 1));
        double step = l.pauses.size() > 1 ? (x1 - x0) / (l.pauses.size() - 1) : 1;
        int series = l.durations.size() * l.gauged.size();
        List<double[]> all = new ArrayList<>();
        int undrawn = 0;
        int index = 0;
        Map<String, Integer> byLabel = new java.util.HashMap<>();
        for (int s = 0; s < l.summary.campaign().settingCount(); s++) {
            byLabel.put(l.summary.campaign().settings().get(s), s);
        }
        for (int gi = 0; gi < l.gauged.size(); gi++) {
            for (int di = 0; di < l.durations.size(); di++, index++) {
                String g = l.gauged.get(gi);
                String d = l.durations.get(di);
                double offset = (index - (series - 1) / 2.0) * 0.5 * step / Math.max(1, series);
                List<Double> xs = new ArrayList<>();
                List<Double> ys = new ArrayList<>();
                Color color = LINE[di % LINE.length];
                for (Map<String, Object> row : tables.baseline()) {
                    int s = byLabel.get((String) row.get("setting"));
                    if (!l.get(s, COUPLING).equals(cc) || !l.get(s, PAUSE_US).equals(d) || !l.get(s, GAUGED).equals(g)) {
                        continue;
                    }
                    double y = (Double) row.get("tts_reference_minus_setting_us");
                    double lo = (Double) row.get("tts_reference_minus_setting_band_low_us");
                    double hi = (Double) row.get("tts_reference_minus_setting_band_high_us");
                    if (!Double.isFinite(y)) {
                        undrawn++;
                        continue;
                    }
                    double x = Double.parseDouble(l.get(s, PAUSE_S)) + offset;
                    xs.add(x);
                    ys.add(y);
                    all.add(new double[] {y, lo, hi});
                    if (Double.isFinite(lo) && Double.isFinite(hi)) {
                        XYSeries bar = c.addSeries("bar " + index + " " + xs.size(), new double[] {x, x},
                                new double[] {lo, hi});
                        bar.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Line);
                        bar.setMarker(SeriesMarkers.NONE);
                        bar.setLineColor(Charts.translucent(color, 150));
                        bar.setLineStyle(new BasicStroke(5f));
                        bar.setShowInLegend(false);
                    }
                }
                if (xs.isEmpty()) {
                    continue;
                }
                XYSeries pts = c.addSeries("pause " + d + " µs" + (l.gauged.size() > 1 ? ", " + l.gaugeName(g) : ""), xs, ys);
                pts.setMarkerColor(color);
                pts.setMarker(gi == 0 ? SeriesMarkers.CIRCLE : SeriesMarkers.SQUARE);
            }
        }
        XYSeries zero = c.addSeries("no difference", new double[] {x0 - 0.6 * step, x1 + 0.6 * step}, new double[] {0, 0});
        zero.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Line);
        zero.setMarker(SeriesMarkers.NONE);
        zero.setLineColor(Color.GRAY);
        zero.setLineStyle(REFERENCE);
        all.add(new double[] {0, 0, 0});
        Charts.yRange(c, all, false);
        c.getStyler().setXAxisMin(x0 - 0.6 * step);
        c.getStyler().setXAxisMax(x1 + 0.6 * step);
        String note = undrawn > 0 ? " " + undrawn + " point(s) infinite, not drawn." : "";
        return Figure.render("pause-delta" + suffix(l, k), "Per pause setting" + (cc.isEmpty() ? "" : " at chain coupling "
                + cc) + ", the " + quantile(l) + " over instances of the instance-wise ΔTTS = TTS(no-pause baseline) − "
                + "TTS(pause) (above zero: the pause is faster). Points: headline (median of the bootstrap replicates); "
                + "bars: " + bandName(l.summary.options().band()) + ". " + Charts.counts(l.summary) + note, c);
    }

    private static Figure heat(Layout l, String d, boolean tts) throws IOException {
        String g = l.gauged.get(0);
        List<String> xs = new ArrayList<>();
        xs.add("none");
        xs.addAll(l.pauses);
        List<Number[]> cells = new ArrayList<>();
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (int yi = 0; yi < l.couplings.size(); yi++) {
            for (int xi = 0; xi < xs.size(); xi++) {
                int s = xi == 0 ? l.find(l.couplings.get(yi), "", null, g)
                        : l.find(l.couplings.get(yi), xs.get(xi), d, g);
                if (s < 0) {
                    continue;
                }
                double v = banded(l, s, tts).headline();
                if (!Double.isFinite(v) || (tts && v <= 0)) {
                    continue;
                }
                double shown = v;
                lo = Math.min(lo, shown);
                hi = Math.max(hi, shown);
                cells.add(new Number[] {xi, yi, shown});
            }
        }
        HeatMapChart c = new HeatMapChartBuilder().width(WIDTH).height(Math.max(360, 120 + 70 * l.couplings.size()))
                .title((tts ? "TTS (µs)" : "Success probability") + ", pause " + d + " µs"
                        + (g.isEmpty() ? "" : ", " + l.gaugeName(g))).xAxisTitle("pause location s_p (none: no pause)")
                .yAxisTitle("chain coupling").build();
        c.getStyler().setChartBackgroundColor(Color.WHITE);
        c.getStyler().setShowValue(true);
        c.getStyler().setValueFont(new Font(Font.SANS_SERIF, Font.PLAIN, 13));
        c.getStyler().setToolTipsEnabled(false);
        c.getStyler().setLegendPosition(Styler.LegendPosition.OutsideE);
        c.getStyler().setRangeColors(tts ? new Color[] {new Color(0x1a, 0x98, 0x50), new Color(0xff, 0xff, 0xbf),
            new Color(0xd7, 0x30, 0x27)} : new Color[] {new Color(0xf7, 0xfb, 0xff), new Color(0x9e, 0xca, 0xe1),
            new Color(0x42, 0x92, 0xc6)});
        // The darkest cell stays a mid blue, so the black values printed on every cell stay legible.
        c.getStyler().setValueFontColor(Color.BLACK);
        c.getStyler().setHeatMapValueDecimalPattern(tts ? "#,##0" : "0.000");
        if (lo < hi) {
            c.getStyler().setMin(lo);
            c.getStyler().setMax(hi);
        }
        c.addSeries(tts ? "TTS (µs)" : "p", xs, l.couplings, cells);
        return Figure.render((tts ? "heat-tts-" : "heat-success-") + slug(d), (tts ? "TTS (µs)"
                : "Success probability per read") + ", the " + quantile(l) + " over instances (headline: median of the "
                + "bootstrap replicates), over chain coupling and pause location for pauses of " + d + " µs"
                + (g.isEmpty() ? "" : ", " + l.gaugeName(g) + " runs") + "; the column 'none' is the no-pause baseline. "
                + "Blank cells: no run, or an infinite TTS. " + Charts.counts(l.summary), c);
    }

    /** Settings of the coupling plots: the no-pause runs when there is a pause column, else all. */
    private static List<Integer> couplingSettings(Layout l, String g) {
        List<Integer> out = new ArrayList<>();
        for (String cc : l.couplings) {
            int s = l.pauses.size() >= 2 || !l.pauses.get(0).isEmpty() ? l.find(cc, "", null, g) : l.find(cc, null, null, g);
            if (s >= 0) {
                out.add(s);
            }
        }
        return out;
    }

    private static Figure coupling(Layout l, String name, boolean tts) throws IOException {
        XYChart c = chart((tts ? "TTS" : "Success probability") + " against chain coupling", "chain coupling",
                tts ? "TTS (µs)" : "success probability per read");
        List<double[]> all = gaugeLines(c, l, s -> {
            CampaignSummary.Banded b = banded(l, s, tts);
            return drawable(b.headline(), tts) ? new double[] {b.headline(), b.band()[0], b.band()[1]} : null;
        }, "headline", " band", tts, 60);
        Charts.yRange(c, all, tts);
        if (!tts) {
            c.getStyler().setYAxisDecimalPattern("0.###");
        }
        Charts.xPad(c, l.couplings);
        boolean paused = l.pauses.size() >= 2 || !l.pauses.get(0).isEmpty();
        return Figure.render(name, (tts ? "TTS" : "Success probability per read") + ", the " + quantile(l)
                + " over instances, against the chain coupling" + (paused ? ", no-pause runs" : "") + (l.gauged.size() > 1
                ? "; solid: gauged, dashed: ungauged" : "") + ". Points: headline (median of the bootstrap replicates); "
                + "shaded: " + bandName(l.summary.options().band()) + ". " + Charts.counts(l.summary), c);
    }

    private static Figure couplingCells(Layout l, String name, boolean broken) throws IOException {
        XYChart c = chart((broken ? "Broken chains per read" : "Residual energy") + " against chain coupling",
                "chain coupling", broken ? "broken chains per read" : "residual energy (logical units)");
        Campaign camp = l.summary.campaign();
        List<double[]> all = gaugeLines(c, l, s -> {
            double sum = 0;
            double lo = Double.POSITIVE_INFINITY;
            double hi = Double.NEGATIVE_INFINITY;
            int n = 0;
            for (CellScore cs : l.summary.cells()) {
                double v = broken ? cs.brokenMean() : cs.residualMean();
                if (cs.setting() == s && Double.isFinite(v)) {
                    sum += v;
                    lo = Math.min(lo, v);
                    hi = Math.max(hi, v);
                    n++;
                }
            }
            return n > 0 ? new double[] {sum / n, lo, hi} : null;
        }, "mean over instances", " range", false, 45);
        Charts.yRange(c, all, false);
        Charts.xPad(c, l.couplings);
        boolean paused = l.pauses.size() >= 2 || !l.pauses.get(0).isEmpty();
        return Figure.render(name, (broken ? "Mean number of broken chains per read (before decoding)"
                : "Mean residual energy above the ground energy of the answered reads") + " against the chain coupling"
                + (paused ? ", no-pause runs" : "") + ": mean over instances (line) and the range over instances (shaded)"
                + (l.gauged.size() > 1 ? "; solid: gauged, dashed: ungauged" : "") + ". " + Charts.counts(l.summary)
                + " " + camp.instanceCount() + " instance(s) per point.", c);
    }

    /**
     * One line with its shaded band for each of the gauged and ungauged groups, a point per chain
     * coupling: {@code point} gives {line, band low, band high} for a setting, or null to leave it
     * out. Returns every point drawn, for the y range.
     */
    private static List<double[]> gaugeLines(XYChart c, Layout l, IntFunction<double[]> point, String unnamed,
            String bandSuffix, boolean log, int alpha) {
        List<double[]> all = new ArrayList<>();
        for (int gi = 0; gi < l.gauged.size(); gi++) {
            String g = l.gauged.get(gi);
            List<Double> xs = new ArrayList<>();
            List<double[]> ys = new ArrayList<>();
            for (int s : couplingSettings(l, g)) {
                double[] v = point.apply(s);
                if (v != null) {
                    xs.add(Double.parseDouble(l.get(s, COUPLING)));
                    ys.add(v);
                    all.add(v);
                }
            }
            if (xs.isEmpty()) {
                continue;
            }
            Color color = LINE[gi % LINE.length];
            String label = l.gaugeName(g).isEmpty() ? unnamed : l.gaugeName(g);
            Charts.band(c, label + bandSuffix, xs, ys, log, Charts.translucent(color, alpha));
            XYSeries line = c.addSeries(label, xs, ys.stream().map(v -> v[0]).toList());
            line.setLineColor(color);
            line.setMarkerColor(color);
            line.setLineStyle(gi == 0 ? SOLID : DASHED);
            line.setMarker(gi == 0 ? SeriesMarkers.CIRCLE : SeriesMarkers.SQUARE);
        }
        return all;
    }

    private static CampaignSummary.Banded banded(Layout l, int s, boolean tts) {
        return tts ? l.summary.settings().get(s).tts() : l.summary.settings().get(s).p();
    }

    private static boolean drawable(double v, boolean positive) {
        return Double.isFinite(v) && (!positive || v > 0);
    }

    private static String suffix(Layout l, int k) {
        return l.couplings.get(k).isEmpty() ? "" : "-cc" + slug(l.couplings.get(k));
    }

    private static String slug(String v) {
        return v.replace("-", "m").replace(".", "p").replaceAll("[^A-Za-z0-9]", "");
    }

    private static String quantile(Layout l) {
        double q = l.summary.options().quantile();
        return q == 0.5 ? "median" : pct(q) + " quantile";
    }

    static String pct(double f) {
        String t = String.format(Locale.ROOT, "%.4g", 100 * f).replaceAll("\\.?0+$", "");
        return t + " %";
    }

    static String bandName(double[] b) {
        return pct(b[0]).replace(" %", "") + "–" + pct(b[1]) + " bootstrap band";
    }
}
