package org.obverse.campaign;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.BadInputException;
import org.obverse.io.table.GroundTable;
import org.obverse.io.table.JobTable;
import org.obverse.testsupport.QuietTest;

/** Preparing a plan: one job per setting and gauge, exact ground energies, and nothing written on a refusal. */
class CampaignPrepareStepTest extends QuietTest {
    @TempDir
    Path dir;

    // h and J of a three-spin frustrated triangle; its ground energy is worked out by hand below.
    private static final String TRIANGLE = """
            {"format": "obverse.problem/1", "domain": "spin",
             "h": [[0, 0.3], [1, -0.2], [2, 0.1]], "J": [[0, 1, 0.8], [1, 2, -0.6], [0, 2, 0.5]], "offset": 0.1}
            """;

    private Path plan(String gauges) throws IOException {
        Files.writeString(dir.resolve("tri.json"), TRIANGLE);
        Files.copy(Path.of("examples/device.json"), dir.resolve("device.json"), StandardCopyOption.REPLACE_EXISTING);
        Path plan = dir.resolve("plan.json");
        Files.writeString(plan, """
                {"format": "obverse.campaign/1",
                 "instances": [{"name": "tri", "problem": "tri.json"}, {"name": "given", "problem": "tri.json",
                                "ground_energy": -7.25}],
                 "device": "device.json", "chain_couplings": [-1.0, -1.5],
                 "schedules": {"anneal_us": [1], "pause_s": [0.4], "pause_us": [0.5], "baseline": true},
                 "gauges": %s, "reads": 20, "seed": 11}
                """.formatted(gauges));
        return plan;
    }

    @Test
    void listsOneJobPerInstanceCouplingScheduleAndGauge() throws IOException {
        Path out = dir.resolve("c");
        CampaignPrepareStep.Result r = CampaignPrepareStep.run(new CampaignPrepareStep.Request(
                plan("{\"count\": 3, \"ungauged_reference\": true}"), out, false, 2), StepProgress.NONE);
        // 2 instances x 2 couplings x 2 schedules (baseline + one pause) x (3 gauges + 1 ungauged reference).
        assertThat(r.jobs()).hasSize(2 * 2 * 2 * 4);
        List<JobTable.Job> read = JobTable.read(out.resolve(CampaignFolder.JOBS));
        assertThat(read).isEqualTo(r.jobs());
        assertThat(read.stream().filter(j -> !j.gauged())).hasSize(2 * 2 * 2)
                .allSatisfy(j -> assertThat(j.reads()).isEqualTo(3 * 20));
        assertThat(read.stream().map(JobTable.Job::id).distinct()).hasSize(read.size());
        for (JobTable.Job j : read) {
            assertThat(out.resolve(j.problem())).isRegularFile();
            assertThat(out.resolve(j.scheduleFile())).isRegularFile();
        }
        assertThat(out.resolve(CampaignFolder.PREPARED)).isRegularFile();
        assertThat(out.resolve(CampaignFolder.RAW)).isDirectory();
        assertThat(CampaignFolder.open(out).plan().instances()).hasSize(2);
    }

    @Test
    void groundEnergiesAreExactOrGiven() throws IOException {
        Path out = dir.resolve("c");
        CampaignPrepareStep.run(new CampaignPrepareStep.Request(plan("{\"count\": 1}"), out, false, 1),
                StepProgress.NONE);
        // Every assignment of the triangle by hand: E(s) = 0.3 s0 - 0.2 s1 + 0.1 s2 + 0.8 s0 s1 - 0.6 s1 s2
        // + 0.5 s0 s2 + 0.1 (common practice, no source: exhaustive enumeration).
        double best = Double.POSITIVE_INFINITY;
        for (int m = 0; m < 8; m++) {
            int s0 = (m & 1) == 0 ? -1 : 1;
            int s1 = (m & 2) == 0 ? -1 : 1;
            int s2 = (m & 4) == 0 ? -1 : 1;
            best = Math.min(best, 0.3 * s0 - 0.2 * s1 + 0.1 * s2 + 0.8 * s0 * s1 - 0.6 * s1 * s2 + 0.5 * s0 * s2 + 0.1);
        }
        List<GroundTable.Row> ground = GroundTable.read(out.resolve(CampaignFolder.GROUND));
        assertThat(ground).extracting(GroundTable.Row::instance).containsExactly("tri", "given");
        assertThat(ground.get(0).source()).isEqualTo("exact");
        assertThat(ground.get(0).energy()).isCloseTo(best, org.assertj.core.data.Offset.offset(1e-12));
        assertThat(ground.get(1)).isEqualTo(new GroundTable.Row("given", -7.25, "given"));
    }

