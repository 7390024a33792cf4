package org.obverse.io.table;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.obverse.anneal.EnergyScales;
import org.obverse.anneal.InvalidEnergyScalesException;
import org.obverse.io.BadInputException;

/**
 * An energy-scales table (spec/spectrum.md): CSV with columns {@code s,A,B} (others ignored), the
 * device's A(s) and B(s) at increasing s from 0 to 1. Read by the spectrum, the path-integral
 * sampler and the pause-gap step; obverse writes none.
 */
public final class EnergyScalesTable {
    private EnergyScalesTable() {
    }

    /**
     * Reads an energy-scales table: CSV with columns s, A, B (others ignored); a bad table is
     * refused naming the file and line (exit 2).
     */
    public static EnergyScales read(Path file, String units) throws IOException {
        List<double[]> rows = new ArrayList<>();
        List<Long> lineOf = new ArrayList<>();
        try (CsvReader in = CsvReader.open(file)) {
            int[] col = in.require("a schedule table", "s", "A", "B");
            String[] rec;
            while ((rec = in.record()) != null) {
                double[] v = new double[3];
                for (int k = 0; k < 3; k++) {
                    String text = rec[col[k]].trim();
                    try {
                        v[k] = Double.parseDouble(text);
                    } catch (NumberFormatException e) {
                        throw in.error(col[k], text, "is not a number", "give s, A and B as decimal numbers");
                    }
                }
                rows.add(v);
                lineOf.add(in.line());
            }
        }
        int n = rows.size();
        double[] s = new double[n];
        double[] a = new double[n];
        double[] b = new double[n];
        for (int i = 0; i < n; i++) {
            s[i] = rows.get(i)[0];
            a[i] = rows.get(i)[1];
            b[i] = rows.get(i)[2];
        }
        try {
            return EnergyScales.fromTable(file.getFileName().toString(), units, s, a, b);
        } catch (InvalidEnergyScalesException e) {
            String place = e.row() >= 0 ? "line " + lineOf.get(e.row()) : "";
            String msg = e.getMessage().replaceFirst("^row \\d+: ", "");
            throw BadInputException.at(file, place, msg, "fix the schedule table (columns s,A,B; s from 0 to 1,"
                    + " strictly increasing; A, B >= 0)");
        }
    }
}
