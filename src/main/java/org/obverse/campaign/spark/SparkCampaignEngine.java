package org.obverse.campaign.spark;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.Iterator;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.UUID;
import java.util.concurrent.ConcurrentHashMap;
import java.util.function.IntConsumer;
import org.apache.spark.SparkConf;
import org.apache.spark.SparkFiles;
import org.apache.spark.TaskContext;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.api.java.function.FlatMapFunction;
import org.apache.spark.api.java.function.VoidFunction;
import org.apache.spark.scheduler.SparkListener;
import org.apache.spark.scheduler.SparkListenerTaskEnd;
import org.apache.spark.util.LongAccumulator;
import org.obverse.anneal.SamplerSettings;
import org.obverse.campaign.CampaignCollectStep;
import org.obverse.campaign.CampaignEngine;
import org.obverse.campaign.CampaignFolder;
import org.obverse.campaign.CampaignRunStep;
import org.obverse.io.BadInputException;
import org.obverse.io.codec.ManifestCodec;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.samples.SampleFormat;
import org.obverse.io.table.JobTable;

/**
 * Runs a campaign's jobs as Spark tasks. The jobs to do become one dataset of job ids (or
 * job-table indices), cut into contiguous partitions in job order — one job a partition unless
 * told otherwise — so the split is the same on every run. A task opens the campaign folder
 * (a path every executor sees: local in local mode, a shared file system on a cluster; or, for
 * an engine made by {@link #at}, a local copy of what its jobs read from a Hadoop file system),
 * and for each of its jobs calls {@link CampaignRunStep#sampleJob} or
 * {@link CampaignCollectStep.JobCollector#collect}, exactly as the local engine does.
 *
 * <p>Why retries and speculative copies are harmless: a job's files depend only on its recorded
 * seed and appear whole by rename, so a second attempt replaces them with the same bytes; a
 * collect task hands its rows back as the value of its partition, and Spark keeps one value per
 * partition however many attempts ran; the driver then places rows by job index, never by
 * arrival. So the table has every job once, in job order, whatever the executors and partitions.
 */
public final class SparkCampaignEngine implements CampaignEngine {
    /**
     * Configuration key for fault drills: a comma-separated list of job ids whose task fails
     * on its first attempt, after the job's work is done and its files are written, so Spark
     * retries it (with a master such as {@code local[2,2]} that allows a retry). Read from the
     * session's local properties of the calling thread, else from its configuration
     * ({@code --conf spark.obverse.failFirstAttempt=j00003}).
     */
    public static final String FAIL_FIRST_ATTEMPT = "spark.obverse.failFirstAttempt";

    private final JavaSparkContext sc;
    private final boolean owned;
    private final int jobsPerPartition;
    /** The campaign folder's Hadoop URI where its job files live there, else null (a path every executor sees). */
    private final String home;

    private SparkCampaignEngine(JavaSparkContext sc, boolean owned, int jobsPerPartition, String home) {
        if (jobsPerPartition < 1) {
            throw new IllegalArgumentException("jobs per partition " + jobsPerPartition + ": need at least 1");
        }
        this.sc = sc;
        this.owned = owned;
        this.jobsPerPartition = jobsPerPartition;
        this.home = home;
    }

    /**
     * Starts a Spark session of its own, stopped by {@link #close()}.
     *
     * @param master           a Spark master URL (local[2], spark://host:7077, yarn …), or null to take the
     *                         one spark-submit set
     * @param jobsPerPartition jobs in one task (1: one task a job)
     */
    public static SparkCampaignEngine start(String master, int jobsPerPartition) {
        SparkConf conf = new SparkConf().setAppName("obverse campaign");
        if (master != null) {
            conf.setMaster(master);
        } else if (!conf.contains("spark.master")) {
            throw new BadInputException("Spark engine: no master URL is set; name one (local[2], spark://host:7077, "
                    + "yarn …) or launch through spark-submit --master");
        }
        return new SparkCampaignEngine(new JavaSparkContext(conf), true, jobsPerPartition, null);
    }

    /** Runs on a session the caller owns (and stops). */
    public static SparkCampaignEngine on(JavaSparkContext sc, int jobsPerPartition) {
        return new SparkCampaignEngine(sc, false, jobsPerPartition, null);
    }

    /**
     * This engine's session for a campaign folder whose job files live on a Hadoop file system
     * at the given URI: each task copies what its jobs read to a local folder of its executor,
     * runs the same per-job functions there, and publishes the jobs' files to the URI
     * ({@link HadoopFolder}). The folder handed to {@link #sample} and {@link #collect} is then
     * the driver's local copy of the prepared part (see {@link HadoopCampaign}).
     */
    SparkCampaignEngine at(String uri) {
        return new SparkCampaignEngine(sc, false, jobsPerPartition, uri);
    }

