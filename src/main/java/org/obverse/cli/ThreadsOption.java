package org.obverse.cli;

import org.obverse.io.BadInputException;
import picocli.CommandLine.Option;

/**
 * {@code --threads T}: worker threads. Every result is independent of it (seeded per job or
 * per block, never per thread), so it changes only the time taken. A picocli mixin shared by
 * every verb that works on several threads.
 */
final class ThreadsOption {
    @Option(names = "--threads", paramLabel = "T", description = "worker threads (default 2); never changes the output")
    Integer threads;

    /** The thread count: the one given (at least 1), else two or the cores there are if fewer. */
    int count() {
        if (threads == null) {
            return Math.max(1, Math.min(2, Runtime.getRuntime().availableProcessors()));
        }
        if (threads < 1) {
            throw new BadInputException("--threads " + threads + ": need at least 1");
        }
        return threads;
    }
}
