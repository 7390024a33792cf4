package org.obverse.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import org.obverse.io.BadInputException;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/**
 * The {@code obverse} command: one subcommand a verb. Exit codes: 0 done, 1 a check failed,
 * 2 bad input or usage (one line), 3 an I/O failure.
 */
@Command(name = "obverse", mixinStandardHelpOptions = true, versionProvider = Main.Version.class,
        description = "Range-aware spin-reversal gauges, chains, sampling and scoring for analog Ising hardware.",
        subcommands = {
            CommandLine.HelpCommand.class,
            GaugeCommand.class,
            UngaugeCommand.class,
            AuditCommand.class,
            EnergyCommand.class,
            DeviceCommand.class,
            EmbedCommand.class,
            DecodeCommand.class,
            ScoreCommand.class,
            ReportCommand.class,
            SampleCommand.class,
            SpectrumCommand.class,
            CampaignCommand.class,
            DemoCommand.class,
        })
public final class Main implements Runnable {
    public static final int DONE = 0;
    public static final int CHECK_FAILED = 1;
    public static final int BAD_INPUT = 2;
    public static final int IO_FAILURE = 3;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    public static void main(String[] args) {
        PrintWriter out = new PrintWriter(System.out, true);
        PrintWriter err = new PrintWriter(System.err, true);
        int code = run(args, out, err);
        out.flush();
        err.flush();
        System.exit(code);
    }

    /** Runs the command line with the given writers and returns the exit code (used by tests). */
    public static int run(String[] args, PrintWriter out, PrintWriter err) {
        CommandLine cl = commandLine();
        cl.setOut(out);
        cl.setErr(err);
        return cl.execute(args);
    }

    /** The configured command tree. */
    public static CommandLine commandLine() {
        CommandLine cl = new CommandLine(new Main());
        cl.setParameterExceptionHandler((ex, args) -> {
            PrintWriter e = ex.getCommandLine().getErr();
            e.println("obverse " + ex.getCommandLine().getCommandName() + ": " + ex.getMessage()
                    + " (see --help)");
            return BAD_INPUT;
        });
        cl.setExecutionExceptionHandler((ex, line, parsed) -> {
            PrintWriter e = line.getErr();
            String verb = line.getCommandName();
            Throwable t = ex;
            if (t instanceof UncheckedIOException && t.getCause() != null) {
                t = t.getCause();
            }
            if (t instanceof BadInputException) {
                e.println("obverse " + verb + ": " + t.getMessage());
                return BAD_INPUT;
            }
            if (t instanceof java.nio.file.NoSuchFileException) {
                e.println("obverse " + verb + ": " + ((java.nio.file.NoSuchFileException) t).getFile()
                        + ": no such file; check the path");
                return BAD_INPUT;
            }
            if (t instanceof IOException) {
                e.println("obverse " + verb + ": I/O failure: " + t);
                return IO_FAILURE;
            }
            if (t instanceof IllegalArgumentException) {
                e.println("obverse " + verb + ": " + t.getMessage());
                return BAD_INPUT;
            }
            throw ex;
        });
        return cl;
    }

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    /** Version from the jar manifest, or "development" when run from classes. */
    static final class Version implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() {
            String v = Main.class.getPackage().getImplementationVersion();
            return new String[] {"obverse " + (v == null ? "development" : v)};
        }
    }
}
