package org.obverse.io.json;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.charset.StandardCharsets;
import java.util.Iterator;
import java.util.Map;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

/**
 * The streaming tree reader against the reference: jackson-databind's own
 * {@code ObjectMapper.readTree} under the same rules (duplicate keys, NaN and trailing values
 * refused). Node for node, with the same node classes (so int, long, big-integer and double
 * nodes fall where the mapper puts them), on generated documents, and the same verdict on
 * broken ones.
 */
class JsonTreeReaderTest extends QuietTest {
    private static final ObjectMapper REFERENCE = JsonFiles.mapper();

    // Number spellings chosen to cross every type boundary: int/long/big-integer edges, signed
    // zeros, exponents, values that overflow or underflow a double, long fractions.
    private static final String[] NUMBERS = {
        "0", "-0", "1", "-1", "7", "2147483647", "2147483648", "-2147483648", "-2147483649",
        "9223372036854775807", "9223372036854775808", "-9223372036854775808", "-9223372036854775809",
        "123456789012345678901234567890", "0.0", "-0.0", "0.1", "1.5", "-2.25", "1e3", "1E3", "1e+3",
        "1e-3", "-1.5e-7", "2.5E10", "1e308", "1e309", "-1e400", "4.9e-324", "1e-400",
        "0.30000000000000004", "3.141592653589793238462643383279", "100000000000000000000.0",
    };
    private static final String[] STRINGS = {
        "", "a", "format", "obverse.problem/1", "q\\\"uote", "back\\\\slash", "tab\\t", "\\u00e9t\\u00e9",
        "\\ud83c\\udf0a", "caf\u00e9", "line\\nbreak", "x y z",
    };

    @Test
    void buildsTheMappersTreeNodeForNode() {
        Seeds.forEachCase(400, 0x75ee_0001L, (rng, seed) -> {
            String text = document(rng);
            JsonNode expected = REFERENCE.readTree(text);
            JsonNode fromText = JsonTreeReader.read(text);
            JsonNode fromBytes = JsonTreeReader.read(text.getBytes(StandardCharsets.UTF_8));
            assertSameTree(fromText, expected, "$", text);
            assertSameTree(fromBytes, expected, "$", text);
        });
    }

    @Test
    void everyNumberSpellingGetsTheMappersNode() throws Exception {
        for (String n : NUMBERS) {
            for (String text : new String[] {"[" + n + "]", "{\"v\":" + n + "}"}) {
                assertSameTree(JsonTreeReader.read(text), REFERENCE.readTree(text), "$", text);
            }
        }
    }

    @Test
    void refusesWhatTheMapperRefuses() throws Exception {
        String[] broken = {
            "{\"a\":1,\"a\":2}", "{\"a\":{\"b\":1,\"b\":1}}", "[NaN]", "{\"v\":Infinity}", "[-Infinity]",
            "{} {}", "[1] 2", "{\"a\":1}x", "{\"a\":", "[1,", "[1,]", "{\"a\" 1}", "{a:1}", "['a']",
            "[01]", "[1.]", "[.5]", "[+1]", "\"unterminated", "{\"a\":tru}", "[1 2]", "}", "]",
        };
        for (String text : broken) {
            assertThat(fails(() -> REFERENCE.readTree(text))).as("reference on %s", text).isTrue();
            assertThat(fails(() -> JsonTreeReader.read(text))).as("reader on %s", text).isTrue();
        }
        // No value at all is not an error for either: the mapper gives a missing node, we null,
        // and JsonFiles refuses both as "not a JSON object".
        assertThat(JsonTreeReader.read("  \n")).isNull();
        assertThat(REFERENCE.readTree("  \n").isMissingNode()).isTrue();
    }

    @Test
    void truncatedDocumentsFailExactlyWhereTheMapperFails() {
        Seeds.forEachCase(200, 0x75ee_0002L, (rng, seed) -> {
            String text = document(rng);
            String cut = text.substring(0, rng.nextInt(text.length() + 1));
            boolean referenceFails = fails(() -> REFERENCE.readTree(cut));
            assertThat(fails(() -> JsonTreeReader.read(cut))).as("%s", cut).isEqualTo(referenceFails);
        });
    }