    /** The session's Hadoop configuration (core-site.xml, spark.hadoop.* settings). */
    org.apache.hadoop.conf.Configuration hadoopConfiguration() {
        return sc.hadoopConfiguration();
    }

    @Override
    public void sample(CampaignFolder folder, List<JobTable.Job> jobs, IntConsumer tick) throws IOException {
        if (jobs.isEmpty()) {
            return;
        }
        List<String> ids = new ArrayList<>(jobs.size());
        jobs.forEach(j -> ids.add(j.id()));
        LongAccumulator done = sc.sc().longAccumulator("obverse jobs sampled");
        Broadcast<byte[]> conf = hadoopConf();
        SampleTask task = new SampleTask(where(folder), conf, UUID.randomUUID().toString(), faults(), done);
        try {
            withProgress(done, tick, () -> sc.parallelize(ids, slices(ids.size())).foreachPartition(task));
        } finally {
            release(conf);
        }
    }

    @Override
    public List<CampaignCollectStep.JobRows> collect(CampaignFolder folder, int[] jobs, IntConsumer tick)
            throws IOException {
        if (jobs.length == 0) {
            return List.of();
        }
        List<Integer> indices = Arrays.stream(jobs).boxed().toList();
        LongAccumulator done = sc.sc().longAccumulator("obverse jobs collected");
        Broadcast<byte[]> conf = hadoopConf();
        CollectTask task = new CollectTask(where(folder), conf, UUID.randomUUID().toString(), faults(), done);
        List<CampaignCollectStep.JobRows> out = new ArrayList<>(jobs.length);
        try {
            withProgress(done, tick, () -> out.addAll(sc.parallelize(indices, slices(indices.size()))
                    .mapPartitions(task).collect()));
        } finally {
            release(conf);
        }
        return out;
    }

    /** The folder as the tasks find it: the shared path, or the Hadoop URI. */
    private String where(CampaignFolder folder) {
        return home != null ? home : folder.dir().toAbsolutePath().normalize().toString();
    }

    /** The Hadoop configuration for the tasks, once per action, where the folder is on a Hadoop file system. */
    private Broadcast<byte[]> hadoopConf() {
        return home == null ? null : sc.broadcast(HadoopFolder.toBytes(sc.hadoopConfiguration()));
    }

    private static void release(Broadcast<byte[]> conf) {
        if (conf != null) {
            conf.destroy();
        }
    }

    /** Stops the Spark session where this engine started it. */
    @Override
    public void close() {
        if (owned) {
            sc.stop();
        }
    }

    private int slices(int jobs) {
        return (jobs + jobsPerPartition - 1) / jobsPerPartition;
    }

    private Set<String> faults() {
        Set<String> out = new LinkedHashSet<>();
        String drill = sc.getLocalProperty(FAIL_FIRST_ATTEMPT);
        for (String s : (drill != null ? drill : sc.getConf().get(FAIL_FIRST_ATTEMPT, "")).split(",")) {
            if (!s.isBlank()) {
                out.add(s.strip());
            }
        }
        return out;
    }

    /**
     * Runs a Spark action, telling tick the jobs done as tasks end (their counts reach the
     * driver with each successful task; a failed attempt's count is dropped), and turns a
     * failed action into the library's exceptions: a bad input stays a bad input.
     */
    private void withProgress(LongAccumulator done, IntConsumer tick, Runnable action) throws IOException {
        SparkListener listener = new SparkListener() {
            @Override
            public void onTaskEnd(SparkListenerTaskEnd end) {
                if (tick != null) {
                    tick.accept((int) Math.min(Integer.MAX_VALUE, done.value()));
                }
            }
        };
        sc.sc().addSparkListener(listener);
        try {
            action.run();
            if (tick != null) {
                tick.accept((int) Math.min(Integer.MAX_VALUE, done.value()));
            }
        } catch (RuntimeException e) {
            throw rethrown(e);
        } catch (Exception e) {
            // Spark's own exception is checked in Java's eyes but thrown from Scala undeclared.
            throw rethrown(e);
        } finally {
            sc.sc().removeSparkListener(listener);
        }
    }

