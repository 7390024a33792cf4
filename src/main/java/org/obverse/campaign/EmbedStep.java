package org.obverse.campaign;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
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
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.codec.ChainList;
import org.obverse.io.codec.ChainsCodec;
import org.obverse.io.codec.DeviceCodec;
import org.obverse.io.json.JsonFiles;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.model.IsingProblem;
import org.obverse.random.LegacyStreams;

/**
 * Places a logical problem on a device through chains and writes the physical problem, whose
 * {@code meta} records the embedding ({@code scale}, {@code chain_coupling},
 * {@code chain_coupling_mode}, {@code chain_couplers}, {@code chain_energy},
 * {@code logical_offset}, {@code logical_variables}, {@code longest_chain}). Without chains it
 * finds them first (seeded) and writes them too.
 *
 * <p>{@link #findChains}, {@link #embed} and {@link #physicalFile} are the in-memory parts a
 * campaign calls: chains found once per problem structure, then one physical problem per
 * chain coupling.
 */
public final class EmbedStep {
    /** Meta keys that mark a problem as the physical problem of an embedding. */
    public static final List<String> EMBEDDING_META = List.of("chain_coupling", "chain_couplers", "chain_energy");

    private EmbedStep() {
    }

    /** How chains are found. */
    public enum Finder {
        /** Rip-up-and-reroute search on any working graph. */
        REROUTE("reroute"),
        /** The native clique of the device's cell lattice ({@code meta.lattice} of the device file). */
        CLIQUE("clique");

        private final String label;

        Finder(String label) {
            this.label = label;
        }

        public String label() {
            return label;
        }

        /** The finder of a label. */
        public static Finder named(String label) {
            for (Finder f : values()) {
                if (f.label.equals(label)) {
                    return f;
                }
            }
            throw new IllegalArgumentException("finder '" + label + "' is not one of reroute, clique");
        }
    }

    /**
     * The search's limits.
     *
     * @param finder           the finder
     * @param seed             seed of the search (reroute)
     * @param rounds           most rounds of one try (≥ 1)
     * @param tries            independent tries; the one with the shortest longest chain is kept
     * @param timeLimitSeconds time limit of the whole search, 0 for none (≥ 0)
     */
    public record Search(Finder finder, long seed, int rounds, int tries, double timeLimitSeconds) {
        public Search {
            if (rounds < 1 || !(timeLimitSeconds >= 0)) {
                throw new IllegalArgumentException("the search needs rounds >= 1 and a time limit >= 0 seconds");
            }
        }
    }

    /**
     * How chains were found.
     *
     * @param search    the search asked for
     * @param seconds   time it took
     * @param lattice   the lattice of a clique embedding, or null
     * @param cliqueMax the largest clique the lattice holds without defects (clique only)
     */
    public record Found(Search search, double seconds, CellLattice lattice, int cliqueMax) {
    }

    /** Chains and how they were found. */
    public record FoundChains(Chains chains, Found found) {
    }

    /**
     * What to embed.
     *
     * @param logical   the logical problem (binary is converted to spin)
     * @param chains    the chains file, or null to find chains
     * @param device    the device, with its working graph
     * @param strength  the chain coupling and its mode
     * @param scale     factor of the logical terms, or NaN for the largest that fits
     * @param out       the physical problem to write
     * @param chainsOut where found chains go, or null for {@code out}'s name with {@code .chains.json}
     * @param search    how to find chains (used only without chains)
     * @param force     replace existing outputs
     */
    public record Request(Path logical, Path chains, Path device, ChainStrength strength, double scale, Path out,
                          Path chainsOut, Search search, boolean force) {
    }

    /**
     * What was written.
     *
     * @param embedded      the embedding
     * @param logical       the logical problem (spin form)
     * @param out           the physical problem written
     * @param chainsWritten the chains file written, or null when chains were given
     * @param found         how the chains were found, or null when given
     */
    public record Result(EmbeddedProblem embedded, IsingProblem logical, Path out, Path chainsWritten, Found found) {
    }

