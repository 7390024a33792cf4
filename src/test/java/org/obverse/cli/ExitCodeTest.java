package org.obverse.cli;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.obverse.io.BadInputException;
import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Exit codes (issue 14, done with issue 13): only bad input maps to 2; a fault of the program
 * is exit 70 with one line asking for a report and the stack trace in a file.
 */
class ExitCodeTest extends CommandTestSupport {
    @Test
    void onlyBadInputKinIsExitTwo() {
        assertThat(Main.isBadInput(new BadInputException("x"))).isTrue();
        assertThat(Main.isBadInput(new IllegalArgumentException("x"))).isFalse();
        assertThat(Main.isBadInput(new IllegalStateException("x"))).isFalse();
    }

    @Test
    void anInternalErrorIsOneLineExitSeventyWithTheTraceInAFile() throws Exception {
        StringWriter err = new StringWriter();
        int code = Main.internalError(new PrintWriter(err, true), "obverse test",
                new IllegalStateException("two\nlines"));
        assertThat(code).isEqualTo(Main.INTERNAL_ERROR).isEqualTo(70);
        String line = err.toString().strip();
        assertThat(line.lines().count()).isEqualTo(1);
        assertThat(line).contains("internal error").contains("please report").contains("two\\nlines");
        Path trace = Path.of(line.substring(line.indexOf("details in ") + "details in ".length()).strip());
        assertThat(Files.readString(trace)).contains("IllegalStateException").contains("ExitCodeTest");
        Files.delete(trace);
    }

    @Test
    void aBadOptionValueIsStillExitTwo() {
        Run r = obverse("gauge", "--problem", "p.json", "--device", "d.json", "--count", "0", "--out", "o");
        assertThat(r.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(r.err().strip().lines().count()).isEqualTo(1);
    }
}
