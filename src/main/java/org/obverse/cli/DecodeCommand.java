package org.obverse.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.obverse.campaign.DecodeStep;
import org.obverse.embed.ChainBreakRule;
import org.obverse.embed.DecodedSamples;
import org.obverse.io.BadInputException;
import org.obverse.io.table.ResultsTable;
import org.obverse.io.samples.SampleCoding;
import org.obverse.io.codec.ScheduleCodec;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code obverse decode}: physical reads to logical reads under a chain-break rule. */
@Command(name = "decode", mixinStandardHelpOptions = true,
        description = {"Reads physical samples of P in the source frame (columns = ascending qubit ids of P) and writes "
                + "logical samples under a chain-break rule: DIR/logical.npy (or .csv, as the input; kept reads, columns = "
                + "ascending logical ids), DIR/kept.npy (bool per read), DIR/broken.npy (int32 broken chains per read), "
                + "DIR/energies.npy (logical energies of the kept reads), DIR/chains.csv (breaks per chain).",
            "With --manifest M, --samples is the folder of un-gauged reads (ungauge's output) and every gauge is "
                + "decoded into DIR/<stem>/ with the files above; P is the manifest's source problem and the chains "
                + "default to the manifest's.",
            "discard drops every read with a broken chain (it still counts as a read when scoring); majority takes each "
                + "chain's majority (a tie: the value with the lower energy given the other chains, then the spin of one of "
                + "the chain's qubits drawn with --seed); descend is majority then greedy single flips on the logical "
                + "problem until none lowers the energy."})
