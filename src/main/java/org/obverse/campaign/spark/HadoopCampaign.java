package org.obverse.campaign.spark;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.HashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.obverse.campaign.CampaignCollectStep;
import org.obverse.campaign.CampaignEngine;
import org.obverse.campaign.CampaignFolder;
import org.obverse.campaign.CampaignPrepareStep;
import org.obverse.campaign.CampaignRunStep;
import org.obverse.campaign.FolderStore;
import org.obverse.campaign.StepProgress;
import org.obverse.io.BadInputException;
import org.obverse.io.codec.CampaignPlanCodec;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.PreparedCodec;
import org.obverse.io.npy.NpyDtype;
import org.obverse.io.npy.NpyHeader;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.samples.SampleFormat;
import org.obverse.io.table.JobTable;

/**
 * Run and collect a campaign whose folder is on a Hadoop file system (hdfs://, s3a://, …), on
 * the Spark engine. The driver copies the prepared part of the folder (plan, tables, inputs,
 * embedded problems, gauges, schedules: small beside the samples) to a local temporary folder,
 * and the library steps run on that copy exactly as on a local folder; only the job files and
 * the tables go through Hadoop: which jobs have raw samples comes from one listing of
 * {@code raw/}, each task publishes its jobs' files ({@link SparkCampaignEngine#at}), and the
 * tables collect writes are published by the same rule ({@link HadoopFolder}). A plan given with
 * a Hadoop {@code --out} is prepared on this machine and uploaded.
 */
public final class HadoopCampaign {
    /** Top-level files of a prepared folder, uploaded last so the folder counts as prepared only when whole. */
    private static final List<String> MARKERS = List.of(CampaignFolder.PREPARED, CampaignFolder.GROUND,
            CampaignFolder.JOBS, CampaignFolder.PLAN);

    /** Sub-folders every task needs whole; the others come per job. */
    private static final List<String> SHARED = List.of("inputs", "schedules");

    private HadoopCampaign() {
    }

    /**
     * {@code campaign run} on a Hadoop folder: source a plan file on this machine with out the
     * folder's URI, or source the URI of a prepared folder (out null).
     */
    public static CampaignRunStep.Result run(Path plan, String folderUri, boolean force, int threads,
                                             CampaignEngine engine, StepProgress progress) throws IOException {
        SparkCampaignEngine spark = spark(engine, folderUri);
        HadoopFolder home = HadoopFolder.open(folderUri, spark.hadoopConfiguration());
        Path local = Files.createTempDirectory("obverse-campaign-");
        Path copy = local.resolve("folder");
        try {
            CampaignPrepareStep.Result prepared = null;
            if (plan != null && (force || !home.exists(""))) {
                if (force) {
                    home.deleteAll();
                }
                prepared = CampaignPrepareStep.run(new CampaignPrepareStep.Request(plan, copy, false, threads),
                        progress);
                upload(home, copy);
            } else {
                checkPrepared(home);
                if (plan != null) {
                    String now = CampaignPrepareStep.inputsHash(CampaignPlanCodec.read(plan));
                    Path p = local.resolve(CampaignFolder.PREPARED);
                    home.download(CampaignFolder.PREPARED, p);
                    if (!now.equals(PreparedCodec.inputsSha256(p))) {
                        throw new BadInputException(home.describe("") + ": was prepared from another plan or other input "
                                + "files; give a new --out folder, or --force to prepare this one anew (its samples "
                                + "are lost)");
                    }
                }
                downloadPrepared(home, copy);
            }
            home.removeTemporary(CampaignFolder.RAW);
            home.removeTemporary(CampaignFolder.DECODED);
            home.removeTemporary("");
            return CampaignRunStep.runPrepared(CampaignFolder.open(copy), prepared, spark.at(home.uri()),
                    new Store(home), threads, progress);
        } catch (BadInputException e) {
            throw renamed(e, copy, home);
        } finally {
            AtomicOutput.deleteTree(local);
        }
    }

    /** {@code campaign collect} on a Hadoop folder. */
    public static CampaignCollectStep.Result collect(String folderUri, CampaignEngine engine, StepProgress progress)
            throws IOException {
        SparkCampaignEngine spark = spark(engine, folderUri);
        HadoopFolder home = HadoopFolder.open(folderUri, spark.hadoopConfiguration());
        checkPrepared(home);
        Path local = Files.createTempDirectory("obverse-campaign-");
        Path copy = local.resolve("folder");
        try {
            downloadPrepared(home, copy);
            home.removeTemporary(CampaignFolder.DECODED);
            home.removeTemporary("");
            return CampaignCollectStep.run(CampaignFolder.open(copy), spark.at(home.uri()), new Store(home), progress);
        } catch (BadInputException e) {
            throw renamed(e, copy, home);
        } finally {
            AtomicOutput.deleteTree(local);
        }
    }

