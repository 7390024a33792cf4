package org.obverse.campaign;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.device.DeviceLimits;
import org.obverse.device.LimitCheck;
import org.obverse.device.LimitViolation;
import org.obverse.gauge.Gauge;
import org.obverse.gauge.GaugeDesign;
import org.obverse.gauge.GaugeSet;
import org.obverse.gauge.LockPolicy;
import org.obverse.gauge.LockedClusters;
import org.obverse.io.BadInputException;
import org.obverse.io.codec.ChainList;
import org.obverse.io.codec.ChainsCodec;
import org.obverse.io.codec.DeviceCodec;
import org.obverse.io.codec.GaugeManifest;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.samples.SampleFiles;
import org.obverse.io.samples.SampleFormat;
import org.obverse.io.samples.SampleReader;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.random.LegacyStreams;
import org.obverse.random.RandomStreams;
import org.obverse.samples.EnergyKernel;
import org.obverse.samples.SampleBlock;
import org.obverse.samples.SpinFlip;
import org.obverse.spectrum.SpectrumCheck;
import org.obverse.spectrum.SpectrumSettings;

/**
 * Re-derives everything a manifest claims and checks it: source hashes, the lock analysis,
 * the gauges redrawn from the seed, each gauged problem against the source re-gauged with its
 * recorded flips, every term against the device's limits, locked couplers and pinned qubits,
 * and energy invariance bit for bit — on the raw samples where given, else on seeded random
 * samples — and reported energies within a stated tolerance.
 */
public final class ManifestAudit {
    /** Seeded random samples per gauge where no samples are given. */
    public static final int RANDOM_READS = 256;
    /** Reported energies may differ from ours by this much relative to the problem's Σ|terms|. */
    public static final double REPORTED_RELATIVE_TOLERANCE = 1e-9;
    /** Stream number of the audit's random samples (distinct from the gauges' stream 0). */
    static final long AUDIT_STREAM = 0x617564697474L;

    private ManifestAudit() {
    }

    /**
     * What to audit: the manifest, the raw samples folder (or null for seeded random samples), and
     * whether to compare the anneal spectrum of each gauged problem with the source's (only for
     * problems small enough for the exact solvers; others are listed as skipped).
     */
    public record Request(Path manifest, Path samples, boolean spectrum) {
        public Request(Path manifest, Path samples) {
            this(manifest, samples, false);
        }
    }

    /** All checks, in order. */
    public record Report(List<AuditCheck> checks) {
        public boolean allPassed() {
            return checks.stream().allMatch(AuditCheck::passed);
        }

        public long skipped() {
            return checks.stream().filter(AuditCheck::skipped).count();
        }

        public long failures() {
            return checks.stream().filter(c -> !c.passed()).count();
        }
    }

