package org.obverse.io.table;

import org.obverse.io.BadInputException;
import java.io.IOException;
import java.nio.file.Files;
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
 * that gauge. A (qubit, gauge) pair given twice is summed. The same for coupler correlations
 * ({@link #readCouplers}). This class owns both tables: {@link QubitRows} and {@link CouplerRows}
 * write them.
 */
public final class MagnetisationTable {
    /**
     * The table as arrays for the bias diagnosis: row g is gauges().get(g), column i is
     * qubits().get(i); reads 0 where a qubit was not read in a gauge; signs null without the
     * sign column.
     */
    public record Loaded(List<Integer> qubits, List<Integer> gauges, double[][] sums, long[][] reads, byte[][] signs) {
    }

    /** The columns of the qubit table as written, sign included. */
    public static final String QUBIT_HEADER = "qubit,gauge,reads,sum_spin,sign";
    /** The columns of the coupler table as written, sign included. */
    public static final String COUPLER_HEADER = "qubit_a,qubit_b,gauge,reads,sum_product,sign";

    private MagnetisationTable() {
    }

    /**
     * A qubit table being written, one row per (qubit, gauge), with the sign column; the text
     * {@link #read} reads back to the same sums, reads and signs.
     */
    public static final class QubitRows {
        private final StringBuilder text = new StringBuilder(QUBIT_HEADER).append('\n');

        /** Adds the row of one qubit in one gauge: its reads, Σ of its ±1 spins and its gauge sign. */
        public QubitRows add(int qubit, int gauge, long reads, long sumSpin, int sign) {
            text.append(qubit).append(',').append(gauge).append(',').append(reads).append(',').append(sumSpin)
                    .append(',').append(sign).append('\n');
            return this;
        }

        /** The table as CSV text, header first. */
        public String text() {
            return text.toString();
        }

        /** Writes the table to file (UTF-8). */
        public void write(Path file) throws IOException {
            Files.writeString(file, text);
        }
    }

    /**
     * A coupler table being written, one row per (coupler, gauge), with the sign column; the
     * text {@link #readCouplers} reads back to the same sums, reads and signs.
     */
    public static final class CouplerRows {
        private final StringBuilder text = new StringBuilder(COUPLER_HEADER).append('\n');

        /** Adds the row of coupler (a, b) in one gauge: its reads, Σ s_a s_b and the sign g_a·g_b. */
        public CouplerRows add(int qubitA, int qubitB, int gauge, long reads, long sumProduct, int sign) {
            text.append(qubitA).append(',').append(qubitB).append(',').append(gauge).append(',').append(reads)
                    .append(',').append(sumProduct).append(',').append(sign).append('\n');
            return this;
        }

        /** The table as CSV text, header first. */
        public String text() {
            return text.toString();
        }

        /** Writes the table to file (UTF-8). */
        public void write(Path file) throws IOException {
            Files.writeString(file, text);
        }
    }

    /** Reads a qubit table ({@code qubit,gauge,reads,sum_spin[,sign]}). */
    public static Loaded read(Path file) throws IOException {
        Parsed p = parse(file, false);
        List<Integer> ids = new ArrayList<>();
        for (long k : p.items()) {
            ids.add((int) k);
        }
        return new Loaded(ids, p.gauges(), p.sums(), p.reads(), p.signs());
    }

    /**
     * Coupler correlations in the device frame (CSV {@code qubit_a,qubit_b,gauge,reads,sum_product[,sign]}):
     * sum_product is Σ s_a s_b over the reads of the gauge, sign the gauge's g_a·g_b.
     *
     * @param couplers the (qubit_a, qubit_b) pairs with a < b, in the order of the columns
     */
    public record Couplers(List<int[]> couplers, List<Integer> gauges, double[][] sums, long[][] reads, byte[][] signs) {
    }

    /** Reads a coupler table. A pair may be given either way round; it is stored as (min, max). */
    public static Couplers readCouplers(Path file) throws IOException {
        Parsed p = parse(file, true);
        List<int[]> pairs = new ArrayList<>();
        for (long k : p.items()) {
            pairs.add(new int[] {(int) (k >>> 32), (int) k});
        }
        return new Couplers(pairs, p.gauges(), p.sums(), p.reads(), p.signs());
    }

    private record Parsed(List<Long> items, List<Integer> gauges, double[][] sums, long[][] reads, byte[][] signs) {
    }

    private static Parsed parse(Path file, boolean couplers) throws IOException {
        Map<List<Long>, long[]> cells = new HashMap<>();
        Map<List<Long>, Integer> signOf = new HashMap<>();
        TreeSet<Long> items = new TreeSet<>();
        TreeSet<Integer> gauges = new TreeSet<>();
        boolean hasSign;
        String sumName = couplers ? "sum_product" : "sum_spin";
        try (CsvReader csv = CsvReader.open(file)) {
            int[] col = couplers
                    ? csv.require("a coupler correlation table", "qubit_a", "qubit_b", "gauge", "reads", sumName)
                    : csv.require("a magnetisation table", "qubit", "gauge", "reads", sumName);
            int off = couplers ? 1 : 0;
            int signCol = csv.column("sign");
            hasSign = signCol >= 0;
            String[] r;
            while ((r = csv.record()) != null) {
                long item;
                int q = (int) bounded(csv, col[0], r[col[0]], 0, Integer.MAX_VALUE, "a qubit id >= 0");
                if (couplers) {
                    int q2 = (int) bounded(csv, col[1], r[col[1]], 0, Integer.MAX_VALUE, "a qubit id >= 0");
                    if (q2 == q) {
                        throw csv.error(col[1], r[col[1]], "is the same qubit as qubit_a", "a coupler joins two qubits");
                    }
                    item = ((long) Math.min(q, q2) << 32) | Math.max(q, q2);
                } else {
                    item = q;
                }
                int g = (int) bounded(csv, col[1 + off], r[col[1 + off]], 0, Integer.MAX_VALUE, "a gauge index >= 0");
                long n = bounded(csv, col[2 + off], r[col[2 + off]], 1, Long.MAX_VALUE, "a read count >= 1");
                long sum = bounded(csv, col[3 + off], r[col[3 + off]], -n, n,
                        "a sum of " + n + " values of -1 or 1 (between -reads and reads)");
                List<Long> key = List.of((long) g, item);
                long[] cell = cells.computeIfAbsent(key, k -> new long[2]);
                cell[0] += n;
                cell[1] += sum;
                if (hasSign) {
                    String t = r[signCol].trim();
                    if (!t.equals("1") && !t.equals("-1") && !t.equals("+1")) {
                        throw csv.error(signCol, t, "is not a gauge sign", "write -1 or 1");
                    }
                    int sign = Integer.parseInt(t.replace("+", ""));
                    Integer prev = signOf.put(key, sign);
                    if (prev != null && prev != sign) {
                        throw csv.error(signCol, t, "contradicts an earlier row of this item and gauge",
                                "give one sign per item and gauge");
                    }
                }
                items.add(item);
                gauges.add(g);
            }
        }
        if (cells.isEmpty()) {
            throw BadInputException.at(file, "", "has no rows", "write one row per item and gauge");
        }
        List<Long> is = new ArrayList<>(items);
        List<Integer> gs = new ArrayList<>(gauges);
        Map<Long, Integer> ii = new TreeMap<>();
        for (int i = 0; i < is.size(); i++) {
            ii.put(is.get(i), i);
        }
        Map<Integer, Integer> gi = new TreeMap<>();
        for (int i = 0; i < gs.size(); i++) {
            gi.put(gs.get(i), i);
        }
        double[][] sums = new double[gs.size()][is.size()];
        long[][] reads = new long[gs.size()][is.size()];
        byte[][] signs = hasSign ? new byte[gs.size()][is.size()] : null;
        for (Map.Entry<List<Long>, long[]> e : cells.entrySet()) {
            int g = gi.get((int) (long) e.getKey().get(0));
            int q = ii.get(e.getKey().get(1));
            reads[g][q] = e.getValue()[0];
            sums[g][q] = e.getValue()[1];
            if (hasSign) {
                signs[g][q] = (byte) (int) signOf.get(e.getKey());
            }
        }
        if (hasSign) {
            for (byte[] row : signs) {
                for (int q = 0; q < row.length; q++) {
                    if (row[q] == 0) {
                        row[q] = 1;
                    }
                }
            }
        }
        return new Parsed(is, gs, sums, reads, signs);
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
