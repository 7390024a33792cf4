package org.obverse.campaign;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.ConcurrentHashMap;
import java.util.function.IntConsumer;
import org.obverse.embed.ChainBreakRule;
import org.obverse.embed.ChainDecoder;
import org.obverse.embed.Chains;
import org.obverse.embed.DecodedSamples;
import org.obverse.io.BadInputException;
import org.obverse.io.codec.CampaignPlan;
import org.obverse.io.codec.ChainList;
import org.obverse.io.codec.ChainsCodec;
import org.obverse.io.codec.GaugeManifest;
import org.obverse.io.table.GroundTable;
import org.obverse.io.table.JobTable;
import org.obverse.io.codec.ManifestCodec;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.table.ResultsTable;
import org.obverse.io.samples.SampleFiles;
import org.obverse.io.samples.SampleFormat;
import org.obverse.io.samples.SampleWriter;
import org.obverse.model.IsingProblem;
import org.obverse.random.RandomStreams;
import org.obverse.random.StreamPurpose;
import org.obverse.samples.EnergyKernel;
import org.obverse.samples.SampleBlock;
import org.obverse.samples.SpinFlip;

/**
 * Collects a campaign folder: for every job whose raw samples are present (from the reference
 * sampler, or placed there from a device), un-gauges them, audits them — the gauged problem's
 * file against its recorded hash, every manifest re-derived, and every read's energy under the
 * gauged problem equal bit for bit to the un-gauged read's energy under the embedded problem,
 * reported energies within tolerance — decodes the chains by the plan's rule and writes one
 * results table, {@code results.csv}, in logical units, in job order.
 *
 * <p>A job that fails its audit is listed and left out; the others go on. Collecting again
 * gives the same bytes (idempotent); a collect that stops half-way leaves the previous table
 * whole, since every output is replaced by rename.
 */
public final class CampaignCollectStep {
    /** Extra columns of the campaign's results table, after the fixed ones. */
    public static final List<String> EXTRA_COLUMNS = List.of("chain_coupling", "anneal_us", "pause_s",
            "pause_us", "gauged", "schedule", "job");

    private CampaignCollectStep() {
    }

    public record Request(Path folder, int threads) {
    }

    /**
     * What was collected.
     *
     * @param results   the results table
     * @param jobs      jobs in the campaign
     * @param collected jobs whose reads are in the table
     * @param missing   jobs without raw samples yet
     * @param failures  one line per failed check (job or manifest)
     * @param rows      rows written
     * @param reads     reads in the table (Σ count)
     */
    public record Result(Path results, int jobs, int collected, int missing, List<String> failures, long rows,
                         long reads) {
        public boolean allPassed() {
            return failures.isEmpty();
        }
    }

    public static Result run(Request r, StepProgress progress) throws IOException {
        return run(r, CampaignEngine.local(r.threads()), progress);
    }

    /** Collect a campaign, its jobs collected by the given engine and merged here by job index. */
    public static Result run(Request r, CampaignEngine engine, StepProgress progress) throws IOException {
        return run(CampaignFolder.open(r.folder()), engine, FolderStore.local(), progress);
    }

