package org.obverse.io.codec;

import org.obverse.io.Messages;
import org.obverse.io.json.JsonFields;
import org.obverse.io.json.JsonFiles;
import org.obverse.io.output.AtomicOutput;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Pattern;

/** Reads and writes the gauge manifest {@code obverse.gauges/1}. */
public final class ManifestCodec {
    public static final String KIND = "gauges";
    private static final Pattern HASH = Pattern.compile("[0-9a-f]{64}");
    private static final Pattern PLAIN_NAME = Pattern.compile("[A-Za-z0-9._-]+\\.json");

    private ManifestCodec() {
    }

    public static GaugeManifest read(Path file) {
        return fromJson(file, JsonFiles.read(file, KIND));
    }

    public static GaugeManifest fromJson(Path file, ObjectNode root) {
        JsonFields f = new JsonFields(file);
        f.onlyKeys(root, KIND, TOP_LEVEL, "remove it, or put it under \"meta\"");
        f.optionalMeta(root);
        JsonNode src = f.required(root, "source", "a manifest names its source files under \"source\"");
        GaugeManifest.SourceFile problem = source(f, src, "problem", true);
        GaugeManifest.SourceFile device = source(f, src, "device", true);
        GaugeManifest.SourceFile chains = source(f, src, "chains", false);
        String lock = text(f, root, "lock");
        String design = text(f, root, "design");
        JsonNode seedNode = f.required(root, "seed", "give the seed");
        if (!seedNode.isIntegralNumber() || !seedNode.canConvertToLong()) {
            throw f.bad("\"seed\"", "is " + JsonFields.describe(seedNode) + ", not a 64-bit integer", "give an integer seed");
        }
        String generator = text(f, root, "generator");
        String expansion = text(f, root, "seed_expansion");
        JsonNode c = f.required(root, "clusters", "give the cluster counts");
        GaugeManifest.ClusterCounts counts = new GaugeManifest.ClusterCounts(count(f, c, "qubits"),
                count(f, c, "clusters"), count(f, c, "free"), count(f, c, "pinned"), count(f, c, "locked_couplers"),
                count(f, c, "pinned_qubits"));
        int redraws = count(f, root, "redraws");
        int distinct = count(f, root, "distinct");
        JsonNode g = f.array(f.required(root, "gauges", "list the gauges"), "\"gauges\"");
        List<GaugeManifest.Entry> entries = new ArrayList<>();
        for (int k = 0; k < g.size(); k++) {
            String place = "gauges[" + k + "]";
            JsonNode e = g.get(k);
            if (!e.isObject()) {
                throw f.bad(place, "is not an object", "write each gauge as {\"index\", \"flipped\", \"problem\", \"sha256\"}");
            }
            int index = count(f, e, "index");
            if (index != k) {
                throw f.bad(place + ".index", "is " + index + ", expected " + k, "list gauges by ascending index from 0");
            }
            JsonNode fl = f.array(f.required(e, "flipped", "give the flipped qubit ids"), place + ".flipped");
            int[] flipped = new int[fl.size()];
            for (int m = 0; m < flipped.length; m++) {
                flipped[m] = f.id(fl.get(m), place + ".flipped[" + m + "]");
                if (m > 0 && flipped[m] <= flipped[m - 1]) {
                    throw f.bad(place + ".flipped", "is not strictly ascending at entry " + m, "list each flipped id once, ascending");
                }
            }
            String name = text(f, e, "problem");
            if (!PLAIN_NAME.matcher(name).matches()) {
                throw f.bad(place + ".problem", "\"" + name + "\" is not a plain file name ending in .json",
                        "gauged problems sit beside the manifest");
            }
            GaugeManifest.Entry entry = new GaugeManifest.Entry(index, flipped, name, hash(f, e, place + ".sha256"));
            refuseClash(f, place + ".problem", entry.stem(), entries);
            entries.add(entry);
        }
        return new GaugeManifest(problem, device, chains, lock, design, seedNode.longValue(), generator, expansion,
                counts, redraws, distinct, entries);
    }

