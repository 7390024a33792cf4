package org.obverse.io.json;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonParseException;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.core.StreamReadFeature;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;

/**
 * JSON text to a tree of Jackson nodes with the streaming parser alone. Setting up an
 * {@code ObjectMapper} loads and initialises some 300 classes, a fifth of a short command's
 * time, and reading needs none of it. The tree is the one {@code ObjectMapper.readTree} builds
 * under {@link JsonFiles}' rules (its test checks node for node, number types included): whole
 * numbers become int, long or big-integer nodes by size, other numbers double nodes; a
 * duplicate key, NaN or a second top-level value is refused.
 */
final class JsonTreeReader {
    private static final JsonFactory FACTORY = JsonFactory.builder()
            .enable(StreamReadFeature.STRICT_DUPLICATE_DETECTION)
            .enable(StreamReadFeature.USE_FAST_DOUBLE_PARSER)
            .build();
    private static final JsonNodeFactory NODES = JsonNodeFactory.instance;

    private JsonTreeReader() {
    }

    /** The value of JSON text, or null where the text holds no value at all. */
    static JsonNode read(String text) throws IOException {
        try (JsonParser p = FACTORY.createParser(text)) {
            return root(p);
        }
    }

    /** The value of JSON bytes (UTF-8, or UTF-16/32 as detected), or null where there is none. */
    static JsonNode read(byte[] bytes) throws IOException {
        try (JsonParser p = FACTORY.createParser(bytes)) {
            return root(p);
        }
    }

    private static JsonNode root(JsonParser p) throws IOException {
        JsonToken t = p.nextToken();
        if (t == null) {
            return null;
        }
        JsonNode value = value(p, t);
        JsonToken extra = p.nextToken();
        if (extra != null) {
            throw new JsonParseException(p, "Trailing token (of type " + extra + ") found after the top-level value");
        }
        return value;
    }

    // Recursion is bounded: the parser refuses nesting deeper than its limit (1000 levels).
    private static JsonNode value(JsonParser p, JsonToken t) throws IOException {
        if (t == null) {
            throw new JsonParseException(p, "Unexpected end-of-input");
        }
        switch (t) {
            case START_OBJECT: {
                ObjectNode o = NODES.objectNode();
                String name;
                while ((name = p.nextFieldName()) != null) {
                    o.set(name, value(p, p.nextToken()));
                }
                return o;
            }
            case START_ARRAY: {
                ArrayNode a = NODES.arrayNode();
                JsonToken next;
                while ((next = p.nextToken()) != JsonToken.END_ARRAY) {
                    a.add(value(p, next));
                }
                return a;
            }
            case VALUE_STRING:
                return NODES.textNode(p.getText());
            case VALUE_NUMBER_INT:
                switch (p.getNumberType()) {
                    case INT:
                        return NODES.numberNode(p.getIntValue());
                    case LONG:
                        return NODES.numberNode(p.getLongValue());
                    default:
                        return NODES.numberNode(p.getBigIntegerValue());
                }
            case VALUE_NUMBER_FLOAT:
                return NODES.numberNode(p.getDoubleValue());
            case VALUE_TRUE:
                return NODES.booleanNode(true);
            case VALUE_FALSE:
                return NODES.booleanNode(false);
            case VALUE_NULL:
                return NODES.nullNode();
            default:
                throw new JsonParseException(p, "Unexpected token " + t);
        }
    }
}
