package org.obverse.io.json;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.TreeMap;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

class ContentHashTest extends QuietTest {

    @Test
    void sha256MatchesThePublishedTestVectors() {
        // FIPS 180-2 (NIST, 2002), Appendix B.1 and B.2: "abc" and the 448-bit message.
        assertThat(ContentHash.sha256("abc".getBytes(StandardCharsets.US_ASCII)))
                .isEqualTo("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
        assertThat(ContentHash.sha256(
                "abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq".getBytes(StandardCharsets.US_ASCII)))
                .isEqualTo("248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
    }

    @Test
    void hashIsTheDigestOfCompactJsonWithSortedKeys() {
        // Differential check against a hand-built serialisation: for objects of integer and
        // ASCII string values, the canonical text is '{' + sorted "key":value pairs + '}' with no
        // white space (common practice for canonical JSON, no source for our exact layout).
        Seeds.forEachCase(200, 0x6a5b_11L, (rng, seed) -> {
            TreeMap<String, Object> values = randomFlatObject(rng);
            StringBuilder canonical = new StringBuilder("{");
            values.forEach((k, v) -> {
                if (canonical.length() > 1) {
                    canonical.append(',');
                }
                canonical.append('"').append(k).append("\":");
                canonical.append(v instanceof String ? "\"" + v + "\"" : v.toString());
            });
            canonical.append('}');
            JsonNode shuffled = JsonFiles.mapper().valueToTree(shuffledCopy(values, rng));
            assertThat(ContentHash.of(shuffled))
                    .as("seed %d", seed)
                    .isEqualTo(ContentHash.sha256(canonical.toString().getBytes(StandardCharsets.UTF_8)));
        });
    }

    @Test
    void layoutAndKeyOrderNeverChangeTheHashAndAnyValueDoes() throws Exception {
        Seeds.forEachCase(200, 0x6a5b_12L, (rng, seed) -> {
            TreeMap<String, Object> values = randomFlatObject(rng);
            String pretty = JsonFiles.mapper().writerWithDefaultPrettyPrinter()
                    .writeValueAsString(shuffledCopy(values, rng));
            String compact = JsonFiles.mapper().writeValueAsString(values);
            String base = ContentHash.of(JsonFiles.mapper().readTree(compact));
            assertThat(ContentHash.of(JsonFiles.mapper().readTree(pretty))).as("seed %d", seed).isEqualTo(base);

            // Change one value by one unit: the hash must change.
            List<String> keys = new ArrayList<>(values.keySet());
            String key = keys.get(rng.nextInt(keys.size()));
            TreeMap<String, Object> changed = new TreeMap<>(values);
            Object v = changed.get(key);
            changed.put(key, v instanceof String ? v + "x" : ((Integer) v) + 1);
            assertThat(ContentHash.of(JsonFiles.mapper().valueToTree(changed))).as("seed %d", seed).isNotEqualTo(base);
        });
    }

    @Test
    void nestedObjectsAreSortedAtEveryDepthButArraysKeepTheirOrder() throws Exception {
        String a = "{\"b\": {\"y\": 1, \"x\": [3, 2]}, \"a\": 0}";
        String b = "{\"a\": 0, \"b\": {\"x\": [3, 2], \"y\": 1}}";
        String swapped = "{\"a\": 0, \"b\": {\"x\": [2, 3], \"y\": 1}}";
        assertThat(ContentHash.of(JsonFiles.mapper().readTree(a))).isEqualTo(ContentHash.of(JsonFiles.mapper().readTree(b)));
        assertThat(ContentHash.of(JsonFiles.mapper().readTree(a))).isNotEqualTo(ContentHash.of(JsonFiles.mapper().readTree(swapped)));
        assertThat(ContentHash.of(JsonFiles.mapper().readTree(a))).isEqualTo(ContentHash.sha256(
                "{\"a\":0,\"b\":{\"x\":[3,2],\"y\":1}}".getBytes(StandardCharsets.UTF_8)));
    }

    private static TreeMap<String, Object> randomFlatObject(UniformRandomProvider rng) {
        TreeMap<String, Object> values = new TreeMap<>();
        int n = 1 + rng.nextInt(8);
        while (values.size() < n) {
            StringBuilder key = new StringBuilder();
            int len = 1 + rng.nextInt(6);
            for (int i = 0; i < len; i++) {
                key.append((char) ('a' + rng.nextInt(26)));
            }
            Object value = rng.nextBoolean() ? (Object) (rng.nextInt(2001) - 1000) : "v" + rng.nextInt(100);
            values.put(key.toString(), value);
        }
        return values;
    }

    private static java.util.LinkedHashMap<String, Object> shuffledCopy(TreeMap<String, Object> values,
            UniformRandomProvider rng) {
        List<String> keys = new ArrayList<>(values.keySet());
        for (int i = keys.size() - 1; i > 0; i--) {
            int j = rng.nextInt(i + 1);
            String t = keys.get(i);
            keys.set(i, keys.get(j));
            keys.set(j, t);
        }
        java.util.LinkedHashMap<String, Object> out = new java.util.LinkedHashMap<>();
        keys.forEach(k -> out.put(k, values.get(k)));
        return out;
    }
}
