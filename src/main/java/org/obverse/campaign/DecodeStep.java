package org.obverse.campaign;

import java.io.IOException;
import java.io.Writer;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.function.IntConsumer;
import org.obverse.embed.ChainBreakRule;
import org.obverse.embed.ChainDecoder;
import org.obverse.embed.Chains;
import org.obverse.embed.DecodedSamples;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.table.ChainBreakTable;
import org.obverse.io.table.EnergyFrame;
import org.obverse.io.codec.ChainList;
import org.obverse.io.codec.ChainsCodec;
import org.obverse.io.codec.GaugeManifest;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.table.ResultsTable;
import org.obverse.io.samples.SampleCoding;
import org.obverse.io.samples.SampleFiles;
import org.obverse.io.samples.SampleFormat;
import org.obverse.io.samples.SampleReader;
import org.obverse.io.samples.SampleWriter;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.random.RandomStreams;
import org.obverse.random.StreamPurpose;
import org.obverse.samples.SampleBlock;

/**
 * Decodes one file of physical reads (source frame: columns = ascending qubit ids of the
 * physical problem) into logical reads under a chain-break rule, and writes the output folder:
 * {@code logical.npy} (or {@code .csv}, as the input; kept reads), {@code kept.npy},
 * {@code broken.npy}, {@code energies.npy} (logical energies of the kept reads),
 * {@code chains.csv} (breaks per chain) and, with labels, {@code results.csv} (logical frame).
 *
 * <p>{@link #writeRows} turns decoded reads into results rows on any
 * {@link ResultsTable.RowWriter}, so a campaign can collect rows of many jobs into one table
 * without writing a folder per job.
 */
public final class DecodeStep {
    /** File names inside the output folder. */
    public static final String KEPT = "kept.npy";
    public static final String BROKEN = "broken.npy";
    public static final String ENERGIES = "energies.npy";
    public static final String CHAINS = "chains.csv";
    public static final String RESULTS = "results.csv";

    private DecodeStep() {
    }

    /**
     * What the results rows of a decoded file carry besides the reads.
     *
     * @param instance    the instance label (not empty)
     * @param setting     the setting label
     * @param gauge       the gauge index, or −1 for none
     * @param runUs       time of one anneal in microseconds, pause included (&gt; 0)
     * @param extraNames  names of extra columns (none of {@link ResultsTable#COLUMNS})
     * @param extraValues their values, one per name
     */
    public record Labels(String instance, String setting, int gauge, double runUs, List<String> extraNames,
                         List<String> extraValues) {
        public Labels {
            if (instance == null || instance.isEmpty() || setting == null) {
                throw new IllegalArgumentException("results rows need an instance label and a setting label");
            }
            if (!(runUs > 0) || Double.isInfinite(runUs)) {
                throw new IllegalArgumentException("run time " + runUs + " must be a positive number of microseconds");
            }
            if (gauge < -1) {
                throw new IllegalArgumentException("gauge " + gauge + " must be a gauge index >= 0, or -1 for none");
            }
            extraNames = List.copyOf(extraNames);
            extraValues = List.copyOf(extraValues);
            if (extraNames.size() != extraValues.size()) {
                throw new IllegalArgumentException(extraNames.size() + " extra columns but " + extraValues.size()
                        + " values");
            }
        }

        /** The same labels for another gauge (−1 for none). */
        public Labels withGauge(int g) {
            return new Labels(instance, setting, g, runUs, extraNames, extraValues);
        }

        /** Labels without extra columns. */
        public Labels(String instance, String setting, int gauge, double runUs) {
            this(instance, setting, gauge, runUs, List.of(), List.of());
        }
    }

    /**
     * What to decode.
     *
     * @param problem  the physical problem the samples answer (its variables give the columns)
     * @param logical  the logical problem (binary is converted to spin)
     * @param chains   the chains the physical problem was embedded with
     * @param samples  the physical reads, source frame
     * @param rule     the chain-break rule
     * @param seed     seed of the tie coin
     * @param coding   how samples are stored, in and out
     * @param out      the output folder
     * @param labels   labels of {@code results.csv}, or null to write none
     * @param force    replace an existing output folder
     */
    public record Request(Path problem, Path logical, Path chains, Path samples, ChainBreakRule rule, long seed,
                          SampleCoding coding, Path out, Labels labels, boolean force) {
    }

