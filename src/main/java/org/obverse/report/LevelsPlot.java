package org.obverse.report;

import java.awt.BasicStroke;
import java.awt.Color;
import java.io.IOException;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYChartBuilder;
import org.knowm.xchart.XYSeries;
import org.knowm.xchart.style.Styler;
import org.knowm.xchart.style.markers.SeriesMarkers;

/**
 * Plots of an anneal spectrum: the reachable levels E_0(s) … against s, with the minimum-gap
 * point s*, the suggested pause window and each dip of the gap marked, and the relevant gap against s (with Δmin
 * and the pause-rule ratios). Takes plain arrays, so it depends on no computing package.
 */
public final class LevelsPlot {
    private static final int WIDTH = 860;
    private static final int HEIGHT = 520;
    private static final Color GROUND = new Color(0x1f, 0x4e, 0x99);
    private static final Color RELEVANT = new Color(0xc0, 0x30, 0x20);
    private static final Color OTHER = new Color(0x8a, 0x9a, 0xae);
    private static final Color PAUSE = new Color(0x2e, 0x8b, 0x57);
    private static final BasicStroke DASHED = new BasicStroke(1.2f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER,
            10f, new float[] {6f, 4f}, 0f);

    private LevelsPlot() {
    }

    /**
     * The levels against s.
     *
     * @param title     chart title (name the problem and the schedule)
     * @param s         Input: the grid
     * @param levels    Input: levels[r][i] = E_i at s[r]
     * @param relevant  index g of the relevant level (drawn in red; the ground level in blue)
     * @param energyUnit label of the energy axis
     */
    public static Figure levels(String title, double[] s, double[][] levels, int relevant, double sStar,
                                double pauseFrom, double pauseTo, String energyUnit) throws IOException {
        return levels(title, s, levels, relevant, sStar, pauseFrom, pauseTo, energyUnit, new double[0]);
    }

    /** The same, with each dip of the gap marked under the levels at its s ({@code dipS}, may be empty). */
    public static Figure levels(String title, double[] s, double[][] levels, int relevant, double sStar,
                                double pauseFrom, double pauseTo, String energyUnit, double[] dipS)
            throws IOException {
        XYChart chart = base(title, "energy (" + energyUnit + ")");
        int count = levels.length == 0 ? 0 : levels[0].length;
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (int i = count - 1; i >= 0; i--) {
            double[] y = new double[s.length];
            for (int r = 0; r < s.length; r++) {
                y[r] = levels[r][i];
                lo = Math.min(lo, y[r]);
                hi = Math.max(hi, y[r]);
            }
            String name = i == 0 ? "E0 (ground)" : i == relevant ? "E" + i + " (relevant)" : "E" + i;
            XYSeries line = chart.addSeries(name, s, y);
            line.setMarker(SeriesMarkers.NONE);
            line.setLineColor(i == 0 ? GROUND : i == relevant ? RELEVANT : OTHER);
            line.setLineStyle(new BasicStroke(i == 0 || i == relevant ? 2.0f : 1.0f));
        }
        marks(chart, lo, hi, sStar, pauseFrom, pauseTo);
        if (dipS.length > 0) {
            double pad = hi > lo ? 0.02 * (hi - lo) : 0.5;
            double[] y = new double[dipS.length];
            java.util.Arrays.fill(y, lo - pad);
            dips(chart, dipS, y);
        }
        return Figure.render("levels", "Reachable levels against s; s* (dashed), the suggested pause window"
                + " (green)" + (dipS.length > 0 ? " and each dip of the gap (diamonds on the axis)." : "."), chart);
    }

    /** The relevant gap against s, with Δmin, s* and the pause window marked. */
    public static Figure gap(String title, double[] s, double[] gap, double sStar, double gapMin,
                             double pauseFrom, double pauseTo, String energyUnit) throws IOException {
        return gap(title, s, gap, sStar, gapMin, pauseFrom, pauseTo, energyUnit, new double[0], new double[0]);
    }

