package org.obverse.io.table;

import org.obverse.io.BadInputException;
import org.obverse.io.Messages;
import java.io.IOException;
import java.io.Writer;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.obverse.stats.Campaign;
import org.obverse.stats.SuccessRule;

/**
 * The tidy results table of a campaign (CSV, spec/results.md): one row per read, or per
 * distinct outcome with a count. Columns {@code instance, setting, gauge, energy, count,
 * broken, run_us}; extra columns are allowed and kept for the caller (a swept parameter).
 *
 * <p>Reading streams the file and sums each (instance, setting, gauge) into a
 * {@link Campaign}, so a table never sits in memory row by row. Ground energies come from a
 * ground-energy file ({@link GroundTable}); without one, an instance's least energy seen over the whole table is used and marked
 * as such (the file is then read twice).
 *
 * <p>Frames: a row's energies are in the frame of its {@value #FRAME} column (logical where the
 * column is absent), and so is a ground energy. Reading refuses a row whose frame differs from
 * its instance's ground energy's and, without ground energies, an instance with rows in both
 * frames.
 */
public final class ResultsTable {
    /** The columns every results table has. */
    public static final List<String> COLUMNS = List.of("instance", "setting", "gauge", "energy", "count", "broken",
            "run_us");

    /**
     * The optional column saying whose energies a row holds ({@link EnergyFrame}); a table or a
     * ground-energy file without it holds logical energies.
     */
    public static final String FRAME = "energy_frame";

    private static final java.util.regex.Pattern DECIMAL =
            java.util.regex.Pattern.compile("[-+]?(\\d+\\.?\\d*|\\.\\d+)([eE][-+]?\\d+)?");

    private ResultsTable() {
    }

    /**
     * A campaign read from a results table, with the values of extra columns per setting.
     *
     * @param campaign     the counts
     * @param rows         data rows read
     * @param extraColumns names of the extra columns, in header order
     * @param settingValues per extra column, per setting label: its value when the same on every
     *                     row of that setting (null when it varies)
     */
    public record Loaded(Campaign campaign, long rows, List<String> extraColumns,
            Map<String, Map<String, String>> settingValues) {
    }

    /**
     * Reads a results table into counts. ground may be null (best seen is used then); each
     * ground energy carries its frame ({@link GroundTable}).
     *
     * @throws BadInputException at the first bad row, or naming an instance with no ground energy
     */
    public static Loaded read(Path file, GroundTable.Energies ground, SuccessRule rule) throws IOException {
        return read(List.of(file), ground, rule);
    }

