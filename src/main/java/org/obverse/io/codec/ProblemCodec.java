package org.obverse.io.codec;

import org.obverse.io.json.ContentHash;
import org.obverse.io.json.JsonFields;
import org.obverse.io.json.JsonFiles;
import org.obverse.io.output.AtomicOutput;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Path;
import java.util.BitSet;
import org.obverse.model.BinaryBuilder;
import org.obverse.model.BinaryProblem;
import org.obverse.model.InvalidProblemException;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;

/**
 * Reads and writes {@code obverse.problem/1}. Written files list terms in ascending order,
 * omit zero fields and zero linear terms, and name in {@code variables} the ids that have no
 * other term, so a problem written and read back is equal to the original.
 */
public final class ProblemCodec {
    public static final String KIND = "problem";

    private ProblemCodec() {
    }

    /**
     * Reads and validates a problem file: {@code obverse.problem/1} JSON, or by its ending an
     * {@code .npy} Q matrix or an {@code .npz} archive of h and J ({@link NpyProblemCodec}).
     */
    public static ProblemFile read(Path file) {
        Path name = file.getFileName();
        String lower = name == null ? "" : name.toString().toLowerCase(java.util.Locale.ROOT);
        if (lower.endsWith(".npy")) {
            return NpyProblemCodec.readMatrix(file);
        }
        if (lower.endsWith(".npz")) {
            return NpyProblemCodec.readArchive(file);
        }
        return fromJson(file, JsonFiles.read(file, KIND));
    }

    /** Parses a problem from a JSON object (file names the source in messages). */
    public static ProblemFile fromJson(Path file, ObjectNode root) {
        JsonFields f = new JsonFields(file);
        JsonNode d = f.required(root, "domain", "give \"domain\": \"spin\" or \"binary\"");
        ObjectNode meta = null;
        if (root.has("meta") && !root.get("meta").isNull()) {
            if (!root.get("meta").isObject()) {
                throw f.bad("\"meta\"", "is not an object", "give meta as a JSON object or leave it out");
            }
            meta = (ObjectNode) root.get("meta").deepCopy();
        }
        double offset = root.has("offset") ? f.number(root.get("offset"), "\"offset\"") : 0.0;
        f.onlyKeys(root, KIND, java.util.Set.of("domain", "h", "J", "Q", "offset", "variables", "meta"),
                "remove it, or put it under \"meta\"");
        String domain = d.asText();
        if (!d.isTextual() || !(domain.equals("spin") || domain.equals("binary"))) {
            throw f.bad("\"domain\"", "is " + JsonFields.describe(d) + "", "give \"spin\" or \"binary\"");
        }
        if (domain.equals("spin")) {
            if (root.has("Q")) {
                throw f.bad("\"Q\"", "is a binary term in a spin problem", "use \"h\" and \"J\", or set \"domain\": \"binary\"");
            }
            IsingBuilder b = IsingProblem.builder();
            b.offset(offset);
            if (root.has("h")) {
                f.eachTuple(root.get("h"), "h", 2, "[i, h_i]", (place, t) -> {
                    int id = f.id(t.get(0), place + "[0]");
                    double v = f.number(t.get(1), place + "[1]");
                    term(f, place, () -> b.field(id, v));
                });
            }
            if (root.has("J")) {
                f.eachTuple(root.get("J"), "J", 3, "[i, j, J_ij]", (place, t) -> pair(f, place, t, b::coupling));
            }
            variables(f, root, b::variable);
            return ProblemFile.of(b.build(), meta);
        }
        if (root.has("h") || root.has("J")) {
            throw f.bad(root.has("h") ? "\"h\"" : "\"J\"", "is a spin term in a binary problem",
                    "use \"Q\", or set \"domain\": \"spin\"");
        }
        BinaryBuilder b = BinaryProblem.builder();
        b.offset(offset);
        if (root.has("Q")) {
            f.eachTuple(root.get("Q"), "Q", 3, "[i, j, Q_ij]", (place, t) -> pair(f, place, t, b::term));
        }
        variables(f, root, b::variable);
        return ProblemFile.of(b.build(), meta);
    }

    /** A term on a pair of variables (or on one, i = j, where the domain allows). */
    @FunctionalInterface
    private interface PairTerm {
        void add(int i, int j, double value);
    }

    /** The pair term [i, j, v] at place. */
    private static void pair(JsonFields f, String place, JsonNode t, PairTerm add) {
        int a = f.id(t.get(0), place + "[0]");
        int c = f.id(t.get(1), place + "[1]");
        double v = f.number(t.get(2), place + "[2]");
        term(f, place, () -> add.add(a, c, v));
    }

