package org.obverse.io.json;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.Collections;
import java.util.HexFormat;
import java.util.List;

/**
 * Canonical content hashing: SHA-256 (lower-case hex) of the compact JSON of a value with
 * object keys sorted. Codecs first rewrite their content in a canonical order (terms sorted,
 * numbers in shortest round-trip form), so two files that say the same thing hash the same,
 * and any change of a value changes the hash.
 */
public final class ContentHash {
    private ContentHash() {
    }

    /** Hash of a JSON value in canonical form. */
    public static String of(JsonNode node) {
        return sha256(JsonFiles.compact(sorted(node)).getBytes(StandardCharsets.UTF_8));
    }

    /** SHA-256 of bytes, lower-case hex. */
    public static String sha256(byte[] bytes) {
        try {
            return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(bytes));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is missing from this Java runtime", e);
        }
    }

    private static JsonNode sorted(JsonNode n) {
        if (n.isObject()) {
            List<String> keys = new ArrayList<>();
            n.fieldNames().forEachRemaining(keys::add);
            Collections.sort(keys);
            ObjectNode out = JsonFiles.newObject();
            for (String k : keys) {
                out.set(k, sorted(n.get(k)));
            }
            return out;
        }
        if (n.isArray()) {
            ArrayNode out = JsonFiles.newArray();
            for (JsonNode c : n) {
                out.add(sorted(c));
            }
            return out;
        }
        return n;
    }
}
