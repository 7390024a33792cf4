package org.obverse.campaign.spark;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.stream.Stream;
import org.apache.hadoop.conf.Configuration;
import org.apache.spark.SparkConf;
import org.apache.spark.Success$;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.scheduler.SparkListener;
import org.apache.spark.scheduler.SparkListenerTaskEnd;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.campaign.CampaignCollectStep;
import org.obverse.campaign.CampaignEngine;
import org.obverse.campaign.CampaignFolder;
import org.obverse.campaign.CampaignPrepareStep;
import org.obverse.campaign.CampaignRunStep;
import org.obverse.campaign.StepProgress;
import org.obverse.io.BadInputException;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.TrianglePlan;

/**
 * The Spark engine against the local one, on one Spark session in this JVM ({@code local[2,2]}:
 * two worker threads, a failed task tried once more). The property judged is the engine's whole
 * promise: the same plan gives the same bytes — results table, raw and decoded files, ground
 * table, audit — on either engine, in any number of partitions, with tasks that fail once and
 * are retried, and with every job done twice. The oracle is the local engine (common practice,
 * no source), whose own table is checked against plain recomputation in CampaignCommandTest.
 */
class SparkCampaignEngineTest extends QuietTest {
    private static JavaSparkContext sc;

    /** The plan prepared once (preparing finds chains: the slow part); each test runs copies of it. */
    @TempDir
    static Path shared;

    private static Path prepared;

    /** Every output of the local engine on the prepared plan. */
    private static Map<String, byte[]> expected;

    @TempDir
    Path dir;

    private static final StepProgress SILENT = (phase, total, work) -> null;

    @BeforeAll
    static void startSparkAndRunLocally() throws IOException {
        sc = new JavaSparkContext(new SparkConf().setMaster("local[2,2]").setAppName("obverse engine test")
                .set("spark.ui.enabled", "false").set("spark.driver.host", "127.0.0.1")
                // Two Hadoop file systems of the tests' own: a folder there is a URI java.nio cannot open.
                .set("spark.hadoop.fs." + TestFileSystems.AtomicRename.SCHEME + ".impl",
                        TestFileSystems.AtomicRename.class.getName())
                .set("spark.hadoop.fs." + TestFileSystems.ObjectStore.SCHEME + ".impl",
                        TestFileSystems.ObjectStore.class.getName())
                .set("spark.hadoop." + HadoopFolder.PUBLISH_KEY + TestFileSystems.ObjectStore.SCHEME, "direct"));
        prepared = shared.resolve("prepared");
        CampaignPrepareStep.run(new CampaignPrepareStep.Request(plan(shared), prepared, false, 2), SILENT);
        Path local = copy(prepared, shared.resolve("local"));
        CampaignRunStep.Result l = CampaignRunStep.run(new CampaignRunStep.Request(local, null, false, 2),
                CampaignEngine.local(2), SILENT);
        assertThat(l.sampled()).isEqualTo(48);
        assertThat(l.collect().allPassed()).isTrue();
        expected = outputs(local);
        // 48 jobs: 48 raw + 48 energies + 3 × 48 decoded files, and the four tables.
        assertThat(expected).hasSize(48 * 5 + 4);
    }

    @AfterAll
    static void stopSpark() {
        if (sc != null) {
            sc.stop();
        }
    }

    private static Path plan(Path dir) throws IOException {
        return TrianglePlan.write(dir, TrianglePlan.PLAN);
    }

    /** Runs a fresh copy of the prepared folder. */
    private CampaignRunStep.Result run(Path out, CampaignEngine engine) throws IOException {
        return CampaignRunStep.run(new CampaignRunStep.Request(copy(prepared, out), null, false, 2), engine, SILENT);
    }

    private static Path copy(Path from, Path to) throws IOException {
        try (Stream<Path> s = Files.walk(from)) {
            for (Path p : (Iterable<Path>) s::iterator) {
                Path q = to.resolve(from.relativize(p).toString());
                if (Files.isDirectory(p)) {
                    Files.createDirectories(q);
                } else {
                    Files.copy(p, q);
                }
            }
        }
        return to;
    }

    /** Every file the run writes (raw, decoded, tables), by path relative to the folder, as bytes. */
    private static Map<String, byte[]> outputs(Path folder) throws IOException {
        Map<String, byte[]> out = new TreeMap<>();
        for (String sub : new String[] {"raw", "decoded"}) {
            try (Stream<Path> s = Files.list(folder.resolve(sub))) {
                for (Path p : (Iterable<Path>) s::iterator) {
                    out.put(sub + "/" + p.getFileName(), Files.readAllBytes(p));
                }
            }
        }
        for (String f : new String[] {"jobs.csv", "results.csv", "ground.csv", "audit.txt"}) {
            out.put(f, Files.readAllBytes(folder.resolve(f)));
        }
        return out;
    }