    /** The same, with each dip of the gap (dipS[k], dipGap[k]) marked (may be empty). */
    public static Figure gap(String title, double[] s, double[] gap, double sStar, double gapMin,
                             double pauseFrom, double pauseTo, String energyUnit, double[] dipS, double[] dipGap)
            throws IOException {
        XYChart chart = base(title, "relevant gap (" + energyUnit + ")");
        XYSeries line = chart.addSeries("gap", s, gap);
        line.setMarker(SeriesMarkers.NONE);
        line.setLineColor(RELEVANT);
        line.setLineStyle(new BasicStroke(2.0f));
        double hi = 0;
        for (double g : gap) {
            hi = Math.max(hi, g);
        }
        XYSeries floor = chart.addSeries("gap min", new double[] {0, 1}, new double[] {gapMin, gapMin});
        floor.setMarker(SeriesMarkers.NONE);
        floor.setLineColor(OTHER);
        floor.setLineStyle(DASHED);
        marks(chart, 0, hi, sStar, pauseFrom, pauseTo);
        if (dipS.length > 0) {
            dips(chart, dipS, dipGap);
        }
        return Figure.render("gap", "Relevant gap against s; its minimum (dashed), the suggested pause window"
                + " (green)" + (dipS.length > 0 ? " and each dip of the gap (diamonds)." : "."), chart);
    }

    private static void dips(XYChart chart, double[] x, double[] y) {
        XYSeries dips = chart.addSeries("dips", x, y);
        dips.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Scatter);
        dips.setMarker(SeriesMarkers.DIAMOND);
        dips.setMarkerColor(Color.BLACK);
    }

    /** s* and Δmin against the chain coupling (two panels' worth in one chart: s* on the left axis). */
    public static Figure chainScan(String title, double[] chainCoupling, double[] sStar, double[] gapMin)
            throws IOException {
        XYChart chart = new XYChartBuilder().width(WIDTH).height(HEIGHT).title(title).xAxisTitle("chain coupling")
                .yAxisTitle("s* and gap min").build();
        chart.getStyler().setChartBackgroundColor(Color.WHITE);
        chart.getStyler().setPlotBackgroundColor(Color.WHITE);
        chart.getStyler().setLegendPosition(Styler.LegendPosition.OutsideE);
        chart.getStyler().setPlotGridLinesColor(new Color(0xe4, 0xe8, 0xee));
        XYSeries star = chart.addSeries("s*", chainCoupling, sStar);
        star.setMarker(SeriesMarkers.CIRCLE);
        star.setLineColor(GROUND);
        star.setMarkerColor(GROUND);
        XYSeries gap = chart.addSeries("gap min", chainCoupling, gapMin);
        gap.setMarker(SeriesMarkers.DIAMOND);
        gap.setLineColor(RELEVANT);
        gap.setMarkerColor(RELEVANT);
        return Figure.render("chain-scan", "Minimum-gap point s* and the minimum gap against the chain coupling.", chart);
    }

    private static XYChart base(String title, String yTitle) {
        XYChart chart = new XYChartBuilder().width(WIDTH).height(HEIGHT).title(title).xAxisTitle("s")
                .yAxisTitle(yTitle).build();
        chart.getStyler().setChartBackgroundColor(Color.WHITE);
        chart.getStyler().setPlotBackgroundColor(Color.WHITE);
        chart.getStyler().setLegendPosition(Styler.LegendPosition.OutsideE);
        chart.getStyler().setXAxisMin(0.0);
        chart.getStyler().setXAxisMax(1.0);
        chart.getStyler().setPlotGridLinesColor(new Color(0xe4, 0xe8, 0xee));
        return chart;
    }

    private static void marks(XYChart chart, double lo, double hi, double sStar, double from, double to) {
        double pad = hi > lo ? 0.02 * (hi - lo) : 0.5;
        XYSeries star = chart.addSeries("s*", new double[] {sStar, sStar}, new double[] {lo - pad, hi + pad});
        star.setMarker(SeriesMarkers.NONE);
        star.setLineColor(Color.BLACK);
        star.setLineStyle(DASHED);
        XYSeries window = chart.addSeries("pause window", new double[] {from, from, to, to, from},
                new double[] {lo - pad, hi + pad, hi + pad, lo - pad, lo - pad});
        window.setMarker(SeriesMarkers.NONE);
        window.setLineColor(PAUSE);
        window.setLineStyle(new BasicStroke(1.6f));
    }
}