    private static IOException rethrown(Exception e) {
        for (Throwable t = e; t != null; t = t.getCause()) {
            if (t instanceof BadInputException b) {
                throw b;
            }
            if (t instanceof UncheckedIOException u && u.getCause() != null) {
                return u.getCause();
            }
            if (t instanceof IOException io) {
                return io;
            }
        }
        String m = String.valueOf(e.getMessage());
        int nl = m.indexOf('\n');
        return new IOException("a Spark task failed: " + (nl < 0 ? m : m.substring(0, nl)), e);
    }

    /**
     * What every task of one Spark action reads from the campaign folder — the plan, the job
     * table, the sampler settings, the collector's shared inputs — read once per executor and
     * action rather than once per task (the job table of a large campaign is megabytes). Keyed by
     * a token the driver draws for each action, so a later action, or another campaign, never sees
     * an earlier one's files; one entry is kept.
     *
     * <p>Where the folder is on a Hadoop file system, the executor keeps a local copy of what its
     * tasks read: the plan, the tables, {@code inputs/} and {@code schedules/} when the action
     * starts, each job's gauged problem, manifest and embedded problem when a job first needs it
     * (kept for the action), and a job's raw files only while it is collected. The per-job
     * functions run on that copy, and the files they write are published to the folder, then
     * removed here.
     */
    private static final class ActionInputs {
        private static ActionInputs last;

        final String token;
        final CampaignFolder folder;
        final List<JobTable.Job> jobs;
        final Map<String, JobTable.Job> byId = new HashMap<>();
        /** The folder on a Hadoop file system, else null. */
        private final HadoopFolder remote;
        /** The executor's local copy of it, else null. */
        private final Path copy;
        private final Map<String, Boolean> staged = new ConcurrentHashMap<>();
        private final Map<String, String> sources = new ConcurrentHashMap<>();
        private SamplerSettings settings;
        private CampaignCollectStep.JobCollector collector;

        private ActionInputs(String token, String dir, Broadcast<byte[]> conf) throws IOException {
            this.token = token;
            if (conf == null) {
                this.remote = null;
                this.copy = null;
                this.folder = CampaignFolder.open(Path.of(dir));
            } else {
                this.remote = HadoopFolder.open(dir, HadoopFolder.fromBytes(conf.value()));
                this.copy = Files.createTempDirectory(localBase(), "obverse-job-files-");
                HadoopCampaign.downloadShared(remote, copy);
                this.folder = CampaignFolder.open(copy);
            }
            this.jobs = folder.jobs();
            for (JobTable.Job j : jobs) {
                byId.put(j.id(), j);
            }
        }

        static synchronized ActionInputs of(String dir, Broadcast<byte[]> conf, String token) throws IOException {
            if (last == null || !last.token.equals(token)) {
                if (last != null) {
                    last.discard();
                }
                last = new ActionInputs(token, dir, conf);
            }
            return last;
        }

        /** Spark's per-application folder of this executor (removed when the application ends), else the temp folder. */
        private static Path localBase() throws IOException {
            String root = TaskContext.get() != null ? SparkFiles.getRootDirectory() : null;
            Path base = root != null ? Path.of(root) : Path.of(System.getProperty("java.io.tmpdir"));
            return Files.createDirectories(base);
        }

        private void discard() {
            if (copy != null) {
                try {
                    AtomicOutput.deleteTree(copy);
                } catch (IOException e) {
                    // Spark removes its application folder at the end anyway.
                }
            }
        }

        synchronized SamplerSettings settings() throws IOException {
            if (settings == null) {
                settings = CampaignRunStep.baseSettings(folder.plan());
            }
            return settings;
        }

        synchronized CampaignCollectStep.JobCollector collector() throws IOException {
            if (collector == null) {
                collector = CampaignCollectStep.JobCollector.open(folder);
            }
            return collector;
        }

        /** Brings a file every job of a setting shares here once for the action (a no-op on a shared path). */
        private void shared(String relative) {
            if (remote != null) {
                staged.computeIfAbsent(relative, r -> {
                    try {
                        remote.download(r, copy.resolve(r));
                    } catch (IOException e) {
                        throw new UncheckedIOException(e);
                    }
                    return Boolean.TRUE;
                });
            }
        }

        /** What sampling a job reads: its gauged problem (the schedules came with the action). */
        void beforeSampling(JobTable.Job j) {
            shared(j.problem());
        }