    private static void assertSameBytes(Map<String, byte[]> actual, Map<String, byte[]> expected) {
        assertThat(actual.keySet()).isEqualTo(expected.keySet());
        for (Map.Entry<String, byte[]> e : expected.entrySet()) {
            assertThat(actual.get(e.getKey())).as(e.getKey()).isEqualTo(e.getValue());
        }
    }

    /** Counts task attempts that ended other than in success while it is registered. */
    private static final class FailedTasks extends SparkListener implements AutoCloseable {
        final AtomicInteger failed = new AtomicInteger();

        FailedTasks() {
            sc.sc().addSparkListener(this);
        }

        @Override
        public void onTaskEnd(SparkListenerTaskEnd end) {
            if (end.reason() != Success$.MODULE$) {
                failed.incrementAndGet();
            }
        }

        @Override
        public void close() {
            sc.sc().removeSparkListener(this);
        }
    }

    @Test
    void bothEnginesAndAnyPartitioningGiveTheSameBytes() throws IOException {
        Path spark = dir.resolve("spark");
        CampaignRunStep.Result s = run(spark, SparkCampaignEngine.on(sc, 1));
        assertThat(s.sampled()).isEqualTo(48);
        assertThat(s.collect().collected()).isEqualTo(48);
        assertThat(s.collect().reads()).isEqualTo(2L * 2 * 3 * (3 * 40 + 3 * 40));
        assertSameBytes(outputs(spark), expected);

        // Sampled and collected in uneven partitions: 7 jobs a task, so 7 tasks, the last of 6.
        Path seven = dir.resolve("spark-7");
        run(seven, SparkCampaignEngine.on(sc, 7));
        assertSameBytes(outputs(seven), expected);

        // Collected again in 10 tasks and in one: the same table, however the rows come back.
        for (int perTask : new int[] {5, 100}) {
            CampaignCollectStep.Result c = CampaignCollectStep.run(new CampaignCollectStep.Request(spark, 2),
                    SparkCampaignEngine.on(sc, perTask), SILENT);
            assertThat(c.collected()).isEqualTo(48);
            assertSameBytes(outputs(spark), expected);
        }
    }

    @Test
    void tasksThatFailOnceAndJobsDoneTwiceLoseAndRepeatNoRow() throws IOException {
        // What a killed run leaves: a stray temporary file, and an energies file whose samples never came.
        Path spark = copy(prepared, dir.resolve("spark"));
        Files.createDirectories(spark.resolve("raw"));
        Files.write(spark.resolve("raw/.j00005.npy.1234.part"), new byte[] {1, 2, 3});
        Files.write(spark.resolve("raw/j00006.energies.npy"), expected.get("raw/j00006.energies.npy"));

        // The first attempt of the tasks of three jobs fails after writing their files (and those of the
        // other jobs of their task: 4 a task); Spark tries each such task again, all its jobs anew.
        sc.setLocalProperty(SparkCampaignEngine.FAIL_FIRST_ATTEMPT, "j00003,j00017,j00047");
        try (FailedTasks failures = new FailedTasks()) {
            CampaignRunStep.Result r = CampaignRunStep.run(new CampaignRunStep.Request(spark, null, false, 2),
                    SparkCampaignEngine.on(sc, 4), SILENT);
            assertThat(r.sampled()).isEqualTo(48);
            assertThat(r.collect().collected()).isEqualTo(48);
            // Three failed attempts while sampling and three while collecting, all retried.
            assertThat(failures.failed.get()).isEqualTo(6);
        } finally {
            sc.setLocalProperty(SparkCampaignEngine.FAIL_FIRST_ATTEMPT, null);
        }
        assertSameBytes(outputs(spark), expected);

        // Every job done a second time (as speculative copies would): the same files, the same table.
        CampaignFolder folder = CampaignFolder.open(spark);
        SparkCampaignEngine twice = SparkCampaignEngine.on(sc, 3);
        twice.sample(folder, folder.jobs(), null);
        CampaignCollectStep.run(new CampaignCollectStep.Request(spark, 2), twice, SILENT);
        assertSameBytes(outputs(spark), expected);
    }

    /** The folder's URI under one of the test file systems. */
    private static String uri(String scheme, Path folder) {
        return scheme + "://" + folder.toAbsolutePath();
    }