    /**
     * What was decoded.
     *
     * @param decoded the decoded reads
     * @param logical the logical problem's variables
     * @param chains  the chains, as read
     * @param out     the folder written
     */
    public record Result(DecodedSamples decoded, VariableIndex logical, Chains chains, Path out) {
        /** Position (among the logical variables) of the chain broken in most reads, or −1 if none broke. */
        public int mostBroken() {
            long[] breaks = decoded.breaksPerChain();
            int worst = -1;
            for (int k = 0; k < breaks.length; k++) {
                if (worst < 0 || breaks[k] > breaks[worst]) {
                    worst = k;
                }
            }
            return worst >= 0 && breaks[worst] > 0 ? worst : -1;
        }
    }

    /**
     * What to decode for every gauge of a manifest: the un-gauged reads of gauge i are
     * {@code samples/<stem>.npy} (or {@code .csv}), in the source frame, as {@code ungauge}
     * writes them.
     *
     * @param manifest     the gauges' manifest; its source problem is the physical problem
     * @param samples      the folder of un-gauged reads
     * @param logical      the logical problem
     * @param chains       the chains, or null for the chains the manifest records
     * @param rule         the chain-break rule
     * @param seed         seed of the tie coins; gauge i uses {@link #gaugeSeed}(seed, i)
     * @param coding       how samples are stored, in and out
     * @param out          the output folder: {@code <stem>/} per gauge (the files of one decode)
     *                     and, with labels, {@code results.csv} over all gauges
     * @param labels       labels of the results rows (the gauge is set per gauge), or null
     * @param allowMissing skip a gauge without reads instead of refusing
     * @param force        replace an existing output folder
     * @param progress     reports gauges decoded
     */
    public record ManifestRequest(Path manifest, Path samples, Path logical, Path chains, ChainBreakRule rule, long seed,
                                  SampleCoding coding, Path out, Labels labels, boolean allowMissing, boolean force,
                                  StepProgress progress) {
        public ManifestRequest {
            if (progress == null) {
                progress = StepProgress.NONE;
            }
        }
    }

    /** One decoded gauge. */
    public record GaugeDone(int gauge, Path input, Path folder, DecodedSamples decoded) {
    }

    /**
     * What was decoded for a manifest.
     *
     * @param done    the decoded gauges in index order
     * @param missing gauges skipped for want of reads
     * @param results the results table, or null
     */
    public record ManifestResult(List<GaugeDone> done, List<Integer> missing, Path results) {
    }

    /** The tie-coin seed of gauge {@code index}, derived from the run's seed. */
    public static long gaugeSeed(long seed, int index) {
        return RandomStreams.derive(seed, StreamPurpose.GAUGES, index);
    }

