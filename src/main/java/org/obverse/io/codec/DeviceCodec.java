package org.obverse.io.codec;

import org.obverse.io.BadInputException;
import org.obverse.io.json.ContentHash;
import org.obverse.io.json.JsonFields;
import org.obverse.io.json.JsonFiles;
import org.obverse.io.output.AtomicOutput;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Path;
import java.util.Map;
import java.util.TreeMap;
import org.obverse.device.CellLattice;
import org.obverse.device.DeviceLimits;
import org.obverse.device.QubitGraph;
import org.obverse.device.ValueRange;

/**
 * Reads and writes {@code obverse.device/1}: {@code field} and {@code coupling} ranges,
 * optional {@code coupling_sum}, {@code coupler_ranges} [[i, j, lo, hi], …], and an optional
 * working graph given as {@code qubits} and {@code couplers} (both or neither). A device made
 * from a cell lattice records the lattice under {@code meta} ({@link LatticeMeta}); the rest of
 * {@code meta} is free and not read.
 */
public final class DeviceCodec {
    public static final String KIND = "device";

    private DeviceCodec() {
    }

    /** The text of meta.lattice.numbering: how a qubit id is made from its place in the lattice. */
    private static final String NUMBERING =
            "qubit = ((row*cols + col)*2 + side)*shore + k; side 0 vertical, side 1 horizontal";

    /**
     * What a device made from a cell lattice records under {@code meta}: {@code lattice}
     * (rows, cols, shore and the numbering of qubits), {@code removed_qubits} (the lattice's
     * qubits missing from the device's working graph) and, where defects were drawn at random,
     * {@code seed}.
     *
     * @param lattice the lattice the device was made from
     * @param seed    the seed of the random defects, or null where none were drawn
     */
    public record LatticeMeta(CellLattice lattice, Long seed) {
        public LatticeMeta {
            if (lattice == null) {
                throw new IllegalArgumentException("a lattice record needs the lattice");
            }
        }
    }

    public static DeviceLimits read(Path file) {
        return fromJson(file, JsonFiles.read(file, KIND));
    }

    public static DeviceLimits fromJson(Path file, ObjectNode root) {
        JsonFields f = new JsonFields(file);
        f.onlyKeys(root, KIND, java.util.Set.of("field", "coupling", "coupling_sum", "coupler_ranges", "qubits",
                "couplers", "meta"), "remove it, or put it under \"meta\"");
        double[] field = f.range(f.required(root, "field", "give \"field\": [lo, hi]"), "\"field\"");
        double[] coupling = f.range(f.required(root, "coupling", "give \"coupling\": [lo, hi]"), "\"coupling\"");
        DeviceLimits.Builder b = DeviceLimits.builder(ValueRange.of(field[0], field[1]),
                ValueRange.of(coupling[0], coupling[1]));
        if (root.has("coupling_sum")) {
            double[] s = f.range(root.get("coupling_sum"), "\"coupling_sum\"");
            b.couplingSum(ValueRange.of(s[0], s[1]));
        }
        if (root.has("coupler_ranges")) {
            f.eachTuple(root.get("coupler_ranges"), "coupler_ranges", 4, "[i, j, lo, hi]", (place, t) -> {
                int i = f.id(t.get(0), place + "[0]");
                int j = f.id(t.get(1), place + "[1]");
                double lo = f.number(t.get(2), place + "[2]");
                double hi = f.number(t.get(3), place + "[3]");
                if (lo > hi) {
                    throw f.bad(place, "has lo " + lo + " > hi " + hi, "give lo <= hi");
                }
                try {
                    b.couplerRange(i, j, ValueRange.of(lo, hi));
                } catch (IllegalArgumentException e) {
                    throw f.bad(place, e.getMessage(), "fix or remove the entry");
                }
            });
        }
        if (root.has("qubits") != root.has("couplers")) {
            throw f.bad(root.has("qubits") ? "\"couplers\"" : "\"qubits\"", "is missing",
                    "a working graph needs both \"qubits\" and \"couplers\"");
        }
        if (root.has("qubits")) {
            JsonNode q = f.array(root.get("qubits"), "\"qubits\"");
            int[] qubits = new int[q.size()];
            for (int k = 0; k < qubits.length; k++) {
                qubits[k] = f.id(q.get(k), "qubits[" + k + "]");
            }
            JsonNode c = f.array(root.get("couplers"), "\"couplers\"");
            int[][] couplers = new int[c.size()][];
            for (int k = 0; k < couplers.length; k++) {
                String place = "couplers[" + k + "]";
                JsonNode t = f.tuple(c.get(k), place, 2, "[i, j]");
                couplers[k] = new int[] {f.id(t.get(0), place + "[0]"), f.id(t.get(1), place + "[1]")};
            }
            try {
                b.graph(QubitGraph.of(qubits, couplers));
            } catch (IllegalArgumentException e) {
                throw f.bad("\"couplers\"", e.getMessage(), "list each coupler once, between listed qubits");
            }
        }
        return b.build();
    }

