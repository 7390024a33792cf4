package org.obverse.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.obverse.io.ResultsTable;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.obverse.anneal.AnnealSchedule;
import org.obverse.anneal.ControlErrors;
import org.obverse.anneal.ReferenceSampler;
import org.obverse.anneal.SampledReads;
import org.obverse.anneal.SamplerSettings;
import org.obverse.anneal.StreamSeeds;
import org.obverse.io.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.ControlErrorsCodec;
import org.obverse.io.GaugeManifest;
import org.obverse.io.ManifestCodec;
import org.obverse.io.NpyVectors;
import org.obverse.io.ProblemCodec;
import org.obverse.io.ProblemFile;
import org.obverse.io.SampleCoding;
import org.obverse.io.SampleFiles;
import org.obverse.io.SampleFormat;
import org.obverse.io.SampleWriter;
import org.obverse.io.ScheduleCodec;
import picocli.CommandLine.ArgGroup;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code obverse sample}: reads from the reference sampler (simulated annealing emulating an
 * imperfect analog machine) for one problem, or for every gauged problem of a manifest.
 */
@Command(name = "sample", mixinStandardHelpOptions = true,
        description = "Samples a problem with the reference sampler (simulated annealing with an anneal schedule and "
                + "a control-error model; seeded, the same output whatever the thread count). With --problem writes "
                + "OUT (.npy or .csv) and OUT's stem + .energies.npy; with --manifest writes OUT/<stem>.npy and "
                + "OUT/<stem>.energies.npy for every gauge.")
public final class SampleCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    static final class Input {
        @Option(names = "--problem", required = true, paramLabel = "P", description = "the problem (obverse.problem/1)")
        Path problem;

