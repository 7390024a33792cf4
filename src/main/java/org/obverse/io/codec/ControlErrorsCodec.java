package org.obverse.io.codec;

import org.obverse.io.json.JsonFields;
import org.obverse.io.json.JsonFiles;
import org.obverse.io.output.AtomicOutput;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Path;
import java.util.Set;
import org.obverse.anneal.ControlErrors;

/**
 * Reads and writes {@code obverse.errors/1}: the control-error model of a simulated device,
 * {@code seed} (integer: the device), {@code field_sigma} and {@code coupling_sigma} (static
 * Gaussian widths, problem units) and optional {@code read_field_sigma} and
 * {@code read_coupling_sigma} (per-read noise, default 0).
 */
public final class ControlErrorsCodec {
    public static final String KIND = "errors";
    private static final Set<String> FIELDS = Set.of("format", "seed", "field_sigma", "coupling_sigma",
            "read_field_sigma", "read_coupling_sigma", "meta");

    private ControlErrorsCodec() {
    }

    /** Reads and validates an errors file. */
    public static ControlErrors read(Path file) {
        return fromJson(file, JsonFiles.read(file, KIND));
    }

    /** Parses the model from a JSON object (file names the source in messages). */
    public static ControlErrors fromJson(Path file, ObjectNode root) {
        JsonFields f = new JsonFields(file);
        f.onlyKeys(root, KIND, FIELDS, "use seed, field_sigma, coupling_sigma, read_field_sigma, read_coupling_sigma;"
                + " free-form data goes under \"meta\"");
        f.optionalMeta(root);
        JsonNode seed = f.required(root, "seed", "give the simulated device's \"seed\" (an integer)");
        if (!seed.isIntegralNumber() || !seed.canConvertToLong()) {
            throw f.bad("\"seed\"", "is " + JsonFields.describe(seed) + ", not an integer", "give a 64-bit integer");
        }
        double field = width(f, root, "field_sigma", true);
        double coupling = width(f, root, "coupling_sigma", true);
        double readField = width(f, root, "read_field_sigma", false);
        double readCoupling = width(f, root, "read_coupling_sigma", false);
        return ControlErrors.of(seed.longValue(), field, coupling, readField, readCoupling);
    }

    private static double width(JsonFields f, ObjectNode root, String name, boolean required) {
        if (!root.has(name)) {
            if (required) {
                throw f.bad("\"" + name + "\"", "is missing", "give a width >= 0 (0 for none)");
            }
            return 0.0;
        }
        double v = f.number(root.get(name), "\"" + name + "\"");
        if (v < 0) {
            throw f.bad("\"" + name + "\"", "is " + v + ", a negative width", "give a width >= 0");
        }
        return v;
    }

    /** The JSON object of a model. */
    public static ObjectNode toJson(ControlErrors e) {
        ObjectNode root = JsonFiles.newObject();
        root.put("format", "obverse." + KIND + "/1");
        root.put("seed", e.deviceSeed());
        root.put("field_sigma", e.fieldSigma());
        root.put("coupling_sigma", e.couplingSigma());
        root.put("read_field_sigma", e.readFieldSigma());
        root.put("read_coupling_sigma", e.readCouplingSigma());
        return root;
    }

    /** Writes an errors file atomically. */
    public static void write(Path file, boolean force, ControlErrors e) throws IOException {
        AtomicOutput.writeText(file, force, java.util.List.of(), JsonFiles.text(toJson(e)));
    }
}