    /**
     * Collect a prepared campaign folder whose job files live in the store: its jobs collected
     * by the engine, merged here by job index, the tables written into the store.
     */
    public static Result run(CampaignFolder folder, CampaignEngine engine, FolderStore store, StepProgress progress)
            throws IOException {
        CampaignPlan plan = folder.plan();
        List<JobTable.Job> jobs = folder.jobs();
        ChainBreakRule.named(plan.decode()); // refuses an unknown rule before any work
        Map<String, String> manifestFailures = auditManifests(folder, jobs);
        String[] rows = new String[jobs.size()];
        String[] failures = new String[jobs.size()];
        long[] reads = new long[jobs.size()];
        boolean[] present = new boolean[jobs.size()];
        double[] best = new double[jobs.size()];
        int[] work = new int[jobs.size()];
        int total = 0;
        boolean[] withRaw = store.hasRaw(folder, jobs);
        for (int k = 0; k < jobs.size(); k++) {
            JobTable.Job j = jobs.get(k);
            present[k] = withRaw[k];
            String mf = j.manifest().isEmpty() ? null : manifestFailures.get(j.manifest());
            if (present[k] && mf != null) {
                failures[k] = j.id() + ": " + mf;
            } else if (present[k]) {
                work[total++] = k;
            }
        }
        if (total > 0) {
            IntConsumer tick = progress.start("collecting", total, 0);
            for (JobRows c : engine.collect(folder, java.util.Arrays.copyOf(work, total), tick)) {
                rows[c.index()] = c.rows();
                failures[c.index()] = c.failure();
                reads[c.index()] = c.reads();
                best[c.index()] = c.best();
            }
        }

        java.io.StringWriter header = new java.io.StringWriter();
        ResultsTable.RowWriter.start(header, EXTRA_COLUMNS);
        StringBuilder table = new StringBuilder(header.toString());
        List<String> failed = new ArrayList<>();
        int collected = 0;
        int missing = 0;
        long rowCount = 0;
        long readCount = 0;
        Map<String, Double> bestSeen = new TreeMap<>();
        for (int k = 0; k < jobs.size(); k++) {
            if (!present[k]) {
                missing++;
            } else if (failures[k] != null) {
                failed.add(failures[k]);
            } else {
                collected++;
                table.append(rows[k]);
                rowCount += rows[k].chars().filter(ch -> ch == '\n').count();
                readCount += reads[k];
                if (!Double.isNaN(best[k])) {
                    bestSeen.merge(jobs.get(k).instance(), best[k], Math::min);
                }
            }
        }
        for (String f : manifestFailures.values()) {
            if (!failed.contains(f)) {
                failed.add(0, f);
            }
        }
        store.writeText(folder, CampaignFolder.RESULTS, table.toString());
        writeGround(folder, store, bestSeen);
        StringBuilder audit = new StringBuilder();
        audit.append(String.format("%d jobs: %d collected, %d without raw samples, %d failed%n", jobs.size(), collected,
                missing, failed.size()));
        for (String f : failed) {
            audit.append("FAILED ").append(f).append('\n');
        }
        store.writeText(folder, CampaignFolder.AUDIT, audit.toString());
        return new Result(folder.resolve(CampaignFolder.RESULTS), jobs.size(), collected, missing, failed, rowCount,
                readCount);
    }

    private record Logical(IsingProblem problem, Chains chains) {
    }

    /**
     * What collecting one job gave: its results rows as text (null where it failed), or the
     * line saying why it failed; its reads; its least logical energy (NaN where none).
     * Serializable, so a cluster task can hand it back.
     */
    public record JobRows(int index, String rows, String failure, long reads, double best)
            implements java.io.Serializable {
        static JobRows failed(int index, String why) {
            return new JobRows(index, null, why, 0, Double.NaN);
        }
    }

    /**
     * Collects single jobs of a campaign folder — un-gauge, audit, decode, rows, and the job's
     * {@code decoded/} files — reading each shared input (logical problems, chains, gauged
     * problems, manifests) once. The work of one job on any engine; safe to use from many
     * threads. Doing a job twice rewrites the same bytes and gives the same rows.
     */
    public static final class JobCollector {
        private final CampaignFolder folder;
        private final CampaignPlan plan;
        private final List<JobTable.Job> jobs;
        private final ChainBreakRule rule;
        private final Map<String, Logical> logical = new ConcurrentHashMap<>();
        private final Map<String, ProblemFile> problems = new ConcurrentHashMap<>();
        private final Map<String, GaugeManifest> manifests = new ConcurrentHashMap<>();

        private JobCollector(CampaignFolder folder) throws IOException {
            this.folder = folder;
            this.plan = folder.plan();
            this.jobs = folder.jobs();
            this.rule = ChainBreakRule.named(plan.decode());
        }

        public static JobCollector open(CampaignFolder folder) throws IOException {
            return new JobCollector(folder);
        }

        /** Collects the job at this index of jobs.csv, whose raw samples must be present. */
        public JobRows collect(int index) throws IOException {
            JobTable.Job j = jobs.get(index);
            Logical l = logical.computeIfAbsent(j.instance(), this::readLogical);
            return collectJob(folder, j, index, plan, rule, l, problems, manifests);
        }