        @Option(names = "--manifest", required = true, paramLabel = "M",
                description = "a gauges manifest: sample every gauged problem it lists")
        Path manifest;
    }

    @ArgGroup(exclusive = true, multiplicity = "1")
    Input input;

    @Option(names = "--reads", required = true, paramLabel = "N", description = "reads per problem (>= 1)")
    int reads;

    @Option(names = "--seed", required = true, paramLabel = "S",
            description = "seed; with --manifest gauge i is sampled with a seed derived from S and i")
    long seed;

    @Option(names = "--schedule", paramLabel = "F", description = "anneal schedule (obverse.schedule/1); default linear 1 us")
    Path schedule;

    @Option(names = "--errors", paramLabel = "F", description = "control-error model (obverse.errors/1); default none")
    Path errors;

    @Option(names = "--out", required = true, paramLabel = "OUT",
            description = "samples file (.npy or .csv) with --problem; a folder (must not exist) with --manifest")
    Path out;

    @Option(names = "--kernel", paramLabel = "K", description = "exact (default) or multi-spin (one coupling magnitude, no errors)")
    String kernel = "exact";

    @Option(names = "--sweeps-per-us", paramLabel = "X", description = "Metropolis sweeps per microsecond of schedule (default 1000)")
    double sweepsPerMicrosecond = SamplerSettings.DEFAULT_SWEEPS_PER_MICROSECOND;

    @Option(names = "--threads", paramLabel = "T", description = "worker threads (default 2); never changes the output")
    Integer threads;

    @Option(names = "--binary", description = "store samples as 0/1 (x = (1 + s) / 2) instead of -1/+1")
    boolean binary;

    @Option(names = "--force", description = "replace existing outputs")
    boolean force;

    @Option(names = "--instance", paramLabel = "NAME",
            description = "also write the results table (spec/results.md) of the reads, for this instance: OUT's stem + "
                    + ".results.csv with --problem, OUT/results.csv with --manifest. Energies are the sampled problem's "
                    + "(for an embedded problem, decode --instance gives logical ones).")
    String instance;

    @Option(names = "--setting", paramLabel = "LABEL", description = "the setting label of the results rows (with --instance)")
    String setting;

    @Override
    public Integer call() throws Exception {
        if (reads < 1) {
            throw new BadInputException("--reads " + reads + ": need at least 1 read");
        }
        SamplerSettings settings = settings();
        ReferenceSampler sampler = ReferenceSampler.of(settings);
        PrintWriter w = spec.commandLine().getOut();
        SampleCoding coding = binary ? SampleCoding.BINARY : SampleCoding.SPIN;
        if ((instance == null) != (setting == null) || (instance != null && instance.isEmpty())) {
            throw new BadInputException("--instance NAME and --setting LABEL go together; give both to write the results table");
        }
        double runUs = settings.schedule().runTimeMicros();
        if (input.problem != null) {
            ProblemFile pf = ProblemCodec.read(input.problem);
            Path energiesFile = energiesBeside(out);
            List<Path> read = AtomicOutput.inputs(input.problem, schedule, errors);
            Path resultsFile = instance == null ? null : besideWith(out, ".results.csv");
            List<Path> targets = resultsFile == null ? List.of(out, energiesFile) : List.of(out, energiesFile, resultsFile);
            for (Path t : targets) {
                AtomicOutput.checkTarget(t, force, read);
            }
            SampledReads s = sample(sampler, pf, seed);
            // Samples, energies and results are published together, after all are written.
            AtomicOutput.writeFiles(targets, force, read, files -> {
                writeSamples(files.get(0), s, false, coding);
                NpyVectors.writeFloat64(files.get(1), false, s.energies());
                if (resultsFile != null) {
                    StringWriter table = new StringWriter();
                    addRows(ResultsTable.RowWriter.start(table, List.of()), s.energies(), -1, runUs);
                    Files.writeString(files.get(2), table.toString());
                }
            });
            w.printf("sampled %d reads of %d variables (%d sweeps, %s us a read), minimum energy %s%n", s.reads(),
                    s.variables().size(), s.sweeps(), s.runTimeMicros(), s.minimumEnergy());
            w.printf("wrote %s and %s%n", out, energiesFile);
            return Main.DONE;
        }
        GaugeManifest m = ManifestCodec.read(input.manifest);
        Path folder = input.manifest.toAbsolutePath().getParent();
        List<String> lines = new ArrayList<>();
        StringWriter table = new StringWriter();
        ResultsTable.RowWriter rows = instance == null ? null : ResultsTable.RowWriter.start(table, List.of());
        List<Path> read = AtomicOutput.inputs(input.manifest, schedule, errors);
        for (GaugeManifest.Entry e : m.gauges()) {
            read.add(folder.resolve(e.problem()).normalize());
        }
        AtomicOutput.writeDirectory(out, force, read, dir -> {
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
                SampledReads s = sample(sampler, pf, StreamSeeds.derive(seed, StreamSeeds.GAUGES, e.index()));
                writeSamples(dir.resolve(SampleFormat.NPY.fileName(e.stem())), s, false, coding);
                NpyVectors.writeFloat64(dir.resolve(e.stem() + ".energies.npy"), false, s.energies());
                lines.add(String.format("%s: %d reads, minimum energy %s", e.stem(), s.reads(), s.minimumEnergy()));
                if (rows != null) {
                    addRows(rows, s.energies(), e.index(), runUs);
                }
            }
            if (rows != null) {
                Files.writeString(dir.resolve("results.csv"), table.toString());
            }
        });
        w.printf("sampled %d gauges, %d reads each (%d sweeps, %s us a read), into %s%n", m.gauges().size(), reads,
                settings.sweeps(), settings.schedule().runTimeMicros(), out);
        for (String line : lines) {
            w.println(line);
        }
        return Main.DONE;
    }

    private SamplerSettings settings() {
        SamplerSettings s = SamplerSettings.defaults();
        if (schedule != null) {
            AnnealSchedule a = ScheduleCodec.read(schedule);
            s = s.withSchedule(a);
        }
        if (errors != null) {
            ControlErrors e = ControlErrorsCodec.read(errors);
            s = s.withErrors(e);
        }
        switch (kernel) {
            case "exact":
                break;
            case "multi-spin":
                s = s.withKernel(SamplerSettings.Kernel.MULTI_SPIN);
                break;
            default:
                throw new BadInputException("--kernel " + kernel + ": unknown kernel; use exact or multi-spin");
        }
        if (!(sweepsPerMicrosecond > 0) || !Double.isFinite(sweepsPerMicrosecond)) {
            throw new BadInputException("--sweeps-per-us " + sweepsPerMicrosecond + ": need a finite number > 0");
        }
        s = s.withSweepsPerMicrosecond(sweepsPerMicrosecond);
        if (threads != null) {
            if (threads < 1) {
                throw new BadInputException("--threads " + threads + ": need at least 1");
            }
            s = s.withThreads(threads);
        }
        if (s.sweepCount() > SamplerSettings.MAX_SWEEPS) {
            throw BadInputException.at(schedule, "", "a read of " + s.schedule().runTimeMicros() + " us at "
                    + sweepsPerMicrosecond + " sweeps per us needs " + (s.sweepCount() == Long.MAX_VALUE ? "more than 2^63"
                    : String.valueOf(s.sweepCount())) + " sweeps, more than the limit " + SamplerSettings.MAX_SWEEPS,
                    "shorten the schedule or lower --sweeps-per-us");
        }
        return s;
    }

    /**
     * Samples the problem's spin form, so the energies are bit for bit those {@code obverse
     * energy} computes for the same file and samples.
     */
    private SampledReads sample(ReferenceSampler sampler, ProblemFile pf, long s) {
        try {
            return sampler.sample(pf.spin(), reads, s);
        } catch (IllegalArgumentException e) {
            // The settings do not suit this problem (e.g. the multi-spin kernel and its couplings).
            throw new BadInputException(e.getMessage(), e);
        }
    }

    private static void writeSamples(Path target, SampledReads s, boolean force, SampleCoding coding) throws IOException {
        try (SampleWriter writer = SampleFiles.create(target, s.variables(), force, coding)) {
            writer.writeBlock(s.samples());
            writer.commit();
        }
    }

    /** One results row per distinct energy, with its count (no chains here: broken 0). */
    private void addRows(ResultsTable.RowWriter rows, double[] energies, int gauge, double runUs) throws IOException {
        java.util.Map<Long, long[]> counts = new java.util.LinkedHashMap<>();
        for (double e : energies) {
            counts.computeIfAbsent(Double.doubleToLongBits(e), k -> new long[1])[0]++;
        }
        for (java.util.Map.Entry<Long, long[]> c : counts.entrySet()) {
            rows.row(instance, setting, gauge, Double.longBitsToDouble(c.getKey()), c.getValue()[0], 0, runUs);
        }
    }

    /** {@code dir/run.npy} → {@code dir/run.energies.npy}. */
    static Path energiesBeside(Path samples) {
        return besideWith(samples, ".energies.npy");
    }

    /** {@code dir/run.npy} → {@code dir/run<suffix>}. */
    static Path besideWith(Path samples, String suffix) {
        SampleFormat.of(samples);
        String name = samples.getFileName().toString();
        int dot = name.lastIndexOf('.');
        String stem = dot > 0 ? name.substring(0, dot) : name;
        Path parent = samples.getParent();
        Path e = Path.of(stem + suffix);
        return parent == null ? e : parent.resolve(e);
    }
}