    /**
     * Reads several results tables into one campaign, as if they were one table. A file given
     * twice, or an (instance, setting, gauge) found in two of the files, is refused: each
     * gauge's reads would be counted twice. ground may be null (best seen over all files).
     *
     * @throws BadInputException at the first bad row, a repeated file or gauge, or an instance with no ground energy
     */
    public static Loaded read(List<Path> files, GroundTable.Energies ground, SuccessRule rule) throws IOException {
        if (files.isEmpty()) {
            throw new IllegalArgumentException("no results table to read");
        }
        Map<Path, Path> real = new HashMap<>();
        for (Path f : files) {
            Path key = f.toAbsolutePath().normalize();
            try {
                key = f.toRealPath();
            } catch (IOException e) {
                // a missing file is reported by the reader below, with its name
            }
            Path prev = real.put(key, f);
            if (prev != null) {
                throw BadInputException.at(f, "", "is given twice (also as " + prev + ")",
                        "give each results table once");
            }
        }
        Map<String, Double> best = null;
        Map<String, EnergyFrame> frames = new HashMap<>();
        if (ground == null) {
            best = new HashMap<>();
            for (Path file : files) {
                try (CsvReader csv = CsvReader.open(file)) {
                    int[] col = csv.require("a results table", COLUMNS.toArray(new String[0]));
                    int frameCol = csv.column(FRAME);
                    String[] r;
                    while ((r = csv.record()) != null) {
                        Row row = parse(csv, col, r);
                        checkFrame(csv, frameCol, r, row.instance, frames, null);
                        if (!Double.isNaN(row.energy)) {
                            best.merge(row.instance, row.energy, Math::min);
                        }
                    }
                }
            }
        }
        Campaign.Builder b = Campaign.builder();
        long rows = 0;
        List<String> extras = new ArrayList<>();
        Map<String, Map<String, String>> values = new LinkedHashMap<>();
        Map<String, Map<String, Boolean>> varies = new HashMap<>();
        Map<String, Double> groundSeen = new HashMap<>();
        // (instance, setting, gauge) → the file it came from: one gauge's reads live in one file.
        Map<List<Object>, Integer> gaugeFile = new HashMap<>();
        for (int fileIndex = 0; fileIndex < files.size(); fileIndex++) {
            Path file = files.get(fileIndex);
            try (CsvReader csv = CsvReader.open(file)) {
                int[] col = csv.require("a results table", COLUMNS.toArray(new String[0]));
                List<String> header = csv.header();
                List<Integer> extraIdx = new ArrayList<>();
                List<String> extraHere = new ArrayList<>();
                int frameCol = csv.column(FRAME);
                for (int i = 0; i < header.size(); i++) {
                    if (!COLUMNS.contains(header.get(i)) && i != frameCol) {
                        extraHere.add(header.get(i));
                        extraIdx.add(i);
                        if (!values.containsKey(header.get(i))) {
                            extras.add(header.get(i));
                            values.put(header.get(i), new LinkedHashMap<>());
                            varies.put(header.get(i), new HashMap<>());
                        }
                    }
                }
                String[] r;
                while ((r = csv.record()) != null) {
                    Row row = parse(csv, col, r);
                    if (ground != null) {
                        checkFrame(csv, frameCol, r, row.instance, frames, ground);
                    }
                    if (files.size() > 1) {
                        Integer first = gaugeFile.putIfAbsent(List.of(row.instance, row.setting, row.gauge), fileIndex);
                        if (first != null && first != fileIndex) {
                            throw BadInputException.at(file, "line " + csv.line(), "repeats instance '" + row.instance
                                    + "', setting '" + row.setting + "', gauge "
                                    + (row.gauge == Campaign.NO_GAUGE ? "(none)" : String.valueOf(row.gauge))
                                    + " already read from " + files.get(first),
                                    "give each gauge's reads in one table only");
                        }
                    }
                    Double g = groundSeen.get(row.instance);
                    if (g == null) {
                        if (ground != null) {
                            g = ground.energy(row.instance);
                            if (g == null) {
                                throw BadInputException.at(ground.file(), "", "has no ground energy for instance '"
                                        + row.instance + "' (" + file + ", line " + csv.line() + ")",
                                        "add a row '" + Messages.excerpt(row.instance) + ",<energy>' or leave out --ground to use the best energy seen");
                            }
                            b.ground(row.instance, g, true);
                        } else {
                            g = best.get(row.instance);
                            if (g == null) {
                                throw BadInputException.at(file, "instance '" + Messages.excerpt(row.instance) + "'", "has no read with an "
                                        + "energy, so no best energy seen to score against", "give its ground energy with --ground");
                            }
                            b.ground(row.instance, g, false);
                        }
                        groundSeen.put(row.instance, g);
                    }
                    if (Double.isNaN(row.energy)) {
                        b.addUnanswered(row.instance, row.setting, row.gauge, row.count, row.runUs * row.count,
                                row.broken * row.count);
                    } else {
                        long succ = rule.isSuccess(row.energy, g) ? row.count : 0;
                        b.add(row.instance, row.setting, row.gauge, row.count, succ, (row.energy - g) * row.count,
                                row.runUs * row.count, row.broken * row.count, row.energy);
                    }
                    for (String name : extras) {
                        int k = extraHere.indexOf(name);
                        // A column that one file lacks is empty on that file's rows.
                        String v = k < 0 ? "" : r[extraIdx.get(k)];
                        String prev = values.get(name).putIfAbsent(row.setting, v);
                        if (prev != null && !prev.equals(v)) {
                            varies.get(name).put(row.setting, true);
                        }
                    }
                    rows++;
                }
            }
        }
        if (rows == 0) {
            throw BadInputException.at(files.get(0), "", "has a header but no rows", "score a table with at least one read");
        }
        for (String name : extras) {
            for (String s : varies.get(name).keySet()) {
                values.get(name).put(s, null);
            }
        }
        return new Loaded(b.build(), rows, extras, values);
    }

