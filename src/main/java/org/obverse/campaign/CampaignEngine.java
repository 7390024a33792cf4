package org.obverse.campaign;

import java.io.IOException;
import java.util.List;
import java.util.function.IntConsumer;
import org.obverse.io.table.JobTable;

/**
 * Where the per-job work of a campaign runs: this machine's threads ({@link #local}), or a
 * cluster (the Spark engine of {@code org.obverse.campaign.spark}). Every engine calls the same
 * per-job functions — {@link CampaignRunStep#sampleJob} and
 * {@link CampaignCollectStep.JobCollector#collect} — and each job's outputs are files of its
 * own, written whole by rename and depending only on the job's recorded seed; the steps merge
 * the per-job rows by job index. So every engine gives the same bytes, and a job done twice
 * (a retried or speculative task) only rewrites the same bytes.
 */
public interface CampaignEngine extends AutoCloseable {
    /**
     * Samples every given job into its raw file.
     *
     * @param tick told the number of jobs done so far (from any thread), or null
     */
    void sample(CampaignFolder folder, List<JobTable.Job> jobs, IntConsumer tick) throws IOException;

    /**
     * Collects the jobs at the given indices of the folder's job table (un-gauge, audit,
     * decode, rows): one result per index, in any order (the caller merges by index).
     */
    List<CampaignCollectStep.JobRows> collect(CampaignFolder folder, int[] jobs, IntConsumer tick) throws IOException;

    /** Releases what the engine holds (a cluster session); the local engine holds nothing. */
    @Override
    default void close() throws IOException {
    }

    /** This machine: a pool of the given number of threads, one job a thread at a time. */
    static CampaignEngine local(int threads) {
        int t = Math.max(1, threads);
        return new CampaignEngine() {
            @Override
            public void sample(CampaignFolder folder, List<JobTable.Job> jobs, IntConsumer tick) throws IOException {
                CampaignRunStep.sampleOnThreads(folder, jobs, t, tick);
            }

            @Override
            public List<CampaignCollectStep.JobRows> collect(CampaignFolder folder, int[] jobs, IntConsumer tick)
                    throws IOException {
                return CampaignCollectStep.collectOnThreads(folder, jobs, t, tick);
            }
        };
    }
}
