package org.obverse.io.codec;

import org.obverse.io.BadInputException;
import org.obverse.io.json.JsonFields;
import org.obverse.io.json.JsonFiles;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.table.CsvReader;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Path;
import org.obverse.anneal.AnnealSchedule;

/**
 * Reads and writes {@code obverse.schedule/1}: an anneal schedule as points
 * {@code [[t_us, s], …]} and an optional {@code max_slope_per_us} (default
 * {@link AnnealSchedule#DEFAULT_MAX_SLOPE_PER_MICROSECOND}). The schedule's own rules (see
 * {@link AnnealSchedule#of}) are checked and a broken one is reported with the file's name.
 */
public final class ScheduleCodec {
    public static final String KIND = "schedule";

    private ScheduleCodec() {
    }

    /** Reads and validates a schedule file. */
    public static AnnealSchedule read(Path file) {
        return fromJson(file, JsonFiles.read(file, KIND));
    }

    /** Parses a schedule from a JSON object (file names the source in messages). */
    public static AnnealSchedule fromJson(Path file, ObjectNode root) {
        JsonFields f = new JsonFields(file);
        f.onlyKeys(root, KIND, java.util.Set.of("points", "max_slope_per_us", "meta"),
                "use \"points\" and optionally \"max_slope_per_us\"; free-form data goes under \"meta\"");
        f.optionalMeta(root);
        JsonNode points = f.array(f.required(root, "points", "give \"points\": [[t_us, s], ...]"), "\"points\"");
        double[] t = new double[points.size()];
        double[] s = new double[points.size()];
        for (int k = 0; k < points.size(); k++) {
            String place = "points[" + k + "]";
            JsonNode p = f.tuple(points.get(k), place, 2, "[t_us, s]");
            t[k] = f.number(p.get(0), place + "[0]");
            s[k] = f.number(p.get(1), place + "[1]");
        }
        double slope = root.has("max_slope_per_us")
                ? f.number(root.get("max_slope_per_us"), "\"max_slope_per_us\"")
                : AnnealSchedule.DEFAULT_MAX_SLOPE_PER_MICROSECOND;
        try {
            return AnnealSchedule.of(t, s, slope);
        } catch (IllegalArgumentException e) {
            throw f.bad("\"points\"", e.getMessage(), "fix the schedule");
        }
    }

    /** The JSON object of a schedule (default slope limit, so it is left out). */
    public static ObjectNode toJson(AnnealSchedule schedule) {
        ObjectNode root = JsonFiles.newObject();
        root.put("format", "obverse." + KIND + "/1");
        ArrayNode points = root.putArray("points");
        for (int k = 0; k < schedule.pointCount(); k++) {
            points.addArray().add(schedule.time(k)).add(schedule.fraction(k));
        }
        return root;
    }

    /**
     * The schedule as a table of points, {@code t_us,s} with a header: the form a device
     * submission takes (spec/campaign.md). Numbers are shortest round-trip decimals.
     */
    public static String tableText(AnnealSchedule schedule) {
        StringBuilder s = new StringBuilder("t_us,s\n");
        for (int k = 0; k < schedule.pointCount(); k++) {
            s.append(schedule.time(k)).append(',').append(schedule.fraction(k)).append('\n');
        }
        return s.toString();
    }

    /** Reads a {@code t_us,s} table (default slope limit) and checks the schedule's rules. */
    public static AnnealSchedule readTable(Path file) throws IOException {
        java.util.List<double[]> rows = new java.util.ArrayList<>();
        try (CsvReader csv = CsvReader.open(file)) {
            int[] c = csv.require("a schedule table", "t_us", "s");
            String[] r;
            while ((r = csv.record()) != null) {
                double t;
                double v;
                try {
                    t = Double.parseDouble(r[c[0]]);
                    v = Double.parseDouble(r[c[1]]);
                } catch (NumberFormatException e) {
                    throw BadInputException.at(file, "line " + csv.line(), "is not two numbers t_us,s", "fix the table");
                }
                rows.add(new double[] {t, v});
            }
        }
        double[] t = new double[rows.size()];
        double[] s = new double[rows.size()];
        for (int k = 0; k < t.length; k++) {
            t[k] = rows.get(k)[0];
            s[k] = rows.get(k)[1];
        }
        try {
            return AnnealSchedule.of(t, s);
        } catch (IllegalArgumentException e) {
            throw BadInputException.at(file, "", e.getMessage(), "fix the schedule table");
        }
    }

    /** Writes a schedule file atomically. */
    public static void write(Path file, boolean force, AnnealSchedule schedule) throws IOException {
        AtomicOutput.writeText(file, force, java.util.List.of(), JsonFiles.text(toJson(schedule)));
    }
}
