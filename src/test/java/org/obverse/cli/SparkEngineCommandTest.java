package org.obverse.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.campaign.spark.TestFileSystems;

/**
 * {@code campaign run|collect --engine spark --master URL} from the command line: the same
 * results table as the local engine (Spark started and stopped by the command, in this JVM,
 * as spark-submit would run it), and the engine options refused in one line where they make
 * no sense. The engine's byte-for-byte properties under failures and partitionings are in
 * org.obverse.campaign.spark.SparkCampaignEngineTest; the oracle here is the local engine
 * (common practice, no source).
 */
class SparkEngineCommandTest extends CommandTestSupport {
    @TempDir
    Path dir;

    /** Two invented spin problems: a frustrated triangle and a chain of three. */
    private static final String[] PROBLEMS = {
        """
        {"format": "obverse.problem/1", "domain": "spin",
         "h": [[0, 0.3], [1, -0.2], [2, 0.1]], "J": [[0, 1, 0.8], [1, 2, -0.6], [0, 2, 0.5]], "offset": 0.1}
        """,
        """
        {"format": "obverse.problem/1", "domain": "spin",
         "h": [[0, -0.4], [1, 0.25], [2, 0.1]], "J": [[0, 1, -0.7], [1, 2, 0.9]], "offset": 0}
        """};

    private static final String PLAN = """
            {"format": "obverse.campaign/1",
             "instances": [{"name": "p0", "problem": "p0.json"}, {"name": "p1", "problem": "p1.json"}],
             "device": "device.json",
             "chain_couplings": [-1.5],
             "schedules": {"anneal_us": [1], "pause_s": [0.4], "pause_us": [0.5], "baseline": true},
             "gauges": {"count": 2, "design": "balanced", "ungauged_reference": true},
             "reads": 30,
             "sampler": {"kind": "sa", "sweeps_per_us": 50},
             "seed": 5}
            """;

    private Path plan() throws IOException {
        for (int k = 0; k < PROBLEMS.length; k++) {
            Files.writeString(dir.resolve("p" + k + ".json"), PROBLEMS[k]);
        }
        Files.copy(Path.of("examples/device.json"), dir.resolve("device.json"), StandardCopyOption.REPLACE_EXISTING);
        Path p = dir.resolve("plan.json");
        Files.writeString(p, PLAN);
        return p;
    }

    @Test
    void theSparkEngineGivesTheLocalEnginesTable() throws IOException {
        Path plan = plan();
        Path local = dir.resolve("local");
        Run l = obverse("campaign", "run", plan.toString(), "--out", local.toString(), "--quiet");
        assertThat(l.code()).as(l.err()).isEqualTo(Main.DONE);

        Path spark = dir.resolve("spark");
        Run s = obverse("campaign", "run", plan.toString(), "--out", spark.toString(), "--quiet", "--engine", "spark",
                "--master", "local[2]", "--jobs-per-task", "2");
        assertThat(s.code()).as(s.err()).isEqualTo(Main.DONE);
        // 2 instances × 1 chain coupling × 2 schedules × (2 gauges + the reference) = 12 jobs.
        assertThat(s.out()).contains("sampled 12 jobs").contains("collected 12 of 12 jobs");
        for (String f : new String[] {"results.csv", "ground.csv", "audit.txt", "raw/j00007.npy"}) {
            assertThat(Files.readAllBytes(spark.resolve(f))).as(f).isEqualTo(Files.readAllBytes(local.resolve(f)));
        }
    }

    @Test
    void aJobFailingEveryAttemptStopsTheRunWithItsCauseAndARunAgainResumes() throws IOException {
        Path plan = plan();
        Path out = dir.resolve("c");
        // local[2] allows one attempt a task, so the drill's failure is final. Spark reads spark.*
        // system properties into the session's configuration.
        System.setProperty(org.obverse.campaign.spark.SparkCampaignEngine.FAIL_FIRST_ATTEMPT, "j00004");
        Run failed;
        try {
            failed = obverse("campaign", "run", plan.toString(), "--out", out.toString(), "--quiet", "--engine",
                    "spark", "--master", "local[2]");
        } finally {
            System.clearProperty(org.obverse.campaign.spark.SparkCampaignEngine.FAIL_FIRST_ATTEMPT);
        }
        assertThat(failed.code()).isEqualTo(Main.IO_FAILURE);
        assertThat(failed.err().lines()).hasSize(1);
        assertThat(failed.err()).contains("a Spark task failed").contains("fault drill").contains("j00004");
        assertThat(out.resolve("results.csv")).doesNotExist();

        // Run again (here on the local engine): only what is missing is sampled; the table is a clean run's.
        Run resumed = obverse("campaign", "run", out.toString(), "--quiet");
        assertThat(resumed.code()).as(resumed.err()).isEqualTo(Main.DONE);
        Path clean = dir.resolve("clean");
        Run fresh = obverse("campaign", "run", plan.toString(), "--out", clean.toString(), "--quiet");
        assertThat(fresh.code()).as(fresh.err()).isEqualTo(Main.DONE);
        assertThat(Files.readAllBytes(out.resolve("results.csv"))).isEqualTo(Files.readAllBytes(
                clean.resolve("results.csv")));
    }