        private Logical readLogical(String instance) {
            for (CampaignPlan.Instance i : plan.instances()) {
                if (i.name().equals(instance)) {
                    ChainList list = ChainsCodec.read(folder.resolve(CampaignFolder.chainsFile(i.name())));
                    return new Logical(ProblemCodec.read(i.problem()).spin(),
                            Chains.of(list.logicalIds(), list.qubitGroups()));
                }
            }
            throw BadInputException.at(folder.resolve(CampaignFolder.JOBS), "", "names instance " + instance
                    + ", which the plan does not list", "prepare the folder again from its plan");
        }
    }

    /** The local engine's collecting: a pool of threads, one job a thread at a time. */
    static List<JobRows> collectOnThreads(CampaignFolder folder, int[] indices, int threads, IntConsumer tick)
            throws IOException {
        JobCollector collector = JobCollector.open(folder);
        return JobThreads.run("collecting", indices.length, threads, tick, k -> collector.collect(indices[k]));
    }

    /** Re-derives every manifest of the campaign; the first failing check of each, by manifest path. */
    private static Map<String, String> auditManifests(CampaignFolder folder, List<JobTable.Job> jobs)
            throws IOException {
        Map<String, String> out = new LinkedHashMap<>();
        for (JobTable.Job j : jobs) {
            if (j.manifest().isEmpty() || out.containsKey(j.manifest())) {
                continue;
            }
            ManifestAudit.Report report = ManifestAudit.run(new ManifestAudit.Request(folder.resolve(j.manifest()), null));
            String first = null;
            for (AuditCheck c : report.checks()) {
                if (!c.passed() && !c.skipped()) {
                    first = j.manifest() + ": " + c.line();
                    break;
                }
            }
            out.put(j.manifest(), first);
        }
        out.values().removeIf(v -> v == null);
        return out;
    }

    /** The job's raw file: the .npy it expects, or a .csv of the same stem from a device. */
    static Path rawFile(CampaignFolder folder, JobTable.Job j) {
        Path raw = folder.resolve(j.raw());
        if (Files.isRegularFile(raw)) {
            return raw;
        }
        String n = raw.getFileName().toString();
        Path csv = raw.resolveSibling(SampleFormat.CSV.fileName(n.substring(0, n.lastIndexOf('.'))));
        return Files.isRegularFile(csv) ? csv : null;
    }