public final class DecodeCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--problem", paramLabel = "P", description = "the physical problem the samples answer")
    Path problem;

    @Option(names = "--manifest", paramLabel = "M",
            description = "a gauges manifest: decode every gauge's un-gauged reads (instead of --problem)")
    Path manifest;

    @Option(names = "--logical", required = true, paramLabel = "Q", description = "the logical problem")
    Path logical;

    @Option(names = "--chains", paramLabel = "C",
            description = "the chains (obverse.chains/1); with --manifest, default: the chains it records")
    Path chains;

    @Option(names = "--samples", required = true, paramLabel = "S",
            description = "physical samples (.npy int8 or .csv, -1/+1); with --manifest, the folder of un-gauged reads")
    Path samples;

    @Option(names = "--rule", required = true, paramLabel = "discard|majority|descend", description = "the chain-break rule")
    String rule;

    @Option(names = "--seed", defaultValue = "0", paramLabel = "S",
            description = "seed of the tie coin (default ${DEFAULT-VALUE}); with --manifest gauge i uses a seed derived "
                    + "from S and i")
    long seed;

    @Mixin
    OutputFolderOption output;

    @Mixin
    ForceOption force;

    @Option(names = "--allow-missing", description = "with --manifest: skip a gauge without un-gauged reads")
    boolean allowMissing;

    @Option(names = "--instance", paramLabel = "NAME",
            description = "also write DIR/results.csv, the results table (spec/results.md) of these reads, for this instance")
    String instance;

    @Option(names = "--setting", paramLabel = "LABEL", description = "the setting label of the results rows (with --instance)")
    String setting;

    @Option(names = "--gauge", paramLabel = "I", description = "the gauge index of the results rows (default: none)")
    Integer gauge;

    @Option(names = "--run-us", paramLabel = "T",
            description = "time of one anneal in microseconds, pause included, for the results rows (or --schedule)")
    Double runUs;

    @Option(names = "--schedule", paramLabel = "F",
            description = "the anneal schedule the reads were taken with (obverse.schedule/1): run_us = its run time")
    Path schedule;

    @Option(names = "--column", paramLabel = "NAME=VALUE",
            description = "an extra column of the results rows, e.g. --column chain_coupling=-1.6 (repeatable)")
    List<String> columns = new ArrayList<>();

    @Option(names = "--binary", description = "samples are stored as 0/1 (x = (1 + s) / 2), in and out, instead of -1/+1")
    boolean binary;

    @Override
    public Integer call() throws Exception {
        if ((problem == null) == (manifest == null)) {
            throw new BadInputException("give either --problem P (one samples file) or --manifest M (every gauge)");
        }
        if (problem != null && chains == null) {
            throw new BadInputException("--chains C is needed with --problem: the chains P was embedded with");
        }
        if (manifest != null && gauge != null) {
            throw new BadInputException("--gauge I goes with --problem; with --manifest every row carries its gauge's index");
        }
        if (problem != null && allowMissing) {
            throw new BadInputException("--allow-missing goes with --manifest");
        }
        ChainBreakRule r;
        try {
            r = ChainBreakRule.named(rule);
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--rule: " + e.getMessage());
        }
        DecodeStep.Labels labels = labels();
        SampleCoding coding = binary ? SampleCoding.BINARY : SampleCoding.SPIN;
        PrintWriter w = spec.commandLine().getOut();
        if (manifest != null) {
            PrintWriter err = spec.commandLine().getErr();
            DecodeStep.ManifestResult res = DecodeStep.runManifest(new DecodeStep.ManifestRequest(manifest, samples,
                    logical, chains, r, seed, coding, output.path(), labels, allowMissing, force.on(),
                    (phase, total, work) -> Progress.of(err, phase, total, work, false)));
            long reads = 0;
            long kept = 0;
            for (DecodeStep.GaugeDone g : res.done()) {
                reads += g.decoded().reads();
                kept += g.decoded().keptReads();
                w.println(g.folder().getFileName() + ": " + g.decoded().reads() + " reads, " + g.decoded().keptReads()
                        + " kept; " + Decimals.fixed(g.decoded().brokenReadFraction(), 6) + " of reads have a broken chain");
            }
            w.println("decoded " + res.done().size() + " gauges (" + r.label() + "): " + reads + " reads, " + kept + " kept"
                    + (res.missing().isEmpty() ? "" : "; skipped gauges without reads: " + res.missing()));
            w.println("wrote " + output.path());
            return Main.DONE;
        }
        DecodeStep.Result res = DecodeStep.run(new DecodeStep.Request(problem, logical, chains, samples, r, seed, coding,
                output.path(), labels == null ? null : labels.withGauge(gauge == null ? -1 : gauge), force.on()));
        DecodedSamples d = res.decoded();
        // Plain concatenation, not printf: see Decimals.
        w.println(d.reads() + " reads, " + d.keptReads() + " kept (" + r.label() + "); broken chains: "
                + Decimals.fixed(d.brokenFraction(), 6) + " of all chain readings, "
                + Decimals.fixed(d.brokenReadFraction(), 6) + " of reads have one");
        int worst = res.mostBroken();
        if (worst >= 0) {
            int id = res.logical().id(worst);
            w.println("most broken: chain of logical " + id + " (length " + res.chains().chainOf(id).length
                    + "), broken in " + d.breaksPerChain()[worst] + " reads");
        }
        w.println("wrote " + output.path());
        return Main.DONE;
    }

    /** The labels of the results rows, or null when none are asked for; the run time never has a default. */
    private DecodeStep.Labels labels() {
        if (instance == null && setting == null && gauge == null && columns.isEmpty() && runUs == null
                && schedule == null) {
            return null;
        }
        if (instance == null || instance.isEmpty() || setting == null) {
            throw new BadInputException("--instance NAME and --setting LABEL go together (and with --gauge, --column, "
                    + "--run-us, --schedule); give both to write DIR/results.csv");
        }
        if ((runUs == null) == (schedule == null)) {
            throw new BadInputException(runUs == null
                    ? "results rows need the run time of one anneal: give --run-us T or --schedule F (the schedule the "
                            + "reads were taken with); there is no default"
                    : "give the run time once: --run-us T or --schedule F, not both");
        }
        double t = runUs != null ? runUs : ScheduleCodec.read(schedule).runTimeMicros();
        if (!(t > 0) || Double.isInfinite(t)) {
            throw new BadInputException("--run-us " + t + " must be a positive number of microseconds");
        }
        if (gauge != null && gauge < 0) {
            throw new BadInputException("--gauge " + gauge + " must be a gauge index >= 0");
        }
        List<String> extraNames = new ArrayList<>();
        List<String> extraValues = new ArrayList<>();
        for (String c : columns) {
            int eq = c.indexOf('=');
            String name = eq <= 0 ? "" : c.substring(0, eq);
            if (eq <= 0 || ResultsTable.COLUMNS.contains(name) || name.equals(ResultsTable.FRAME)
                    || extraNames.contains(name)) {
                throw new BadInputException("--column " + c + " must be NAME=VALUE with a new NAME that is not one of "
                        + ResultsTable.COLUMNS + " or " + ResultsTable.FRAME);
            }
            extraNames.add(c.substring(0, eq));
            extraValues.add(c.substring(eq + 1));
        }
        return new DecodeStep.Labels(instance, setting, -1, t, extraNames, extraValues);
    }
}