    private static void term(JsonFields f, String place, Runnable add) {
        try {
            add.run();
        } catch (InvalidProblemException e) {
            throw f.bad(place, e.getMessage(), "fix or remove the term");
        }
    }

    private static void variables(JsonFields f, ObjectNode root, java.util.function.IntConsumer add) {
        if (root.has("variables")) {
            JsonNode v = f.array(root.get("variables"), "\"variables\"");
            for (int k = 0; k < v.size(); k++) {
                add.accept(f.id(v.get(k), "variables[" + k + "]"));
            }
        }
    }

    /** The JSON object of a spin problem. */
    public static ObjectNode toJson(IsingProblem p, ObjectNode meta) {
        ObjectNode root = JsonFiles.newObject();
        root.put("format", "obverse." + KIND + "/1");
        root.put("domain", "spin");
        VariableIndex ids = p.variables();
        BitSet named = new BitSet(p.size());
        ArrayNode h = root.putArray("h");
        for (int k = 0; k < p.size(); k++) {
            if (p.field(k) != 0.0) {
                h.addArray().add(ids.id(k)).add(p.field(k));
                named.set(k);
            }
        }
        ArrayNode j = root.putArray("J");
        for (int e = 0; e < p.edgeCount(); e++) {
            j.addArray().add(ids.id(p.edgeU(e))).add(ids.id(p.edgeV(e))).add(p.coupling(e));
            named.set(p.edgeU(e));
            named.set(p.edgeV(e));
        }
        finish(root, ids, named, p.offset(), meta);
        return root;
    }

    /** The JSON object of a binary problem. */
    public static ObjectNode toJson(BinaryProblem p, ObjectNode meta) {
        ObjectNode root = JsonFiles.newObject();
        root.put("format", "obverse." + KIND + "/1");
        root.put("domain", "binary");
        VariableIndex ids = p.variables();
        BitSet named = new BitSet(p.size());
        ArrayNode q = root.putArray("Q");
        // Linear and pair terms in one ascending (i, j) list: (k, k) sorts before (k, j > k).
        int e = 0;
        for (int k = 0; k < p.size(); k++) {
            if (p.linear(k) != 0.0) {
                q.addArray().add(ids.id(k)).add(ids.id(k)).add(p.linear(k));
                named.set(k);
            }
            for (; e < p.edgeCount() && p.edgeU(e) == k; e++) {
                q.addArray().add(ids.id(k)).add(ids.id(p.edgeV(e))).add(p.quadratic(e));
                named.set(k);
                named.set(p.edgeV(e));
            }
        }
        finish(root, ids, named, p.offset(), meta);
        return root;
    }

    private static void finish(ObjectNode root, VariableIndex ids, BitSet named, double offset, ObjectNode meta) {
        root.put("offset", offset);
        if (named.cardinality() < ids.size()) {
            ArrayNode v = root.putArray("variables");
            for (int k = named.nextClearBit(0); k < ids.size(); k = named.nextClearBit(k + 1)) {
                v.add(ids.id(k));
            }
        }
        if (meta != null) {
            root.set("meta", meta.deepCopy());
        }
    }

    /** The JSON object of a problem file. */
    public static ObjectNode toJson(ProblemFile pf) {
        return pf.ising() != null ? toJson(pf.ising(), pf.meta()) : toJson(pf.binary(), pf.meta());
    }

    /** Writes a problem file atomically. */
    public static void write(Path file, boolean force, ProblemFile pf) throws IOException {
        AtomicOutput.writeText(file, force, java.util.List.of(), JsonFiles.text(toJson(pf)));
    }

    /** Keys of the embedding block; any one of the first three marks a problem as physical. */
    private static final java.util.List<String> EMBEDDING_MARKS = java.util.List.of("chain_coupling", "chain_couplers",
            "chain_energy");
    private static final String GAUGE = "gauge";

    /** The physical problem file of an embedding: the problem with the embedding block as its meta. */
    public static ProblemFile embedded(IsingProblem physical, EmbeddingMeta m) {
        ObjectNode meta = JsonFiles.newObject();
        meta.put("scale", m.scale());
        meta.put("chain_coupling", m.chainCoupling());
        meta.put("chain_coupling_mode", m.chainCouplingMode());
        meta.put("chain_couplers", m.chainCouplers());
        meta.put("chain_energy", m.chainEnergy());
        meta.put("logical_offset", m.logicalOffset());
        meta.put("logical_variables", m.logicalVariables());
        meta.put("longest_chain", m.longestChain());
        return ProblemFile.of(physical, meta);
    }

