package org.obverse.io.codec;

import org.obverse.io.BadInputException;
import org.obverse.io.json.JsonFields;
import org.obverse.io.json.JsonFiles;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.math.BigDecimal;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.Iterator;
import java.util.List;
import java.util.Set;
import java.util.regex.Pattern;
import org.obverse.anneal.PathIntegralSettings;
import org.obverse.anneal.SamplerSettings;

/**
 * Reads {@code obverse.campaign/1} (spec/campaign.md) into a {@link CampaignPlan}. Every
 * refusal names the key path, as in {@code schedules.pause_s[2]: 1.3 is outside (0, 1)}; files
 * the plan names must exist. Checks that need the device (chain couplings inside its range)
 * are made where the device is read, by the prepare step.
 */
public final class CampaignPlanCodec {
    /** The sampler kernels a plan may name: those of the sample command. */
    private static final String[] KERNELS = java.util.Arrays.stream(SamplerSettings.Kernel.values())
            .map(SamplerSettings.Kernel::label).toArray(String[]::new);

    public static final String KIND = "campaign";

    /** Names that become file names: letters, digits, '.', '_' and '-', not starting with '.'. */
    private static final Pattern NAME = Pattern.compile("[A-Za-z0-9_-][A-Za-z0-9._-]{0,63}");

    private static final Set<String> TOP = Set.of("name", "instances", "device", "chains", "chain_couplings",
            "chain_coupling_mode", "schedules", "gauges", "reads", "decode", "sampler", "seed", "meta");

    private final Path file;
    private final Path base;

    private CampaignPlanCodec(Path file) {
        this.file = file;
        Path parent = file.toAbsolutePath().getParent();
        this.base = parent == null ? Path.of("") : parent;
    }

    /** Reads and checks a plan file. */
    public static CampaignPlan read(Path file) {
        return new CampaignPlanCodec(file).parse(JsonFiles.read(file, KIND));
    }

    /** The plan in a parsed JSON object (file names the source and anchors relative paths). */
    public static CampaignPlan fromJson(Path file, ObjectNode root) {
        return new CampaignPlanCodec(file).parse(root);
    }

    /**
     * New names for the files a plan names, relative to the folder of a copy of the plan (the
     * prepare step copies every input into the campaign folder and renames them).
     *
     * @param problems     one per instance, in plan order
     * @param device       the device file's
     * @param chains       the chains file's, null where the plan names none
     * @param schedules    one per listed schedule file, in plan order; empty for a grid of schedules
     * @param errors       the sampler's control-error model's, null where it names none
     * @param energyScales the sampler's energy-scales table's, null where it names none
     */
    public record FileNames(List<String> problems, String device, String chains, List<String> schedules,
                            String errors, String energyScales) {
        public FileNames {
            problems = List.copyOf(problems);
            schedules = List.copyOf(schedules);
        }
    }

    /**
     * The text of a plan's file with its files renamed: the document as the plan's file holds
     * it (keys in its order, {@code meta} and every other value kept), only the file names
     * replaced.
     *
     * @throws BadInputException where the plan's file no longer matches the plan read from it
     */
    public static String relocatedText(CampaignPlan plan, FileNames names) {
        ObjectNode root = JsonFiles.read(plan.file(), KIND);
        CampaignPlanCodec c = new CampaignPlanCodec(plan.file());
        JsonNode instances = root.get("instances");
        if (instances == null || !instances.isArray() || instances.size() != names.problems().size()
                || plan.instances().size() != names.problems().size()) {
            throw c.bad("instances", "no longer lists " + plan.instances().size() + " instances",
                    "leave the plan unchanged while a campaign is prepared from it");
        }
        for (int k = 0; k < names.problems().size(); k++) {
            ((ObjectNode) instances.get(k)).put("problem", names.problems().get(k));
        }
        root.put("device", names.device());
        if (names.chains() != null) {
            root.put("chains", names.chains());
        }
        JsonNode schedules = root.get("schedules");
        if (schedules != null && schedules.isArray()) {
            if (schedules.size() != names.schedules().size()) {
                throw c.bad("schedules", "no longer lists " + names.schedules().size() + " schedule files",
                        "leave the plan unchanged while a campaign is prepared from it");
            }
            for (int k = 0; k < names.schedules().size(); k++) {
                ((ObjectNode) schedules.get(k)).put("file", names.schedules().get(k));
            }
        }
        JsonNode sampler = root.get("sampler");
        if (sampler != null && sampler.isObject()) {
            if (names.errors() != null) {
                ((ObjectNode) sampler).put("errors", names.errors());
            }
            if (names.energyScales() != null) {
                ((ObjectNode) sampler).put("energy_scales", names.energyScales());
            }
        }
        return JsonFiles.text(root);
    }