    private static JobRows collectJob(CampaignFolder folder, JobTable.Job j, int index, CampaignPlan plan,
                                        ChainBreakRule rule, Logical logical, Map<String, ProblemFile> problems,
                                        Map<String, GaugeManifest> manifests) throws IOException {
        Path raw = rawFile(folder, j);
        ProblemFile gaugedFile = problems.computeIfAbsent(j.problem(), p -> ProblemCodec.read(folder.resolve(p)));
        String hash = ProblemCodec.contentHash(gaugedFile);
        if (!hash.equals(j.problemSha256())) {
            return JobRows.failed(index, j.id() + ": " + j.problem() + " has content hash " + hash.substring(0, 12)
                    + "…, jobs.csv records " + j.problemSha256().substring(0, 12) + "…");
        }
        IsingProblem gauged = gaugedFile.spin();
        IsingProblem physical = gauged;
        int[] flipped = new int[0];
        if (!j.manifest().isEmpty()) {
            GaugeManifest m = manifests.computeIfAbsent(j.manifest(), p -> ManifestCodec.read(folder.resolve(p)));
            Path manifestDir = folder.resolve(j.manifest()).getParent();
            physical = problems.computeIfAbsent(j.manifest() + "#source",
                    p -> ProblemCodec.read(manifestDir.resolve(m.problem().path()))).spin();
            int[] ids = m.gauges().get(j.gauge()).flipped();
            flipped = new int[ids.length];
            for (int k = 0; k < ids.length; k++) {
                flipped[k] = gauged.variables().indexOf(ids[k]);
            }
        }
        SampleBlock block;
        try {
            block = SampleFiles.readAll(raw, gauged.variables());
        } catch (BadInputException e) {
            return JobRows.failed(index, j.id() + ": " + e.getMessage());
        }
        double[] deviceFrame = EnergyKernel.exact(gauged).energies(block);
        SpinFlip.of(gauged.size(), flipped).applyInPlace(block);
        double[] sourceFrame = EnergyKernel.exact(physical).energies(block);
        for (int r = 0; r < deviceFrame.length; r++) {
            if (Double.doubleToRawLongBits(deviceFrame[r]) != Double.doubleToRawLongBits(sourceFrame[r])) {
                return JobRows.failed(index, j.id() + ": read " + r + " has energy " + deviceFrame[r]
                        + " under the gauged problem but " + sourceFrame[r] + " un-gauged: the gauge changed an energy");
            }
        }
        Path reported = CampaignRunStep.energiesOf(folder.resolve(j.raw()));
        if (Files.isRegularFile(reported)) {
            double[] rep;
            try {
                rep = NpyVectors.readFloat64(reported, deviceFrame.length);
            } catch (BadInputException e) {
                return JobRows.failed(index, j.id() + ": " + e.getMessage());
            }
            double tol = ManifestAudit.REPORTED_RELATIVE_TOLERANCE * ManifestAudit.termScale(gauged);
            for (int r = 0; r < rep.length; r++) {
                if (!(Math.abs(rep[r] - deviceFrame[r]) <= tol)) {
                    return JobRows.failed(index, j.id() + ": read " + r + " reports energy " + rep[r] + " but its sample has "
                            + deviceFrame[r] + " (tolerance " + tol + ")");
                }
            }
        }
        ChainDecoder decoder = DecodeStep.decoder(logical.problem(), logical.chains(), physical.variables(), rule,
                RandomStreams.derive(plan.seed(), StreamPurpose.PLAN_DECODE, index),
                folder.resolve(CampaignFolder.chainsFile(j.instance())), folder.resolve(j.problem()));
        DecodedSamples d = DecodeStep.decode(decoder, block, raw);
        writeDecoded(folder, j, logical.problem(), d);
        List<String> extra = List.of(Double.toString(j.chainCoupling()), JobTable.number(j.annealUs()),
                JobTable.number(j.pauseS()), JobTable.number(j.pauseUs()), j.gauged() ? "yes" : "no", j.schedule(), j.id());
        java.io.StringWriter text = new java.io.StringWriter();
        ResultsTable.RowWriter rows = ResultsTable.RowWriter.continuing(text, EXTRA_COLUMNS);
        DecodeStep.writeRows(rows, new DecodeStep.Labels(j.instance(), CampaignFolder.setting(j.chainCoupling(),
                j.schedule(), j.gauged()), j.gauge(), j.runUs(), EXTRA_COLUMNS, extra), d);
        double best = Double.NaN;
        for (double e : d.energies()) {
            best = Double.isNaN(best) ? e : Math.min(best, e);
        }
        return new JobRows(index, text.toString(), null, d.reads(), best);
    }

    /**
     * The decoded reads of a job, so anyone can recompute its rows: {@code decoded/JOB.npy}
     * (logical samples of the kept reads, columns in ascending logical id), {@code JOB.kept.npy}
     * (one bool per raw read) and {@code JOB.broken.npy} (broken chains per raw read).
     */
    private static void writeDecoded(CampaignFolder folder, JobTable.Job j, IsingProblem logical, DecodedSamples d)
            throws IOException {
        Path dir = Files.createDirectories(folder.resolve(CampaignFolder.DECODED));
        try (SampleWriter w = SampleFiles.create(dir.resolve(j.id() + ".npy"), logical.variables(), true)) {
            w.writeBlock(d.logical());
            w.commit();
        }
        NpyVectors.writeBool(dir.resolve(j.id() + ".kept.npy"), true, d.kept());
        NpyVectors.writeInt32(dir.resolve(j.id() + ".broken.npy"), true, d.brokenChains());
    }

    /** Rewrites ground.csv with the best energy seen filled in where no ground energy was known. */
    private static void writeGround(CampaignFolder folder, FolderStore store, Map<String, Double> bestSeen)
            throws IOException {
        Path file = folder.resolve(CampaignFolder.GROUND);
        List<GroundTable.Row> rows = new ArrayList<>();
        for (GroundTable.Row r : GroundTable.read(file)) {
            rows.add(r.source().equals("best_seen") ? r.withEnergy(bestSeen.getOrDefault(r.instance(), Double.NaN)) : r);
        }
        store.writeText(folder, CampaignFolder.GROUND, GroundTable.text(rows));
    }
}