    @Test
    void refusesAnExistingFolderWithoutForceAndLeavesItAlone() throws IOException {
        Path out = Files.createDirectories(dir.resolve("c"));
        Files.writeString(out.resolve("keep.txt"), "mine");
        Path p = plan("{\"count\": 1}");
        assertThatThrownBy(() -> CampaignPrepareStep.run(new CampaignPrepareStep.Request(p, out, false, 1),
                StepProgress.NONE)).isInstanceOf(BadInputException.class).hasMessageContaining("--force");
        assertThat(Files.readString(out.resolve("keep.txt"))).isEqualTo("mine");
        CampaignPrepareStep.run(new CampaignPrepareStep.Request(p, out, true, 1), StepProgress.NONE);
        assertThat(out.resolve("keep.txt")).doesNotExist();
        assertThat(CampaignFolder.isPrepared(out)).isTrue();
    }

    @Test
    void theSameGaugesAndJobsFromTheSameSeedWhateverTheThreads() throws IOException {
        Path p = plan("{\"count\": 2}");
        CampaignPrepareStep.Result one = CampaignPrepareStep.run(new CampaignPrepareStep.Request(p, dir.resolve("a"),
                false, 1), StepProgress.NONE);
        CampaignPrepareStep.Result two = CampaignPrepareStep.run(new CampaignPrepareStep.Request(p, dir.resolve("b"),
                false, 2), StepProgress.NONE);
        assertThat(two.jobs()).isEqualTo(one.jobs());
        assertThat(Files.readString(dir.resolve("b").resolve(CampaignFolder.GROUND)))
                .isEqualTo(Files.readString(dir.resolve("a").resolve(CampaignFolder.GROUND)));
    }

    @Test
    void theFolderCopyOfThePlanNamesItsInputsAndKeepsEveryOtherByte() throws IOException {
        Path out = dir.resolve("c");
        CampaignPrepareStep.run(new CampaignPrepareStep.Request(plan("{\"count\": 1}"), out, false, 1),
                StepProgress.NONE);
        // Expected bytes written by hand from the plan above: each input renamed into inputs/ (an instance's
        // problem by its name), Jackson's default pretty printer (common practice, no source).
        assertThat(Files.readString(out.resolve(CampaignFolder.PLAN))).isEqualTo("""
                {
                  "format" : "obverse.campaign/1",
                  "instances" : [ {
                    "name" : "tri",
                    "problem" : "inputs/tri.json"
                  }, {
                    "name" : "given",
                    "problem" : "inputs/given.json",
                    "ground_energy" : -7.25
                  } ],
                  "device" : "inputs/device.json",
                  "chain_couplings" : [ -1.0, -1.5 ],
                  "schedules" : {
                    "anneal_us" : [ 1 ],
                    "pause_s" : [ 0.4 ],
                    "pause_us" : [ 0.5 ],
                    "baseline" : true
                  },
                  "gauges" : {
                    "count" : 1
                  },
                  "reads" : 20,
                  "seed" : 11
                }
                """);
        assertThat(Files.readString(out.resolve("inputs/given.json"))).isEqualTo(TRIANGLE);
        assertThat(Files.readString(out.resolve("inputs/device.json")))
                .isEqualTo(Files.readString(Path.of("examples/device.json")));
    }
}
