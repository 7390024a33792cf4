package org.obverse.cli;

import picocli.CommandLine.Option;

/**
 * {@code --force}: replace an output that exists (spec/commands.md, "Outputs"). Without it no
 * command overwrites anything; with it the old output is replaced in one rename, only after the
 * new one is complete. A picocli mixin shared by every verb that writes.
 */
final class ForceOption {
    @Option(names = "--force", description = "replace an existing output")
    boolean force;

    /** Whether an existing output may be replaced. */
    boolean on() {
        return force;
    }
}
