package org.obverse.report;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import org.knowm.xchart.BitmapEncoder;
import org.knowm.xchart.VectorGraphicsEncoder;
import org.knowm.xchart.internal.chartpart.Chart;

/**
 * One rendered plot: a file stem, a caption, and the chart as PNG bytes and SVG text.
 *
 * @param name    file stem (letters, digits, dashes)
 * @param caption what the plot shows, for the report
 * @param png     the PNG image
 * @param svg     the SVG document
 */
public record Figure(String name, String caption, byte[] png, String svg) {
    /** Renders a chart both ways (needs no display: AWT runs headless). */
    public static Figure render(String name, String caption, Chart<?, ?> chart) throws IOException {
        byte[] png = BitmapEncoder.getBitmapBytes(chart, BitmapEncoder.BitmapFormat.PNG);
        ByteArrayOutputStream svg = new ByteArrayOutputStream();
        VectorGraphicsEncoder.saveVectorGraphic(chart, svg, VectorGraphicsEncoder.VectorGraphicsFormat.SVG);
        return new Figure(name, caption, png, svg.toString(StandardCharsets.UTF_8));
    }
}