    public static Result run(Request r) throws IOException {
        List<Path> read = AtomicOutput.inputs(r.logical(), r.chains(), r.device());
        AtomicOutput.checkTarget(r.out(), r.force(), read);
        IsingProblem q = ProblemCodec.read(r.logical()).spin();
        ObjectNode deviceJson = JsonFiles.read(r.device(), DeviceCodec.KIND);
        DeviceLimits d = DeviceCodec.fromJson(r.device(), deviceJson);
        QubitGraph g = d.graph().orElseThrow(() -> BadInputException.at(r.device(), "", "lists no working graph",
                "give \"qubits\" and \"couplers\"; embedding needs them"));
        Chains c;
        Found found = null;
        Path writeChains = null;
        if (r.chains() != null) {
            ChainList list = ChainsCodec.read(r.chains());
            c = Chains.of(list.logicalIds(), list.qubitGroups());
        } else {
            writeChains = r.chainsOut() != null ? r.chainsOut() : siblingChains(r.out());
            AtomicOutput.checkTarget(writeChains, r.force(), read);
            FoundChains fc = findChains(q, g, DeviceCodec.lattice(r.device(), deviceJson), r.device(), r.logical(),
                    r.search());
            c = fc.chains();
            found = fc.found();
        }
        EmbeddedProblem ep = embed(q, c, d, r.strength(), r.scale(), r.chains(), r.device());
        // The problem and the chains found for it are published together.
        boolean withChains = writeChains != null;
        AtomicOutput.writeFiles(withChains ? List.of(r.out(), writeChains) : List.of(r.out()), r.force(), read, files -> {
            ProblemCodec.write(files.get(0), false, physicalFile(q, ep));
            if (withChains) {
                ChainsCodec.write(files.get(1), false, chainList(ep.chains()));
            }
        });
        return new Result(ep, q, r.out(), writeChains, found);
    }

    /**
     * Embeds a logical problem; chains that do not fit are bad input about chainsFile (or the
     * device file where the chains were found, not given: chainsFile null).
     */
    public static EmbeddedProblem embed(IsingProblem logical, Chains chains, DeviceLimits device, ChainStrength strength,
                                        double scale, Path chainsFile, Path deviceFile) {
        try {
            return ChainEmbedder.embed(logical, chains, device, strength, scale);
        } catch (IllegalArgumentException e) {
            Path about = chainsFile != null ? chainsFile : deviceFile;
            throw BadInputException.at(about, "", e.getMessage(), chainsFile != null
                    ? "fix the chains, or leave out --chains to have them found" : "");
        }
    }

    /** The physical problem file of an embedding: the physical problem with the embedding's meta. */
    public static ProblemFile physicalFile(IsingProblem logical, EmbeddedProblem ep) {
        ObjectNode meta = JsonFiles.MAPPER.createObjectNode();
        meta.put("scale", ep.scale());
        meta.put("chain_coupling", ep.strength().value());
        meta.put("chain_coupling_mode", ep.strength().mode().label());
        meta.put("chain_couplers", ep.chainCouplerCount());
        meta.put("chain_energy", ep.chainEnergy());
        meta.put("logical_offset", logical.offset());
        meta.put("logical_variables", logical.size());
        meta.put("longest_chain", ep.chains().maxLength());
        return ProblemFile.of(ep.physical(), meta);
    }

    /** The chains file's content of chains. */
    public static ChainList chainList(Chains c) {
        return new ChainList(c.logicalIds().toArray(), c.qubitGroups());
    }

    /**
     * Finds chains for a logical problem on a working graph.
     *
     * @param lattice     the cell lattice the device file records, or null (the clique finder needs it)
     * @param deviceFile  the device file, named in refusals
     * @param logicalFile the logical problem's file, named in refusals
     * @throws BadInputException where no embedding is found
     */
    public static FoundChains findChains(IsingProblem q, QubitGraph g, CellLattice lattice, Path deviceFile,
                                         Path logicalFile, Search s) {
        long start = System.nanoTime();
        if (s.finder() == Finder.CLIQUE) {
            if (lattice == null) {
                throw BadInputException.at(deviceFile, "\"meta\".\"lattice\"", "is missing",
                        "--finder clique needs a device made by 'obverse device lattice'; use --finder reroute");
            }
            try {
                Chains c = CliqueEmbedding.avoidingDefects(lattice, g, q.variables());
                return new FoundChains(c, new Found(s, (System.nanoTime() - start) / 1e9, lattice,
                        CliqueEmbedding.maxSize(lattice)));
            } catch (IllegalArgumentException e) {
                throw BadInputException.at(logicalFile, "", e.getMessage(), "");
            }
        }
        try {
            Chains c = RerouteEmbeddingFinder.findBest(q, g,
                    new FinderLimits(s.rounds(), (long) (s.timeLimitSeconds() * 1000)), s.tries(),
                    LegacyStreams.ofSeed(s.seed()));
            return new FoundChains(c, new Found(s, (System.nanoTime() - start) / 1e9, null, 0));
        } catch (EmbeddingNotFoundException e) {
            throw BadInputException.at(logicalFile, "", e.getMessage() + " (seed " + s.seed() + ")", "");
        }
    }

    /** {@code dir/p.json} → {@code dir/p.chains.json}. */
    public static Path siblingChains(Path problem) {
        String name = problem.getFileName().toString();
        String stem = name.endsWith(".json") ? name.substring(0, name.length() - 5) : name;
        return problem.resolveSibling(stem + ".chains.json");
    }
}
