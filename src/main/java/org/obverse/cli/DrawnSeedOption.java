package org.obverse.cli;

import java.security.SecureRandom;
import picocli.CommandLine.Option;

/**
 * {@code --seed S} of a verb whose draws may be fresh each run: without it a seed is drawn from
 * the system's secure generator, and the verb prints and records the seed it used, so any run can
 * be repeated. A picocli mixin shared by those verbs; the verbs whose seed is required or has a
 * fixed default (sample, decode, the bootstrap of score and report) declare their own.
 */
final class DrawnSeedOption {
    @Option(names = "--seed", paramLabel = "S", description = "seed (default: drawn at random and printed)")
    Long seed;

    /** Whether a seed was given. */
    boolean given() {
        return seed != null;
    }

    /** The seed given, else a fresh one. */
    long orDrawn() {
        return seed != null ? seed : new SecureRandom().nextLong();
    }
}