    /**
     * Refuses a row whose frame differs from its instance's ground energy's (ground given)
     * or, without ground energies, from the frame of the instance's earlier rows.
     */
    private static void checkFrame(CsvReader csv, int frameCol, String[] r, String instance,
            Map<String, EnergyFrame> seen, GroundTable.Energies ground) {
        EnergyFrame f = frameCol < 0 ? EnergyFrame.LOGICAL : frame(csv, frameCol, r[frameCol]);
        if (ground != null) {
            EnergyFrame g = ground.frame(instance);
            if (f != g) {
                throw BadInputException.at(csv.file(), "line " + csv.line(), "instance '" + instance + "' has "
                         + f.label() + " energies but its ground energy (" + ground.file() + ") is " + g.label(),
                        f == EnergyFrame.PHYSICAL
                                ? "decode the physical samples with their chains (decode --instance) to get logical "
                                        + "energies, or give ground energies in the physical frame (column " + FRAME + ")"
                                : "give the ground energy of the logical problem, or score physical rows");
            }
            return;
        }
        EnergyFrame before = seen.putIfAbsent(instance, f);
        if (before != null && before != f) {
            throw BadInputException.at(csv.file(), "line " + csv.line(), "instance '" + instance + "' mixes "
                    + before.label() + " and " + f.label() + " energies",
                    "decode the physical samples with their chains so that every row is logical");
        }
    }

    private static EnergyFrame frame(CsvReader csv, int column, String text) {
        EnergyFrame f = EnergyFrame.ofLabel(text.trim());
        if (f == null) {
            throw csv.error(column, text, "is not an energy frame", "write logical or physical");
        }
        return f;
    }

    private record Row(String instance, String setting, int gauge, double energy, long count, long broken,
            double runUs) {
    }

    private static Row parse(CsvReader csv, int[] col, String[] r) {
        String inst = r[col[0]];
        if (inst.isEmpty()) {
            throw csv.error(col[0], inst, "is empty", "name the instance on every row");
        }
        String gaugeText = r[col[2]].trim();
        int gauge = Campaign.NO_GAUGE;
        if (!gaugeText.isEmpty()) {
            long gv = integer(csv, col[2], gaugeText);
            if (gv < 0 || gv > Integer.MAX_VALUE) {
                throw csv.error(col[2], gaugeText, "is not a gauge index >= 0", "use the gauge's index, or leave it empty");
            }
            gauge = (int) gv;
        }
        // An empty energy is a read that gave no answer (discarded for a broken chain): a failure.
        double energy = r[col[3]].trim().isEmpty() ? Double.NaN : number(csv, col[3], r[col[3]]);
        long count = integer(csv, col[4], r[col[4]]);
        if (count < 1) {
            throw csv.error(col[4], r[col[4]], "is not a count >= 1", "count the reads that gave this row (at least 1)");
        }
        String brokenText = r[col[5]].trim();
        long broken = brokenText.isEmpty() ? 0 : integer(csv, col[5], brokenText);
        if (broken < 0) {
            throw csv.error(col[5], brokenText, "is negative", "count broken chains (0 or more)");
        }
        double run = number(csv, col[6], r[col[6]]);
        if (!(run > 0)) {
            throw csv.error(col[6], r[col[6]], "is not a run time > 0", "give the time of one anneal in microseconds");
        }
        return new Row(inst, r[col[1]], gauge, energy, count, broken, run);
    }

