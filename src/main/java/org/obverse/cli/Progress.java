package org.obverse.cli;

import java.io.PrintWriter;
import java.util.function.IntConsumer;

/**
 * Progress of a long step on a command's error stream: a percentage updated in place with a
 * carriage return when a person is watching (a console), otherwise a plain line at each
 * quarter. Thread-safe; silent for small jobs or when quiet.
 */
final class Progress implements IntConsumer {
    private final PrintWriter err;
    private final String label;
    private final int total;
    private final boolean console;
    private int shown = -1;

    private Progress(PrintWriter err, String label, int total, boolean console) {
        this.err = err;
        this.label = label;
        this.total = total;
        this.console = console;
    }

    /** A progress line, or null (no reporting) when quiet or when the job is small. */
    static Progress of(PrintWriter err, String label, int total, long work, boolean quiet) {
        boolean console = System.console() != null;
        if (quiet || total <= 0 || (!console && work < 50_000_000L)) {
            return null;
        }
        return new Progress(err, label, total, console);
    }

    @Override
    public synchronized void accept(int done) {
        int pct = (int) (100L * done / total);
        int step = console ? pct : pct / 25 * 25;
        if (step == shown) {
            return;
        }
        shown = step;
        if (console) {
            err.print("\r" + label + ": " + pct + " % (" + done + "/" + total + ")");
            if (done == total) {
                err.println();
            }
        } else {
            err.println(label + ": " + step + " % (" + done + "/" + total + ")");
        }
        err.flush();
    }
}
