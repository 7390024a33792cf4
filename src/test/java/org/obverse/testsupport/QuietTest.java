package org.obverse.testsupport;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;

import static org.junit.jupiter.api.Assertions.fail;

/**
 * Base class of every test: a test that prints to stdout or stderr fails, so the build log
 * shows only what the runner reports. Commands under test print to their own writers.
 */
public abstract class QuietTest {
    private PrintStream savedOut;
    private PrintStream savedErr;
    private ByteArrayOutputStream captured;

    @BeforeEach
    final void captureConsole() {
        savedOut = System.out;
        savedErr = System.err;
        captured = new ByteArrayOutputStream();
        PrintStream sink = new PrintStream(captured, true, StandardCharsets.UTF_8);
        System.setOut(sink);
        System.setErr(sink);
    }

    @AfterEach
    final void releaseConsole() {
        System.setOut(savedOut);
        System.setErr(savedErr);
        String text = captured.toString(StandardCharsets.UTF_8);
        if (!text.isEmpty()) {
            fail("test printed to the console (tests must be silent):\n" + text);
        }
    }
}