    private BadInputException bad(String key, String problem, String remedy) {
        return BadInputException.at(file, key, problem, remedy);
    }

    private CampaignPlan parse(ObjectNode root) {
        only(root, "", TOP);
        List<CampaignPlan.Instance> instances = instances(required(root, "instances"));
        Path device = existingFile(required(root, "device"), "device");
        Path chains = root.hasNonNull("chains") ? existingFile(root.get("chains"), "chains") : null;
        double[] couplings = chainCouplings(required(root, "chain_couplings"));
        String mode = root.has("chain_coupling_mode")
                ? oneOf(root.get("chain_coupling_mode"), "chain_coupling_mode", "uniform", "length", "degree")
                : "uniform";
        List<CampaignPlan.Schedule> schedules = schedules(required(root, "schedules"));
        CampaignPlan.Gauges gauges = gauges(required(root, "gauges"));
        int reads = positiveInt(required(root, "reads"), "reads");
        String decode = root.has("decode") ? oneOf(root.get("decode"), "decode", "discard", "majority", "descend")
                : "majority";
        CampaignPlan.Sampler sampler = root.has("sampler") ? sampler(root.get("sampler"))
                : new CampaignPlan.Sampler("sa", 1000.0, "exact", null, null, null, Double.NaN, 0);
        JsonNode seed = required(root, "seed");
        if (!seed.isIntegralNumber() || !seed.canConvertToLong()) {
            throw bad("seed", "is " + JsonFields.describe(seed) + ", not a whole number", "give an integer seed");
        }
        if (root.has("name") && !root.get("name").isTextual()) {
            throw bad("name", "is not a string", "give the campaign a text label");
        }
        return new CampaignPlan(file, instances, device, chains, couplings, mode, schedules, gauges, reads, decode,
                sampler, seed.longValue());
    }

    private List<CampaignPlan.Instance> instances(JsonNode node) {
        if (!node.isArray() || node.isEmpty()) {
            throw bad("instances", "is " + JsonFields.describe(node) + ", not a non-empty array",
                    "list the problems as [{\"name\": ..., \"problem\": ...}, ...]");
        }
        List<CampaignPlan.Instance> out = new ArrayList<>();
        Set<String> names = new HashSet<>();
        for (int k = 0; k < node.size(); k++) {
            String key = "instances[" + k + "]";
            JsonNode i = object(node.get(k), key);
            only(i, key, Set.of("name", "problem", "ground_energy"));
            String name = name(required(i, key, "name"), key + ".name");
            if (!names.add(name)) {
                throw bad(key + ".name", "'" + name + "' names two instances", "give each instance its own name");
            }
            Path problem = existingFile(required(i, key, "problem"), key + ".problem");
            Double ground = i.hasNonNull("ground_energy") ? finite(i.get("ground_energy"), key + ".ground_energy") : null;
            out.add(new CampaignPlan.Instance(name, problem, ground));
        }
        return out;
    }