    public static ObjectNode toJson(DeviceLimits d) {
        ObjectNode root = JsonFiles.newObject();
        root.put("format", "obverse." + KIND + "/1");
        range(root.putArray("field"), d.fieldRange());
        range(root.putArray("coupling"), d.couplingRange());
        d.couplingSumRange().ifPresent(r -> range(root.putArray("coupling_sum"), r));
        if (!d.couplerRanges().isEmpty()) {
            ArrayNode cr = root.putArray("coupler_ranges");
            for (Map.Entry<Long, ValueRange> e : new TreeMap<>(d.couplerRanges()).entrySet()) {
                long key = e.getKey();
                cr.addArray().add((int) (key >>> 32)).add((int) key).add(e.getValue().lo()).add(e.getValue().hi());
            }
        }
        d.graph().ifPresent(g -> {
            ArrayNode q = root.putArray("qubits");
            for (int id : g.qubits().toArray()) {
                q.add(id);
            }
            ArrayNode c = root.putArray("couplers");
            for (int[] pair : g.couplers()) {
                c.addArray().add(pair[0]).add(pair[1]);
            }
        });
        return root;
    }

    /** The JSON of a device made from a cell lattice, the lattice recorded under {@code meta}. */
    public static ObjectNode toJson(DeviceLimits d, LatticeMeta meta) {
        ObjectNode root = toJson(d);
        ObjectNode m = root.putObject("meta");
        CellLattice l = meta.lattice();
        ObjectNode shape = m.putObject("lattice");
        shape.put("rows", l.rows()).put("cols", l.cols()).put("shore", l.shore());
        shape.put("numbering", NUMBERING);
        ArrayNode missing = m.putArray("removed_qubits");
        for (int q : l.graph().qubits().toArray()) {
            if (d.graph().map(g -> !g.hasQubit(q)).orElse(false)) {
                missing.add(q);
            }
        }
        if (meta.seed() != null) {
            m.put("seed", meta.seed().longValue());
        }
        return root;
    }

    /**
     * The cell lattice a device file's JSON records under {@code meta.lattice}, or null where
     * it records none (rows, cols and shore are not all whole numbers).
     *
     * @throws BadInputException where the recorded sizes make no lattice
     */
    public static CellLattice lattice(Path file, ObjectNode root) {
        JsonNode shape = root.path("meta").path("lattice");
        if (!shape.path("rows").isInt() || !shape.path("cols").isInt() || !shape.path("shore").isInt()) {
            return null;
        }
        try {
            return CellLattice.of(shape.get("rows").asInt(), shape.get("cols").asInt(), shape.get("shore").asInt());
        } catch (IllegalArgumentException e) {
            throw BadInputException.at(file, "\"meta\".\"lattice\"", e.getMessage(),
                    "remake the device from its lattice, or remove \"meta\".\"lattice\"");
        }
    }

    /** The cell lattice a device file records, or null where it records none. */
    public static CellLattice lattice(Path file) {
        return lattice(file, JsonFiles.read(file, KIND));
    }

    private static void range(ArrayNode a, ValueRange r) {
        a.add(r.lo()).add(r.hi());
    }

    public static void write(Path file, boolean force, DeviceLimits d) throws IOException {
        AtomicOutput.writeText(file, force, java.util.List.of(), JsonFiles.text(toJson(d)));
    }

    /** Writes a device made from a cell lattice, the lattice recorded under {@code meta}. */
    public static void write(Path file, boolean force, DeviceLimits d, LatticeMeta meta) throws IOException {
        AtomicOutput.writeText(file, force, java.util.List.of(), JsonFiles.text(toJson(d, meta)));
    }

    public static String contentHash(DeviceLimits d) {
        return ContentHash.of(toJson(d));
    }
}
