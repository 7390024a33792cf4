package org.obverse.io.json;

import org.obverse.io.BadInputException;
import com.fasterxml.jackson.databind.JsonNode;
import java.nio.file.Path;

/** Typed access to fields of a parsed JSON file, with one-line errors naming file and place. */
public final class JsonFields {
    private final Path file;

    public JsonFields(Path file) {
        this.file = file;
    }

    public BadInputException bad(String place, String problem, String remedy) {
        return BadInputException.at(file, place, problem, remedy);
    }

    /** Refuses a top-level key other than "format" and the given ones, naming the kind of file. */
    public void onlyKeys(JsonNode root, String kind, java.util.Set<String> allowed, String remedy) {
        for (java.util.Iterator<String> it = root.fieldNames(); it.hasNext(); ) {
            String k = it.next();
            if (!k.equals("format") && !allowed.contains(k)) {
                throw bad("\"" + k + "\"", "is not a field of " + kind + " files", remedy);
            }
        }
    }

    /** Refuses a {@code meta} that is present but not an object (it is free-form, but an object). */
    public void optionalMeta(JsonNode root) {
        JsonNode m = root.get("meta");
        if (m != null && !m.isObject()) {
            throw bad("\"meta\"", "is " + describe(m) + ", not an object", "put free-form data in an object");
        }
    }

    public JsonNode required(JsonNode obj, String name, String remedy) {
        JsonNode n = obj.get(name);
        if (n == null || n.isNull()) {
            throw bad("\"" + name + "\"", "is missing", remedy);
        }
        return n;
    }

    public JsonNode array(JsonNode node, String place) {
        if (!node.isArray()) {
            throw bad(place, "is not an array", "give a JSON array");
        }
        return node;
    }

    public double number(JsonNode node, String place) {
        if (node == null || !node.isNumber()) {
            throw bad(place, "is " + describe(node) + ", not a number", "give a finite number");
        }
        double v = node.doubleValue();
        if (!Double.isFinite(v)) {
            throw bad(place, "is " + node.asText() + ", not a finite number", "give a finite number");
        }
        return v;
    }

    public int id(JsonNode node, String place) {
        if (node == null || !node.isIntegralNumber() || !node.canConvertToInt()) {
            throw bad(place, "is " + describe(node) + ", not an integer id", "ids are integers >= 0");
        }
        int v = node.intValue();
        if (v < 0) {
            throw bad(place, "is " + v + ", a negative id", "ids are integers >= 0");
        }
        return v;
    }

    public JsonNode tuple(JsonNode node, String place, int size, String shape) {
        if (!node.isArray() || node.size() != size) {
            throw bad(place, "is " + describe(node) + ", not " + shape, "write each entry as " + shape);
        }
        return node;
    }

    /** What to do with one entry of a list of tuples: its place ({@code key[k]}) and the tuple. */
    @FunctionalInterface
    public interface TupleReader {
        void read(String place, JsonNode tuple);
    }

    /**
     * Each entry of {@code list}, the value of {@code key}, checked to be a tuple of size
     * entries ({@link #tuple}) and handed to reader with its place {@code key[k]}.
     */
    public void eachTuple(JsonNode list, String key, int size, String shape, TupleReader reader) {
        JsonNode a = array(list, "\"" + key + "\"");
        for (int k = 0; k < a.size(); k++) {
            String place = key + "[" + k + "]";
            reader.read(place, tuple(a.get(k), place, size, shape));
        }
    }

    public double[] range(JsonNode node, String place) {
        JsonNode t = tuple(node, place, 2, "[lo, hi]");
        double lo = number(t.get(0), place + "[0]");
        double hi = number(t.get(1), place + "[1]");
        if (lo > hi) {
            throw bad(place, "is [" + lo + ", " + hi + "] with lo > hi", "give [lo, hi] with lo <= hi");
        }
        return new double[] {lo, hi};
    }

    public static String describe(JsonNode n) {
        if (n == null) {
            return "missing";
        }
        String t = n.toString();
        return t.length() > 40 ? t.substring(0, 37) + "..." : t;
    }
}