    public static Report run(Request r) throws IOException {
        List<AuditCheck> out = new ArrayList<>();
        SourceFiles src = new SourceFiles(r.manifest());
        GaugeManifest m = src.manifest;
        if (r.samples() != null && !Files.isDirectory(r.samples())) {
            throw BadInputException.at(r.samples(), "", "is not a folder", "give the folder that holds the raw samples");
        }

        ProblemFile pf;
        DeviceLimits device;
        ChainList chains;
        try {
            pf = src.problem();
            device = src.device();
            chains = src.chains();
        } catch (BadInputException e) {
            out.add(AuditCheck.fail("sources", "every source file can be read", e.getMessage()));
            return new Report(out);
        }
        String ph = ProblemCodec.contentHash(pf);
        out.add(AuditCheck.of("source problem", "content hash matches the manifest",
                ph.equals(m.problem().sha256()) ? null : "hash " + ph.substring(0, 12) + "…, recorded "
                        + m.problem().sha256().substring(0, 12) + "… (" + m.problem().path() + " changed)",
                m.problem().path()));
        String dh = DeviceCodec.contentHash(device);
        out.add(AuditCheck.of("device", "content hash matches the manifest",
                dh.equals(m.device().sha256()) ? null : "hash differs (" + m.device().path() + " changed)",
                m.device().path()));
        if (chains != null) {
            String ch = ChainsCodec.contentHash(chains);
            out.add(AuditCheck.of("chains", "content hash matches the manifest",
                    ch.equals(m.chains().sha256()) ? null : "hash differs (" + m.chains().path() + " changed)",
                    m.chains().path()));
        }
        IsingProblem p = pf.spin();
        VariableIndex ids = p.variables();
        List<LimitViolation> sv = LimitCheck.violations(p, device);
        out.add(AuditCheck.of("source problem", "within the device's limits",
                sv.isEmpty() ? null : sv.size() + " violations, first " + sv.get(0).describe(), ""));

        LockPolicy lock;
        LockedClusters clusters;
        try {
            lock = LockPolicy.ofLabel(m.lock());
            clusters = LockedClusters.of(p, device, lock, chains == null ? null : chains.qubitGroups());
        } catch (IllegalArgumentException e) {
            out.add(AuditCheck.fail("locks", "the lock analysis can be re-derived", e.getMessage()));
            return new Report(out);
        }
        GaugeManifest.ClusterCounts derived = GaugeStep.counts(clusters);
        out.add(AuditCheck.of("locks", "re-derived clusters match the manifest",
                derived.equals(m.clusters()) ? null : "derived " + derived + ", recorded " + m.clusters(),
                derived.clusters() + " clusters, " + derived.free() + " free, " + derived.pinned() + " pinned, "
                        + derived.lockedCouplers() + " locked couplers"));

        List<Gauge> gauges = new ArrayList<>();
        for (GaugeManifest.Entry e : m.gauges()) {
            gauges.add(UngaugeStep.toGauge(r.manifest(), e, ids));
        }
        redrawCheck(out, m, p, device, clusters, gauges);
        int distinct = GaugeSet.countDistinct(p, gauges);
        out.add(AuditCheck.of("gauges", "distinct gauged problems as recorded",
                distinct == m.distinct() ? null : "counted " + distinct + ", recorded " + m.distinct(),
                distinct + " of " + gauges.size()));

        String sourceHash = m.problem().sha256();
        double termScale = termScale(p);
        for (int i = 0; i < gauges.size(); i++) {
            GaugeManifest.Entry e = m.gauges().get(i);
            Gauge g = gauges.get(i);
            String subject = "gauge " + e.index();
            String why = clusters.whyNotAllowed(g, ids);
            out.add(AuditCheck.of(subject, "flips respect the locked clusters and pinned qubits", why,
                    g.flippedCount() + " qubits flipped"));
            Path gp = src.folder.resolve(e.problem());
            ProblemFile onDisk;
            try {
                onDisk = ProblemCodec.read(gp);
            } catch (BadInputException ex) {
                out.add(AuditCheck.fail(subject, e.problem() + " can be read", ex.getMessage()));
                continue;
            }
            String gh = ProblemCodec.contentHash(onDisk);
            out.add(AuditCheck.of(subject, e.problem() + " matches its recorded hash",
                    gh.equals(e.sha256()) ? null : "hash " + gh.substring(0, 12) + "…, recorded " + e.sha256().substring(0, 12) + "…",
                    ""));
            ProblemFile rederived = GaugeStep.gaugedFile(pf, p, g, e.index(), sourceHash);
            IsingProblem gauged = rederived.ising();
            out.add(AuditCheck.of(subject, e.problem() + " equals the source re-gauged with the recorded flips",
                    firstDifference(onDisk.spin(), gauged), p.size() + " fields, " + p.edgeCount() + " couplers"));
            List<LimitViolation> gv = LimitCheck.violations(onDisk.spin(), device);
            out.add(AuditCheck.of(subject, "every term within the device's limits",
                    gv.isEmpty() ? null : gv.size() + " violations, first " + gv.get(0).describe(), ""));
            out.add(AuditCheck.of(subject, "locked couplers unchanged", lockedChanged(p, onDisk.spin(), clusters),
                    clusters.lockedCouplers().length + " locked"));
            energyChecks(out, subject, r.samples(), e, p, gauged, g, m.seed(), termScale);
            if (r.spectrum()) {
                spectrumCheck(out, subject, p, onDisk.spin());
            }
        }
        return new Report(out);
    }

