package org.obverse.cli;

import java.math.BigDecimal;
import java.math.RoundingMode;

/**
 * Fixed-point text of a double, as {@code String.format(Locale.ROOT, "%.Nf", v)} writes it (the
 * shortest decimal form rounded half up to N places), without the formatter: its first use
 * sets up locale data, a tenth of a short command's own work. Console lines of the commands
 * that finish in a fraction of a second use it; their text is unchanged.
 */
final class Decimals {
    private Decimals() {
    }

    /** v with exactly places digits after the point; NaN and infinities as the formatter writes them. */
    static String fixed(double v, int places) {
        if (Double.isNaN(v)) {
            return "NaN";
        }
        if (Double.isInfinite(v)) {
            return v > 0 ? "Infinity" : "-Infinity";
        }
        String s = new BigDecimal(Double.toString(Math.abs(v))).setScale(places, RoundingMode.HALF_UP).toPlainString();
        // The formatter keeps the sign of anything below zero, -0.0 and values that round to 0 included.
        return Double.compare(v, 0.0) < 0 ? "-" + s : s;
    }
}