    private double[] chainCouplings(JsonNode node) {
        if (!node.isArray() || node.isEmpty()) {
            throw bad("chain_couplings", "is " + JsonFields.describe(node) + ", not a non-empty array",
                    "give the chain couplings to sweep, e.g. [-1.2, -1.6, -2.0]");
        }
        double[] v = new double[node.size()];
        for (int k = 0; k < v.length; k++) {
            String key = "chain_couplings[" + k + "]";
            v[k] = finite(node.get(k), key);
            if (!(v[k] < 0)) {
                throw bad(key, v[k] + " is not negative", "a chain coupling is ferromagnetic: give a value < 0");
            }
            for (int j = 0; j < k; j++) {
                if (v[j] == v[k]) {
                    throw bad(key, v[k] + " is listed twice", "list each chain coupling once");
                }
            }
        }
        return v;
    }

    private List<CampaignPlan.Schedule> schedules(JsonNode node) {
        List<CampaignPlan.Schedule> out = new ArrayList<>();
        if (node.isArray()) {
            if (node.isEmpty()) {
                throw bad("schedules", "is an empty list", "name at least one schedule file");
            }
            Set<String> names = new HashSet<>();
            for (int k = 0; k < node.size(); k++) {
                String key = "schedules[" + k + "]";
                JsonNode s = object(node.get(k), key);
                only(s, key, Set.of("name", "file"));
                String name = name(required(s, key, "name"), key + ".name");
                if (!names.add(name)) {
                    throw bad(key + ".name", "'" + name + "' names two schedules", "give each schedule its own name");
                }
                Path f = existingFile(required(s, key, "file"), key + ".file");
                out.add(new CampaignPlan.Schedule(name, Double.NaN, Double.NaN, Double.NaN, f));
            }
            return out;
        }
        JsonNode grid = object(node, "schedules");
        only(grid, "schedules", Set.of("anneal_us", "pause_s", "pause_us", "baseline"));
        double[] anneal = numbers(required(grid, "schedules", "anneal_us"), "schedules.anneal_us", false);
        double[] at = grid.has("pause_s") ? numbers(grid.get("pause_s"), "schedules.pause_s", true) : new double[0];
        double[] hold = grid.has("pause_us") ? numbers(grid.get("pause_us"), "schedules.pause_us", true) : new double[0];
        for (int k = 0; k < anneal.length; k++) {
            if (!(anneal[k] > 0)) {
                throw bad("schedules.anneal_us[" + k + "]", anneal[k] + " is not positive", "give anneal times in µs, > 0");
            }
        }
        for (int k = 0; k < at.length; k++) {
            if (!(at[k] > 0 && at[k] < 1)) {
                throw bad("schedules.pause_s[" + k + "]", at[k] + " is outside (0, 1)",
                        "a pause sits at a point s strictly between 0 and 1");
            }
        }
        for (int k = 0; k < hold.length; k++) {
            if (!(hold[k] > 0)) {
                throw bad("schedules.pause_us[" + k + "]", hold[k] + (hold[k] < 0 ? " is negative" : " is zero"),
                        "give pause durations in µs, > 0 (the no-pause anneal is \"baseline\": true)");
            }
        }
        if ((at.length == 0) != (hold.length == 0)) {
            throw bad(at.length == 0 ? "schedules.pause_s" : "schedules.pause_us", "is missing or empty while "
                    + (at.length == 0 ? "pause_us" : "pause_s") + " is given", "a pause needs both a location and a duration");
        }
        boolean baseline = true;
        if (grid.has("baseline")) {
            if (!grid.get("baseline").isBoolean()) {
                throw bad("schedules.baseline", "is " + JsonFields.describe(grid.get("baseline")) + ", not true or false",
                        "say whether to add the no-pause anneal");
            }
            baseline = grid.get("baseline").booleanValue();
        }
        if (!baseline && at.length == 0) {
            throw bad("schedules", "has no pause and no baseline", "give pause_s and pause_us, or \"baseline\": true");
        }
        for (double a : anneal) {
            if (baseline) {
                out.add(new CampaignPlan.Schedule("a" + plain(a), a, Double.NaN, Double.NaN, null));
            }
            for (double s : at) {
                for (double d : hold) {
                    out.add(new CampaignPlan.Schedule("a" + plain(a) + "-p" + plain(s) + "x" + plain(d), a, s, d, null));
                }
            }
        }
        return out;
    }