    static double number(CsvReader csv, int column, String text) {
        String t = text.trim();
        if (!DECIMAL.matcher(t).matches()) {
            throw csv.error(column, text, "is not a finite decimal number", "write a number such as -12.5 or 3e-2");
        }
        double v = Double.parseDouble(t);
        if (!Double.isFinite(v)) {
            throw csv.error(column, text, "is out of range", "write a finite number");
        }
        return v;
    }

    private static long integer(CsvReader csv, int column, String text) {
        try {
            return Long.parseLong(text.trim());
        } catch (NumberFormatException e) {
            throw csv.error(column, text, "is not an integer", "write a whole number");
        }
    }

    /**
     * Writes results-table rows: the fixed columns then the given extra columns. Not
     * thread-safe; the caller owns and closes the underlying writer.
     */
    public static final class RowWriter {
        private final Writer out;
        private final int extras;
        private final String frame;

        private RowWriter(Writer out, EnergyFrame frame, List<String> extraColumns, boolean header)
                throws IOException {
            this.out = out;
            this.extras = extraColumns.size();
            this.frame = frame.label();
            StringBuilder h = new StringBuilder(String.join(",", COLUMNS)).append(',').append(FRAME);
            for (String e : extraColumns) {
                if (COLUMNS.contains(e) || e.equals(FRAME)) {
                    throw new IllegalArgumentException("extra column " + e + " clashes with a fixed column");
                }
                h.append(',').append(CsvReader.quote(e));
            }
            if (header) {
                out.write(h.append('\n').toString());
            }
        }

        /**
         * Starts a table with the header: the fixed columns, {@value ResultsTable#FRAME} (the
         * frame of every row), then the extra columns.
         */
        public static RowWriter start(Writer out, EnergyFrame frame, List<String> extraColumns) throws IOException {
            return new RowWriter(out, frame, extraColumns, true);
        }

        /** Starts a table of logical energies. */
        public static RowWriter start(Writer out, List<String> extraColumns) throws IOException {
            return new RowWriter(out, EnergyFrame.LOGICAL, extraColumns, true);
        }

        /** Rows of logical energies with these extra columns, without a header: part of a table written elsewhere. */
        public static RowWriter continuing(Writer out, List<String> extraColumns) throws IOException {
            return new RowWriter(out, EnergyFrame.LOGICAL, extraColumns, false);
        }

        /** One row; gauge −1 writes an empty gauge field; a NaN energy (a discarded read) an empty energy; count ≥ 1. */
        public void row(String instance, String setting, int gauge, double energy, long count, long broken,
                double runUs, String... extraValues) throws IOException {
            if (extraValues.length != extras) {
                throw new IllegalArgumentException("expected " + extras + " extra values, got " + extraValues.length);
            }
            if (count < 1) {
                throw new IllegalArgumentException("count must be >= 1, got " + count);
            }
            StringBuilder s = new StringBuilder();
            s.append(CsvReader.quote(instance)).append(',').append(CsvReader.quote(setting)).append(',');
            if (gauge >= 0) {
                s.append(gauge);
            }
            s.append(',').append(Double.isNaN(energy) ? "" : format(energy)).append(',').append(count).append(',').append(broken).append(',')
                    .append(format(runUs)).append(',').append(frame);
            for (String v : extraValues) {
                s.append(',').append(CsvReader.quote(v));
            }
            out.write(s.append('\n').toString());
        }
    }

    /** Shortest decimal that reads back to the same double. */
    static String format(double v) {
        if (v == Math.rint(v) && Math.abs(v) < 1e15) {
            return String.format(Locale.ROOT, "%d", (long) v);
        }
        return Double.toString(v);
    }
}
