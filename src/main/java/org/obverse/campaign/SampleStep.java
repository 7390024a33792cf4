package org.obverse.campaign;

import java.io.IOException;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.function.IntConsumer;
import org.obverse.anneal.ReferenceSampler;
import org.obverse.anneal.SampledReads;
import org.obverse.anneal.SamplerSettings;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.table.EnergyFrame;
import org.obverse.io.codec.GaugeManifest;
import org.obverse.io.codec.ManifestCodec;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.table.ResultsTable;
import org.obverse.io.samples.SampleCoding;
import org.obverse.io.samples.SampleFiles;
import org.obverse.io.samples.SampleFormat;
import org.obverse.io.samples.SampleWriter;
import org.obverse.random.RandomStreams;
import org.obverse.random.StreamPurpose;

/**
 * Samples problems with the reference sampler into raw sample files: one problem file into
 * {@code OUT} (.npy or .csv) and {@code <stem>.energies.npy} beside it, or every gauged problem
 * of a manifest into a fresh folder ({@code <stem>.npy}, {@code <stem>.energies.npy}), gauge i
 * with the seed {@link #gaugeSeed}. Optionally also the results table of the reads (one row per
 * distinct energy), in the frame {@link #frameOf} says. Energies are those of the sampled
 * problem's spin form, bit for bit.
 *
 * <p>{@link #sampleInto} samples one problem already in memory into one target file, the call
 * a campaign makes per job.
 */
public final class SampleStep {
    /** The results table's name inside the output folder of a manifest. */
    public static final String RESULTS = "results.csv";

    private SampleStep() {
    }

    /**
     * Labels of the results rows of the reads.
     *
     * @param instance the instance label (not empty)
     * @param setting  the setting label
     */
    public record Labels(String instance, String setting) {
        public Labels {
            if (instance == null || instance.isEmpty() || setting == null) {
                throw new IllegalArgumentException("results rows need an instance label and a setting label");
            }
        }
    }

    /**
     * What to sample. Exactly one of problem and manifest is given.
     *
     * @param problem  one problem file, sampled into {@code out} (a .npy or .csv file); or null
     * @param manifest a gauges manifest, every gauge sampled into the folder {@code out}; or null
     * @param settings the sampler's settings (schedule, errors, kernel, threads)
     * @param reads    reads per problem (≥ 1)
     * @param seed     the seed; gauge i of a manifest uses {@link #gaugeSeed}(seed, i)
     * @param out      the samples file, or the folder (which must not exist unless force)
     * @param coding   how samples are stored
     * @param labels   labels of a results table to write beside, or null for none
     * @param force    replace existing outputs
     * @param progress reports gauges done (manifest only)
     */
    public record Request(Path problem, Path manifest, SamplerSettings settings, int reads, long seed, Path out,
                          SampleCoding coding, Labels labels, boolean force, StepProgress progress) {
        public Request {
            if ((problem == null) == (manifest == null)) {
                throw new IllegalArgumentException("give either a problem or a manifest to sample");
            }
            if (progress == null) {
                progress = StepProgress.NONE;
            }
        }
    }

    /**
     * One sampled problem.
     *
     * @param gauge     the gauge index, or −1 for a problem sampled on its own
     * @param samples   the samples file written
     * @param energies  the energies file written
     * @param reads     reads taken
     * @param variables the problem's variables
     * @param sweeps    Metropolis sweeps of one read
     * @param runUs     the schedule's run time of one read
     * @param minimumEnergy the least energy read
     */
    public record Done(int gauge, Path samples, Path energies, int reads, int variables, int sweeps, double runUs,
                       double minimumEnergy) {
    }

    /**
     * What was written.
     *
     * @param done    one entry per sampled problem, in gauge order
     * @param results the results table written, or null
     */
    public record Result(List<Done> done, Path results, EnergyFrame frame) {
    }

    /**
     * The frame of a sampled problem's energies: physical where its meta records an embedding
     * (the keys {@code embed} writes, which a gauged problem keeps), logical otherwise (a problem
     * sampled directly is its own logical problem).
     */
    public static EnergyFrame frameOf(ProblemFile problem) {
        if (problem.meta() != null) {
            for (String key : EmbedStep.EMBEDDING_META) {
                if (problem.meta().has(key)) {
                    return EnergyFrame.PHYSICAL;
                }
            }
        }
        return EnergyFrame.LOGICAL;
    }

