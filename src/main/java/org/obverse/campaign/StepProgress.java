package org.obverse.campaign;

import java.util.function.IntConsumer;

/**
 * Where a long file-level step reports how far it has got. The library only counts; the caller
 * decides whether and how to show it (the command line prints to its error stream).
 */
@FunctionalInterface
public interface StepProgress {
    /** No reporting. */
    StepProgress NONE = (phase, total, work) -> null;

    /**
     * A phase of {@code total} units (about {@code work} elementary operations in all) starts.
     * Returns what receives the number of units done so far (possibly from several threads), or
     * null for no reporting of this phase.
     */
    IntConsumer start(String phase, int total, long work);
}