    private static void redrawCheck(List<AuditCheck> out, GaugeManifest m, IsingProblem p, DeviceLimits d,
                                    LockedClusters clusters, List<Gauge> gauges) {
        String claim = "redrawn from seed " + m.seed() + " (" + m.design() + " design) they reproduce the manifest";
        if (!m.generator().equals(RandomStreams.ALGORITHM) || !m.seedExpansion().equals(RandomStreams.EXPANSION)) {
            out.add(AuditCheck.fail("gauges", claim, "generator " + m.generator() + "/" + m.seedExpansion()
                    + " is not this version's " + RandomStreams.ALGORITHM + "/" + RandomStreams.EXPANSION));
            return;
        }
        try {
            GaugeSet again = GaugeSet.draw(p, d, clusters, GaugeDesign.ofLabel(m.design()), gauges.size(), m.seed());
            int first = -1;
            for (int i = 0; i < gauges.size() && first < 0; i++) {
                if (!again.gauge(i).equals(gauges.get(i))) {
                    first = i;
                }
            }
            String failure = first >= 0 ? "gauge " + first + " differs"
                    : again.redraws() != m.redraws() ? "redraws " + again.redraws() + ", recorded " + m.redraws() : null;
            out.add(AuditCheck.of("gauges", claim, failure, gauges.size() + " gauges, " + again.redraws() + " redraws"));
        } catch (IllegalArgumentException ex) {
            out.add(AuditCheck.fail("gauges", claim, ex.getMessage()));
        }
    }

    private static void energyChecks(List<AuditCheck> out, String subject, Path samplesDir, GaugeManifest.Entry e,
                                     IsingProblem source, IsingProblem gauged, Gauge g, long seed, double termScale)
            throws IOException {
        Path raw = null;
        if (samplesDir != null) {
            for (SampleFormat f : SampleFormat.values()) {
                Path c = samplesDir.resolve(f.fileName(e.stem()));
                if (Files.exists(c)) {
                    raw = c;
                }
            }
        }
        VariableIndex ids = source.variables();
        InvarianceCheck check = new InvarianceCheck(source, gauged, g);
        if (raw != null) {
            try (SampleReader in = SampleFiles.open(raw, ids)) {
                SampleBlock b = null;
                while ((b = in.nextBlock(UngaugeStep.CHUNK_READS, b)) != null) {
                    check.add(b);
                }
            }
        } else {
            // Drawn read by read, spin by spin, from the audit's own stream of the manifest's seed.
            UniformRandomProvider rng = LegacyStreams.gauges(seed ^ AUDIT_STREAM, e.index());
            SampleBlock b = SampleBlock.allDown(RANDOM_READS, ids.size());
            for (int r = 0; r < RANDOM_READS; r++) {
                for (int k = 0; k < ids.size(); k++) {
                    b.setSpin(r, k, rng.nextBoolean() ? 1 : -1);
                }
            }
            check.add(b);
        }
        long reads = check.reads;
        long mismatches = check.mismatches;
        String firstMismatch = check.firstMismatch;
        double[] energies = Arrays.copyOf(check.energies, (int) reads);
        String where = raw != null ? reads + " reads of " + raw.getFileName() : reads + " seeded random reads";
        out.add(AuditCheck.of(subject, "energy unchanged bit for bit under the un-gauge",
                mismatches == 0 ? null : mismatches + " of " + reads + " reads differ, first " + firstMismatch, where));
        if (samplesDir != null) {
            Path rep = samplesDir.resolve(e.stem() + ".energies.npy");
            if (Files.exists(rep) && raw != null) {
                double[] reported = NpyVectors.readFloat64(rep, energies.length);
                double tol = REPORTED_RELATIVE_TOLERANCE * termScale;
                int bad = -1;
                double worst = 0;
                for (int r = 0; r < reported.length; r++) {
                    double diff = Math.abs(reported[r] - energies[r]);
                    worst = Math.max(worst, diff);
                    if (!(diff <= tol) && bad < 0) {
                        bad = r;
                    }
                }
                out.add(AuditCheck.of(subject, "reported energies agree within " + tol,
                        bad < 0 ? null : "read " + bad + ": reported " + reported[bad] + ", computed " + energies[bad],
                        reported.length + " reads, largest difference " + worst));
            }
        }
    }

    /**
     * Energy invariance on reads in the device frame: each read's energy under the gauged
     * problem against the un-gauged read's (an XOR of the flipped words) under the source, both
     * by the exact kernels that sum in {@link IsingProblem#energy}'s order, so equal bits are
     * required; keeps the gauged energies for the reported-energy check.
     */
    private static final class InvarianceCheck {
        private final EnergyKernel onGauged;
        private final EnergyKernel onSource;
        private final SpinFlip flip;
        private double[] eg = new double[0];
        private double[] es = new double[0];
        double[] energies = new double[1024];
        long reads;
        long mismatches;
        String firstMismatch;

