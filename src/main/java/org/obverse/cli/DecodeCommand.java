package org.obverse.cli;

import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import org.obverse.io.ResultsTable;
import java.util.concurrent.Callable;
import org.obverse.embed.ChainBreakRule;
import org.obverse.embed.ChainDecoder;
import org.obverse.embed.Chains;
import org.obverse.embed.DecodedSamples;
import org.obverse.io.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.ChainList;
import org.obverse.io.ChainsCodec;
import org.obverse.io.NpyVectors;
import org.obverse.io.ProblemCodec;
import org.obverse.io.SampleCoding;
import org.obverse.io.SampleFiles;
import org.obverse.io.SampleReader;
import org.obverse.io.SampleWriter;
import org.obverse.io.SampleFormat;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.samples.SampleBlock;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code obverse decode}: physical reads to logical reads under a chain-break rule. */
@Command(name = "decode", mixinStandardHelpOptions = true,
        description = {"Reads physical samples of P in the source frame (columns = ascending qubit ids of P) and writes "
                + "logical samples under a chain-break rule: DIR/logical.npy (or .csv, as the input; kept reads, columns = "
                + "ascending logical ids), DIR/kept.npy (bool per read), DIR/broken.npy (int32 broken chains per read), "
                + "DIR/energies.npy (logical energies of the kept reads), DIR/chains.csv (breaks per chain).",
            "discard drops every read with a broken chain (it still counts as a read when scoring); majority takes each "
                + "chain's majority (a tie: the value with the lower energy given the other chains, then the spin of one of "
                + "the chain's qubits drawn with --seed); descend is majority then greedy single flips on the logical "
                + "problem until none lowers the energy."})
