package org.obverse.cli;

import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Spec;

/** {@code obverse device}: makes device files; its subcommands say how. */
@Command(name = "device", mixinStandardHelpOptions = true,
        description = "Makes device files (obverse.device/1).",
        subcommands = {DeviceLatticeCommand.class})
public final class DeviceCommand implements Runnable {
    @Spec
    CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }
}