    private interface Parse {
        Object run() throws Exception;
    }

    private static boolean fails(Parse p) {
        try {
            p.run();
            return false;
        } catch (Exception e) {
            return true;
        }
    }

    private static void assertSameTree(JsonNode actual, JsonNode expected, String path, String text) {
        assertThat(actual).as("%s in %s", path, text).isNotNull();
        assertThat(actual.getClass()).as("node class at %s in %s", path, text).isEqualTo(expected.getClass());
        if (expected.isObject()) {
            assertThat(actual.size()).as("size at %s", path).isEqualTo(expected.size());
            Iterator<Map.Entry<String, JsonNode>> a = actual.fields();
            Iterator<Map.Entry<String, JsonNode>> e = expected.fields();
            while (e.hasNext()) {
                Map.Entry<String, JsonNode> x = e.next();
                Map.Entry<String, JsonNode> y = a.next();
                assertThat(y.getKey()).as("key order at %s", path).isEqualTo(x.getKey());
                assertSameTree(y.getValue(), x.getValue(), path + "." + x.getKey(), text);
            }
        } else if (expected.isArray()) {
            assertThat(actual.size()).as("size at %s", path).isEqualTo(expected.size());
            for (int i = 0; i < expected.size(); i++) {
                assertSameTree(actual.get(i), expected.get(i), path + "[" + i + "]", text);
            }
        } else {
            assertThat(actual).as("value at %s in %s", path, text).isEqualTo(expected);
        }
    }

    private static String document(UniformRandomProvider rng) {
        StringBuilder b = new StringBuilder();
        value(rng, b, 0, true);
        return b.toString();
    }

    private static void value(UniformRandomProvider rng, StringBuilder b, int depth, boolean container) {
        int kind = container ? rng.nextInt(2) : rng.nextInt(depth > 5 ? 5 : 7);
        switch (kind) {
            case 0:
                b.append('{').append(space(rng));
                int fields = rng.nextInt(5);
                for (int i = 0; i < fields; i++) {
                    if (i > 0) {
                        b.append(',').append(space(rng));
                    }
                    // Keys unique within the object: the index makes them so.
                    b.append('"').append(STRINGS[rng.nextInt(STRINGS.length)]).append(i).append('"').append(space(rng))
                            .append(':').append(space(rng));
                    value(rng, b, depth + 1, false);
                }
                b.append(space(rng)).append('}');
                break;
            case 1:
                b.append('[');
                int items = rng.nextInt(6);
                for (int i = 0; i < items; i++) {
                    if (i > 0) {
                        b.append(',').append(space(rng));
                    }
                    value(rng, b, depth + 1, false);
                }
                b.append(']');
                break;
            case 2:
                b.append('"').append(STRINGS[rng.nextInt(STRINGS.length)]).append('"');
                break;
            case 3:
            case 4:
                b.append(rng.nextBoolean() ? NUMBERS[rng.nextInt(NUMBERS.length)] : randomNumber(rng));
                break;
            case 5:
                b.append(rng.nextBoolean() ? "true" : rng.nextBoolean() ? "false" : "null");
                break;
            default:
                value(rng, b, depth + 1, true);
        }
    }

    private static String randomNumber(UniformRandomProvider rng) {
        switch (rng.nextInt(4)) {
            case 0:
                return Integer.toString(rng.nextInt());
            case 1:
                return Long.toString(rng.nextLong());
            case 2:
                return Double.toString(rng.nextDouble() * Math.pow(10, rng.nextInt(40) - 20) * (rng.nextBoolean() ? 1 : -1));
            default:
                return (rng.nextBoolean() ? "-" : "") + (1 + rng.nextInt(9)) + "." + Math.abs(rng.nextLong()) + "e"
                        + (rng.nextInt(700) - 350);
        }
    }

    private static String space(UniformRandomProvider rng) {
        return rng.nextInt(4) == 0 ? " \n\t".substring(0, 1 + rng.nextInt(3)) : "";
    }
}