    /** Decodes the un-gauged reads of every gauge of a manifest into one folder. */
    public static ManifestResult runManifest(ManifestRequest r) throws IOException {
        SourceFiles src = new SourceFiles(r.manifest());
        GaugeManifest m = src.manifest;
        List<Path> read = AtomicOutput.inputs(r.manifest(), r.samples(), r.logical(), r.chains(), src.resolve(m.problem()),
                src.resolve(m.device()), m.chains() == null ? null : src.resolve(m.chains()));
        for (GaugeManifest.Entry e : m.gauges()) {
            read.add(src.folder.resolve(e.problem()));
        }
        AtomicOutput.checkTarget(r.out(), r.force(), read);
        Path problemPath = src.resolve(m.problem());
        ProblemFile pf = src.problem();
        SourceFiles.requireHash(problemPath, ProblemCodec.contentHash(pf), m.problem().sha256(), "source problem");
        VariableIndex qubits = pf.variables();
        IsingProblem q = ProblemCodec.read(r.logical()).spin();
        Path chainsFile = r.chains();
        ChainList list;
        if (chainsFile == null) {
            if (m.chains() == null) {
                throw BadInputException.at(r.manifest(), "chains", "records no chains (the gauges were drawn without them)",
                        "give the chains the source problem was embedded with");
            }
            chainsFile = src.resolve(m.chains());
            list = ChainsCodec.read(chainsFile);
            SourceFiles.requireHash(chainsFile, ChainsCodec.contentHash(list), m.chains().sha256(), "chains");
        } else {
            list = ChainsCodec.read(chainsFile);
        }
        Chains c = Chains.of(list.logicalIds(), list.qubitGroups());
        decoder(q, c, qubits, r.rule(), r.seed(), chainsFile, problemPath);
        if (!Files.isDirectory(r.samples())) {
            throw BadInputException.at(r.samples(), "", "is not a folder", "give the folder of un-gauged reads");
        }
        List<Path> inputs = new ArrayList<>();
        List<Integer> missing = new ArrayList<>();
        for (GaugeManifest.Entry e : m.gauges()) {
            Path found = SourceFiles.gaugeSamples(r.samples(), e);
            if (found == null) {
                if (!r.allowMissing()) {
                    throw BadInputException.at(r.samples(), "", "no un-gauged reads for gauge " + e.index() + " (expected "
                            + SourceFiles.gaugeSampleNames(e) + ")", "un-gauge its raw samples first, or allow missing gauges if it was not run");
                }
                missing.add(e.index());
            }
            inputs.add(found);
        }
        Chains used = c.restrictedTo(q.variables());
        List<GaugeDone> done = new ArrayList<>();
        IntConsumer tick = r.progress().start("decode", m.gauges().size() - missing.size(), 0);
        AtomicOutput.writeDirectory(r.out(), r.force(), read, dir -> {
            Writer table = r.labels() == null ? null : Files.newBufferedWriter(dir.resolve(RESULTS));
            try {
                ResultsTable.RowWriter rows = table == null ? null
                        : ResultsTable.RowWriter.start(table, EnergyFrame.LOGICAL, r.labels().extraNames());
                for (int i = 0; i < inputs.size(); i++) {
                    Path in = inputs.get(i);
                    if (in == null) {
                        continue;
                    }
                    GaugeManifest.Entry e = m.gauges().get(i);
                    ChainDecoder decoder = ChainDecoder.of(q, c, qubits, r.rule(), gaugeSeed(r.seed(), e.index()));
                    SampleBlock physical;
                    try (SampleReader reader = SampleFiles.open(in, qubits, r.coding())) {
                        physical = reader.readRemaining();
                    }
                    DecodedSamples d = decode(decoder, physical, in);
                    Path sub = Files.createDirectory(dir.resolve(e.stem()));
                    writeFolder(sub, Path.of(SampleFormat.of(in).fileName("logical")), q, used, d, r.coding());
                    if (rows != null) {
                        writeRows(rows, r.labels().withGauge(e.index()), d);
                    }
                    done.add(new GaugeDone(e.index(), in, r.out().resolve(e.stem()), d));
                    if (tick != null) {
                        tick.accept(done.size());
                    }
                }
            } finally {
                if (table != null) {
                    table.close();
                }
            }
        });
        return new ManifestResult(done, missing, r.labels() == null ? null : r.out().resolve(RESULTS));
    }

