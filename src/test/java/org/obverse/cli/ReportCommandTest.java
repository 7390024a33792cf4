package org.obverse.cli;

import java.awt.image.BufferedImage;
import java.io.ByteArrayInputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Base64;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import javax.imageio.ImageIO;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

class ReportCommandTest extends QuietTest {
    @TempDir
    Path dir;

    @Test
    void writesSelfContainedPageWithPlotsAndBiasMap() throws Exception {
        System.setProperty("java.awt.headless", "true");
        Path res = dir.resolve("results.csv");
        Path gr = dir.resolve("ground.csv");
        ScoreCommandTest.campaign(res, gr, 21);
        // Magnetisation of 20 qubits over 10 balanced gauges; qubit 113 has a planted bias of 0.3
        // (z about 19 against a threshold near 3.5): missed with negligible probability.
        UniformRandomProvider rng = Seeds.rng(22);
        StringBuilder m = new StringBuilder("qubit,gauge,reads,sum_spin\n");
        for (int g = 0; g < 10; g++) {
            for (int q = 100; q < 120; q++) {
                double mean = ((g + q) % 2 == 0 ? 0.2 : -0.2) + (q == 113 ? 0.3 : 0);
                long sum = 0;
                for (int r = 0; r < 400; r++) {
                    sum += rng.nextDouble() < (1 + mean) / 2 ? 1 : -1;
                }
                m.append(q).append(',').append(g).append(",400,").append(sum).append('\n');
            }
        }
        Path mag = dir.resolve("mag.csv");
        Files.writeString(mag, m);
        Path cor = dir.resolve("cor.csv");
        Files.writeString(cor, "qubit_a,qubit_b,gauge,reads,sum_product,sign\n100,101,0,400,10,1\n101,100,1,400,-12,-1\n"
                + "101,102,0,400,380,1\n101,102,1,400,390,-1\n");
        Path out = dir.resolve("report");
        ScoreCommandTest.Run r = ScoreCommandTest.run("report", "--results", res.toString(), "--ground", gr.toString(),
                "--out", out.toString(), "--replicates", "100", "--compare", "anneal=40", "anneal=10",
                "--sweep", "anneal_us", "--magnetisation", mag.toString(), "--correlations", cor.toString());
        assertThat(r.code()).as(r.err()).isZero();
        assertThat(r.out()).contains("1 qubit(s) flagged");
        String html = Files.readString(out.resolve("report.html"));
        assertThat(html).startsWith("<!DOCTYPE html>").contains("</html>").doesNotContain("src=\"plots/");
        Matcher img = Pattern.compile("data:image/png;base64,([A-Za-z0-9+/=]+)").matcher(html);
        int images = 0;
        while (img.find()) {
            BufferedImage b = ImageIO.read(new ByteArrayInputStream(Base64.getDecoder().decode(img.group(1))));
            assertThat(b.getWidth()).isGreaterThanOrEqualTo(600);
            images++;
        }
        assertThat(images).isEqualTo(6);
        // Coupler 101-102 stays correlated (+0.95, +0.975) whatever its gauge sign: a device bias.
        assertThat(r.out()).contains("1 coupler(s) flagged");
        assertThat(html).contains("<td>101–102</td>");
        for (String name : new String[] {"tts", "success", "gauges", "compare-1", "bias", "coupler-bias"}) {
            assertThat(out.resolve("plots/" + name + ".png")).exists();
            assertThat(Files.readString(out.resolve("plots/" + name + ".svg"))).contains("<svg");
        }
        assertThat(html).contains("<td>113</td>").contains("class=\"flag\"");
        assertThat(out.resolve("instances.csv")).exists();
    }

    @Test
    void seriesDrawsOneLinePerValueOfAColumn() throws Exception {
        System.setProperty("java.awt.headless", "true");
        Path res = dir.resolve("results.csv");
        Path gr = dir.resolve("ground.csv");
        ScoreCommandTest.campaign(res, gr, 24);
        Path out = dir.resolve("report");
        ScoreCommandTest.Run r = ScoreCommandTest.run("report", "--results", res.toString(), "--ground", gr.toString(),
                "--out", out.toString(), "--replicates", "50", "--series", "anneal_us", "--quiet");
        assertThat(r.code()).as(r.err()).isZero();
        // SVG text is drawn as outlines, so look for the second line's colour (rgb(176,74,16)), which
        // only a grouped plot uses, and check an ungrouped plot of the same table lacks it.
        String grouped = Files.readString(out.resolve("plots/tts.svg"));
        assertThat(grouped).contains("rgb(176,74,16)");
        ScoreCommandTest.Run plain = ScoreCommandTest.run("report", "--results", res.toString(), "--ground",
                gr.toString(), "--out", dir.resolve("plain").toString(), "--replicates", "50", "--quiet");
        assertThat(plain.code()).isZero();
        assertThat(Files.readString(dir.resolve("plain/plots/tts.svg"))).doesNotContain("rgb(176,74,16)");
        ScoreCommandTest.Run bad = ScoreCommandTest.run("report", "--results", res.toString(), "--ground",
                gr.toString(), "--out", dir.resolve("r2").toString(), "--series", "nope", "--quiet");
        assertThat(bad.code()).isEqualTo(2);
        assertThat(bad.err()).contains("--series nope");
        assertThat(dir.resolve("r2")).doesNotExist();
    }

    @Test
    void badMagnetisationIsExitTwo() throws Exception {
        Path res = dir.resolve("results.csv");
        Path gr = dir.resolve("ground.csv");
        ScoreCommandTest.campaign(res, gr, 23);
        Path mag = dir.resolve("mag.csv");
        Files.writeString(mag, "qubit,gauge,reads,sum_spin\n1,0,10,11\n");
        ScoreCommandTest.Run r = ScoreCommandTest.run("report", "--results", res.toString(), "--out",
                dir.resolve("o").toString(), "--magnetisation", mag.toString());
        assertThat(r.code()).isEqualTo(2);
        assertThat(r.err()).contains("mag.csv: line 2, column sum_spin").contains("out of range");
        assertThat(dir.resolve("o")).doesNotExist();
    }
}
