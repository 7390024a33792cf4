package org.obverse.cli;

import org.obverse.campaign.SampleStep;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.obverse.anneal.AnnealSchedule;
import org.obverse.anneal.ControlErrors;
import org.obverse.anneal.EnergyScales;
import org.obverse.anneal.PathIntegralSettings;
import org.obverse.anneal.SamplerSettings;
import org.obverse.io.BadInputException;
import org.obverse.io.table.EnergyFrame;
import org.obverse.io.codec.ControlErrorsCodec;
import org.obverse.io.samples.SampleCoding;
import org.obverse.io.codec.ScheduleCodec;
import picocli.CommandLine.ArgGroup;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code obverse sample}: reads from the reference sampler (simulated annealing emulating an
 * imperfect analog machine, or with {@code --sampler sqa} simulated quantum annealing by path
 * integral) for one problem, or for every gauged problem of a manifest.
 */
@Command(name = "sample", mixinStandardHelpOptions = true,
        description = "Samples a problem with the reference sampler (simulated annealing, or with --sampler sqa "
                + "simulated quantum annealing, with an anneal schedule and a control-error model; seeded, the same "
                + "output whatever the thread count). With --problem writes "
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

    @Option(names = "--kernel", paramLabel = "K", description = "exact (default), multi-spin or multi-spin-steady (one coupling magnitude, no errors)")
    String kernel = "exact";

    @Option(names = "--sweeps-per-us", paramLabel = "X", description = "Metropolis sweeps per microsecond of schedule (default 1000)")
    double sweepsPerMicrosecond = SamplerSettings.DEFAULT_SWEEPS_PER_MICROSECOND;

    @Mixin
    ThreadsOption threads;

    @Option(names = "--binary", description = "store samples as 0/1 (x = (1 + s) / 2) instead of -1/+1")
    boolean binary;

    @Mixin
    ForceOption force;

    @Option(names = "--sampler", paramLabel = "sa|sqa",
            description = "sa: simulated annealing (default); sqa: simulated quantum annealing of H(s) = -(A/2) sum X + "
                    + "(B/2) H_P by path-integral Monte Carlo at --temperature with --slices")
    String sampler = SamplerSettings.Method.SIMULATED_ANNEALING.label();

    @Option(names = "--energy-scales", paramLabel = "F",
            description = "sqa: CSV with header s,A,B as spectrum reads it (default: the illustrative pair A = 1 - s, "
                    + "B = s, which is no device's schedule)")
    Path energyScales;

    @Option(names = "--energy-units", paramLabel = "U",
            description = "sqa: the energy units of A and B in the --energy-scales table, as you state them")
    String energyUnits;

    @Option(names = "--temperature", paramLabel = "T",
            description = "sqa: k_B T in the energy units of A and B (> 0; required with sqa)")
    Double temperature;

    @Option(names = "--slices", paramLabel = "P",
            description = "sqa: imaginary-time (Trotter) slices, 1.." + PathIntegralSettings.MAX_SLICES + " (default "
                    + PathIntegralSettings.DEFAULT_SLICES + "; 1 is the classical limit)")
    Integer slices;

    @Option(names = "--instance", paramLabel = "NAME",
            description = "also write the results table (spec/results.md) of the reads, for this instance: OUT's stem + "
                    + ".results.csv with --problem, OUT/results.csv with --manifest. Energies are the sampled problem's: "
                    + "energy_frame physical for an embedded problem (decode --instance gives logical ones), logical "
                    + "otherwise; run_us is the schedule's run time.")
    String instance;

    @Option(names = "--setting", paramLabel = "LABEL", description = "the setting label of the results rows (with --instance)")
    String setting;

    @Override
    public Integer call() throws Exception {
        if (reads < 1) {
            throw new BadInputException("--reads " + reads + ": need at least 1 read");
        }
        SamplerSettings settings = settings();
        PrintWriter w = spec.commandLine().getOut();
        if (settings.pathIntegral() != null) {
            w.println("sampler: " + settings.pathIntegral().describe());
        }
        SampleCoding coding = binary ? SampleCoding.BINARY : SampleCoding.SPIN;
        if ((instance == null) != (setting == null) || (instance != null && instance.isEmpty())) {
            throw new BadInputException("--instance NAME and --setting LABEL go together; give both to write the results table");
        }
        SampleStep.Labels labels = instance == null ? null : new SampleStep.Labels(instance, setting);
        PrintWriter err = spec.commandLine().getErr();
        SampleStep.Result r = SampleStep.run(new SampleStep.Request(input.problem, input.manifest, settings, reads, seed,
                out, coding, labels, force.on(), (phase, total, work) -> Progress.of(err, phase, total, work, false)));
        if (r.results() != null && r.frame() == EnergyFrame.PHYSICAL) {
            w.printf("the results rows hold physical energies (the problem records an embedding): energy_frame physical;"
                    + " decode --instance gives logical ones%n");
        }
        if (input.problem != null) {
            SampleStep.Done s = r.done().get(0);
            w.printf("sampled %d reads of %d variables (%d sweeps, %s us a read), minimum energy %s%n", s.reads(),
                    s.variables(), s.sweeps(), s.runUs(), s.minimumEnergy());
            w.printf("wrote %s and %s%n", s.samples(), s.energies());
            return Main.DONE;
        }
        w.printf("sampled %d gauges, %d reads each (%d sweeps, %s us a read), into %s%n", r.done().size(), reads,
                settings.sweeps(), settings.schedule().runTimeMicros(), out);
        for (SampleStep.Done s : r.done()) {
            String stem = s.samples().getFileName().toString();
            w.println(String.format("%s: %d reads, minimum energy %s", stem.substring(0, stem.length() - 4), s.reads(),
                    s.minimumEnergy()));
        }
        return Main.DONE;
    }

    private SamplerSettings settings() throws IOException {
        SamplerSettings s = SamplerSettings.defaults();
        if (schedule != null) {
            AnnealSchedule a = ScheduleCodec.read(schedule);
            s = s.withSchedule(a);
        }
        if (errors != null) {
            ControlErrors e = ControlErrorsCodec.read(errors);
            s = s.withErrors(e);
        }
        SamplerSettings.Kernel k = SamplerSettings.Kernel.byLabel(kernel);
        if (k == null) {
            throw new BadInputException("--kernel " + kernel + ": unknown kernel; use " + SamplerSettings.Kernel.labels());
        }
        s = s.withKernel(k);
        if (!(sweepsPerMicrosecond > 0) || !Double.isFinite(sweepsPerMicrosecond)) {
            throw new BadInputException("--sweeps-per-us " + sweepsPerMicrosecond + ": need a finite number > 0");
        }
        s = s.withSweepsPerMicrosecond(sweepsPerMicrosecond);
        s = s.withThreads(threads.count());
        if (s.sweepCount() > SamplerSettings.MAX_SWEEPS) {
            throw BadInputException.at(schedule, "", "a read of " + s.schedule().runTimeMicros() + " us at "
                    + sweepsPerMicrosecond + " sweeps per us needs " + (s.sweepCount() == Long.MAX_VALUE ? "more than 2^63"
                    : String.valueOf(s.sweepCount())) + " sweeps, more than the limit " + SamplerSettings.MAX_SWEEPS,
                    "shorten the schedule or lower --sweeps-per-us");
        }
        return withMethod(s);
    }

    /** The sampler choice and its options (sqa only) on top of the shared settings. */
    private SamplerSettings withMethod(SamplerSettings s) throws IOException {
        SamplerSettings.Method method = SamplerSettings.Method.fromLabel(sampler);
        if (method == null) {
            throw new BadInputException("--sampler " + sampler + ": unknown sampler; use sa or sqa");
        }
        if (method == SamplerSettings.Method.SIMULATED_ANNEALING) {
            if (temperature != null || slices != null || energyScales != null || energyUnits != null) {
                throw new BadInputException("--temperature, --slices, --energy-scales and --energy-units apply to "
                        + "--sampler sqa only; add --sampler sqa or drop them");
            }
            return s;
        }
        if (s.kernel() != SamplerSettings.Kernel.EXACT) {
            throw new BadInputException("--kernel " + kernel + ": the multi-spin kernel runs --sampler sa only; drop it");
        }
        if (temperature == null) {
            throw new BadInputException("--sampler sqa needs --temperature T (k_B T in the energy units of A and B)");
        }
        if (!(temperature > 0) || !Double.isFinite(temperature)) {
            throw new BadInputException("--temperature " + temperature + ": need a finite number > 0 (k_B T in the "
                    + "energy units of A and B)");
        }
        int p = slices == null ? PathIntegralSettings.DEFAULT_SLICES : slices;
        if (p < 1 || p > PathIntegralSettings.MAX_SLICES) {
            throw new BadInputException("--slices " + p + ": need a whole number from 1 to "
                    + PathIntegralSettings.MAX_SLICES);
        }
        if (energyUnits != null && energyScales == null) {
            throw new BadInputException("--energy-units goes with --energy-scales F; give the table or drop the units");
        }
        EnergyScales scales = energyScales == null ? EnergyScales.illustrative()
                : SpectrumCommand.readSchedule(energyScales,
                        energyUnits == null ? "units of the energy-scales table (not stated)" : energyUnits);
        return s.withPathIntegral(new PathIntegralSettings(scales, temperature, p));
    }
}
