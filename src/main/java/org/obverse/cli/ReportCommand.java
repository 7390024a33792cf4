package org.obverse.cli;

import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/** {@code obverse report}: placeholder replaced below. */
@Command(name = "report", mixinStandardHelpOptions = true, description = "HTML report")
public final class ReportCommand implements Callable<Integer> {
    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        return Main.DONE;
    }
}
