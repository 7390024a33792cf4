package org.obverse.campaign;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.obverse.device.DeviceLimits;
import org.obverse.device.LimitCheck;
import org.obverse.device.LimitViolation;
import org.obverse.gauge.Gauge;
import org.obverse.gauge.GaugeDesign;
import org.obverse.gauge.GaugeSet;
import org.obverse.gauge.GaugeTransform;
import org.obverse.gauge.LockPolicy;
import org.obverse.gauge.LockedClusters;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.codec.ChainList;
import org.obverse.io.codec.ChainsCodec;
import org.obverse.io.codec.DeviceCodec;
import org.obverse.io.codec.GaugeManifest;
import org.obverse.io.json.JsonFiles;
import org.obverse.io.codec.ManifestCodec;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.random.RandomStreams;

/**
 * Gauges a problem file on a device: writes {@code manifest.json} and one gauged spin problem
 * per gauge ({@code g0000.json} …) into a fresh folder, all or nothing. A binary source is
 * gauged in its exact spin form.
 */
public final class GaugeStep {
    /** The manifest's file name inside the output folder. */
    public static final String MANIFEST = "manifest.json";

    private GaugeStep() {
    }

    /** What to gauge and how. chains may be null. */
    public record Request(Path problem, Path device, Path chains, LockPolicy lock, GaugeDesign design, int count,
                          long seed, Path out, boolean force) {
    }

    /** What was written. */
    public record Result(GaugeManifest manifest, GaugeSet gauges, Path manifestFile) {
    }

    public static Result run(Request r) throws IOException {
        ProblemFile pf = ProblemCodec.read(r.problem());
        DeviceLimits device = DeviceCodec.read(r.device());
        ChainList chains = r.chains() == null ? null : ChainsCodec.read(r.chains());
        IsingProblem p = pf.spin();
        if (r.lock() == LockPolicy.CHAINS && chains == null) {
            throw BadInputException.at(null, "--lock chains", "needs the embedding's chains", "give --chains FILE");
        }
        List<LimitViolation> v = LimitCheck.violations(p, device);
        if (!v.isEmpty()) {
            throw BadInputException.at(r.problem(), v.get(0).term(), "breaks the device's limits before any gauge: "
                    + v.get(0).describe() + (v.size() > 1 ? " (and " + (v.size() - 1) + " more)" : ""),
                    "fix the problem or the device file " + r.device());
        }
        LockedClusters clusters;
        try {
            clusters = LockedClusters.of(p, device, r.lock(), chains == null ? null : chains.qubitGroups());
        } catch (IllegalArgumentException e) {
            throw BadInputException.at(r.chains(), "", e.getMessage(), "use the chains of this problem's embedding");
        }
        GaugeSet set;
        try {
            set = GaugeSet.draw(p, device, clusters, r.design(), r.count(), r.seed());
        } catch (IllegalArgumentException e) {
            throw BadInputException.at(r.device(), "coupling_sum", e.getMessage(), "");
        }
        Path outAbs = r.out().toAbsolutePath().normalize();
        int width = Math.max(4, String.valueOf(r.count() - 1).length());
        List<GaugeManifest.Entry> entries = new ArrayList<>();
        List<ProblemFile> gauged = new ArrayList<>();
        String sourceHash = ProblemCodec.contentHash(pf);
        VariableIndex ids = p.variables();
        for (int i = 0; i < set.size(); i++) {
            Gauge g = set.gauge(i);
            ProblemFile gp = gaugedFile(pf, p, g, i, sourceHash);
            String name = String.format("g%0" + width + "d.json", i);
            int[] flipped = g.flippedPositions();
            for (int k = 0; k < flipped.length; k++) {
                flipped[k] = ids.id(flipped[k]);
            }
            entries.add(new GaugeManifest.Entry(i, flipped, name, ProblemCodec.contentHash(gp)));
            gauged.add(gp);
        }
        GaugeManifest m = new GaugeManifest(
                new GaugeManifest.SourceFile(relative(outAbs, r.problem()), sourceHash),
                new GaugeManifest.SourceFile(relative(outAbs, r.device()), DeviceCodec.contentHash(device)),
                chains == null ? null
                        : new GaugeManifest.SourceFile(relative(outAbs, r.chains()), ChainsCodec.contentHash(chains)),
                r.lock().label(), r.design().label(), r.seed(), RandomStreams.ALGORITHM, RandomStreams.EXPANSION,
                counts(clusters), set.redraws(), set.distinctCount(), entries);
        AtomicOutput.writeDirectory(r.out(), r.force(), AtomicOutput.inputs(r.problem(), r.device(), r.chains()), dir -> {
            for (int i = 0; i < gauged.size(); i++) {
                ProblemCodec.write(dir.resolve(entries.get(i).problem()), false, gauged.get(i));
            }
            ManifestCodec.write(dir.resolve(MANIFEST), false, m);
        });
        return new Result(m, set, r.out().resolve(MANIFEST));
    }

    /**
     * The gauged problem file of gauge index i: the transformed spin problem, with the source's
     * meta and a {@code gauge} entry (index and source hash) added.
     */
    static ProblemFile gaugedFile(ProblemFile source, IsingProblem spin, Gauge g, int index, String sourceHash) {
        ObjectNode meta = source.meta() == null ? JsonFiles.MAPPER.createObjectNode() : source.meta().deepCopy();
        ObjectNode gm = meta.putObject("gauge");
        gm.put("index", index);
        gm.put("source_sha256", sourceHash);
        gm.put("flipped_count", g.flippedCount());
        return ProblemFile.of(GaugeTransform.apply(spin, g), meta);
    }

    static GaugeManifest.ClusterCounts counts(LockedClusters c) {
        return new GaugeManifest.ClusterCounts(c.size(), c.clusterCount(), c.freeCount(), c.pinnedClusterCount(),
                c.lockedCouplers().length, c.pinnedQubitCount());
    }

    /** A path as seen from the output folder, with forward slashes. */
    static String relative(Path outFolder, Path file) {
        Path abs = file.toAbsolutePath().normalize();
        return outFolder.relativize(abs).toString().replace('\\', '/');
    }
}