    public static Result run(Request r) throws IOException {
        List<Path> read = AtomicOutput.inputs(r.problem(), r.logical(), r.chains(), r.samples());
        AtomicOutput.checkTarget(r.out(), r.force(), read);
        VariableIndex qubits = ProblemCodec.read(r.problem()).variables();
        IsingProblem q = ProblemCodec.read(r.logical()).spin();
        ChainList list = ChainsCodec.read(r.chains());
        Chains c = Chains.of(list.logicalIds(), list.qubitGroups());
        ChainDecoder decoder = decoder(q, c, qubits, r.rule(), r.seed(), r.chains(), r.problem());
        SampleBlock physical;
        try (SampleReader in = SampleFiles.open(r.samples(), qubits, r.coding())) {
            physical = in.readRemaining();
        }
        DecodedSamples d = decode(decoder, physical, r.samples());
        Path logicalName = Path.of(SampleFormat.of(r.samples()).fileName("logical"));
        AtomicOutput.writeDirectory(r.out(), r.force(), read, dir -> {
            writeFolder(dir, logicalName, q, c.restrictedTo(q.variables()), d, r.coding());
            if (r.labels() != null) {
                try (Writer out = Files.newBufferedWriter(dir.resolve(RESULTS))) {
                    writeRows(ResultsTable.RowWriter.start(out, EnergyFrame.LOGICAL, r.labels().extraNames()), r.labels(), d);
                }
            }
        });
        return new Result(d, q.variables(), c, r.out());
    }

    /** The files of one decoded file of reads, into an existing folder. */
    private static void writeFolder(Path dir, Path logicalName, IsingProblem q, Chains used, DecodedSamples d,
                                    SampleCoding coding) throws IOException {
        try (SampleWriter w = SampleFiles.create(dir.resolve(logicalName), q.variables(), false, coding)) {
            w.writeBlock(d.logical());
            w.commit();
        }
        NpyVectors.writeBool(dir.resolve(KEPT), false, d.kept());
        NpyVectors.writeInt32(dir.resolve(BROKEN), false, d.brokenChains());
        NpyVectors.writeFloat64(dir.resolve(ENERGIES), false, d.energies());
        Files.writeString(dir.resolve(CHAINS), ChainBreakTable.text(d, used));
    }

    /**
     * The decoder of a physical problem's reads, refusing chains that do not fit (named after
     * the chains file, or the physical problem's file, either may be null).
     */
    public static ChainDecoder decoder(IsingProblem logical, Chains chains, VariableIndex qubits, ChainBreakRule rule,
                                       long seed, Path chainsFile, Path problemFile) {
        try {
            return ChainDecoder.of(logical, chains, qubits, rule, seed);
        } catch (IllegalArgumentException e) {
            throw BadInputException.at(chainsFile, "", e.getMessage(),
                    "give the chains that " + (problemFile == null ? "the physical problem" : problemFile)
                            + " was embedded with");
        }
    }

    /** Decodes one block of physical reads; a wrong width is bad input about samplesFile. */
    public static DecodedSamples decode(ChainDecoder decoder, SampleBlock physical, Path samplesFile) {
        try {
            return decoder.decode(physical);
        } catch (IllegalArgumentException e) {
            throw BadInputException.at(samplesFile, "", e.getMessage(), "");
        }
    }

    /**
     * Results rows of decoded reads: one row per distinct (energy, broken chains) among the kept
     * reads, in first-seen order, with its count; then one row per broken-chain count among the
     * discarded reads, ascending, with an empty energy (a read that gave no answer: a failure
     * when scored). The writer must have been started with {@code labels.extraNames()}.
     */
    public static void writeRows(ResultsTable.RowWriter rows, Labels labels, DecodedSamples d) throws IOException {
        boolean[] kept = d.kept();
        int[] broken = d.brokenChains();
        double[] energies = d.energies();
        Map<String, long[]> keptCounts = new LinkedHashMap<>();
        TreeMap<Long, long[]> droppedCounts = new TreeMap<>();
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
        String[] extra = labels.extraValues().toArray(new String[0]);
        for (long[] slot : keptCounts.values()) {
            rows.row(labels.instance(), labels.setting(), labels.gauge(), Double.longBitsToDouble(slot[0]), slot[2],
                    slot[1], labels.runUs(), extra);
        }
        for (Map.Entry<Long, long[]> x : droppedCounts.entrySet()) {
            rows.row(labels.instance(), labels.setting(), labels.gauge(), Double.NaN, x.getValue()[0], x.getKey(),
                    labels.runUs(), extra);
        }
    }
}
