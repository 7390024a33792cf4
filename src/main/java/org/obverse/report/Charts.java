package org.obverse.report;

import java.awt.Color;
import java.awt.Font;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYSeries;
import org.knowm.xchart.style.Styler;
import org.knowm.xchart.style.XYStyler;
import org.knowm.xchart.style.markers.SeriesMarkers;
import org.obverse.stats.Campaign;
import org.obverse.stats.CampaignSummary;

/** Shared drawing rules of the report: style, shaded bands, axis ranges, caption counts. */
final class Charts {
    private Charts() {
    }

    /** White background, legible fonts, legend outside on the right, no tool tips. */
    static void style(XYChart chart) {
        XYStyler st = chart.getStyler();
        st.setChartBackgroundColor(Color.WHITE);
        st.setLegendPosition(Styler.LegendPosition.OutsideE);
        st.setToolTipsEnabled(false);
        st.setPlotGridLinesColor(new Color(0xdd, 0xdd, 0xdd));
        st.setChartTitleFont(new Font(Font.SANS_SERIF, Font.BOLD, 15));
        st.setAxisTitleFont(new Font(Font.SANS_SERIF, Font.PLAIN, 14));
        st.setAxisTickLabelsFont(new Font(Font.SANS_SERIF, Font.PLAIN, 12));
        st.setLegendFont(new Font(Font.SANS_SERIF, Font.PLAIN, 12));
        st.setDefaultSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Line);
        st.setMarkerSize(8);
    }

    /** A colour with the given alpha (0–255). */
    static Color translucent(Color c, int alpha) {
        return new Color(c.getRed(), c.getGreen(), c.getBlue(), alpha);
    }

    /**
     * A shaded band between ys[k][1] and ys[k][2] over xs (points whose ends are not drawable
     * are left out of the polygon), drawn as a filled polygon without legend entry.
     */
    static void band(XYChart chart, String name, List<Double> xs, List<double[]> ys, boolean positive, Color fill) {
        List<Double> px = new ArrayList<>();
        List<Double> py = new ArrayList<>();
        List<Integer> ok = new ArrayList<>();
        for (int k = 0; k < xs.size(); k++) {
            double lo = ys.get(k)[1];
            double hi = ys.get(k)[2];
            if (Double.isFinite(lo) && Double.isFinite(hi) && (!positive || lo > 0)) {
                ok.add(k);
            }
        }
        if (ok.size() < 2) {
            return;
        }
        for (int k : ok) {
            px.add(xs.get(k));
            py.add(ys.get(k)[2]);
        }
        for (int j = ok.size() - 1; j >= 0; j--) {
            px.add(xs.get(ok.get(j)));
            py.add(ys.get(ok.get(j))[1]);
        }
        XYSeries s = chart.addSeries(name, px, py);
        s.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.PolygonArea);
        s.setFillColor(fill);
        s.setLineColor(new Color(0, 0, 0, 0));
        s.setMarker(SeriesMarkers.NONE);
        s.setShowInLegend(false);
    }

    /**
     * Fits the y axis to the values (headline and band ends): logarithmic when positive values
     * span more than a factor 30 (so at least one decade boundary is labelled), else linear with
     * a margin; success probabilities start at 0.
     */
    static void yRange(XYChart chart, List<double[]> values, boolean positive) {
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (double[] v : values) {
            for (double x : v) {
                if (Double.isFinite(x) && (!positive || x > 0)) {
                    lo = Math.min(lo, x);
                    hi = Math.max(hi, x);
                }
            }
        }
        if (!(lo <= hi)) {
            return;
        }
        if (positive && hi / lo > 30) {
            chart.getStyler().setYAxisLogarithmic(true);
            chart.getStyler().setYAxisMin(Math.pow(10, Math.floor(Math.log10(lo))));
            chart.getStyler().setYAxisMax(Math.pow(10, Math.ceil(Math.log10(hi))));
            chart.getStyler().setYAxisDecimalPattern("#,##0.###");
            return;
        }
        double pad = hi > lo ? 0.08 * (hi - lo) : Math.max(1e-9, 0.1 * Math.abs(hi));
        chart.getStyler().setYAxisMin(positive || lo >= 0 ? Math.max(0, lo - pad) : lo - pad);
        chart.getStyler().setYAxisMax(hi + pad);
    }

    /** Pads the x axis around numeric category values. */
    static void xPad(XYChart chart, List<String> values) {
        double lo = Double.parseDouble(values.get(0));
        double hi = Double.parseDouble(values.get(values.size() - 1));
        double pad = hi > lo ? 0.08 * (hi - lo) : 0.5;
        chart.getStyler().setXAxisMin(lo - pad);
        chart.getStyler().setXAxisMax(hi + pad);
    }

    /** "N instances; G gauges per setting; R reads per gauge; B bootstrap replicates (resample …)." */
    static String counts(CampaignSummary summary) {
        Campaign c = summary.campaign();
        int gMin = Integer.MAX_VALUE;
        int gMax = 0;
        long rMin = Long.MAX_VALUE;
        long rMax = 0;
        for (int cell = 0; cell < c.instanceCount() * c.settingCount(); cell++) {
            int g = c.gaugeTo(cell) - c.gaugeFrom(cell);
            if (g == 0) {
                continue;
            }
            gMin = Math.min(gMin, g);
            gMax = Math.max(gMax, g);
            for (int k = c.gaugeFrom(cell); k < c.gaugeTo(cell); k++) {
                rMin = Math.min(rMin, c.reads(k));
                rMax = Math.max(rMax, c.reads(k));
            }
        }
        return c.instanceCount() + " instance(s); " + range(gMin, gMax) + " gauge(s) per setting (an ungauged run "
                + "counts as one); " + range(rMin, rMax) + " reads per gauge; " + summary.options().replicates()
                + " bootstrap replicates (resample " + summary.options().resampling().label() + ").";
    }

    private static String range(long lo, long hi) {
        return lo == hi ? String.valueOf(lo) : lo + "–" + hi;
    }

    /** A number as a short label. */
    static String num(double v) {
        if (!Double.isFinite(v)) {
            return Double.isNaN(v) ? "–" : v > 0 ? "∞" : "−∞";
        }
        if (Math.abs(v) >= 1000) {
            return String.format(Locale.ROOT, "%.0f", v);
        }
        String t = String.format(Locale.ROOT, "%.3g", v);
        if (!t.contains("e") && t.contains(".")) {
            t = t.replaceAll("0+$", "").replaceAll("\\.$", "");
        }
        return t;
    }
}