    private CampaignPlan.Gauges gauges(JsonNode node) {
        JsonNode g = object(node, "gauges");
        only(g, "gauges", Set.of("count", "design", "lock", "ungauged_reference"));
        int count = positiveInt(required(g, "gauges", "count"), "gauges.count");
        String design = g.has("design") ? oneOf(g.get("design"), "gauges.design", "random", "balanced") : "random";
        String lock = g.has("lock") ? oneOf(g.get("lock"), "gauges.lock", "range", "chains") : "range";
        boolean reference = false;
        if (g.has("ungauged_reference")) {
            if (!g.get("ungauged_reference").isBoolean()) {
                throw bad("gauges.ungauged_reference", "is " + JsonFields.describe(g.get("ungauged_reference"))
                        + ", not true or false", "say whether to add the same reads without a gauge");
            }
            reference = g.get("ungauged_reference").booleanValue();
        }
        return new CampaignPlan.Gauges(count, design, lock, reference);
    }

    private CampaignPlan.Sampler sampler(JsonNode node) {
        if (node.isTextual() && node.asText().equals("external")) {
            return new CampaignPlan.Sampler("external", Double.NaN, null, null, null, null, Double.NaN, 0);
        }
        JsonNode s = object(node, "sampler");
        String kind = oneOf(required(s, "sampler", "kind"), "sampler.kind", "sa", "sqa", "external");
        if (kind.equals("external")) {
            only(s, "sampler", Set.of("kind"));
            return new CampaignPlan.Sampler("external", Double.NaN, null, null, null, null, Double.NaN, 0);
        }
        Set<String> keys = kind.equals("sa") ? Set.of("kind", "sweeps_per_us", "kernel", "errors")
                : Set.of("kind", "sweeps_per_us", "errors", "energy_scales", "energy_units", "temperature", "slices");
        only(s, "sampler", keys);
        double sweeps = 1000.0;
        if (s.has("sweeps_per_us")) {
            sweeps = finite(s.get("sweeps_per_us"), "sampler.sweeps_per_us");
            if (!(sweeps > 0)) {
                throw bad("sampler.sweeps_per_us", sweeps + " is not positive", "give sweeps per µs of schedule, > 0");
            }
        }
        Path errors = s.hasNonNull("errors") ? existingFile(s.get("errors"), "sampler.errors") : null;
        if (kind.equals("sa")) {
            String kernel = s.has("kernel") ? oneOf(s.get("kernel"), "sampler.kernel", KERNELS) : "exact";
            return new CampaignPlan.Sampler("sa", sweeps, kernel, errors, null, null, Double.NaN, 0);
        }
        Path scales = s.hasNonNull("energy_scales") ? existingFile(s.get("energy_scales"), "sampler.energy_scales") : null;
        String units = null;
        if (s.has("energy_units")) {
            if (!s.get("energy_units").isTextual()) {
                throw bad("sampler.energy_units", "is not a string", "state the units of the energy-scales table");
            }
            units = s.get("energy_units").asText();
        }
        double t = finite(required(s, "sampler", "temperature"), "sampler.temperature");
        if (!(t > 0)) {
            throw bad("sampler.temperature", t + " is not positive", "give k_B·T > 0 in the energy-scales table's units");
        }
        int slices = positiveInt(required(s, "sampler", "slices"), "sampler.slices");
        if (slices > PathIntegralSettings.MAX_SLICES) {
            throw bad("sampler.slices", slices + " is more than " + PathIntegralSettings.MAX_SLICES,
                    "give at most " + PathIntegralSettings.MAX_SLICES + " imaginary-time slices");
        }
        return new CampaignPlan.Sampler("sqa", sweeps, null, errors, scales, units, t, slices);
    }

    // --- field helpers, each naming the key path -------------------------------------------------

