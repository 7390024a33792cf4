package org.obverse.cli;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.security.SecureRandom;
import java.util.concurrent.Callable;
import org.apache.commons.rng.simple.RandomSource;
import org.obverse.device.CellLattice;
import org.obverse.device.DeviceLimits;
import org.obverse.device.QubitGraph;
import org.obverse.embed.ChainEmbedder;
import org.obverse.embed.ChainStrength;
import org.obverse.embed.Chains;
import org.obverse.embed.CliqueEmbedding;
import org.obverse.embed.EmbeddedProblem;
import org.obverse.embed.EmbeddingNotFoundException;
import org.obverse.embed.FinderLimits;
import org.obverse.embed.RerouteEmbeddingFinder;
import org.obverse.io.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.ChainList;
import org.obverse.io.ChainsCodec;
import org.obverse.io.DeviceCodec;
import org.obverse.io.JsonFiles;
import org.obverse.io.ProblemCodec;
import org.obverse.io.ProblemFile;
import org.obverse.model.IsingProblem;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
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

    @Option(names = "--seed", paramLabel = "S", description = "seed of the search (default: drawn and printed)")
    Long seed;

    @Option(names = "--rounds", defaultValue = "2000", paramLabel = "R", description = "most search rounds (default ${DEFAULT-VALUE})")
    int rounds;

    @Option(names = "--tries", defaultValue = "16", paramLabel = "K",
            description = "independent searches (within the time limit); the one with the shortest longest chain is kept "
                    + "(default ${DEFAULT-VALUE})")
    int tries;

    @Option(names = "--time-limit", defaultValue = "60", paramLabel = "SECONDS",
            description = "time limit of the whole search, 0 for none; no new try starts after it (default ${DEFAULT-VALUE})")
    double timeLimit;

    @Option(names = "--force", description = "replace existing output files")
    boolean force;

    @Override
    public Integer call() throws Exception {
        List<Path> read = AtomicOutput.inputs(logical, chains, device);
        AtomicOutput.checkTarget(out, force, read);
        IsingProblem q = ProblemCodec.read(logical).spin();
        ObjectNode deviceJson = JsonFiles.read(device, DeviceCodec.KIND);
        DeviceLimits d = DeviceCodec.fromJson(device, deviceJson);
        QubitGraph g = d.graph().orElseThrow(() -> BadInputException.at(device, "", "lists no working graph",
                "give \"qubits\" and \"couplers\"; embedding needs them"));
        PrintWriter w = spec.commandLine().getOut();
        Chains c;
        Path writeChains = null;
        if (chains != null) {
            ChainList list = ChainsCodec.read(chains);
            c = Chains.of(list.logicalIds(), list.qubitGroups());
        } else {
            writeChains = chainsOut != null ? chainsOut : siblingChains(out);
            AtomicOutput.checkTarget(writeChains, force, read);
            c = find(q, g, deviceJson, w);
        }
        ChainStrength strength = new ChainStrength(chainCoupling, ChainStrength.Mode.named(mode));
        EmbeddedProblem ep;
        try {
            ep = ChainEmbedder.embed(q, c, d, strength, scale == null ? Double.NaN : scale);
        } catch (IllegalArgumentException e) {
            Path about = chains != null ? chains : device;
            throw BadInputException.at(about, "", e.getMessage(), chains != null
                    ? "fix the chains, or leave out --chains to have them found" : "");
        }
        ObjectNode meta = JsonFiles.MAPPER.createObjectNode();
        meta.put("scale", ep.scale());
        meta.put("chain_coupling", chainCoupling);
        meta.put("chain_coupling_mode", strength.mode().label());
        meta.put("chain_couplers", ep.chainCouplerCount());
        meta.put("chain_energy", ep.chainEnergy());
        meta.put("logical_offset", q.offset());
        meta.put("logical_variables", q.size());
        meta.put("longest_chain", ep.chains().maxLength());
        // The problem and the chains found for it are published together.
        boolean withChains = writeChains != null;
        AtomicOutput.writeFiles(withChains ? List.of(out, writeChains) : List.of(out), force, read, files -> {
            ProblemCodec.write(files.get(0), false, ProblemFile.of(ep.physical(), meta));
            if (withChains) {
                ChainsCodec.write(files.get(1), false,
                        new ChainList(ep.chains().logicalIds().toArray(), ep.chains().qubitGroups()));
            }
        });
        w.printf("embedded %d logical variables on %d qubits: longest chain %d, %d chain couplers%n", q.size(),
                ep.physical().size(), ep.chains().maxLength(), ep.chainCouplerCount());
        w.printf("scale %s, chain coupling %s (%s), chain energy %s: E_phys = %s * E_logical + %s for unbroken reads%n",
                ep.scale(), chainCoupling, strength.mode().label(), ep.chainEnergy(), ep.scale(), ep.chainEnergy());
        if (writeChains != null) {
            w.printf("wrote %s%n", writeChains);
        }
        w.printf("wrote %s%n", out);
        return Main.DONE;
    }

    private Chains find(IsingProblem q, QubitGraph g, ObjectNode deviceJson, PrintWriter w) {
        if (finder.equals("clique")) {
            JsonNode shape = deviceJson.path("meta").path("lattice");
            if (!shape.path("rows").isInt() || !shape.path("cols").isInt() || !shape.path("shore").isInt()) {
                throw BadInputException.at(device, "\"meta\".\"lattice\"", "is missing",
                        "--finder clique needs a device made by 'obverse device lattice'; use --finder reroute");
            }
            CellLattice lattice = CellLattice.of(shape.get("rows").asInt(), shape.get("cols").asInt(),
                    shape.get("shore").asInt());
            try {
                Chains c = CliqueEmbedding.avoidingDefects(lattice, g, q.variables());
                w.printf("native clique of %d variables in %s (at most %d without defects): chains of length %d%n",
                        q.size(), lattice, CliqueEmbedding.maxSize(lattice), c.maxLength());
                return c;
            } catch (IllegalArgumentException e) {
                throw BadInputException.at(logical, "", e.getMessage(), "");
            }
        }
        if (!finder.equals("reroute")) {
            throw new BadInputException("--finder '" + finder + "' is not one of reroute, clique");
        }
        if (rounds < 1 || !(timeLimit >= 0)) {
            throw new BadInputException("--rounds must be >= 1 and --time-limit >= 0");
        }
        long s = seed != null ? seed : new SecureRandom().nextLong();
        long start = System.nanoTime();
        try {
            Chains c = RerouteEmbeddingFinder.findBest(q, g, new FinderLimits(rounds, (long) (timeLimit * 1000)), tries,
                    RandomSource.XO_RO_SHI_RO_128_PP.create(s));
            w.printf("found chains (rip-up and reroute, seed %d, best of up to %d tries) in %.1f s%n", s, tries,
                    (System.nanoTime() - start) / 1e9);
            return c;
        } catch (EmbeddingNotFoundException e) {
            throw BadInputException.at(logical, "", e.getMessage() + " (seed " + s + ")", "");
        }
    }

    private static Path siblingChains(Path problem) {
        String name = problem.getFileName().toString();
        String stem = name.endsWith(".json") ? name.substring(0, name.length() - 5) : name;
        return problem.resolveSibling(stem + ".chains.json");
    }
}
