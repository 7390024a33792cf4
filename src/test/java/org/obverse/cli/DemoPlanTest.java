package org.obverse.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Path;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.obverse.io.codec.CampaignPlan;
import org.obverse.io.codec.CampaignPlanCodec;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.problems.WindArray;
import org.obverse.testsupport.QuietTest;

/** The demo's plan in examples/wind-array is what the demo says it is, and fits the demo's budget. */
class DemoPlanTest extends QuietTest {
    @Test
    void theShippedLayoutsAreTheWindArrayQubos() {
        Path dir = Path.of("examples/wind-array");
        for (Map.Entry<String, WindArray> e : DemoCommand.instances()) {
            ProblemFile shipped = ProblemCodec.read(dir.resolve(e.getKey() + ".json"));
            ProblemFile built = ProblemFile.of(e.getValue().problem().qubo(), null);
            assertThat(ProblemCodec.contentHash(shipped)).as(e.getKey()).isEqualTo(ProblemCodec.contentHash(built));
        }
    }

    @Test
    void thePlanSweepsChainCouplingsAndAPauseGridGaugedAndUngauged() {
        CampaignPlan p = CampaignPlanCodec.read(Path.of("examples/wind-array/plan.json"));
        assertThat(p.instances()).extracting(CampaignPlan.Instance::name)
                .containsExactlyElementsOf(DemoCommand.instances().stream().map(Map.Entry::getKey).toList());
        assertThat(p.chainCouplings()).hasSize(3);
        assertThat(p.schedules()).hasSize(1 + 2 * 2);
        assertThat(p.schedules().get(0).baseline()).isTrue();
        assertThat(p.gauges().ungaugedReference()).isTrue();
        for (String f : DemoCommand.PLAN_FILES) {
            assertThat(Path.of("examples/wind-array").resolve(f)).isRegularFile();
            assertThat(DemoCommand.class.getResource(DemoCommand.PLAN_RESOURCES + f)).as(f).isNotNull();
        }
    }
}