    private static SparkCampaignEngine spark(CampaignEngine engine, String uri) {
        if (engine instanceof SparkCampaignEngine s) {
            return s;
        }
        throw new BadInputException(uri + ": a campaign folder on a Hadoop file system is run by the Spark engine; "
                + "give --engine spark, or a local folder");
    }

    private static void checkPrepared(HadoopFolder home) throws IOException {
        if (!home.exists("")) {
            throw new BadInputException(home.describe("") + ": no such folder; give a campaign folder made by "
                    + "'obverse campaign prepare' and copied there, or run a plan with --out " + home.describe(""));
        }
        for (String f : new String[] {CampaignFolder.PLAN, CampaignFolder.JOBS, CampaignFolder.GROUND}) {
            if (!home.isFile(f)) {
                throw new BadInputException(home.describe("") + ": has no " + f + ", so it is not a prepared campaign folder "
                        + "(or its upload stopped); copy a prepared folder there whole, or give --force with a plan "
                        + "to prepare it anew");
            }
        }
    }

    /** A message about the local copy names the folder's URI instead. */
    private static BadInputException renamed(BadInputException e, Path copy, HadoopFolder home) {
        String m = e.getMessage();
        String local = copy.toString();
        return m == null || !m.contains(local) ? e : new BadInputException(m.replace(local, home.describe("")), e);
    }

    /** Uploads a folder prepared here: every file whole, the files that mark it prepared last. */
    private static void upload(HadoopFolder home, Path copy) throws IOException {
        home.upload(copy, new LinkedHashSet<>(MARKERS));
    }

    /** The top-level files (the tables collect writes left out) and the sub-folders every task reads. */
    static void downloadShared(HadoopFolder home, Path copy) throws IOException {
        for (String f : home.list("").keySet()) {
            if (!f.equals(CampaignFolder.RESULTS) && !f.equals(CampaignFolder.AUDIT)) {
                home.download(f, copy.resolve(f));
            }
        }
        for (String sub : SHARED) {
            home.downloadTree(sub, copy);
        }
    }

    /** All of the prepared part, for the driver: it audits every manifest. */
    static void downloadPrepared(HadoopFolder home, Path copy) throws IOException {
        downloadShared(home, copy);
        home.downloadTree("embedded", copy);
        home.downloadTree("gauges", copy);
    }

    /** The driver's view of the job files on the Hadoop folder. */
    private static final class Store implements FolderStore {
        private final HadoopFolder home;

        Store(HadoopFolder home) {
            this.home = home;
        }

        /**
         * Present with the lengths the sampler gives a job's files: an NPY header for the shape,
         * then reads × qubits bytes of int8 samples, or 8 × reads bytes of float64 energies.
         * Files appear only whole (published by rename, or as objects committed at close), so
         * their headers are not read: one listing of raw/ answers for every job.
         */
        @Override
        public boolean[] sampled(CampaignFolder folder, List<JobTable.Job> jobs) throws IOException {
            Map<String, Long> raw = home.list(CampaignFolder.RAW);
            Map<String, Integer> qubits = new HashMap<>();
            long energiesHeader = NpyHeader.of(NpyDtype.FLOAT64, 0).encode(0).length;
            boolean[] out = new boolean[jobs.size()];
            for (int k = 0; k < out.length; k++) {
                JobTable.Job j = jobs.get(k);
                List<String> files = CampaignFolder.rawFiles(j);
                Long energies = raw.get(name(files.get(0)));
                Long samples = raw.get(name(files.get(1)));
                if (energies == null || samples == null) {
                    continue;
                }
                int q = qubits.computeIfAbsent(j.problem(),
                        p -> ProblemCodec.read(folder.resolve(p)).variables().size());
                long samplesHeader = NpyHeader.of(NpyDtype.INT8, 0, q).encode(0).length;
                out[k] = samples == samplesHeader + (long) j.reads() * q && energies == energiesHeader + 8L * j.reads();
            }
            return out;
        }

        @Override
        public boolean[] hasRaw(CampaignFolder folder, List<JobTable.Job> jobs) throws IOException {
            Set<String> raw = home.list(CampaignFolder.RAW).keySet();
            boolean[] out = new boolean[jobs.size()];
            for (int k = 0; k < out.length; k++) {
                String n = name(jobs.get(k).raw());
                out[k] = raw.contains(n) || raw.contains(SampleFormat.CSV.fileName(n.substring(0, n.lastIndexOf('.'))));
            }
            return out;
        }

        private static String name(String relative) {
            return relative.substring(relative.lastIndexOf('/') + 1);
        }

        @Override
        public void removeStaleParts(CampaignFolder folder) throws IOException {
            home.removeTemporary(CampaignFolder.RAW);
        }

        @Override
        public void writeText(CampaignFolder folder, String name, String text) throws IOException {
            Path local = folder.resolve(name);
            AtomicOutput.writeText(local, true, List.of(), text);
            home.publish(local, name);
        }

        @Override
        public String describe(CampaignFolder folder, String name) {
            return home.describe(name);
        }
    }
}
