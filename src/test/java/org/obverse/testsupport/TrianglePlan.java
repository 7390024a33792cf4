package org.obverse.testsupport;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;

/**
 * The small campaign the campaign and engine tests share: two frustrated triangles (invented
 * values; on the example device's ring graph each needs a chain), 2 chain couplings × 3 schedules
 * × (3 gauges + the ungauged reference) = 48 jobs of 40 reads.
 */
public final class TrianglePlan {
    private TrianglePlan() {
    }

    /** A frustrated triangle; {@code %s} is the field on spin 0. */
    public static final String TRIANGLE = """
            {"format": "obverse.problem/1", "domain": "spin",
             "h": [[0, %s], [1, -0.2], [2, 0.1]], "J": [[0, 1, 0.8], [1, 2, -0.6], [0, 2, 0.5]], "offset": 0.1}
            """;

    /** 2 instances × 2 chain couplings × 3 schedules × (3 gauges + the ungauged reference) = 48 jobs. */
    public static final String PLAN = """
            {"format": "obverse.campaign/1",
             "instances": [{"name": "tri-a", "problem": "tri-a.json"}, {"name": "tri-b", "problem": "tri-b.json"}],
             "device": "device.json",
             "chain_couplings": [-1.2, -1.8],
             "schedules": {"anneal_us": [1], "pause_s": [0.3, 0.6], "pause_us": [0.5], "baseline": true},
             "gauges": {"count": 3, "design": "random", "ungauged_reference": true},
             "reads": 40,
             "decode": "majority",
             "sampler": {"kind": "sa", "sweeps_per_us": 60, "errors": "errors.json"},
             "seed": 11}
            """;

    /**
     * Writes the two triangles, the example device and error model, and {@code planText} as
     * plan.json into dir; returns the plan's path.
     */
    public static Path write(Path dir, String planText) throws IOException {
        Files.writeString(dir.resolve("tri-a.json"), String.format(TRIANGLE, "0.3"));
        Files.writeString(dir.resolve("tri-b.json"), String.format(TRIANGLE, "-0.45"));
        Files.copy(Path.of("examples/device.json"), dir.resolve("device.json"), StandardCopyOption.REPLACE_EXISTING);
        Files.copy(Path.of("examples/errors.json"), dir.resolve("errors.json"), StandardCopyOption.REPLACE_EXISTING);
        Path p = dir.resolve("plan.json");
        Files.writeString(p, planText);
        return p;
    }
}
