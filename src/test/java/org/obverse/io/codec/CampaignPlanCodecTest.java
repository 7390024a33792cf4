package org.obverse.io.codec;

import org.obverse.io.BadInputException;
import org.obverse.io.codec.CampaignPlan;
import org.obverse.io.codec.CampaignPlanCodec;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.testsupport.QuietTest;

/** The campaign plan's reader: the grid it expands to, and one-line refusals naming the key path. */
class CampaignPlanCodecTest extends QuietTest {
    @TempDir
    Path dir;

    private static final String GOOD = """
            {"format": "obverse.campaign/1",
             "instances": [{"name": "a", "problem": "a.json"}, {"name": "b", "problem": "a.json", "ground_energy": -2}],
             "device": "device.json",
             "chain_couplings": [-1.2, -1.8],
             "schedules": {"anneal_us": [1, 2], "pause_s": [0.3, 0.5], "pause_us": [0.5], "baseline": true},
             "gauges": {"count": 4, "design": "balanced", "ungauged_reference": true},
             "reads": 10,
             "seed": 5}
            """;

    private Path plan(String text) throws IOException {
        Files.writeString(dir.resolve("a.json"), Files.readString(Path.of("examples/logical.json")));
        Files.writeString(dir.resolve("device.json"), Files.readString(Path.of("examples/device.json")));
        Path p = dir.resolve("plan.json");
        Files.writeString(p, text);
        return p;
    }

    @Test
    void aGridExpandsToTheBaselineAndEveryPausePerAnnealTime() throws IOException {
        CampaignPlan p = CampaignPlanCodec.read(plan(GOOD));
        assertThat(p.instances()).extracting(CampaignPlan.Instance::name).containsExactly("a", "b");
        assertThat(p.instances().get(0).groundEnergy()).isNull();
        assertThat(p.instances().get(1).groundEnergy()).isEqualTo(-2.0);
        assertThat(p.schedules()).extracting(CampaignPlan.Schedule::name)
                .containsExactly("a1", "a1-p0.3x0.5", "a1-p0.5x0.5", "a2", "a2-p0.3x0.5", "a2-p0.5x0.5");
        assertThat(p.schedules().get(0).baseline()).isTrue();
        assertThat(p.schedules().get(2).pauseS()).isEqualTo(0.5);
        assertThat(p.gauges()).isEqualTo(new CampaignPlan.Gauges(4, "balanced", "range", true));
        assertThat(p.decode()).isEqualTo("majority");
        assertThat(p.sampler().kind()).isEqualTo("sa");
        assertThat(p.sampler().sweepsPerUs()).isEqualTo(1000.0);
        assertThat(p.seed()).isEqualTo(5L);
        assertThat(p.sampler().kernel()).isEqualTo("exact");
        for (String k : List.of("multi-spin", "multi-spin-steady")) {
            CampaignPlan q = CampaignPlanCodec.read(plan(GOOD.replace("\"seed\": 5",
                    "\"seed\": 5, \"sampler\": {\"kind\": \"sa\", \"kernel\": \"" + k + "\"}")));
            assertThat(q.sampler().kernel()).isEqualTo(k);
        }
    }

    @Test
    void everyRefusalNamesTheKeyPath() throws IOException {
        refused(GOOD.replace("\"seed\": 5", "\"sed\": 5"), "plan.json: sed: is not a key of a campaign plan");
        refused(GOOD.replace(",\n \"seed\": 5", "").replace("\"reads\": 10,", "\"reads\": 10"), "seed: is missing");
        refused(GOOD.replace("[0.3, 0.5]", "[0.3, 0.5, 1.3]"), "schedules.pause_s[2]: 1.3 is outside (0, 1)");
        refused(GOOD.replace("[0.3, 0.5]", "[0, 0.5]"), "schedules.pause_s[0]: 0.0 is outside (0, 1)");
        refused(GOOD.replace("\"pause_us\": [0.5]", "\"pause_us\": [-0.5]"), "schedules.pause_us[0]: -0.5 is negative");
        refused(GOOD.replace("\"pause_us\": [0.5]", "\"pause_us\": [0]"), "schedules.pause_us[0]: 0.0 is zero");
        refused(GOOD.replace("\"anneal_us\": [1, 2]", "\"anneal_us\": []"), "schedules.anneal_us: is [], not a non-empty array");
        refused(GOOD.replace("{\"name\": \"b\", \"problem\": \"a.json\"", "{\"name\": \"b\", \"problem\": \"missing.json\""),
                "instances[1].problem: no such file");
        refused(GOOD.replace("\"name\": \"b\"", "\"name\": \"a\""), "instances[1].name: 'a' names two instances");
        refused(GOOD.replace("\"name\": \"b\"", "\"name\": \"../b\""), "instances[1].name: is \"../b\", not a name");
        refused(GOOD.replace("[-1.2, -1.8]", "[-1.2, 0.5]"), "chain_couplings[1]: 0.5 is not negative");
        refused(GOOD.replace("[-1.2, -1.8]", "[-1.2, -1.2]"), "chain_couplings[1]: -1.2 is listed twice");
        refused(GOOD.replace("\"count\": 4", "\"cout\": 4"), "gauges.cout: is not a key of gauges");
        refused(GOOD.replace("\"count\": 4", "\"count\": 0"), "gauges.count: is 0, not a whole number >= 1");
        refused(GOOD.replace("\"design\": \"balanced\"", "\"design\": \"even\""), "gauges.design: is \"even\", not one of random, balanced");
        refused(GOOD.replace("\"reads\": 10", "\"reads\": 2.5"), "reads: is 2.5, not a whole number >= 1");
        refused(GOOD.replace("\"seed\": 5", "\"seed\": 5, \"sampler\": {\"kind\": \"sqa\", \"slices\": 8}"),
                "sampler.temperature: is missing");
        refused(GOOD.replace("\"seed\": 5", "\"seed\": 5, \"sampler\": {\"kind\": \"sa\", \"sweeps_per_us\": -1}"),
                "sampler.sweeps_per_us: -1.0 is not positive");
        refused(GOOD.replace("\"pause_us\": [0.5], ", ""), "schedules.pause_us: is missing or empty while pause_s is given");
        refused(GOOD.replace("\"seed\": 5", "\"seed\": 5, \"sampler\": {\"kind\": \"sa\", \"kernel\": \"fast\"}"),
                "sampler.kernel: is \"fast\", not one of exact, multi-spin, multi-spin-steady");
        refused(GOOD.replace("\"obverse.campaign/1\"", "\"obverse.campaign/2\""), "\"format\": is \"obverse.campaign/2\"");
    }

