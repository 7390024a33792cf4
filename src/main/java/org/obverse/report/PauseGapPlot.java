package org.obverse.report;

import java.awt.BasicStroke;
import java.awt.Color;
import java.io.IOException;
import java.util.List;
import java.util.Locale;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYChartBuilder;
import org.knowm.xchart.XYSeries;
import org.knowm.xchart.style.Styler;
import org.knowm.xchart.style.markers.SeriesMarkers;

/**
 * Where a pause helps, beside where the gap closes: success probability against the pause
 * location s_p (one line per pause duration, the no-pause baseline as a dashed level; left
 * axis) and the relevant gap of the same embedded problem against s (right axis), its dips
 * marked. A user sees at a glance whether the best pause sits just after a dip.
 */
public final class PauseGapPlot {
    private static final Color GAP = new Color(0xc0, 0x30, 0x20);
    private static final Color[] LINES = {new Color(0x1f, 0x4e, 0x99), new Color(0x2e, 0x8b, 0x57),
        new Color(0x8e, 0x44, 0xad), new Color(0xd3, 0x84, 0x00), new Color(0x16, 0x7f, 0x8a)};
    private static final BasicStroke DASHED = new BasicStroke(1.4f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER,
            10f, new float[] {6f, 4f}, 0f);

    private PauseGapPlot() {
    }

    /** p-success at the pause locations of one pause duration. */
    public record PauseLine(double pauseUs, double[] pauseS, double[] pSuccess) {
    }

    /**
     * The figure.
     *
     * @param name       file stem
     * @param title      the chart's title
     * @param caption    what it shows, for the report
     * @param lines      p-success against s_p, one per pause duration
     * @param baselineP  p-success without a pause (NaN: none)
     * @param s          the gap curve's points
     * @param gap        the relevant gap at each point
     * @param dipS       s of each dip of the gap
     * @param energyUnit units of the gap
     */
    public static Figure of(String name, String title, String caption, List<PauseLine> lines, double baselineP,
                            double[] s, double[] gap, double[] dipS, String energyUnit) throws IOException {
        XYChart chart = new XYChartBuilder().width(900).height(520).title(title)
                .xAxisTitle("s (pause location s_p for the success probability)").yAxisTitle("p-success").build();
        var st = chart.getStyler();
        st.setChartBackgroundColor(Color.WHITE);
        st.setPlotBackgroundColor(Color.WHITE);
        st.setPlotGridLinesColor(new Color(0xe4, 0xe8, 0xee));
        st.setLegendPosition(Styler.LegendPosition.OutsideS);
        st.setLegendLayout(Styler.LegendLayout.Horizontal);
        st.setXAxisMin(0.0);
        st.setXAxisMax(1.0);
        chart.getStyler().setYAxisGroupPosition(1, Styler.YAxisPosition.Right);
        chart.setYAxisGroupTitle(0, "p-success");
        chart.setYAxisGroupTitle(1, "relevant gap (" + energyUnit + ")");
        double pMax = Double.isNaN(baselineP) ? 0 : baselineP;
        for (int k = 0; k < lines.size(); k++) {
            PauseLine l = lines.get(k);
            XYSeries ser = chart.addSeries(String.format(Locale.ROOT, "pause %s us", trim(l.pauseUs())), l.pauseS(),
                    l.pSuccess());
            Color c = LINES[k % LINES.length];
            ser.setLineColor(c);
            ser.setMarkerColor(c);
            ser.setMarker(SeriesMarkers.CIRCLE);
            for (double p : l.pSuccess()) {
                pMax = Math.max(pMax, p);
            }
        }
        if (!Double.isNaN(baselineP)) {
            XYSeries base = chart.addSeries("no pause", new double[] {0, 1}, new double[] {baselineP, baselineP});
            base.setMarker(SeriesMarkers.NONE);
            base.setLineColor(Color.DARK_GRAY);
            base.setLineStyle(DASHED);
        }
        XYSeries g = chart.addSeries("gap", s, gap);
        g.setYAxisGroup(1);
        g.setMarker(SeriesMarkers.NONE);
        g.setLineColor(GAP);
        g.setLineStyle(new BasicStroke(2.0f));
        if (dipS.length > 0) {
            double[] at = new double[dipS.length];
            for (int k = 0; k < dipS.length; k++) {
                at[k] = interpolate(s, gap, dipS[k]);
            }
            XYSeries d = chart.addSeries("gap dips", dipS, at);
            d.setYAxisGroup(1);
            d.setXYSeriesRenderStyle(XYSeries.XYSeriesRenderStyle.Scatter);
            d.setMarker(SeriesMarkers.DIAMOND);
            d.setMarkerColor(Color.BLACK);
        }
        st.setYAxisMin(0, 0.0);
        st.setYAxisMax(0, pMax > 0 ? Math.min(1.0, pMax * 1.1) : 1.0);
        st.setYAxisMin(1, 0.0);
        return Figure.render(name, caption, chart);
    }

    private static double interpolate(double[] x, double[] y, double at) {
        for (int k = 1; k < x.length; k++) {
            if (at <= x[k]) {
                double t = (at - x[k - 1]) / (x[k] - x[k - 1]);
                return y[k - 1] + t * (y[k] - y[k - 1]);
            }
        }
        return y[y.length - 1];
    }

    private static String trim(double v) {
        return java.math.BigDecimal.valueOf(v).stripTrailingZeros().toPlainString();
    }
}
