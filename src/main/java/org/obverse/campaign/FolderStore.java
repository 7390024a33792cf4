package org.obverse.campaign;

import java.io.IOException;
import java.nio.file.DirectoryStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.table.JobTable;
import org.obverse.model.VariableIndex;

/**
 * Where a campaign folder's job files (raw samples, decoded files) and the tables collect
 * writes live, as the driver of a run or collect sees them. The steps read the prepared part
 * of the folder (plan, job table, inputs, gauges, schedules) from a {@link CampaignFolder} on
 * this machine; this says which jobs have raw samples and where the tables go. {@link #local()}
 * is the folder itself; the Spark engine has one for a folder on a Hadoop file system
 * (hdfs://, s3a://, …), whose prepared part it copies to this machine first.
 */
public interface FolderStore {
    /**
     * For each job, whether its raw samples and energies are there, whole, with one row per
     * read: {@code run} skips such a job.
     */
    boolean[] sampled(CampaignFolder folder, List<JobTable.Job> jobs) throws IOException;

    /** For each job, whether its raw samples are there (as .npy, or .csv from a device): collect takes it. */
    boolean[] hasRaw(CampaignFolder folder, List<JobTable.Job> jobs) throws IOException;

    /** Removes the temporary files that a stopped run left among the raw samples. */
    void removeStaleParts(CampaignFolder folder) throws IOException;

    /** Writes one of the folder's tables (results.csv, ground.csv, audit.txt) whole, replacing it. */
    void writeText(CampaignFolder folder, String name, String text) throws IOException;

    /** Where a file of the folder is, for messages. */
    String describe(CampaignFolder folder, String name);

    /** The folder on this machine (or a shared POSIX file system): java.nio, rename. */
    static FolderStore local() {
        return new FolderStore() {
            @Override
            public boolean[] sampled(CampaignFolder folder, List<JobTable.Job> jobs) throws IOException {
                boolean[] out = new boolean[jobs.size()];
                // Each problem file is read once to learn its qubits, however many jobs share it.
                Map<String, VariableIndex> variables = new HashMap<>();
                for (int k = 0; k < out.length; k++) {
                    out[k] = CampaignRunStep.done(folder, jobs.get(k), variables);
                }
                return out;
            }

            @Override
            public boolean[] hasRaw(CampaignFolder folder, List<JobTable.Job> jobs) {
                boolean[] out = new boolean[jobs.size()];
                for (int k = 0; k < out.length; k++) {
                    out[k] = CampaignCollectStep.rawFile(folder, jobs.get(k)) != null;
                }
                return out;
            }

            @Override
            public void removeStaleParts(CampaignFolder folder) throws IOException {
                Path raw = folder.resolve(CampaignFolder.RAW);
                if (!Files.isDirectory(raw)) {
                    return;
                }
                try (DirectoryStream<Path> s = Files.newDirectoryStream(raw, ".*.part")) {
                    for (Path p : s) {
                        Files.deleteIfExists(p);
                    }
                }
            }

            @Override
            public void writeText(CampaignFolder folder, String name, String text) throws IOException {
                AtomicOutput.writeText(folder.resolve(name), true, List.of(), text);
            }

            @Override
            public String describe(CampaignFolder folder, String name) {
                return folder.resolve(name).toString();
            }
        };
    }
}