    @Test
    void aFolderOnAFileSystemWithAtomicRenameGivesTheLocalEnginesBytes() throws IOException {
        Path folder = copy(prepared, dir.resolve("on-testfs"));
        String uri = uri(TestFileSystems.AtomicRename.SCHEME, folder);
        assertThat(Files.exists(Path.of(uri))).isFalse();
        int renames = TestFileSystems.AtomicRename.RENAMES.get();
        CampaignRunStep.Result r = HadoopCampaign.run(null, uri, false, 2, SparkCampaignEngine.on(sc, 5), SILENT);
        assertThat(r.sampled()).isEqualTo(48);
        assertThat(r.collect().collected()).isEqualTo(48);
        // outputs() lists raw/ and decoded/ whole: a temporary name left behind would show as a key too.
        assertSameBytes(outputs(folder), expected);
        // Each of the 48 × 5 job files and the three tables appeared by one rename (ground.csv, there since
        // prepare, by the rename that replaces a file).
        assertThat(TestFileSystems.AtomicRename.RENAMES.get() - renames).isEqualTo(48 * 5 + 3);
    }

    @Test
    void anObjectStoreFolderWithTasksThatFailOnceGivesTheLocalEnginesBytesWithoutARename() throws IOException {
        Path folder = copy(prepared, dir.resolve("on-testobj"));
        // What a killed run leaves: a stray temporary file, and an energies object whose samples never came.
        Files.createDirectories(folder.resolve("raw"));
        Files.write(folder.resolve("raw/.j00005.npy.1234.part"), new byte[] {1, 2, 3});
        Files.write(folder.resolve("raw/j00006.energies.npy"), expected.get("raw/j00006.energies.npy"));
        // And a samples file 64 bytes short, whose length does not fit the job's reads: not done, so
        // sampled again and replaced.
        byte[] whole = expected.get("raw/j00009.npy");
        Files.write(folder.resolve("raw/j00009.npy"), java.util.Arrays.copyOf(whole, whole.length - 64));
        Files.write(folder.resolve("raw/j00009.energies.npy"), expected.get("raw/j00009.energies.npy"));
        String uri = uri(TestFileSystems.ObjectStore.SCHEME, folder);
        int renames = TestFileSystems.ObjectStore.RENAMES.get();
        int creates = TestFileSystems.ObjectStore.CREATES.get();

        sc.setLocalProperty(SparkCampaignEngine.FAIL_FIRST_ATTEMPT, "j00003,j00017,j00047");
        try (FailedTasks failures = new FailedTasks()) {
            CampaignRunStep.Result r = HadoopCampaign.run(null, uri, false, 2, SparkCampaignEngine.on(sc, 4), SILENT);
            assertThat(r.sampled()).isEqualTo(48);
            assertThat(r.collect().collected()).isEqualTo(48);
            assertThat(failures.failed.get()).isEqualTo(6);
        } finally {
            sc.setLocalProperty(SparkCampaignEngine.FAIL_FIRST_ATTEMPT, null);
        }
        assertSameBytes(outputs(folder), expected);
        assertThat(TestFileSystems.ObjectStore.RENAMES.get() - renames).isZero();
        // One object per job file and table, and again for each job a failed attempt had done before it
        // failed (4 jobs a task; j00003 and j00047 end their tasks, j00017 is the second of its task):
        // 4 + 2 + 4 jobs, 2 raw files each while sampling and 3 decoded files each while collecting.
        assertThat(TestFileSystems.ObjectStore.CREATES.get() - creates).isEqualTo(48 * 5 + 3 + (4 + 2 + 4) * (2 + 3));

        // Collected again in one task: the same table, whatever the partitioning.
        CampaignCollectStep.Result c = HadoopCampaign.collect(uri, SparkCampaignEngine.on(sc, 100), SILENT);
        assertThat(c.collected()).isEqualTo(48);
        assertSameBytes(outputs(folder), expected);
    }

    @Test
    void publishingIsByRenameUnlessTheSchemeIsAnObjectStore() {
        // The stores' documented semantics: an s3a, gs or wasb object appears whole when its writer closes;
        // HDFS renames atomically and shows a file while it is written (common practice, no source).
        Configuration conf = new Configuration(false);
        for (String s : new String[] {"s3a", "gs", "wasbs", "S3A"}) {
            assertThat(HadoopFolder.rule(s, conf)).as(s).isEqualTo(HadoopFolder.Publish.DIRECT);
        }
        for (String s : new String[] {"hdfs", "file", "viewfs", "abfss", "testfs"}) {
            assertThat(HadoopFolder.rule(s, conf)).as(s).isEqualTo(HadoopFolder.Publish.RENAME);
        }
        conf.set(HadoopFolder.PUBLISH_KEY + "abfss", "direct");
        conf.set(HadoopFolder.PUBLISH_KEY + "s3a", "rename");
        assertThat(HadoopFolder.rule("abfss", conf)).isEqualTo(HadoopFolder.Publish.DIRECT);
        assertThat(HadoopFolder.rule("s3a", conf)).isEqualTo(HadoopFolder.Publish.RENAME);
        conf.set(HadoopFolder.PUBLISH_KEY + "gs", "atomic");
        assertThatThrownBy(() -> HadoopFolder.rule("gs", conf)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("obverse.publish.gs = atomic");
    }
}