    private void only(JsonNode obj, String key, Set<String> allowed) {
        for (Iterator<String> it = obj.fieldNames(); it.hasNext(); ) {
            String k = it.next();
            if (key.isEmpty() && k.equals("format")) {
                continue;
            }
            if (!allowed.contains(k)) {
                throw bad(key.isEmpty() ? k : key + "." + k, "is not a key of " + (key.isEmpty() ? "a campaign plan" : key),
                        "use " + String.join(", ", new java.util.TreeSet<>(allowed)));
            }
        }
    }

    private JsonNode required(JsonNode obj, String name) {
        return required(obj, "", name);
    }

    private JsonNode required(JsonNode obj, String key, String name) {
        JsonNode n = obj.get(name);
        String path = key.isEmpty() ? name : key + "." + name;
        if (n == null || n.isNull()) {
            throw bad(path, "is missing", "spec/campaign.md lists the keys of a plan");
        }
        return n;
    }

    private JsonNode object(JsonNode n, String key) {
        if (n == null || !n.isObject()) {
            throw bad(key, "is " + JsonFields.describe(n) + ", not an object", "spec/campaign.md shows its form");
        }
        return n;
    }

    private double finite(JsonNode n, String key) {
        if (n == null || !n.isNumber() || !Double.isFinite(n.doubleValue())) {
            throw bad(key, "is " + JsonFields.describe(n) + ", not a finite number", "give a number");
        }
        return n.doubleValue();
    }

    private double[] numbers(JsonNode n, String key, boolean mayBeEmpty) {
        if (!n.isArray() || (!mayBeEmpty && n.isEmpty())) {
            throw bad(key, "is " + JsonFields.describe(n) + ", not a" + (mayBeEmpty ? "n" : " non-empty") + " array",
                    "give a list of numbers");
        }
        double[] v = new double[n.size()];
        for (int k = 0; k < v.length; k++) {
            v[k] = finite(n.get(k), key + "[" + k + "]");
            for (int j = 0; j < k; j++) {
                if (v[j] == v[k]) {
                    throw bad(key + "[" + k + "]", v[k] + " is listed twice", "list each value once");
                }
            }
        }
        return v;
    }

    private int positiveInt(JsonNode n, String key) {
        if (n == null || !n.isIntegralNumber() || !n.canConvertToInt() || n.intValue() < 1) {
            throw bad(key, "is " + JsonFields.describe(n) + ", not a whole number >= 1", "give a count of at least 1");
        }
        return n.intValue();
    }

    private String oneOf(JsonNode n, String key, String... allowed) {
        if (n != null && n.isTextual()) {
            for (String a : allowed) {
                if (a.equals(n.asText())) {
                    return a;
                }
            }
        }
        throw bad(key, "is " + JsonFields.describe(n) + ", not one of " + String.join(", ", allowed),
                "use one of " + String.join(", ", allowed));
    }

    private String name(JsonNode n, String key) {
        if (n == null || !n.isTextual() || !NAME.matcher(n.asText()).matches()) {
            throw bad(key, "is " + JsonFields.describe(n) + ", not a name of letters, digits, '.', '_' or '-'",
                    "names become file names: up to 64 of those characters, not starting with '.'");
        }
        return n.asText();
    }

    private Path existingFile(JsonNode n, String key) {
        if (n == null || !n.isTextual() || n.asText().isEmpty()) {
            throw bad(key, "is " + JsonFields.describe(n) + ", not a file name", "give a path relative to the plan");
        }
        Path p = base.resolve(n.asText()).normalize();
        if (!Files.isRegularFile(p)) {
            throw bad(key, (Files.exists(p) ? "is not a regular file: " : "no such file: ") + p,
                    "give a path relative to the plan's folder");
        }
        return p;
    }

    /** The shortest plain decimal of a number, for schedule names: 1.0 → "1", 0.25 → "0.25". */
    static String plain(double v) {
        return BigDecimal.valueOf(v).stripTrailingZeros().toPlainString();
    }
}