    /**
     * Names that a gauge's files would share with another output: the manifest itself, the
     * moments tables that {@code ungauge} writes beside the samples, the results table of
     * {@code sample}, another gauge's stem (case folded, for file systems that fold case), or a
     * stem that looks like another gauge's energies file.
     */
    private static void refuseClash(JsonFields f, String place, String stem, List<GaugeManifest.Entry> earlier) {
        String folded = stem.toLowerCase(java.util.Locale.ROOT);
        if (RESERVED_STEMS.contains(folded) || folded.endsWith(".energies")) {
            throw f.bad(place, "the name " + Messages.excerpt(stem) + " is kept for an output of obverse ("
                    + String.join(", ", RESERVED_STEMS) + ", *.energies)", "name the gauged problem like g0007.json");
        }
        for (GaugeManifest.Entry e : earlier) {
            if (e.stem().toLowerCase(java.util.Locale.ROOT).equals(folded)) {
                throw f.bad(place, "gauges " + e.index() + " and " + earlier.size() + " share the file name "
                        + Messages.excerpt(stem), "give each gauge its own problem file");
            }
        }
    }

    /** Stems no gauge may use (see {@link #refuseClash}). */
    static final java.util.Set<String> RESERVED_STEMS = new java.util.TreeSet<>(
            java.util.Set.of("manifest", "magnetisation", "correlations", "results"));

    /** The manifest's top-level keys. */
    static final java.util.Set<String> TOP_LEVEL = java.util.Set.of("source", "lock", "design", "seed", "generator",
            "seed_expansion", "clusters", "redraws", "distinct", "gauges", "meta");

    private static GaugeManifest.SourceFile source(JsonFields f, JsonNode src, String name, boolean required) {
        JsonNode n = src.get(name);
        if (n == null || n.isNull()) {
            if (required) {
                throw f.bad("source." + name, "is missing", "the manifest must name its " + name + " file");
            }
            return null;
        }
        String path = text(f, n, "path");
        return new GaugeManifest.SourceFile(path, hash(f, n, "source." + name + ".sha256"));
    }

    private static String hash(JsonFields f, JsonNode obj, String place) {
        JsonNode h = obj.get("sha256");
        if (h == null || !h.isTextual() || !HASH.matcher(h.asText()).matches()) {
            throw f.bad(place, "is " + JsonFields.describe(h) + ", not a SHA-256 in lower-case hex", "restore the manifest");
        }
        return h.asText();
    }

    private static String text(JsonFields f, JsonNode obj, String name) {
        JsonNode n = obj.get(name);
        if (n == null || !n.isTextual()) {
            throw f.bad("\"" + name + "\"", "is " + JsonFields.describe(n) + ", not a string", "restore the manifest");
        }
        return n.asText();
    }

    private static int count(JsonFields f, JsonNode obj, String name) {
        JsonNode n = obj.get(name);
        if (n == null || !n.isIntegralNumber() || !n.canConvertToInt() || n.intValue() < 0) {
            throw f.bad("\"" + name + "\"", "is " + JsonFields.describe(n) + ", not a count", "give an integer >= 0");
        }
        return n.intValue();
    }

    public static ObjectNode toJson(GaugeManifest m) {
        ObjectNode root = JsonFiles.newObject();
        root.put("format", "obverse." + KIND + "/1");
        ObjectNode src = root.putObject("source");
        putSource(src, "problem", m.problem());
        putSource(src, "device", m.device());
        if (m.chains() != null) {
            putSource(src, "chains", m.chains());
        }
        root.put("lock", m.lock());
        root.put("design", m.design());
        root.put("seed", m.seed());
        root.put("generator", m.generator());
        root.put("seed_expansion", m.seedExpansion());
        ObjectNode c = root.putObject("clusters");
        c.put("qubits", m.clusters().qubits());
        c.put("clusters", m.clusters().clusters());
        c.put("free", m.clusters().free());
        c.put("pinned", m.clusters().pinned());
        c.put("locked_couplers", m.clusters().lockedCouplers());
        c.put("pinned_qubits", m.clusters().pinnedQubits());
        root.put("redraws", m.redraws());
        root.put("distinct", m.distinct());
        ArrayNode g = root.putArray("gauges");
        for (GaugeManifest.Entry e : m.gauges()) {
            ObjectNode o = g.addObject();
            o.put("index", e.index());
            ArrayNode fl = o.putArray("flipped");
            for (int id : e.flipped()) {
                fl.add(id);
            }
            o.put("problem", e.problem());
            o.put("sha256", e.sha256());
        }
        return root;
    }

    private static void putSource(ObjectNode src, String name, GaugeManifest.SourceFile s) {
        ObjectNode o = src.putObject(name);
        o.put("path", s.path());
        o.put("sha256", s.sha256());
    }

    public static void write(Path file, boolean force, GaugeManifest m) throws IOException {
        AtomicOutput.writeText(file, force, java.util.List.of(), JsonFiles.text(toJson(m)));
    }
}
