package org.obverse.io.table;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

/**
 * A campaign folder's {@code ground.csv} (spec/campaign.md): one row per instance,
 * {@code instance,ground_energy,ground_source}, where the source is {@code given} (by the plan),
 * {@code exact} (every assignment tried) or {@code best_seen} (the least energy the campaign saw;
 * empty until collected). Written by the prepare step, rewritten by collect, read by the pause-gap
 * step; it is also a ground-energy file that {@link ResultsTable#readGround} reads.
 */
public final class GroundTable {
    /** The columns, in order. */
    public static final List<String> COLUMNS = List.of("instance", "ground_energy", "ground_source");
    /** The sources a row may name. */
    public static final List<String> SOURCES = List.of("given", "exact", "best_seen");

    private GroundTable() {
    }

    /**
     * One instance's ground energy.
     *
     * @param instance the instance's name
     * @param energy   its ground energy, NaN where none is known yet (only for best_seen)
     * @param source   given, exact or best_seen
     */
    public record Row(String instance, double energy, String source) {
        public Row {
            if (!SOURCES.contains(source)) {
                throw new IllegalArgumentException("ground source " + source + " is none of " + SOURCES);
            }
        }

        /** The same row with another energy. */
        public Row withEnergy(double e) {
            return new Row(instance, e, source);
        }
    }

    /** The text of a ground table: an unknown energy is an empty cell, any other the shortest round-trip decimal. */
    public static String text(List<Row> rows) {
        StringBuilder s = new StringBuilder(String.join(",", COLUMNS)).append('\n');
        for (Row r : rows) {
            s.append(CsvReader.quote(r.instance())).append(',').append(JobTable.number(r.energy())).append(',')
                    .append(r.source()).append('\n');
        }
        return s.toString();
    }

    /**
     * Reads a ground table, in file order.
     *
     * @throws org.obverse.io.BadInputException for missing columns, an empty or repeated instance,
     *     an energy that is not a finite number (or empty outside best_seen), an unknown source
     */
    public static List<Row> read(Path file) throws IOException {
        List<Row> out = new ArrayList<>();
        Set<String> seen = new HashSet<>();
        try (CsvReader csv = CsvReader.open(file)) {
            int[] c = csv.require("a campaign's ground-energy table", "instance", "ground_energy", "ground_source");
            String[] r;
            while ((r = csv.record()) != null) {
                String inst = r[c[0]];
                if (inst.isEmpty()) {
                    throw csv.error(c[0], inst, "is empty", "name the instance");
                }
                if (!seen.add(inst)) {
                    throw csv.error(c[0], inst, "appears twice", "give each instance one ground energy");
                }
                String source = r[c[2]];
                if (!SOURCES.contains(source)) {
                    throw csv.error(c[2], source, "is not a ground source", "write one of " + String.join(", ", SOURCES));
                }
                double e;
                if (r[c[1]].isEmpty()) {
                    if (!source.equals("best_seen")) {
                        throw csv.error(c[1], "", "is empty", "only a best_seen row may leave its energy empty");
                    }
                    e = Double.NaN;
                } else {
                    e = ResultsTable.number(csv, c[1], r[c[1]]);
                }
                out.add(new Row(inst, e, source));
            }
        }
        return out;
    }
}
