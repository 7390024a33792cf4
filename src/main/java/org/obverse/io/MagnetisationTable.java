package org.obverse.io;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.TreeSet;

/**
 * Device-frame magnetisation per qubit per gauge (CSV, spec/results.md): columns
 * {@code qubit,gauge,reads,sum_spin} and optionally {@code sign} (the gauge's sign of the
 * qubit, −1 or +1). sum_spin is the sum of the qubit's ±1 device-frame spins over the reads of
 * that gauge. A (qubit, gauge) pair given twice is summed.
 */
public final class MagnetisationTable {
    /**
     * The table as arrays for the bias diagnosis: row g is gauges().get(g), column i is
     * qubits().get(i); reads 0 where a qubit was not read in a gauge; signs null without the
     * sign column.
     */
    public record Loaded(List<Integer> qubits, List<Integer> gauges, double[][] sums, long[][] reads, byte[][] signs) {
    }

    private MagnetisationTable() {
    }

    /** Reads the file. */
    public static Loaded read(Path file) throws IOException {
        Map<Long, long[]> cells = new HashMap<>();
        Map<Long, Integer> signOf = new HashMap<>();
        TreeSet<Integer> qubits = new TreeSet<>();
        TreeSet<Integer> gauges = new TreeSet<>();
        boolean hasSign;
        try (CsvReader csv = CsvReader.open(file)) {
            int[] col = csv.require("a magnetisation table", "qubit", "gauge", "reads", "sum_spin");
            int signCol = csv.column("sign");
            hasSign = signCol >= 0;
            String[] r;
            while ((r = csv.record()) != null) {
                int q = (int) bounded(csv, col[0], r[col[0]], 0, Integer.MAX_VALUE, "a qubit id >= 0");
                int g = (int) bounded(csv, col[1], r[col[1]], 0, Integer.MAX_VALUE, "a gauge index >= 0");
                long n = bounded(csv, col[2], r[col[2]], 1, Long.MAX_VALUE, "a read count >= 1");
                long sum = bounded(csv, col[3], r[col[3]], -n, n, "a sum of " + n + " spins (between -reads and reads)");
                long key = ((long) g << 32) | q;
                long[] cell = cells.computeIfAbsent(key, k -> new long[2]);
                cell[0] += n;
                cell[1] += sum;
                if (hasSign) {
                    String t = r[signCol].trim();
                    if (!t.equals("1") && !t.equals("-1") && !t.equals("+1")) {
                        throw csv.error(signCol, t, "is not a gauge sign", "write -1 or 1");
                    }
                    Integer prev = signOf.put(key, Integer.parseInt(t.replace("+", "")));
                    if (prev != null && prev != Integer.parseInt(t.replace("+", ""))) {
                        throw csv.error(signCol, t, "contradicts an earlier row of this qubit and gauge",
                                "give one sign per qubit and gauge");
                    }
                }
                qubits.add(q);
                gauges.add(g);
            }
        }
        if (cells.isEmpty()) {
            throw BadInputException.at(file, "", "has no rows", "write one row per qubit and gauge");
        }
        List<Integer> qs = new ArrayList<>(qubits);
        List<Integer> gs = new ArrayList<>(gauges);
        Map<Integer, Integer> qi = new TreeMap<>();
        for (int i = 0; i < qs.size(); i++) {
            qi.put(qs.get(i), i);
        }
        Map<Integer, Integer> gi = new TreeMap<>();
        for (int i = 0; i < gs.size(); i++) {
            gi.put(gs.get(i), i);
        }
        double[][] sums = new double[gs.size()][qs.size()];
        long[][] reads = new long[gs.size()][qs.size()];
        byte[][] signs = hasSign ? new byte[gs.size()][qs.size()] : null;
        for (Map.Entry<Long, long[]> e : cells.entrySet()) {
            int g = gi.get((int) (e.getKey() >>> 32));
            int q = qi.get((int) (long) e.getKey());
            reads[g][q] = e.getValue()[0];
            sums[g][q] = e.getValue()[1];
            if (hasSign) {
                signs[g][q] = (byte) (int) signOf.get(e.getKey());
            }
        }
        if (hasSign) {
            for (int g = 0; g < gs.size(); g++) {
                for (int q = 0; q < qs.size(); q++) {
                    if (signs[g][q] == 0) {
                        signs[g][q] = 1;
                    }
                }
            }
        }
        return new Loaded(qs, gs, sums, reads, signs);
    }

    private static long bounded(CsvReader csv, int column, String text, long lo, long hi, String what) {
        long v;
        try {
            v = Long.parseLong(text.trim());
        } catch (NumberFormatException e) {
            throw csv.error(column, text, "is not an integer", "write " + what);
        }
        if (v < lo || v > hi) {
            throw csv.error(column, text, "is out of range", "write " + what);
        }
        return v;
    }
}
