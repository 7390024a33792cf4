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
import java.util.Arrays;
import java.util.HashMap;
import java.util.Map;
import java.util.TreeMap;

/** Reads and writes {@code obverse.chains/1}: {@code chains} as [[logical_id, [qubit, …]], …]. */
public final class ChainsCodec {
    public static final String KIND = "chains";

    private ChainsCodec() {
    }

    public static ChainList read(Path file) {
        return fromJson(file, JsonFiles.read(file, KIND));
    }

    public static ChainList fromJson(Path file, ObjectNode root) {
        JsonFields f = new JsonFields(file);
        f.onlyKeys(root, KIND, java.util.Set.of("chains", "meta"), "remove it, or put it under \"meta\"");
        JsonNode chains = f.array(f.required(root, "chains", "give \"chains\": [[logical_id, [qubit, ...]], ...]"),
                "\"chains\"");
        TreeMap<Integer, int[]> byId = new TreeMap<>();
        Map<Integer, Integer> owner = new HashMap<>();
        for (int k = 0; k < chains.size(); k++) {
            String place = "chains[" + k + "]";
            JsonNode t = f.tuple(chains.get(k), place, 2, "[logical_id, [qubit, ...]]");
            int id = f.id(t.get(0), place + "[0]");
            JsonNode qs = f.array(t.get(1), place + "[1]");
            if (qs.size() == 0) {
                throw f.bad(place, "chain of logical " + id + " has no qubits", "give each chain at least one qubit");
            }
            int[] q = new int[qs.size()];
            for (int m = 0; m < q.length; m++) {
                q[m] = f.id(qs.get(m), place + "[1][" + m + "]");
                Integer prev = owner.putIfAbsent(q[m], id);
                if (prev != null) {
                    throw f.bad(place, "qubit " + q[m] + " is in the chains of logical " + prev + " and " + id,
                            "each qubit may belong to one chain only");
                }
            }
            Arrays.sort(q);
            if (byId.put(id, q) != null) {
                throw f.bad(place, "logical " + id + " has a second chain", "give each logical variable one chain");
            }
        }
        int[] ids = byId.keySet().stream().mapToInt(Integer::intValue).toArray();
        return new ChainList(ids, byId.values().toArray(new int[0][]));
    }

    public static ObjectNode toJson(ChainList c) {
        ObjectNode root = JsonFiles.newObject();
        root.put("format", "obverse." + KIND + "/1");
        ArrayNode a = root.putArray("chains");
        int[] ids = c.logicalIds();
        int[][] groups = c.qubitGroups();
        for (int k = 0; k < ids.length; k++) {
            ArrayNode entry = a.addArray();
            entry.add(ids[k]);
            ArrayNode q = entry.addArray();
            for (int id : groups[k]) {
                q.add(id);
            }
        }
        return root;
    }

    public static void write(Path file, boolean force, ChainList c) throws IOException {
        AtomicOutput.writeText(file, force, java.util.List.of(), JsonFiles.text(toJson(c)));
    }

    public static String contentHash(ChainList c) {
        return ContentHash.of(toJson(c));
    }
}
