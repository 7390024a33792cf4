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

    @Test
    void theBiasMapOfACellLatticeLeavesPinnedQubitsUntested() throws Exception {
        Path camp = dir.resolve("camp");
        CampaignTables.write(camp, new CampaignTables.Plan(3, new double[] {-1.6}, new double[] {0.4},
                new double[] {1}, 2, 20, 2), Seeds.rng(42));
        Path device = dir.resolve("device.json");
        java.io.StringWriter sink = new java.io.StringWriter();
        int code = org.obverse.cli.Main.run(new String[] {"device", "lattice", "--rows", "2", "--cols", "2", "--shore",
            "2", "--field", "-2,2", "--coupling", "-2,1", "--out", device.toString()}, new java.io.PrintWriter(sink),
                new java.io.PrintWriter(sink));
        assertThat(code).as(sink.toString()).isZero();
        // 16 qubits, 8 gauges of 400 reads. Qubit 3 is pinned (sign +1 in every gauge) and fully
        // magnetised: any test would flag it, so it must be left out. Qubit 9 carries a device
        // bias of 0.5 (mean spin 0.5 whatever the gauge): z ≈ 0.5 / √(0.75 / 3200) ≈ 33, flagged.
        StringBuilder m = new StringBuilder("qubit,gauge,reads,sum_spin,sign\n");
        for (int q = 0; q < 16; q++) {
            for (int g = 0; g < 8; g++) {
                int sign = q == 3 ? 1 : ((g + q) % 2 == 0 ? 1 : -1);
                long sum = q == 3 ? 400 : q == 9 ? 200 : 0;
                m.append(q).append(',').append(g).append(",400,").append(sum).append(',').append(sign).append('\n');
            }
        }
        Path mag = dir.resolve("mag.csv");
        Files.writeString(mag, m);
        ScoreStep.Request scoring = new ScoreStep.Request(List.of(camp), null, 0.99, 0.95, 0.5,
                new double[] {0.35, 0.65}, new double[] {0.05, 0.95}, 50, 5, 1, List.of(), null, List.of(), 1e-9, 1e-9,
                Resampling.INSTANCES, null);
        ReportStep.Result r = ReportStep.run(new ReportStep.Request(scoring, mag, null, 0.01, false, null,
                dir.resolve("report"), false, device));
        assertThat(r.bias().flagged()).extracting(org.obverse.stats.BiasDiagnostics.Item::item).containsExactly(9);
        String html = Files.readString(dir.resolve("report/report.html"));
        assertThat(html).contains("2 × 2 cell lattice").contains("1 qubit(s) that no gauge flipped (pinned) are left out")
                .contains("not tested (never flipped)");
    }
}