    @Test
    void engineOptionsThatMakeNoSenseAreRefusedInOneLine() throws IOException {
        Path plan = plan();
        Path out = dir.resolve("c");
        Run bad = obverse("campaign", "run", plan.toString(), "--out", out.toString(), "--engine", "cluster");
        assertThat(bad.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(bad.err().strip()).isEqualTo("obverse campaign run: --engine cluster: use local or spark");
        assertThat(out).doesNotExist();

        Run master = obverse("campaign", "run", plan.toString(), "--out", out.toString(), "--master", "local[2]");
        assertThat(master.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(master.err().strip()).isEqualTo("obverse campaign run: --master has a meaning only with --engine spark");

        Run none = obverse("campaign", "collect", dir.toString(), "--engine", "spark", "--jobs-per-task", "0");
        assertThat(none.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(none.err().strip()).isEqualTo("obverse campaign collect: --jobs-per-task 0: need at least 1");
        assertThat(CampaignCommand.EngineOptions.sparkPresent()).isTrue();
    }

    @Test
    void aPlanRunIntoAHadoopFolderIsPreparedHereUploadedAndResumed() throws IOException {
        Path plan = plan();
        Path local = dir.resolve("local");
        Run l = obverse("campaign", "run", plan.toString(), "--out", local.toString(), "--quiet");
        assertThat(l.code()).as(l.err()).isEqualTo(Main.DONE);

        // An object store of the tests' own (org.obverse.campaign.spark.TestFileSystems), registered through
        // spark.hadoop.* system properties, which Spark reads into the session's Hadoop configuration.
        Path remote = dir.resolve("remote");
        String uri = "testobj://" + remote.toAbsolutePath();
        System.setProperty("spark.hadoop.fs.testobj.impl", TestFileSystems.ObjectStore.class.getName());
        System.setProperty("spark.hadoop.obverse.publish.testobj", "direct");
        try {
            Run s = obverse("campaign", "run", plan.toString(), "--out", uri, "--quiet", "--engine", "spark",
                    "--master", "local[2]", "--jobs-per-task", "3");
            assertThat(s.code()).as(s.err()).isEqualTo(Main.DONE);
            assertThat(s.out()).contains("sampled 12 jobs (0 already").contains("rows of " + uri + "/results.csv");
            for (String f : new String[] {"results.csv", "ground.csv", "audit.txt", "jobs.csv", "raw/j00007.npy",
                "decoded/j00011.npy"}) {
                assertThat(Files.readAllBytes(remote.resolve(f))).as(f).isEqualTo(Files.readAllBytes(local.resolve(f)));
            }
            // The same plan again resumes the folder there: nothing is sampled, the table is rewritten the same.
            Files.delete(remote.resolve("results.csv"));
            Run again = obverse("campaign", "run", plan.toString(), "--out", uri, "--quiet", "--engine", "spark",
                    "--master", "local[2]");
            assertThat(again.code()).as(again.err()).isEqualTo(Main.DONE);
            assertThat(again.out()).contains("sampled 0 jobs (12 already had raw samples)");
            assertThat(Files.readAllBytes(remote.resolve("results.csv"))).isEqualTo(
                    Files.readAllBytes(local.resolve("results.csv")));
        } finally {
            System.clearProperty("spark.hadoop.fs.testobj.impl");
            System.clearProperty("spark.hadoop.obverse.publish.testobj");
        }
    }

    @Test
    void aHadoopFolderIsRefusedInOneLineWhereItCannotWork() throws IOException {
        Path plan = plan();
        String uri = "hdfs://namenode:8020/campaigns/c1";
        Run prepare = obverse("campaign", "prepare", plan.toString(), "--out", uri);
        assertThat(prepare.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(prepare.err().lines()).hasSize(1);
        assertThat(prepare.err()).contains("prepare writes a folder on this machine").contains("hdfs dfs -put");

        Run local = obverse("campaign", "run", uri);
        assertThat(local.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(local.err().strip()).isEqualTo("obverse campaign run: " + uri + ": a campaign folder on a Hadoop "
                + "file system (hdfs://, s3a:// …) is run by the Spark engine; give --engine spark, or a local folder");
        Run collect = obverse("campaign", "collect", uri, "--engine", "local");
        assertThat(collect.code()).isEqualTo(Main.BAD_INPUT);

        Run both = obverse("campaign", "run", uri, "--out", dir.resolve("x").toString(), "--engine", "spark");
        assertThat(both.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(both.err()).contains("is a campaign folder, so --out has no meaning");
        assertThat(dir.resolve("x")).doesNotExist();
    }
}
