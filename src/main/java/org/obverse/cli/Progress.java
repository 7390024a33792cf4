package org.obverse.cli;

import java.io.PrintWriter;
import java.util.Locale;
import java.util.function.IntConsumer;

/**
 * Progress of a long step on a command's error stream: a bar with the estimated time left,
 * redrawn in place with a carriage return when a person is watching (a console), otherwise a
 * plain line every {@value #LINE_STEP} percent. Thread-safe; silent for small jobs or when quiet.
 */
final class Progress implements IntConsumer {
    /** Percent between two plain lines when no console is watching. */
    static final int LINE_STEP = 5;
    private static final int BAR = 30;

    private final PrintWriter err;
    private final String label;
    private final int total;
    private final boolean console;
    private final long start = System.nanoTime();
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
        int step = console ? pct : pct / LINE_STEP * LINE_STEP;
        if (step == shown) {
            return;
        }
        shown = step;
        String left = eta(done);
        if (console) {
            int filled = (int) ((long) BAR * done / total);
            err.print("\r" + label + " [" + "#".repeat(filled) + ".".repeat(BAR - filled) + "] " + pct + " % (" + done
                    + "/" + total + ")" + left + "   ");
            if (done == total) {
                err.println();
            }
        } else {
            err.println(label + ": " + step + " % (" + done + "/" + total + ")" + left);
        }
        err.flush();
    }

    /** ", about 1 min 20 s left" from the rate so far; empty before anything is done or at the end. */
    private String eta(int done) {
        if (done <= 0 || done >= total) {
            return "";
        }
        double seconds = (System.nanoTime() - start) / 1e9 * (total - done) / done;
        long s = Math.round(seconds);
        return s >= 60 ? String.format(Locale.ROOT, ", about %d min %02d s left", s / 60, s % 60)
                : String.format(Locale.ROOT, ", about %d s left", s);
    }
}
