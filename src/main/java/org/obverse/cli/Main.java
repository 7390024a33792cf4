package org.obverse.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.nio.file.FileSystemException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.List;
import org.obverse.anneal.InvalidEnergyScalesException;
import org.obverse.embed.EmbeddingNotFoundException;
import org.obverse.io.BadInputException;
import org.obverse.io.Messages;
import org.obverse.model.InvalidProblemException;
import org.obverse.spectrum.SpectrumLimitException;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/**
 * The {@code obverse} command: one subcommand a verb. Exit codes: 0 done, 1 a check failed,
 * 2 bad input or usage (one line), 3 an I/O failure, 70 an internal error (one line asking for a
 * report; the stack trace goes to a file).
 */
@Command(name = "obverse", mixinStandardHelpOptions = true, versionProvider = Main.Version.class,
        description = "Range-aware spin-reversal gauges, chains, sampling and scoring for analog Ising hardware.")
public final class Main implements Runnable {
    /**
     * The verbs in the order the usage lists them. Added by hand rather than through the
     * annotation so that a run builds only the verb it runs: picocli reflects over every
     * registered command when it is added, a tenth of a second of every short command. Made by
     * {@link #verb} (a plain switch: a constructor reference per verb would load every
     * command's class).
     */
    private static final List<String> VERBS = List.of("help", "gauge", "ungauge", "audit", "energy", "device", "embed",
            "decode", "score", "report", "sample", "spectrum", "campaign", "demo");

    private static Object verb(String name) {
        switch (name) {
            case "help": return new CommandLine.HelpCommand();
            case "gauge": return new GaugeCommand();
            case "ungauge": return new UngaugeCommand();
            case "audit": return new AuditCommand();
            case "energy": return new EnergyCommand();
            case "device": return new DeviceCommand();
            case "embed": return new EmbedCommand();
            case "decode": return new DecodeCommand();
            case "score": return new ScoreCommand();
            case "report": return new ReportCommand();
            case "sample": return new SampleCommand();
            case "spectrum": return new SpectrumCommand();
            case "campaign": return new CampaignCommand();
            case "demo": return new DemoCommand();
            default: throw new IllegalArgumentException("no verb " + name);
        }
    }

    public static final int DONE = 0;
    public static final int CHECK_FAILED = 1;
    public static final int BAD_INPUT = 2;
    public static final int IO_FAILURE = 3;
    /** A fault of this program (sysexits' EX_SOFTWARE): please report it. */
    public static final int INTERNAL_ERROR = 70;

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
        return run(commandLine(args.length == 0 ? null : args[0]), args, out, err);
    }

    /** Runs a command tree made by {@link #commandLine()} (set up further by the caller). */
    static int run(CommandLine cl, String[] args, PrintWriter out, PrintWriter err) {
        cl.setOut(out);
        cl.setErr(err);
        try {
            return cl.execute(args);
        } catch (Throwable t) {
            // Errors (out of memory, stack overflow) and anything a handler let through.
            return internalError(err, "obverse", t);
        }
    }

    /** The configured command tree. */
    public static CommandLine commandLine() {
        return commandLine(null);
    }

    /**
     * The configured command tree for a run whose first argument is {@code first}: only that
     * verb where it names one (a run of one verb never reaches the others; its usage, errors
     * and output are the same), every verb otherwise (no argument, an option, help, a typo).
     */
    static CommandLine commandLine(String first) {
        CommandLine cl = new CommandLine(new Main());
        boolean one = first != null && !first.equals("help") && VERBS.contains(first);
        for (String v : VERBS) {
            if (!one || v.equals(first)) {
                cl.addSubcommand(v, verb(v));
            }
        }
        cl.setParameterExceptionHandler((ex, args) -> {
            PrintWriter e = ex.getCommandLine().getErr();
            e.println(line(ex.getCommandLine().getCommandSpec().qualifiedName() + ": " + ex.getMessage()
                    + " (see --help)"));
            return BAD_INPUT;
        });
        cl.setExecutionExceptionHandler((ex, cmd, parsed) -> {
            PrintWriter e = cmd.getErr();
            String verb = cmd.getCommandSpec().qualifiedName();
            Throwable t = ex;
            if (t instanceof UncheckedIOException && t.getCause() != null) {
                t = t.getCause();
            }
            if (isBadInput(t)) {
                e.println(line(verb + ": " + t.getMessage()));
                return BAD_INPUT;
            }
            if (t instanceof NoSuchFileException) {
                e.println(line(verb + ": " + ((NoSuchFileException) t).getFile() + ": no such file; check the path"));
                return BAD_INPUT;
            }
            if (t instanceof IOException) {
                e.println(line(verb + ": I/O failure: " + describe((IOException) t)));
                return IO_FAILURE;
            }
            return internalError(e, verb, t);
        });
        return cl;
    }

    /**
     * Bad input or usage, exit 2: {@link BadInputException} and the core's exceptions that name a
     * value the caller chose (a problem that breaks a rule, energy scales that are not a table, a
     * spectrum too large to solve, an embedding that cannot be found). Any other exception is a
     * fault of this program.
     */
    static boolean isBadInput(Throwable t) {
        return t instanceof BadInputException
                || t instanceof InvalidProblemException
                || t instanceof InvalidEnergyScalesException
                || t instanceof SpectrumLimitException
                || t instanceof EmbeddingNotFoundException;
    }

    /** An I/O failure in one line, naming the file where the exception knows it. */
    static String describe(IOException e) {
        if (e instanceof FileSystemException) {
            FileSystemException f = (FileSystemException) e;
            String s = f.getFile() == null ? "" : f.getFile() + ": ";
            if (f.getOtherFile() != null) {
                s += "(and " + f.getOtherFile() + ") ";
            }
            return s + (f.getReason() == null ? e.getClass().getSimpleName() : f.getReason());
        }
        return e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
    }

    /**
     * A fault of this program: one line asking for a report, the stack trace written to a file
     * in the temporary folder (exit 70, as sysexits' EX_SOFTWARE).
     */
    static int internalError(PrintWriter err, String verb, Throwable t) {
        String where;
        try {
            Path trace = Files.createTempFile("obverse-internal-error-", ".txt");
            StringWriter text = new StringWriter();
            try (PrintWriter w = new PrintWriter(text)) {
                w.println(verb);
                t.printStackTrace(w);
            }
            Files.writeString(trace, text.toString());
            where = "details in " + trace;
        } catch (IOException | RuntimeException | Error e) {
            where = "the details could not be saved (" + e + ")";
        }
        err.println(line(verb + ": internal error (" + t.getClass().getName()
                + (t.getMessage() == null ? "" : ": " + t.getMessage()) + "); please report it with the "
                + "command line and the files it read; " + where));
        err.flush();
        return INTERNAL_ERROR;
    }

    private static String line(String s) {
        return Messages.oneLine(s, Messages.MAX_MESSAGE);
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