        /** What collecting a job reads: its gauged problem, manifest and embedded problem, and its raw files. */
        void beforeCollecting(JobTable.Job j) throws IOException {
            if (remote == null) {
                return;
            }
            shared(j.problem());
            if (!j.manifest().isEmpty()) {
                shared(j.manifest());
                shared(sources.computeIfAbsent(j.manifest(), this::manifestSource));
            }
            List<String> raw = CampaignFolder.rawFiles(j);
            if (!fetch(raw.get(1))) {
                String n = raw.get(1);
                fetch(SampleFormat.CSV.fileName(n.substring(0, n.lastIndexOf('.'))));
            }
            fetch(raw.get(0));
        }

        /** The embedded problem a manifest (copied here) gauges, relative to the folder. */
        private String manifestSource(String manifestFile) {
            Path manifest = copy.resolve(manifestFile);
            Path source = manifest.getParent().resolve(ManifestCodec.read(manifest).problem().path()).normalize();
            if (!source.startsWith(copy)) {
                throw new BadInputException(remote.describe(manifestFile) + ": problem.path: points outside the "
                        + "campaign folder; prepare the folder again with 'obverse campaign prepare'");
            }
            return copy.relativize(source).toString().replace(java.io.File.separatorChar, '/');
        }

        /** Copies one job file here afresh; false where the folder has no such file. */
        private boolean fetch(String relative) throws IOException {
            try {
                remote.download(relative, copy.resolve(relative));
                return true;
            } catch (java.io.FileNotFoundException e) {
                return false;
            }
        }

        /** Publishes the files a job wrote here, in order, to the folder; then removes them here. */
        void publish(List<String> written) throws IOException {
            if (remote == null) {
                return;
            }
            for (String f : written) {
                Path p = copy.resolve(f);
                if (Files.isRegularFile(p)) {
                    remote.publish(p, f);
                    Files.delete(p);
                }
            }
        }

        /** Removes a job's raw files copied here for collecting. */
        void forgetRaw(JobTable.Job j) throws IOException {
            if (remote == null) {
                return;
            }
            List<String> raw = CampaignFolder.rawFiles(j);
            String n = raw.get(1);
            for (String f : List.of(raw.get(0), n, SampleFormat.CSV.fileName(n.substring(0, n.lastIndexOf('.'))))) {
                Files.deleteIfExists(copy.resolve(f));
            }
        }
    }

    /** Fails the first attempt of a task holding a job named for a fault drill. */
    private static void drill(Set<String> faults, String job) {
        TaskContext tc = TaskContext.get();
        if (faults.contains(job) && tc != null && tc.attemptNumber() == 0) {
            throw new IllegalStateException("fault drill: first attempt of the task of job " + job
                    + " fails after its work (" + FAIL_FIRST_ATTEMPT + ")");
        }
    }

    /** Samples the jobs of one partition. */
    private record SampleTask(String dir, Broadcast<byte[]> conf, String token, Set<String> faults,
                              LongAccumulator done) implements VoidFunction<Iterator<String>> {
        @Override
        public void call(Iterator<String> ids) throws IOException {
            if (!ids.hasNext()) {
                return;
            }
            ActionInputs in = ActionInputs.of(dir, conf, token);
            TaskContext tc = TaskContext.get();
            SamplerSettings settings = in.settings().withThreads(tc == null ? 1 : Math.max(1, tc.cpus()));
            while (ids.hasNext()) {
                String id = ids.next();
                JobTable.Job j = in.byId.get(id);
                in.beforeSampling(j);
                CampaignRunStep.sampleJob(in.folder, j, settings);
                // Energies first, samples last: a job counts as done once its samples file is there.
                in.publish(CampaignFolder.rawFiles(j));
                done.add(1);
                drill(faults, id);
            }
        }
    }

    /** Collects the jobs of one partition into their rows. */
    private record CollectTask(String dir, Broadcast<byte[]> conf, String token, Set<String> faults,
                               LongAccumulator done)
            implements FlatMapFunction<Iterator<Integer>, CampaignCollectStep.JobRows> {
        @Override
        public Iterator<CampaignCollectStep.JobRows> call(Iterator<Integer> indices) throws IOException {
            List<CampaignCollectStep.JobRows> out = new ArrayList<>();
            if (!indices.hasNext()) {
                return out.iterator();
            }
            ActionInputs in = ActionInputs.of(dir, conf, token);
            CampaignCollectStep.JobCollector collector = in.collector();
            while (indices.hasNext()) {
                int index = indices.next();
                JobTable.Job j = in.jobs.get(index);
                in.beforeCollecting(j);
                out.add(collector.collect(index));
                in.publish(CampaignFolder.decodedFiles(j));
                in.forgetRaw(j);
                done.add(1);
                drill(faults, j.id());
            }
            return out.iterator();
        }
    }
}
