package org.obverse.cli;

import org.obverse.io.BadInputException;
import org.obverse.campaign.EmbedStep;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.obverse.embed.ChainStrength;
import org.obverse.embed.EmbeddedProblem;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code obverse embed}: places a logical problem on a device through chains. */
@Command(name = "embed", mixinStandardHelpOptions = true,
        description = {"Writes the physical problem of a logical one on a device: each logical field spread evenly over "
                + "its chain's qubits, each logical coupling evenly over the couplers between the two chains, the chain "
                + "coupling on every coupler inside a chain, and the logical terms scaled to fit the symmetric part of "
                + "the device's ranges.",
            "For every read with no broken chain: E_phys = scale * E_logical + chain_energy (meta of the output; with one "
                + "chain coupling V, chain_energy = chain_couplers * V). The physical offset is scale * the logical offset.",
            "Without --chains, finds chains (--finder) and writes them to --chains-out."})
public final class EmbedCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--logical", required = true, paramLabel = "Q", description = "the logical problem (obverse.problem/1; binary is converted to spin)")
    Path logical;

    @Option(names = "--chains", paramLabel = "C", description = "the chains (obverse.chains/1); without it they are found")
    Path chains;

    @Option(names = "--device", required = true, paramLabel = "D", description = "the device, with its working graph (obverse.device/1)")
    Path device;

    @Option(names = "--chain-coupling", required = true, paramLabel = "V",
            description = "the coupling inside chains, in device units (negative holds a chain together)")
    double chainCoupling;

    @Option(names = "--chain-coupling-mode", defaultValue = "uniform", paramLabel = "uniform|length|degree",
            description = "uniform: V in every chain; length or degree: V * a / max a for a chain's length or logical "
                    + "degree a (default ${DEFAULT-VALUE})")
    String mode;

    @Option(names = "--scale", paramLabel = "S", description = "multiply the logical terms by S (default: the largest that fits)")
    Double scale;

    @Option(names = "--out", required = true, paramLabel = "P", description = "the physical problem to write")
    Path out;

    @Option(names = "--chains-out", paramLabel = "C", description = "where to write found chains (default: P's name with .chains.json)")
    Path chainsOut;

    @Option(names = "--finder", defaultValue = "reroute", paramLabel = "reroute|clique",
            description = "reroute: rip-up-and-reroute search on any working graph; clique: the native clique of the "
                    + "device's lattice (from device lattice) (default ${DEFAULT-VALUE})")
    String finder;

    @Mixin
    DrawnSeedOption seed;

    @Option(names = "--rounds", defaultValue = "2000", paramLabel = "R", description = "most search rounds (default ${DEFAULT-VALUE})")
    int rounds;

    @Option(names = "--tries", defaultValue = "16", paramLabel = "K",
            description = "independent searches (within the time limit); the one with the shortest longest chain is kept "
                    + "(default ${DEFAULT-VALUE})")
    int tries;

    @Option(names = "--time-limit", defaultValue = "60", paramLabel = "SECONDS",
            description = "time limit of the whole search, 0 for none; no new try starts after it (default ${DEFAULT-VALUE})")
    double timeLimit;

    @Mixin
    ForceOption force;

    @Override
    public Integer call() throws Exception {
        ChainStrength strength;
        try {
            strength = new ChainStrength(chainCoupling, ChainStrength.Mode.named(mode));
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--chain-coupling / --chain-coupling-mode: " + e.getMessage());
        }
        EmbedStep.Search search = null;
        if (chains == null) {
            EmbedStep.Finder f;
            try {
                f = EmbedStep.Finder.named(finder);
            } catch (IllegalArgumentException e) {
                throw new BadInputException("--finder '" + finder + "' is not one of reroute, clique");
            }
            if (f == EmbedStep.Finder.REROUTE && (rounds < 1 || !(timeLimit >= 0))) {
                throw new BadInputException("--rounds must be >= 1 and --time-limit >= 0");
            }
            long s = f == EmbedStep.Finder.CLIQUE && !seed.given() ? 0 : seed.orDrawn();
            search = new EmbedStep.Search(f, s, Math.max(rounds, 1), tries, Math.max(timeLimit, 0));
        }
        EmbedStep.Result r = EmbedStep.run(new EmbedStep.Request(logical, chains, device, strength,
                scale == null ? Double.NaN : scale, out, chainsOut, search, force.on()));
        PrintWriter w = spec.commandLine().getOut();
        EmbedStep.Found found = r.found();
        if (found != null && found.lattice() != null) {
            w.printf("native clique of %d variables in %s (at most %d without defects): chains of length %d%n",
                    r.logical().size(), found.lattice(), found.cliqueMax(), r.embedded().chains().maxLength());
        } else if (found != null) {
            w.printf("found chains (rip-up and reroute, seed %d, best of up to %d tries) in %.1f s%n",
                    found.search().seed(), found.search().tries(), found.seconds());
        }
        EmbeddedProblem ep = r.embedded();
        w.printf("embedded %d logical variables on %d qubits: longest chain %d, %d chain couplers%n", r.logical().size(),
                ep.physical().size(), ep.chains().maxLength(), ep.chainCouplerCount());
        w.printf("scale %s, chain coupling %s (%s), chain energy %s: E_phys = %s * E_logical + %s for unbroken reads%n",
                ep.scale(), chainCoupling, strength.mode().label(), ep.chainEnergy(), ep.scale(), ep.chainEnergy());
        if (r.chainsWritten() != null) {
            w.printf("wrote %s%n", r.chainsWritten());
        }
        w.printf("wrote %s%n", out);
        return Main.DONE;
    }
}
