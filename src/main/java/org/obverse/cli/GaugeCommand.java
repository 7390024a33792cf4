package org.obverse.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.obverse.io.BadInputException;
import org.obverse.campaign.GaugeStep;
import org.obverse.gauge.GaugeDesign;
import org.obverse.gauge.LockPolicy;
import org.obverse.io.codec.GaugeManifest;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/** {@code obverse gauge}: draws range-aware gauges and writes the gauged problems and a manifest. */
@Command(name = "gauge", mixinStandardHelpOptions = true,
        description = {"Draws spin-reversal gauges that respect the device's limits and writes DIR/manifest.json "
                + "and one gauged problem per gauge (g0000.json ...).",
            "Couplers whose negation leaves the range (e.g. chains at -1.6 on [-2, +1]) lock their qubits together; "
                + "fields whose negation leaves the field range pin their qubit."})
public final class GaugeCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--problem", required = true, paramLabel = "P", description = "the physical problem (obverse.problem/1)")
    Path problem;

    @Option(names = "--device", required = true, paramLabel = "D", description = "the device's limits (obverse.device/1)")
    Path device;

    @Option(names = "--chains", paramLabel = "C", description = "the embedding's chains (obverse.chains/1)")
    Path chains;

    @Option(names = "--lock", paramLabel = "range|chains",
            description = "range: lock only what the limits force; chains: each chain is one cluster too "
                    + "(the same as gauging the logical problem). Default: chains when --chains is given, else range.")
    String lock;

    @Option(names = "--count", required = true, paramLabel = "N", description = "number of gauges")
    int count;

    @Option(names = "--design", defaultValue = "random", paramLabel = "random|balanced",
            description = "random: each free cluster's sign fair and independent; balanced: each cluster flipped in "
                    + "half the gauges (pairwise balanced where N is a power of two). Default: ${DEFAULT-VALUE}.")
    String design;

    @Mixin
    DrawnSeedOption seed;

    @Mixin
    OutputFolderOption output;

    @Mixin
    ForceOption force;

    @Override
    public Integer call() throws Exception {
        if (count < 1) {
            throw new BadInputException("--count " + count + " must be at least 1");
        }
        LockPolicy policy = lock == null ? (chains != null ? LockPolicy.CHAINS : LockPolicy.RANGE) : LockPolicy.ofLabel(lock);
        long s = seed.orDrawn();
        GaugeStep.Result r = GaugeStep.run(new GaugeStep.Request(problem, device, chains, policy,
                GaugeDesign.ofLabel(design), count, s, output.path(), force.on()));
        GaugeManifest m = r.manifest();
        PrintWriter w = spec.commandLine().getOut();
        GaugeManifest.ClusterCounts c = m.clusters();
        w.printf("locks (%s): %d qubits in %d clusters: %d free, %d pinned; %d locked couplers, %d pinned qubits%n",
                m.lock(), c.qubits(), c.clusters(), c.free(), c.pinned(), c.lockedCouplers(), c.pinnedQubits());
        w.printf("gauges (%s, seed %d, %s): %d drawn, %d distinct, %d redrawn for the coupling-sum range%n",
                m.design(), m.seed(), m.generator(), m.gauges().size(), m.distinct(), m.redraws());
        w.printf("wrote %s and %d gauged problems%n", r.manifestFile(), m.gauges().size());
        return Main.DONE;
    }
}
