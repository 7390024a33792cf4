package org.obverse.cli;

import java.nio.file.Path;
import picocli.CommandLine.Option;

/**
 * {@code --out DIR}: the folder a verb writes, published whole or not at all; an existing one is
 * replaced only with {@code --force} ({@link ForceOption}). A picocli mixin shared by the verbs
 * whose output is one folder; verbs that write one file name it with their own {@code --out}
 * (its label says the file's kind).
 */
final class OutputFolderOption {
    @Option(names = "--out", required = true, paramLabel = "DIR",
            description = "output folder (must not exist, unless --force)")
    Path out;

    /** The folder to write. */
    Path path() {
        return out;
    }
}
