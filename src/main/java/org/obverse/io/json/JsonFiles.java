package org.obverse.io.json;

import org.obverse.io.BadInputException;
import org.obverse.io.Messages;
import org.obverse.io.TextInput;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.StreamReadFeature;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.json.JsonMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Path;

/**
 * Reading and writing obverse's JSON files: every file carries {@code "format":
 * "obverse.<kind>/1"}; a malformed file, another kind or another version is refused with one
 * line that names the file and the place. Number fields are read strictly (no strings for
 * numbers, no NaN).
 */
public final class JsonFiles {
    private JsonFiles() {
    }

    /**
     * The shared mapper, for writing (doubles in shortest round-trip form); reading goes through
     * {@link JsonTreeReader}. Made on first use: a command that only reads JSON never pays for
     * setting it up.
     */
    public static ObjectMapper mapper() {
        return Mapper.INSTANCE;
    }

    private static final class Mapper {
        static final ObjectMapper INSTANCE = JsonMapper.builder()
                .enable(StreamReadFeature.STRICT_DUPLICATE_DETECTION)
                .enable(DeserializationFeature.FAIL_ON_TRAILING_TOKENS)
                .disable(JsonParser.Feature.ALLOW_NON_NUMERIC_NUMBERS)
                .disable(SerializationFeature.FAIL_ON_EMPTY_BEANS)
                .build();
    }

    /** A new empty JSON object (the node factory every reader and writer here uses). */
    public static ObjectNode newObject() {
        return JsonNodeFactory.instance.objectNode();
    }

    /** A new empty JSON array. */
    public static ArrayNode newArray() {
        return JsonNodeFactory.instance.arrayNode();
    }

    /**
     * Reads a JSON object from a file and checks its format tag. The file is read through
     * {@link TextInput} (a regular file of at most {@link TextInput#MAX_JSON_BYTES}, strict UTF-8).
     */
    public static ObjectNode read(Path file, String kind) {
        String text;
        try {
            text = TextInput.readAll(file, TextInput.MAX_JSON_BYTES);
        } catch (IOException e) {
            throw BadInputException.at(file, "", "cannot be read (" + e.getClass().getSimpleName()
                    + (e.getMessage() == null ? "" : ": " + e.getMessage()) + ")", "check the path and permissions");
        }
        return parse(file, text, kind);
    }

    /** Parses JSON text (named by file, for messages) and checks the format tag. */
    public static ObjectNode parse(Path file, String text, String kind) {
        JsonNode root;
        try {
            root = JsonTreeReader.read(text);
        } catch (JsonProcessingException e) {
            throw syntax(file, e);
        } catch (IOException e) {
            throw BadInputException.at(file, "", "cannot be parsed (" + e.getMessage() + ")", "fix the file");
        }
        return checkFormat(file, root, kind);
    }

    /** Parses JSON bytes (named by file, for messages) and checks the format tag. */
    public static ObjectNode parse(Path file, byte[] bytes, String kind) {
        JsonNode root;
        try {
            root = JsonTreeReader.read(bytes);
        } catch (JsonProcessingException e) {
            throw syntax(file, e);
        } catch (IOException e) {
            throw BadInputException.at(file, "", "cannot be parsed (" + e.getMessage() + ")", "fix the file");
        }
        return checkFormat(file, root, kind);
    }

    private static BadInputException syntax(Path file, JsonProcessingException e) {
        String where = e.getLocation() == null ? ""
                : "line " + e.getLocation().getLineNr() + ", column " + e.getLocation().getColumnNr();
        return BadInputException.at(file, where, "is not valid JSON (" + Messages.excerpt(e.getOriginalMessage()) + ")",
                "fix the file's syntax");
    }

    private static ObjectNode checkFormat(Path file, JsonNode root, String kind) {
        if (root == null || !root.isObject()) {
            throw BadInputException.at(file, "top level", "is not a JSON object", "an obverse file is one JSON object");
        }
        String expected = "obverse." + kind + "/1";
        JsonNode f = root.get("format");
        if (f == null || !f.isTextual()) {
            throw BadInputException.at(file, "\"format\"", "is missing", "an " + kind + " file starts with \"format\": \""
                    + expected + "\"");
        }
        if (!f.asText().equals(expected)) {
            throw BadInputException.at(file, "\"format\"", "is \"" + f.asText() + "\", not \"" + expected + "\"",
                    "pass a file of kind " + kind + " (this version reads " + expected + ")");
        }
        return (ObjectNode) root;
    }

    /** Pretty JSON text, with a final newline. */
    public static String text(JsonNode node) {
        try {
            return mapper().writerWithDefaultPrettyPrinter().writeValueAsString(node) + "\n";
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("cannot serialise JSON", e);
        }
    }

    /** Compact JSON text, used for canonical hashing. */
    public static String compact(JsonNode node) {
        try {
            return mapper().writeValueAsString(node);
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("cannot serialise JSON", e);
        }
    }
}