    /**
     * A gauged problem file: the gauged problem with the source's meta kept and the gauge block
     * added as {@code meta.gauge} (replacing one the source had, in its place).
     */
    public static ProblemFile gauged(ProblemFile source, IsingProblem gauged, GaugeMeta g) {
        ObjectNode meta = source.meta() == null ? JsonFiles.newObject() : source.meta().deepCopy();
        ObjectNode gm = meta.putObject(GAUGE);
        gm.put("index", g.index());
        gm.put("source_sha256", g.sourceSha256());
        gm.put("flipped_count", g.flippedCount());
        return ProblemFile.of(gauged, meta);
    }

    /**
     * Whether a problem's meta records an embedding (any of {@code chain_coupling},
     * {@code chain_couplers}, {@code chain_energy}): its energies are then physical ones. A
     * gauged problem keeps its source's embedding block.
     */
    public static boolean recordsEmbedding(ProblemFile pf) {
        if (pf.meta() != null) {
            for (String key : EMBEDDING_MARKS) {
                if (pf.meta().has(key)) {
                    return true;
                }
            }
        }
        return false;
    }

    /**
     * The embedding block of a problem read from file, or empty where its meta records none.
     *
     * @throws org.obverse.io.BadInputException where the block is there but a field is missing or of the wrong type
     */
    public static java.util.Optional<EmbeddingMeta> embedding(Path file, ProblemFile pf) {
        if (!recordsEmbedding(pf)) {
            return java.util.Optional.empty();
        }
        JsonFields f = new JsonFields(file);
        ObjectNode m = pf.meta();
        String fix = "write the problem again with 'obverse embed', or remove the embedding keys from meta";
        return java.util.Optional.of(new EmbeddingMeta(
                f.number(m.get("scale"), "\"meta\".\"scale\""),
                f.number(m.get("chain_coupling"), "\"meta\".\"chain_coupling\""),
                text(f, m, "chain_coupling_mode", "\"meta\"", fix),
                count(f, m, "chain_couplers", "\"meta\"", fix),
                f.number(m.get("chain_energy"), "\"meta\".\"chain_energy\""),
                f.number(m.get("logical_offset"), "\"meta\".\"logical_offset\""),
                count(f, m, "logical_variables", "\"meta\"", fix),
                count(f, m, "longest_chain", "\"meta\"", fix)));
    }

    /**
     * The gauge block of a problem read from file, or empty where its meta has none.
     *
     * @throws org.obverse.io.BadInputException where the block is there but a field is missing or of the wrong type
     */
    public static java.util.Optional<GaugeMeta> gauge(Path file, ProblemFile pf) {
        if (pf.meta() == null || !pf.meta().has(GAUGE)) {
            return java.util.Optional.empty();
        }
        JsonFields f = new JsonFields(file);
        JsonNode g = pf.meta().get(GAUGE);
        String at = "\"meta\".\"gauge\"";
        String fix = "gauge the source problem again with 'obverse gauge', or remove meta.gauge";
        if (!g.isObject()) {
            throw f.bad(at, "is " + JsonFields.describe(g) + ", not an object", fix);
        }
        return java.util.Optional.of(new GaugeMeta(count(f, g, "index", at, fix), text(f, g, "source_sha256", at, fix),
                count(f, g, "flipped_count", at, fix)));
    }

    private static String text(JsonFields f, JsonNode obj, String key, String at, String fix) {
        JsonNode n = obj.get(key);
        if (n == null || !n.isTextual()) {
            throw f.bad(at + ".\"" + key + "\"", "is " + JsonFields.describe(n) + ", not a string", fix);
        }
        return n.asText();
    }

    private static int count(JsonFields f, JsonNode obj, String key, String at, String fix) {
        JsonNode n = obj.get(key);
        if (n == null || !n.isIntegralNumber() || !n.canConvertToInt() || n.intValue() < 0) {
            throw f.bad(at + ".\"" + key + "\"", "is " + JsonFields.describe(n) + ", not a count >= 0", fix);
        }
        return n.intValue();
    }

    /**
     * SHA-256 of the problem's canonical form: what the manifest binds (layout and meta order
     * don't matter). An {@code .npy} or {@code .npz} problem hashes as the problem it decodes to,
     * so it hashes the same as the JSON file of the same problem without meta.
     */
    public static String contentHash(ProblemFile pf) {
        return ContentHash.of(toJson(pf));
    }
}
