package org.obverse.cli;

import java.io.PrintWriter;
import java.io.StringWriter;
import org.obverse.testsupport.QuietTest;

/** Runs the command line in-process and keeps what it printed. */
abstract class CommandTestSupport extends QuietTest {
    /** Exit code and the two streams of one run. */
    record Run(int code, String out, String err) {
    }

    static Run obverse(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new Run(code, out.toString(), err.toString());
    }
}