public final class DecodeCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--problem", required = true, paramLabel = "P", description = "the physical problem the samples answer")
    Path problem;

    @Option(names = "--logical", required = true, paramLabel = "Q", description = "the logical problem")
    Path logical;

    @Option(names = "--chains", required = true, paramLabel = "C", description = "the chains (obverse.chains/1)")
    Path chains;

    @Option(names = "--samples", required = true, paramLabel = "S", description = "physical samples (.npy int8 or .csv, -1/+1)")
    Path samples;

    @Option(names = "--rule", required = true, paramLabel = "discard|majority|descend", description = "the chain-break rule")
    String rule;

    @Option(names = "--seed", defaultValue = "0", paramLabel = "S", description = "seed of the tie coin (default ${DEFAULT-VALUE})")
    long seed;

    @Option(names = "--out", required = true, paramLabel = "DIR", description = "output folder")
    Path out;

    @Option(names = "--force", description = "replace an existing output folder")
    boolean force;

    @Option(names = "--instance", paramLabel = "NAME",
            description = "also write DIR/results.csv, the results table (spec/results.md) of these reads, for this instance")
    String instance;

    @Option(names = "--setting", paramLabel = "LABEL", description = "the setting label of the results rows (with --instance)")
    String setting;

    @Option(names = "--gauge", paramLabel = "I", description = "the gauge index of the results rows (default: none)")
    Integer gauge;

    @Option(names = "--run-us", paramLabel = "T", defaultValue = "1",
            description = "time of one anneal in microseconds, pause included, for the results rows (default ${DEFAULT-VALUE})")
    double runUs;

    @Option(names = "--column", paramLabel = "NAME=VALUE",
            description = "an extra column of the results rows, e.g. --column chain_coupling=-1.6 (repeatable)")
    List<String> columns = new ArrayList<>();

    @Option(names = "--binary", description = "samples are stored as 0/1 (x = (1 + s) / 2), in and out, instead of -1/+1")
    boolean binary;

    @Override
    public Integer call() throws Exception {
        ChainBreakRule r;
        try {
            r = ChainBreakRule.named(rule);
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--rule: " + e.getMessage());
        }
        List<String> extraNames = new ArrayList<>();
        List<String> extraValues = new ArrayList<>();
        if (instance != null || setting != null || gauge != null || !columns.isEmpty()) {
            if (instance == null || instance.isEmpty() || setting == null) {
                throw new BadInputException("--instance NAME and --setting LABEL go together (and with --gauge, --column)"
                        + "; give both to write DIR/results.csv");
            }
            if (!(runUs > 0) || Double.isInfinite(runUs)) {
                throw new BadInputException("--run-us " + runUs + " must be a positive number of microseconds");
            }
            if (gauge != null && gauge < 0) {
                throw new BadInputException("--gauge " + gauge + " must be a gauge index >= 0");
            }
            for (String c : columns) {
                int eq = c.indexOf('=');
                if (eq <= 0 || ResultsTable.COLUMNS.contains(c.substring(0, eq)) || extraNames.contains(c.substring(0, eq))) {
                    throw new BadInputException("--column " + c + " must be NAME=VALUE with a new NAME that is not one of "
                            + ResultsTable.COLUMNS);
                }
                extraNames.add(c.substring(0, eq));
                extraValues.add(c.substring(eq + 1));
            }
        }
        AtomicOutput.checkTarget(out, force, AtomicOutput.inputs(problem, logical, chains, samples));
        VariableIndex qubits = ProblemCodec.read(problem).variables();
        IsingProblem q = ProblemCodec.read(logical).spin();
        ChainList list = ChainsCodec.read(chains);
        Chains c = Chains.of(list.logicalIds(), list.qubitGroups());
        ChainDecoder decoder;
        try {
            decoder = ChainDecoder.of(q, c, qubits, r, seed);
        } catch (IllegalArgumentException e) {
            throw BadInputException.at(chains, "", e.getMessage(), "give the chains that " + problem + " was embedded with");
        }
        SampleCoding coding = binary ? SampleCoding.BINARY : SampleCoding.SPIN;
        SampleBlock physical;
        try (SampleReader in = SampleFiles.open(samples, qubits, coding)) {
            physical = in.readRemaining();
        }
        DecodedSamples d;
        try {
            d = decoder.decode(physical);
        } catch (IllegalArgumentException e) {
            throw BadInputException.at(samples, "", e.getMessage(), "");
        }
        Path logicalName = Path.of(SampleFormat.of(samples).fileName("logical"));
        AtomicOutput.writeDirectory(out, force, AtomicOutput.inputs(problem, logical, chains, samples), dir -> {
            try (SampleWriter w = SampleFiles.create(dir.resolve(logicalName), q.variables(), false, coding)) {
                w.writeBlock(d.logical());
                w.commit();
            }
            NpyVectors.writeBool(dir.resolve("kept.npy"), false, d.kept());
            NpyVectors.writeInt32(dir.resolve("broken.npy"), false, d.brokenChains());
            NpyVectors.writeFloat64(dir.resolve("energies.npy"), false, d.energies());
            StringBuilder csv = new StringBuilder("logical_id,length,broken_reads,broken_fraction\n");
            long[] breaks = d.breaksPerChain();
            Chains used = c.restrictedTo(q.variables());
            for (int k = 0; k < breaks.length; k++) {
                csv.append(used.logicalId(k)).append(',').append(used.length(k)).append(',').append(breaks[k]).append(',')
                        .append(d.reads() == 0 ? 0.0 : (double) breaks[k] / d.reads()).append('\n');
            }
            Files.writeString(dir.resolve("chains.csv"), csv);
            if (instance != null) {
                try (java.io.Writer out = Files.newBufferedWriter(dir.resolve("results.csv"))) {
                    writeResults(ResultsTable.RowWriter.start(out, extraNames), d, extraValues.toArray(new String[0]));
                }
            }
        });
        PrintWriter w = spec.commandLine().getOut();
        w.printf("%d reads, %d kept (%s); broken chains: %.6f of all chain readings, %.6f of reads have one%n", d.reads(),
                d.keptReads(), r.label(), d.brokenFraction(), d.brokenReadFraction());
        long[] breaks = d.breaksPerChain();
        int worst = -1;
        for (int k = 0; k < breaks.length; k++) {
            if (worst < 0 || breaks[k] > breaks[worst]) {
                worst = k;
            }
        }
        if (worst >= 0 && breaks[worst] > 0) {
            w.printf("most broken: chain of logical %d (length %d), broken in %d reads%n",
                    q.variables().id(worst), c.chainOf(q.variables().id(worst)).length, breaks[worst]);
        }
        w.printf("wrote %s%n", out);
        return Main.DONE;
    }

    /**
     * One row per distinct (energy, broken chains) among the kept reads, with its count, and one
     * per broken-chain count among the discarded reads, with an empty energy (a failure).
     */
    private void writeResults(ResultsTable.RowWriter rows, DecodedSamples d, String[] extra) throws IOException {
        boolean[] kept = d.kept();
        int[] broken = d.brokenChains();
        double[] energies = d.energies();
        java.util.Map<String, long[]> keptCounts = new java.util.LinkedHashMap<>();
        java.util.TreeMap<Long, long[]> droppedCounts = new java.util.TreeMap<>();
        int e = 0;
        for (int k = 0; k < kept.length; k++) {
            if (kept[k]) {
                // One slot per distinct (energy bits, broken chains), holding (bits, broken, count).
                long bits = Double.doubleToLongBits(energies[e++]);
                int b = broken[k];
                keptCounts.computeIfAbsent(bits + "/" + b, x -> new long[] {bits, b, 0})[2]++;
            } else {
                droppedCounts.computeIfAbsent((long) broken[k], x -> new long[1])[0]++;
            }
        }
        int g = gauge == null ? -1 : gauge;
        for (long[] slot : keptCounts.values()) {
            rows.row(instance, setting, g, Double.longBitsToDouble(slot[0]), slot[2], slot[1], runUs, extra);
        }
        for (java.util.Map.Entry<Long, long[]> x : droppedCounts.entrySet()) {
            rows.row(instance, setting, g, Double.NaN, x.getValue()[0], x.getKey(), runUs, extra);
        }
    }
}
