package org.obverse.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.testsupport.QuietTest;

/**
 * The demo runs score and report in a working folder renamed at the end; what they record of
 * their inputs must name the final folder, escaped as JSON and HTML need, with nothing
 * rewritten afterwards. Checked with a final folder name that needs escaping in both
 * (a quote, an ampersand, angle brackets): common practice, no source.
 */
class DemoFinalPathTest extends QuietTest {
    @TempDir
    Path dir;

    @Test
    void scoresAndReportNameTheFinalFolderAndStayValid() throws Exception {
        System.setProperty("java.awt.headless", "true");
        Path work = Files.createDirectories(dir.resolve("work"));
        ScoreCommandTest.campaign(work.resolve("results.csv"), work.resolve("ground.csv"), 31);
        Path finalFolder = dir.resolve("demo \"q\" & <b>'s");
        for (String verb : new String[] {"score", "report"}) {
            StringWriter o = new StringWriter();
            StringWriter e = new StringWriter();
            int code = DemoCommand.runInWorkFolder(new String[] {verb, "--results", work.resolve("results.csv").toString(),
                "--ground", work.resolve("ground.csv").toString(), "--out", work.resolve(verb).toString(),
                "--replicates", "50", "--sweep", "anneal_us", "--quiet"}, work, finalFolder,
                    new PrintWriter(o, true), new PrintWriter(e, true));
            assertThat(code).as(e.toString()).isZero();
        }
        Files.move(work, finalFolder);
        String results = finalFolder.toAbsolutePath().normalize().resolve("results.csv").toString();
        String ground = finalFolder.toAbsolutePath().normalize().resolve("ground.csv").toString();

        ObjectMapper json = new ObjectMapper();
        for (String f : new String[] {"score/scores.json", "report/scores.json"}) {
            JsonNode root = json.readTree(finalFolder.resolve(f).toFile());
            assertThat(root.get("results")).as(f).hasSize(1);
            assertThat(root.get("results").get(0).asText()).as(f).isEqualTo(results);
            assertThat(root.get("ground").asText()).as(f).isEqualTo(ground);
            assertThat(Path.of(root.get("results").get(0).asText())).isRegularFile();
            assertThat(Path.of(root.get("ground").asText())).isRegularFile();
        }

        Path report = finalFolder.resolve("report");
        String html = Files.readString(report.resolve("report.html"));
        // The folder name appears only escaped: no raw markup from it, the escaped path in the page.
        assertThat(html).doesNotContain("<b>").contains(escape(results)).contains(escape(ground));
        Matcher code = Pattern.compile("<code>([^<]*)</code>").matcher(html);
        int named = 0;
        while (code.find()) {
            String text = unescape(code.group(1));
            if (text.equals(results) || text.equals(ground)) {
                assertThat(Path.of(text)).isRegularFile();
                named++;
            }
        }
        assertThat(named).isEqualTo(2);
        // Every link resolves: an anchor to an element of the page, a file to one beside it.
        Matcher link = Pattern.compile("(?:href|src)=\"([^\"]*)\"").matcher(html);
        int links = 0;
        while (link.find()) {
            String target = unescape(link.group(1));
            if (target.startsWith("data:")) {
                continue;
            }
            if (target.startsWith("#")) {
                assertThat(html).as(target).contains("id=\"" + target.substring(1) + "\"");
            } else {
                assertThat(report.resolve(target)).as(target).isRegularFile();
            }
            links++;
        }
        assertThat(links).isPositive();
    }

    @Test
    void onlyFilesInTheWorkingFolderAreRenamed() {
        Path work = Path.of("/a/work");
        Path fin = Path.of("/a/out & \"x\"");
        assertThat(DemoCommand.finalName(Path.of("/a/work/c/results.csv"), work, fin))
                .isEqualTo(Path.of("/a/out & \"x\"/c/results.csv"));
        assertThat(DemoCommand.finalName(Path.of("/a/workshop/results.csv"), work, fin))
                .isEqualTo(Path.of("/a/workshop/results.csv"));
        assertThat(DemoCommand.finalName(Path.of("/b/ground.csv"), work, fin)).isEqualTo(Path.of("/b/ground.csv"));
    }

    private static String escape(String s) {
        return s.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;").replace("\"", "&quot;");
    }

    private static String unescape(String s) {
        return s.replace("&quot;", "\"").replace("&lt;", "<").replace("&gt;", ">").replace("&#39;", "'")
                .replace("&amp;", "&");
    }
}
