package org.obverse.campaign;

import java.awt.image.BufferedImage;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.stats.Resampling;
import org.obverse.testsupport.CampaignTables;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

/** The report of an invented pause × chain-coupling × gauged campaign folder: the figures a paper needs. */
class CampaignReportTest extends QuietTest {
    @TempDir
    Path dir;

    @BeforeAll
    static void headless() {
        System.setProperty("java.awt.headless", "true");
    }

    @Test
    void drawsThePauseAndCouplingFiguresWithCountsInEveryCaption() throws Exception {
        Path camp = dir.resolve("camp");
        CampaignTables.write(camp, new CampaignTables.Plan(6, new double[] {-1.2, -1.6, -2.0},
                new double[] {0.3, 0.45, 0.6}, new double[] {1, 10}, 3, 40, 2), Seeds.rng(41));
        ScoreStep.Request scoring = new ScoreStep.Request(List.of(camp), null, 0.99, 0.95, 0.5,
                new double[] {0.35, 0.65}, new double[] {0.05, 0.95}, 120, 5, 2, List.of(), "pause_s=",
                List.of("pause_s", "pause_us"), 1e-9, 1e-9, Resampling.INSTANCES, null);
        Path out = dir.resolve("report");
        ReportStep.Result r = ReportStep.run(new ReportStep.Request(scoring, null, null, 0.01, false, null, out, false));
        List<String> expected = List.of("pause-tts-ccm1p2", "pause-success-ccm1p6", "pause-delta-ccm2", "heat-tts-1",
                "heat-success-10", "coupling-tts", "coupling-success", "coupling-broken", "coupling-residual", "gauges");
        String html = Files.readString(out.resolve("report.html"));
        for (String name : expected) {
            Path png = out.resolve("plots/" + name + ".png");
            assertThat(png).exists();
            assertThat(out.resolve("plots/" + name + ".svg")).exists();
            BufferedImage img = ImageIO.read(png.toFile());
            // Wide enough for the legend beside the plot, no wider than the page's 1,100 px column by much.
            assertThat(img.getWidth()).isBetween(700, 1200);
            assertThat(html).contains("id=\"fig-" + name + "\"");
        }
        // Every caption names the instances, gauges, reads and replicates.
        int captions = html.split("<figcaption>").length - 1;
        assertThat(captions).isEqualTo(r.figureCount());
        // Each caption appears twice: as the figure caption and as the image's alternative text.
        assertThat(html.split("6 instance\\(s\\); 1–3 gauge\\(s\\) per setting").length - 1).isEqualTo(2 * captions);
        assertThat(html).contains("40–120 reads per gauge; 120 bootstrap replicates (resample instances)");
        // The baseline table and the sweep table are on the page.
        assertThat(html).contains("Against the baseline pause_s=").contains("Best setting of the sweep over pause_s × pause_us");
        assertThat(out.resolve("baseline.csv")).exists();
        assertThat(out.resolve("sweep.csv")).exists();
    }
}