    private void refused(String text, String expected) throws IOException {
        Path p = plan(text);
        assertThatThrownBy(() -> CampaignPlanCodec.read(p)).isInstanceOf(BadInputException.class)
                .hasMessageContaining(expected).satisfies(e -> assertThat(e.getMessage()).doesNotContain("\n"));
    }

    @Test
    void aRelocatedPlanRenamesOnlyItsFiles() throws IOException {
        for (String f : List.of("p.json", "dev.json", "ch.json", "s1.json", "s2.json", "err.json", "scales.csv")) {
            Files.writeString(dir.resolve(f), "x");
        }
        Path p = dir.resolve("plan.json");
        // Keys in an unusual order, meta and a ground energy kept as written.
        Files.writeString(p, """
                {"format": "obverse.campaign/1", "seed": 3, "meta": {"note": "kept", "n": [1, 2]},
                 "instances": [{"problem": "p.json", "name": "a", "ground_energy": -1.5}, {"name": "b", "problem": "p.json"}],
                 "device": "dev.json", "chains": "ch.json", "chain_couplings": [-2],
                 "schedules": [{"name": "s1", "file": "s1.json"}, {"file": "s2.json", "name": "s2"}],
                 "gauges": {"count": 1}, "reads": 5,
                 "sampler": {"kind": "sqa", "errors": "err.json", "energy_scales": "scales.csv", "temperature": 0.5,
                             "slices": 8}}
                """);
        CampaignPlan plan = CampaignPlanCodec.read(p);
        String text = CampaignPlanCodec.relocatedText(plan, new CampaignPlanCodec.FileNames(
                List.of("in/a.json", "in/b.json"), "in/device.json", "in/chains.json", List.of("in/s1", "in/s2"),
                "in/errors.json", "in/scales.csv"));
        // Expected bytes written by hand: Jackson's default pretty printer, two-space indent, " : " between key
        // and value (common practice, no source).
        assertThat(text).isEqualTo("""
                {
                  "format" : "obverse.campaign/1",
                  "seed" : 3,
                  "meta" : {
                    "note" : "kept",
                    "n" : [ 1, 2 ]
                  },
                  "instances" : [ {
                    "problem" : "in/a.json",
                    "name" : "a",
                    "ground_energy" : -1.5
                  }, {
                    "name" : "b",
                    "problem" : "in/b.json"
                  } ],
                  "device" : "in/device.json",
                  "chains" : "in/chains.json",
                  "chain_couplings" : [ -2 ],
                  "schedules" : [ {
                    "name" : "s1",
                    "file" : "in/s1"
                  }, {
                    "file" : "in/s2",
                    "name" : "s2"
                  } ],
                  "gauges" : {
                    "count" : 1
                  },
                  "reads" : 5,
                  "sampler" : {
                    "kind" : "sqa",
                    "errors" : "in/errors.json",
                    "energy_scales" : "in/scales.csv",
                    "temperature" : 0.5,
                    "slices" : 8
                  }
                }
                """);
        // The plan file changed under the reader: refused, naming the key, not written half-right.
        Files.writeString(p, Files.readString(p).replace(", {\"name\": \"b\", \"problem\": \"p.json\"}", ""));
        assertThatThrownBy(() -> CampaignPlanCodec.relocatedText(plan, new CampaignPlanCodec.FileNames(
                List.of("in/a.json", "in/b.json"), "in/device.json", "in/chains.json", List.of("in/s1", "in/s2"),
                "in/errors.json", "in/scales.csv"))).isInstanceOf(BadInputException.class)
                .hasMessageContaining("plan.json: instances: no longer lists 2 instances");
    }
}