        InvarianceCheck(IsingProblem source, IsingProblem gauged, Gauge g) {
            onGauged = EnergyKernel.exact(gauged);
            onSource = EnergyKernel.exact(source);
            flip = SpinFlip.of(source.size(), g.flippedPositions());
        }

        /** Checks every read of a block; the block is un-gauged in place. */
        void add(SampleBlock b) {
            int got = b.reads();
            if (eg.length < got) {
                eg = new double[got];
                es = new double[got];
            }
            onGauged.energies(b, eg, 0);
            flip.applyInPlace(b);
            onSource.energies(b, es, 0);
            if (reads + got > energies.length) {
                energies = Arrays.copyOf(energies, (int) Math.max(energies.length * 2L, reads + got));
            }
            for (int r = 0; r < got; r++) {
                if (Double.doubleToRawLongBits(eg[r]) != Double.doubleToRawLongBits(es[r]) && mismatches++ == 0) {
                    firstMismatch = "read " + (reads + r) + ": gauged " + eg[r] + ", source " + es[r];
                }
            }
            System.arraycopy(eg, 0, energies, (int) reads, got);
            reads += got;
        }
    }

    private static void spectrumCheck(List<AuditCheck> out, String subject, IsingProblem source, IsingProblem gauged) {
        String claim = "anneal spectrum equals the source's (lowest levels of the reachable sector at s = "
                + Arrays.toString(SpectrumCheck.DEFAULT_S) + ", illustrative schedule)";
        if (!SpectrumCheck.fits(source, SpectrumSettings.defaults())) {
            out.add(AuditCheck.skip(subject, claim, source.size() + " spins are more than the exact solvers take"));
            return;
        }
        SpectrumCheck.Comparison c = SpectrumCheck.sameSpectrum(source, gauged);
        out.add(AuditCheck.of(subject, claim, c.same() ? null : c.reason(),
                "largest difference " + c.worstDifference()));
    }

    /** |offset| + Σ|h| + Σ|J|: the largest energy magnitude; reported energies are compared relative to it. */
    static double termScale(IsingProblem p) {
        double s = Math.abs(p.offset());
        for (int k = 0; k < p.size(); k++) {
            s += Math.abs(p.field(k));
        }
        for (int e = 0; e < p.edgeCount(); e++) {
            s += Math.abs(p.coupling(e));
        }
        return Math.max(s, 1.0);
    }

    private static String firstDifference(IsingProblem onDisk, IsingProblem expected) {
        if (!onDisk.variables().equals(expected.variables())) {
            return "its variables differ from the source's";
        }
        VariableIndex ids = expected.variables();
        for (int k = 0; k < expected.size(); k++) {
            if (Double.compare(onDisk.field(k), expected.field(k)) != 0) {
                return "field of " + ids.id(k) + " is " + onDisk.field(k) + ", expected " + expected.field(k);
            }
        }
        if (onDisk.edgeCount() != expected.edgeCount()) {
            return onDisk.edgeCount() + " couplers, expected " + expected.edgeCount();
        }
        for (int e = 0; e < expected.edgeCount(); e++) {
            if (onDisk.edgeU(e) != expected.edgeU(e) || onDisk.edgeV(e) != expected.edgeV(e)) {
                return "coupler " + e + " joins other qubits than expected";
            }
            if (Double.compare(onDisk.coupling(e), expected.coupling(e)) != 0) {
                return "coupling (" + ids.id(expected.edgeU(e)) + ", " + ids.id(expected.edgeV(e)) + ") is "
                        + onDisk.coupling(e) + ", expected " + expected.coupling(e);
            }
        }
        if (Double.compare(onDisk.offset(), expected.offset()) != 0) {
            return "offset is " + onDisk.offset() + ", expected " + expected.offset();
        }
        return null;
    }

    private static String lockedChanged(IsingProblem source, IsingProblem gauged, LockedClusters c) {
        if (gauged.edgeCount() != source.edgeCount()) {
            return "coupler count differs";
        }
        for (int e : c.lockedCouplers()) {
            if (Double.compare(gauged.coupling(e), source.coupling(e)) != 0) {
                VariableIndex ids = source.variables();
                return "coupling (" + ids.id(source.edgeU(e)) + ", " + ids.id(source.edgeV(e)) + ") is "
                        + gauged.coupling(e) + ", was " + source.coupling(e);
            }
        }
        return null;
    }
}