    /** The seed gauge {@code index} of a manifest is sampled with, derived from the run's seed. */
    public static long gaugeSeed(long seed, int index) {
        return RandomStreams.derive(seed, StreamPurpose.GAUGES, index);
    }

    public static Result run(Request r) throws IOException {
        if (r.reads() < 1) {
            throw new BadInputException("reads " + r.reads() + ": need at least 1 read");
        }
        ReferenceSampler sampler = ReferenceSampler.of(r.settings());
        double runUs = r.settings().schedule().runTimeMicros();
        return r.problem() != null ? one(r, sampler, runUs) : manifest(r, sampler, runUs);
    }

    private static Result one(Request r, ReferenceSampler sampler, double runUs) throws IOException {
        ProblemFile pf = ProblemCodec.read(r.problem());
        Path energiesFile = beside(r.out(), ".energies.npy");
        List<Path> read = AtomicOutput.inputs(r.problem());
        Path resultsFile = r.labels() == null ? null : beside(r.out(), ".results.csv");
        List<Path> targets = resultsFile == null ? List.of(r.out(), energiesFile)
                : List.of(r.out(), energiesFile, resultsFile);
        for (Path t : targets) {
            AtomicOutput.checkTarget(t, r.force(), read);
        }
        SampledReads s = sample(sampler, pf, r.reads(), r.seed());
        // Samples, energies and results are published together, after all are written.
        AtomicOutput.writeFiles(targets, r.force(), read, files -> {
            writeSamples(files.get(0), s, false, r.coding());
            NpyVectors.writeFloat64(files.get(1), false, s.energies());
            if (resultsFile != null) {
                StringWriter table = new StringWriter();
                writeRows(ResultsTable.RowWriter.start(table, frameOf(pf), List.of()), r.labels(), -1, runUs, s.energies());
                Files.writeString(files.get(2), table.toString());
            }
        });
        return new Result(List.of(done(-1, r.out(), energiesFile, s)), resultsFile, frameOf(pf));
    }

    /** Samples; settings that do not suit the problem (e.g. multi-spin and its couplings) are bad input. */
    private static SampledReads sample(ReferenceSampler sampler, ProblemFile pf, int reads, long seed) {
        try {
            return sampler.sample(pf.spin(), reads, seed);
        } catch (IllegalArgumentException e) {
            throw new BadInputException(e.getMessage(), e);
        }
    }

    private static Result manifest(Request r, ReferenceSampler sampler, double runUs) throws IOException {
        GaugeManifest m = ManifestCodec.read(r.manifest());
        Path folder = r.manifest().toAbsolutePath().getParent();
        List<Done> done = new ArrayList<>();
        StringWriter table = new StringWriter();
        ResultsTable.RowWriter[] rows = new ResultsTable.RowWriter[1];
        EnergyFrame[] frame = new EnergyFrame[1];
        IntConsumer tick = r.progress().start("sample", m.gauges().size(),
                (long) m.gauges().size() * r.reads() * r.settings().sweeps());
        List<Path> read = AtomicOutput.inputs(r.manifest());
        for (GaugeManifest.Entry e : m.gauges()) {
            read.add(folder.resolve(e.problem()).normalize());
        }
        AtomicOutput.writeDirectory(r.out(), r.force(), read, dir -> {
            for (GaugeManifest.Entry e : m.gauges()) {
                Path file = folder.resolve(e.problem()).normalize();
                ProblemFile pf = ProblemCodec.read(file);
                String hash = ProblemCodec.contentHash(pf);
                if (!hash.equals(e.sha256())) {
                    throw BadInputException.at(file, "", "the gauged problem of gauge " + e.index()
                            + " changed since the gauges were made (content hash " + hash.substring(0, 12)
                            + "…, the manifest records " + e.sha256().substring(0, 12) + "…)",
                            "restore the file or draw the gauges again");
                }
                EnergyFrame f = frameOf(pf);
                if (frame[0] == null) {
                    frame[0] = f;
                    rows[0] = r.labels() == null ? null : ResultsTable.RowWriter.start(table, f, List.of());
                } else if (frame[0] != f) {
                    throw BadInputException.at(file, "meta", "records no embedding while other gauged problems of "
                            + r.manifest() + " do", "draw the gauges again from one source problem");
                }
                SampledReads s = sample(sampler, pf, r.reads(), gaugeSeed(r.seed(), e.index()));
                Path samples = dir.resolve(SampleFormat.NPY.fileName(e.stem()));
                Path energies = dir.resolve(e.stem() + ".energies.npy");
                writeSamples(samples, s, false, r.coding());
                NpyVectors.writeFloat64(energies, false, s.energies());
                done.add(done(e.index(), r.out().resolve(samples.getFileName()), r.out().resolve(energies.getFileName()), s));
                if (rows[0] != null) {
                    writeRows(rows[0], r.labels(), e.index(), runUs, s.energies());
                }
                if (tick != null) {
                    tick.accept(done.size());
                }
            }
            if (rows[0] != null) {
                Files.writeString(dir.resolve(RESULTS), table.toString());
            }
        });
        return new Result(done, rows[0] == null ? null : r.out().resolve(RESULTS), frame[0]);
    }

