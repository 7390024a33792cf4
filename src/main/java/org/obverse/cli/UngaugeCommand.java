package org.obverse.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.obverse.campaign.UngaugeStep;
import org.obverse.io.samples.SampleCoding;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/** {@code obverse ungauge}: raw samples in the device frame → samples in the source frame. */
@Command(name = "ungauge", mixinStandardHelpOptions = true,
        description = "Maps each gauge's raw samples (SAMPLES/<stem>.npy or .csv, device frame) back to the source "
                + "frame, s = g * s', into OUT/<stem> in the same layout.")
public final class UngaugeCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--manifest", required = true, paramLabel = "M", description = "the gauges' manifest.json")
    Path manifest;

    @Option(names = "--samples", required = true, paramLabel = "DIR", description = "folder of raw samples, one file per gauge")
    Path samples;

    @Mixin
    OutputFolderOption output;

    @Option(names = "--allow-missing", description = "skip gauges that have no samples file instead of failing")
    boolean allowMissing;

    @Mixin
    ForceOption force;

    @Option(names = "--binary", description = "samples are stored as 0/1 (x = (1 + s) / 2) instead of -1/+1, in and out")
    boolean binary;

    @Override
    public Integer call() throws Exception {
        UngaugeStep.Result r = UngaugeStep.run(new UngaugeStep.Request(manifest, samples, output.path(), allowMissing, force.on(),
                binary ? SampleCoding.BINARY : SampleCoding.SPIN));
        PrintWriter w = spec.commandLine().getOut();
        long reads = r.done().stream().mapToLong(UngaugeStep.Done::reads).sum();
        w.printf("ungauged %d gauges, %d reads, into %s%n", r.done().size(), reads, output.path());
        if (!r.missing().isEmpty()) {
            w.printf("skipped %d gauges without samples (--allow-missing): %s%n", r.missing().size(), r.missing());
        }
        return Main.DONE;
    }
}
