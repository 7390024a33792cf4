package org.obverse.campaign;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.table.CsvReader;
import org.obverse.io.table.GroundTable;
import org.obverse.io.table.JobTable;
import org.obverse.testsupport.QuietTest;

/**
 * Collecting a sampled campaign: every read of every job in results.csv once, the same bytes
 * when collected again, and best_seen ground energies filled in from the least energy seen.
 */
class CampaignCollectStepTest extends QuietTest {
    @TempDir
    Path dir;

    private Path sampledCampaign() throws IOException {
        Files.writeString(dir.resolve("tri.json"), """
                {"format": "obverse.problem/1", "domain": "spin",
                 "h": [[0, 0.3], [1, -0.2], [2, 0.1]], "J": [[0, 1, 0.8], [1, 2, -0.6], [0, 2, 0.5]], "offset": 0.1}
                """);
        Files.copy(Path.of("examples/device.json"), dir.resolve("device.json"), StandardCopyOption.REPLACE_EXISTING);
        Path plan = dir.resolve("plan.json");
        Files.writeString(plan, """
                {"format": "obverse.campaign/1", "instances": [{"name": "tri", "problem": "tri.json"},
                  {"name": "twin", "problem": "tri.json", "ground_energy": -1.0}],
                 "device": "device.json", "chain_couplings": [-1.0], "schedules": {"anneal_us": [1]},
                 "gauges": {"count": 2, "ungauged_reference": true}, "reads": 25, "sampler": {"kind": "sa",
                 "sweeps_per_us": 20}, "seed": 5}
                """);
        Path out = dir.resolve("c");
        CampaignRunStep.run(new CampaignRunStep.Request(plan, out, false, 2), StepProgress.NONE);
        return out;
    }

    /** Per job: the reads its rows count, and the least energy among them. */
    private static Map<String, double[]> perJob(Path results) throws IOException {
        Map<String, double[]> out = new HashMap<>();
        try (CsvReader csv = CsvReader.open(results)) {
            int[] c = csv.require("results", "job", "energy", "count");
            String[] r;
            while ((r = csv.record()) != null) {
                double[] t = out.computeIfAbsent(r[c[0]], k -> new double[] {0, Double.POSITIVE_INFINITY});
                t[0] += Long.parseLong(r[c[2]]);
                if (!r[c[1]].isEmpty()) {
                    t[1] = Math.min(t[1], Double.parseDouble(r[c[1]]));
                }
            }
        }
        return out;
    }

    @Test
    void everyReadOfEveryJobIsCountedOnceAndCollectingAgainGivesTheSameBytes() throws IOException {
        Path out = sampledCampaign();
        List<JobTable.Job> jobs = JobTable.read(out.resolve(CampaignFolder.JOBS));
        Map<String, double[]> counted = perJob(out.resolve(CampaignFolder.RESULTS));
        assertThat(counted.keySet()).containsExactlyInAnyOrderElementsOf(jobs.stream().map(JobTable.Job::id).toList());
        for (JobTable.Job j : jobs) {
            assertThat(counted.get(j.id())[0]).as(j.id()).isEqualTo(j.reads());
        }
        byte[] before = Files.readAllBytes(out.resolve(CampaignFolder.RESULTS));
        CampaignCollectStep.Result again = CampaignCollectStep.run(new CampaignCollectStep.Request(out, 1),
                StepProgress.NONE);
        assertThat(again.collected()).isEqualTo(jobs.size());
        assertThat(again.failures()).isEmpty();
        assertThat(Files.readAllBytes(out.resolve(CampaignFolder.RESULTS))).isEqualTo(before);
        assertThat(Files.readString(out.resolve(CampaignFolder.AUDIT)))
                .startsWith(jobs.size() + " jobs: " + jobs.size() + " collected, 0 without raw samples, 0 failed");
    }

    @Test
    void aBestSeenGroundEnergyIsTheLeastEnergyOfItsInstance() throws IOException {
        Path out = sampledCampaign();
        // Turn the exact ground energy of "tri" into an unknown one, as for an instance too large to solve.
        Path ground = out.resolve(CampaignFolder.GROUND);
        List<GroundTable.Row> rows = GroundTable.read(ground);
        assertThat(rows.get(0).source()).isEqualTo("exact");
        Files.writeString(ground, GroundTable.text(List.of(new GroundTable.Row("tri", Double.NaN, "best_seen"),
                rows.get(1))));
        CampaignCollectStep.run(new CampaignCollectStep.Request(out, 2), StepProgress.NONE);
        double least = Double.POSITIVE_INFINITY;
        Map<String, double[]> counted = perJob(out.resolve(CampaignFolder.RESULTS));
        for (JobTable.Job j : JobTable.read(out.resolve(CampaignFolder.JOBS))) {
            if (j.instance().equals("tri")) {
                least = Math.min(least, counted.get(j.id())[1]);
            }
        }
        List<GroundTable.Row> after = GroundTable.read(ground);
        assertThat(after.get(0)).isEqualTo(new GroundTable.Row("tri", least, "best_seen"));
        assertThat(after.get(1)).isEqualTo(new GroundTable.Row("twin", -1.0, "given"));
        // The sampler finds the exact ground state of three spins in 100 reads.
        assertThat(least).isEqualTo(rows.get(0).energy());
    }

    @Test
    void aFailedJobHasNoRowsAndNoBestEnergy() {
        CampaignCollectStep.JobRows f = CampaignCollectStep.JobRows.failed(7, "j0007: raw file has 3 columns");
        assertThat(f.index()).isEqualTo(7);
        assertThat(f.rows()).isNull();
        assertThat(f.failure()).isEqualTo("j0007: raw file has 3 columns");
        assertThat(f.reads()).isZero();
        assertThat(f.best()).isNaN();
    }
}
