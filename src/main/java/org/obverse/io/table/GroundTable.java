package org.obverse.io.table;

import org.obverse.io.BadInputException;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * The ground-energy file (spec/results.md, spec/campaign.md): one row per instance,
 * {@code instance,ground_energy}, with two optional columns. {@code ground_source} says where
 * the energy came from: {@code given} (by the plan or the user), {@code exact} (every assignment
 * tried) or {@code best_seen} (the least energy a campaign saw; empty until collected); a file
 * without the column gives its energies. {@value ResultsTable#FRAME} says whose energy it is
 * ({@link EnergyFrame}; logical where the column is absent). Other columns are ignored.
 *
 * <p>This class alone reads and writes the format: a campaign folder's {@code ground.csv}
 * (written by the prepare step, rewritten by collect, read by the pause-gap step) and the file
 * that scoring takes, which may be that same {@code ground.csv}.
 */
public final class GroundTable {
    /** The columns a campaign writes, in order ({@value ResultsTable#FRAME} follows only where a row is physical). */
    public static final List<String> COLUMNS = List.of("instance", "ground_energy", "ground_source");
    /** The sources a row may name. */
    public static final List<String> SOURCES = List.of("given", "exact", "best_seen");
    /** The source of a row whose energy nobody knows until a campaign is collected. */
    public static final String BEST_SEEN = "best_seen";

    private static final String WHAT = "a ground-energy file";

    private GroundTable() {
    }

    /**
     * One instance's ground energy.
     *
     * @param instance the instance's name
     * @param energy   its ground energy, NaN where none is known yet (only for best_seen)
     * @param source   given, exact or best_seen
     * @param frame    whose energy it is
     */
    public record Row(String instance, double energy, String source, EnergyFrame frame) {
        public Row {
            if (!SOURCES.contains(source)) {
                throw new IllegalArgumentException("ground source " + source + " is none of " + SOURCES);
            }
            if (frame == null) {
                throw new IllegalArgumentException("a ground energy needs a frame");
            }
            if (Double.isNaN(energy) && !source.equals(BEST_SEEN)) {
                throw new IllegalArgumentException("only a best_seen ground energy may be unknown");
            }
        }

        /** A logical ground energy. */
        public Row(String instance, double energy, String source) {
            this(instance, energy, source, EnergyFrame.LOGICAL);
        }

        /** The same row with another energy. */
        public Row withEnergy(double e) {
            return new Row(instance, e, source, frame);
        }
    }

    /**
     * Ground energies to score against: by instance, every energy known.
     *
     * @param file the file they were read from, named in refusals; null when given in code
     * @param rows by instance, in file order
     */
    public record Energies(Path file, Map<String, Row> rows) {
        public Energies {
            rows = Collections.unmodifiableMap(new LinkedHashMap<>(rows));
        }

        /** Logical ground energies given in code, without a file. */
        public static Energies logical(Map<String, Double> energies) {
            Map<String, Row> rows = new LinkedHashMap<>();
            energies.forEach((k, v) -> rows.put(k, new Row(k, v, "given")));
            return new Energies(null, rows);
        }

        /** An instance's ground energy, or null where it has none. */
        public Double energy(String instance) {
            Row r = rows.get(instance);
            return r == null ? null : r.energy();
        }

        /** The frame of an instance's ground energy (logical where it has none). */
        public EnergyFrame frame(String instance) {
            Row r = rows.get(instance);
            return r == null ? EnergyFrame.LOGICAL : r.frame();
        }
    }

    /**
     * The text of a ground table: the campaign's columns, then {@value ResultsTable#FRAME} where
     * some row is physical. An unknown energy is an empty cell, any other the shortest round-trip
     * decimal.
     */
    public static String text(List<Row> rows) {
        boolean frames = rows.stream().anyMatch(r -> r.frame() != EnergyFrame.LOGICAL);
        StringBuilder s = new StringBuilder(String.join(",", COLUMNS));
        s.append(frames ? "," + ResultsTable.FRAME + "\n" : "\n");
        for (Row r : rows) {
            s.append(CsvReader.quote(r.instance())).append(',').append(JobTable.number(r.energy())).append(',')
                    .append(r.source());
            if (frames) {
                s.append(',').append(r.frame().label());
            }
            s.append('\n');
        }
        return s.toString();
    }

    /**
     * Reads a ground table, in file order; a best_seen row may leave its energy empty (NaN).
     *
     * @throws org.obverse.io.BadInputException for a missing column, an empty or repeated
     *     instance, an energy that is not a finite number (or empty outside best_seen), an
     *     unknown source or frame: one line naming the file, line and column
     */
    public static List<Row> read(Path file) throws IOException {
        return read(file, false);
    }

    /**
     * Reads ground energies to score against: as {@link #read}, and every energy must be known.
     *
     * @throws org.obverse.io.BadInputException as {@link #read}, and for an empty energy
     */
    public static Energies readEnergies(Path file) throws IOException {
        Map<String, Row> out = new LinkedHashMap<>();
        for (Row r : read(file, true)) {
            out.put(r.instance(), r);
        }
        return new Energies(file, out);
    }

    private static List<Row> read(Path file, boolean known) throws IOException {
        List<Row> out = new ArrayList<>();
        Set<String> seen = new HashSet<>();
        try (CsvReader csv = CsvReader.open(file)) {
            int[] c = csv.require(WHAT, "instance", "ground_energy");
            int sourceCol = csv.column("ground_source");
            int frameCol = csv.column(ResultsTable.FRAME);
            String[] r;
            while ((r = csv.record()) != null) {
                String inst = r[c[0]];
                if (inst.isEmpty()) {
                    throw csv.error(c[0], inst, "is empty", "name the instance");
                }
                if (!seen.add(inst)) {
                    throw csv.error(c[0], inst, "appears twice", "give each instance one ground energy");
                }
                String source = sourceCol < 0 ? "given" : r[sourceCol];
                if (!SOURCES.contains(source)) {
                    throw csv.error(sourceCol, source, "is not a ground source", "write one of " + String.join(", ", SOURCES));
                }
                EnergyFrame frame = EnergyFrame.LOGICAL;
                if (frameCol >= 0) {
                    frame = EnergyFrame.ofLabel(r[frameCol].trim());
                    if (frame == null) {
                        throw csv.error(frameCol, r[frameCol], "is not an energy frame", "write logical or physical");
                    }
                }
                double e;
                if (r[c[1]].trim().isEmpty()) {
                    if (!source.equals(BEST_SEEN)) {
                        throw csv.error(c[1], r[c[1]], "is empty", sourceCol < 0 ? "write the instance's ground energy"
                                : "only a best_seen row may leave its energy empty");
                    }
                    if (known) {
                        throw csv.error(c[1], r[c[1]], "is empty (best_seen, not yet collected)",
                                "collect the campaign first, or give the instance's ground energy");
                    }
                    e = Double.NaN;
                } else {
                    e = ResultsTable.number(csv, c[1], r[c[1]]);
                }
                out.add(new Row(inst, e, source, frame));
            }
        }
        return out;
    }
}
