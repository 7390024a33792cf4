package org.obverse.campaign;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.testsupport.QuietTest;

/** The pause-and-gap table of a path-integral campaign, checked against the results table it summarises. */
class PauseGapStepTest extends QuietTest {
    @TempDir
    Path dir;

    private Path campaign(String sampler) throws IOException {
        Files.writeString(dir.resolve("tri.json"), """
                {"format": "obverse.problem/1", "domain": "spin",
                 "h": [[0, 0.3], [1, -0.2], [2, 0.1]], "J": [[0, 1, 0.8], [1, 2, -0.6], [0, 2, 0.5]], "offset": 0.1}
                """);
        Files.copy(Path.of("examples/device.json"), dir.resolve("device.json"),
                java.nio.file.StandardCopyOption.REPLACE_EXISTING);
        Path plan = dir.resolve("plan.json");
        Files.writeString(plan, """
                {"format": "obverse.campaign/1", "instances": [{"name": "tri", "problem": "tri.json"}],
                 "device": "device.json", "chain_couplings": [-1.0],
                 "schedules": {"anneal_us": [1], "pause_s": [0.3, 0.6], "pause_us": [0.5], "baseline": true},
                 "gauges": {"count": 2}, "reads": 30, "sampler": %s, "seed": 3}
                """.formatted(sampler));
        Path out = dir.resolve("c-" + sampler.hashCode());
        CampaignRunStep.run(new CampaignRunStep.Request(plan, out, false, 2), StepProgress.NONE);
        return out;
    }

    @Test
    void eachPauseGetsItsSuccessRateAndTheGapAtItsLocation() throws IOException {
        Path out = campaign("{\"kind\": \"sqa\", \"sweeps_per_us\": 40, \"temperature\": 0.05, \"slices\": 8}");
        PauseGapStep.Result r = PauseGapStep.run(new PauseGapStep.Request(out, 4));
        assertThat(r.skipped()).isNull();
        assertThat(r.figures()).hasSize(1);
        assertThat(r.figures().get(0).png()).isNotEmpty();
        List<String> rows = r.table().lines().skip(1).toList();
        assertThat(rows).hasSize(3);
        // Recount reads and successes from results.csv directly: gauged rows, energy at the exact ground energy.
        double ground = Double.parseDouble(Files.readAllLines(out.resolve("ground.csv")).get(1).split(",")[1]);
        for (String row : rows) {
            String[] f = row.split(",", -1);
            long reads = 0;
            long successes = 0;
            for (String line : Files.readAllLines(out.resolve("results.csv")).subList(1,
                    Files.readAllLines(out.resolve("results.csv")).size())) {
                String[] t = line.split(",", -1);
                // instance,setting,gauge,energy,count,broken,run_us,energy_frame,chain_coupling,anneal_us,pause_s,pause_us,gauged
                if (t[12].equals("yes") && t[10].equals(f[3]) && t[11].equals(f[4])) {
                    reads += Long.parseLong(t[4]);
                    if (!t[3].isEmpty() && Double.parseDouble(t[3]) <= ground + 1e-9 + 1e-9 * Math.abs(ground)) {
                        successes += Long.parseLong(t[4]);
                    }
                }
            }
            assertThat(Long.parseLong(f[5])).as(row).isEqualTo(reads).isEqualTo(2 * 30);
            assertThat(Long.parseLong(f[6])).as(row).isEqualTo(successes);
            assertThat(Double.parseDouble(f[7])).isEqualTo((double) successes / reads);
            if (f[3].isEmpty()) {
                assertThat(f[8]).isEmpty();
            } else {
                assertThat(Double.parseDouble(f[8])).isPositive();
                if (!f[9].isEmpty()) {
                    assertThat(Double.parseDouble(f[9])).isLessThanOrEqualTo(Double.parseDouble(f[3]));
                }
            }
        }
    }

    @Test
    void simulatedAnnealingHasNoGapToCompareWith() throws IOException {
        Path out = campaign("{\"kind\": \"sa\", \"sweeps_per_us\": 40}");
        PauseGapStep.Result r = PauseGapStep.run(new PauseGapStep.Request(out, 4));
        assertThat(r.skipped()).contains("not the path-integral sampler");
        assertThat(r.figures()).isEmpty();
        assertThat(r.table()).isEqualTo(org.obverse.io.table.PauseGapTable.HEADER);
    }
}
