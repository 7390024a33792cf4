package org.obverse.campaign;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.BadInputException;
import org.obverse.testsupport.QuietTest;

/** The campaign folder's layout (spec/campaign.md) and its refusal of folders that are not prepared campaigns. */
class CampaignFolderTest extends QuietTest {
    @TempDir
    Path dir;

    @Test
    void namesTheFilesTheSpecLaysOut() {
        // The layout of spec/campaign.md, written out by hand.
        assertThat(CampaignFolder.chainsFile("layout-a")).isEqualTo("inputs/layout-a.chains.json");
        assertThat(CampaignFolder.embeddedFile("layout-a", -1.5)).isEqualTo("embedded/layout-a/V=-1.5.json");
        assertThat(CampaignFolder.gaugeFolder("layout-a", -2.0)).isEqualTo("gauges/layout-a/V=-2.0");
        assertThat(CampaignFolder.setting(-1.5, "p0.3", true)).isEqualTo("V=-1.5 p0.3 gauged");
        assertThat(CampaignFolder.setting(-1.5, "p0.3", false)).isEqualTo("V=-1.5 p0.3 no gauge");
        // Two couplings that differ get two folders: the name keeps every digit.
        assertThat(CampaignFolder.gaugeFolder("x", -1.1)).isNotEqualTo(CampaignFolder.gaugeFolder("x", Math.nextUp(-1.1)));
    }

    @Test
    void opensAFolderWithPlanJobsAndGroundOnly() throws IOException {
        Path c = Files.createDirectories(dir.resolve("c"));
        assertThat(CampaignFolder.isPrepared(c)).isFalse();
        Files.writeString(c.resolve(CampaignFolder.PLAN), "{}");
        Files.writeString(c.resolve(CampaignFolder.JOBS), "job\n");
        assertThat(CampaignFolder.isPrepared(c)).isTrue();
        // Plan and jobs without ground.csv is still not a folder collect can use.
        assertThatThrownBy(() -> CampaignFolder.open(c)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("has no ground.csv").hasMessageContaining("campaign prepare");
        Files.writeString(c.resolve(CampaignFolder.GROUND), "instance,ground_energy,ground_source\n");
        CampaignFolder f = CampaignFolder.open(c);
        assertThat(f.dir()).isEqualTo(c);
        assertThat(f.resolve(CampaignFolder.RESULTS)).isEqualTo(c.resolve("results.csv"));
    }

    @Test
    void refusesAMissingFolderAndAFile() throws IOException {
        Path missing = dir.resolve("none");
        assertThatThrownBy(() -> CampaignFolder.open(missing)).isInstanceOf(BadInputException.class)
                .hasMessageStartingWith(missing + ": no such folder");
        Path file = Files.writeString(dir.resolve("plain.txt"), "x");
        assertThatThrownBy(() -> CampaignFolder.open(file)).isInstanceOf(BadInputException.class)
                .hasMessageStartingWith(file + ": is not a folder");
        Path empty = Files.createDirectories(dir.resolve("empty"));
        assertThatThrownBy(() -> CampaignFolder.open(empty)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("has no plan.json");
    }
}