    /**
     * Samples one problem already in memory (its spin form) into {@code target} (.npy or .csv)
     * and {@code <stem>.energies.npy} beside it. The energies are written first and the samples
     * file last, each under a temporary name and then renamed, so a present samples file means
     * both are complete (a campaign's resume check relies on that).
     *
     * @return the reads, in memory
     */
    public static SampledReads sampleInto(ProblemFile problem, SamplerSettings settings, int reads, long seed,
                                          Path target, SampleCoding coding, boolean force) throws IOException {
        if (reads < 1) {
            throw new IllegalArgumentException("reads " + reads + ": need at least 1 read");
        }
        Path energiesFile = beside(target, ".energies.npy");
        AtomicOutput.checkTarget(target, force, List.of());
        SampledReads s = ReferenceSampler.of(settings).sample(problem.spin(), reads, seed);
        NpyVectors.writeFloat64(energiesFile, true, s.energies());
        writeSamples(target, s, force, coding);
        return s;
    }

    /**
     * Results rows of sampled reads: one row per distinct energy (first-seen order) with its
     * count; no chains here, so broken is 0.
     *
     * @param gauge the gauge index, or −1 for none
     */
    public static void writeRows(ResultsTable.RowWriter rows, Labels labels, int gauge, double runUs,
                                 double[] energies, String... extraValues) throws IOException {
        Map<Long, long[]> counts = new LinkedHashMap<>();
        for (double e : energies) {
            counts.computeIfAbsent(Double.doubleToLongBits(e), k -> new long[1])[0]++;
        }
        for (Map.Entry<Long, long[]> c : counts.entrySet()) {
            rows.row(labels.instance(), labels.setting(), gauge, Double.longBitsToDouble(c.getKey()), c.getValue()[0], 0,
                    runUs, extraValues);
        }
    }

    private static Done done(int gauge, Path samples, Path energies, SampledReads s) {
        return new Done(gauge, samples, energies, s.reads(), s.variables().size(), s.sweeps(), s.runTimeMicros(),
                s.minimumEnergy());
    }

    private static void writeSamples(Path target, SampledReads s, boolean force, SampleCoding coding)
            throws IOException {
        try (SampleWriter writer = SampleFiles.create(target, s.variables(), force, coding)) {
            writer.writeBlock(s.samples());
            writer.commit();
        }
    }

    /** {@code dir/run.npy} → {@code dir/run<suffix>}; refuses a name that is not .npy or .csv. */
    public static Path beside(Path samples, String suffix) {
        SampleFormat.of(samples);
        String name = samples.getFileName().toString();
        int dot = name.lastIndexOf('.');
        String stem = dot > 0 ? name.substring(0, dot) : name;
        Path parent = samples.getParent();
        Path e = Path.of(stem + suffix);
        return parent == null ? e : parent.resolve(e);
    }
}
