package org.obverse.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.obverse.campaign.CampaignCollectStep;
import org.obverse.campaign.CampaignEngine;
import org.obverse.campaign.CampaignPrepareStep;
import org.obverse.campaign.CampaignRunStep;
import org.obverse.campaign.StepProgress;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code obverse campaign}: the experiment as one object — a plan (obverse.campaign/1)
 * prepared into a folder of jobs, run on the reference sampler or collected from a device, and
 * gathered into one results table.
 */
@Command(name = "campaign", mixinStandardHelpOptions = true,
        description = {"Runs a whole campaign from a plan (obverse.campaign/1, spec/campaign.md): instances x chain "
                + "couplings x schedules x gauges, in one folder and one results table.",
            "  prepare PLAN --out DIR   jobs for a sampler or a device (DIR/jobs.csv)",
            "  run PLAN --out DIR       prepare where DIR is new, sample every job, collect",
            "  run DIR                  sample the jobs without raw samples yet, collect",
            "  collect DIR              un-gauge, audit, decode into DIR/results.csv"},
        subcommands = {CampaignCommand.Prepare.class, CampaignCommand.Run.class, CampaignCommand.Collect.class})
public final class CampaignCommand implements Runnable {
    @Spec
    CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    static StepProgress progress(CommandSpec spec, boolean quiet) {
        PrintWriter err = spec.commandLine().getErr();
        return (phase, total, work) -> Progress.of(err, phase, total, work, quiet);
    }

    /** {@code campaign prepare}. */
    @Command(name = "prepare", mixinStandardHelpOptions = true,
            description = "Prepares a campaign folder: inputs copied in, chains found where the plan gives none, every "
                    + "instance embedded at every chain coupling and gauged, every schedule written as (t_us, s) points, "
                    + "exact ground energies of instances up to 32 variables, and DIR/jobs.csv naming for each job the "
                    + "problem and schedule to submit and the raw samples file it expects.")
    static final class Prepare implements Callable<Integer> {
        @Spec
        CommandSpec spec;

        @Parameters(index = "0", paramLabel = "PLAN", description = "the campaign plan (obverse.campaign/1)")
        Path plan;

        @Option(names = "--out", required = true, paramLabel = "DIR", description = "the campaign folder to make")
        Path out;

        @Option(names = "--force", description = "replace an existing folder (its samples are lost)")
        boolean force;

        @Mixin
        WorkOptions work;

        @Override
        public Integer call() throws Exception {
            if (isUri(out.toString())) {
                throw new org.obverse.io.BadInputException("--out " + out + ": prepare writes a folder on this machine; "
                        + "prepare it here and copy it (hdfs dfs -put DIR URI), or let 'obverse campaign run PLAN --out "
                        + "URI --engine spark' prepare and upload it");
            }
            CampaignPrepareStep.Result r = CampaignPrepareStep.run(new CampaignPrepareStep.Request(plan, out, force,
                    work.threads()), progress(spec, work.quiet));
            PrintWriter w = spec.commandLine().getOut();
            r.notes().forEach(w::println);
            w.printf("prepared %s: %d jobs listed in %s%n", r.folder(), r.jobs().size(), r.folder().resolve("jobs.csv"));
            return Main.DONE;
        }
    }

    /** {@code campaign run}. */
    @Command(name = "run", mixinStandardHelpOptions = true,
            description = {"Samples every job with the reference sampler, then collects (DIR/results.csv).",
                "With PLAN --out DIR, prepares DIR first where it is new, or resumes it where it was prepared from the "
                    + "same plan and inputs. A job whose raw file is already there is skipped, so a run that was "
                    + "stopped, run again, gives the same bytes as one that was not."})
    static final class Run implements Callable<Integer> {
        @Spec
        CommandSpec spec;

        @Parameters(index = "0", paramLabel = "PLAN|DIR",
                description = "a plan file, or a prepared campaign folder (a local path, or with --engine spark a Hadoop "
                        + "URI: hdfs://, s3a:// …)")
        String source;

        @Option(names = "--out", paramLabel = "DIR",
                description = "the campaign folder (with a plan): a local path, or with --engine spark a Hadoop URI")
        String out;

        @Option(names = "--force", description = "prepare the folder anew even where it exists (its samples are lost)")
        boolean force;

        @Mixin
        WorkOptions work;

        @Mixin
        EngineOptions engine;

        @Override
        public Integer call() throws Exception {
            long start = System.nanoTime();
            CampaignRunStep.Result r;
            String remote = isUri(source) ? source : isUri(out) ? out : null;
            if (remote != null) {
                engine.requireSpark(remote);
                if (isUri(source) && out != null) {
                    throw new org.obverse.io.BadInputException(source + ": is a campaign folder, so --out has no "
                            + "meaning; run 'obverse campaign run " + source + "' alone, or give a plan file with --out");
                }
                Path plan = isUri(source) ? null : Path.of(source);
                if (plan != null && java.nio.file.Files.isDirectory(plan)) {
                    throw new org.obverse.io.BadInputException(source + ": is a campaign folder here; copy it whole to "
                            + out + " (hdfs dfs -put " + source + " " + out + "), then run 'obverse campaign run " + out
                            + " --engine spark'");
                }
                try (CampaignEngine e = engine.open(work.threads())) {
                    r = SparkStart.run(plan, remote, force, work.threads(), e, progress(spec, work.quiet));
                }
            } else {
                try (CampaignEngine e = engine.open(work.threads())) {
                    r = CampaignRunStep.run(new CampaignRunStep.Request(Path.of(source), out == null ? null
                            : Path.of(out), force, work.threads()), e, progress(spec, work.quiet));
                }
            }
            PrintWriter w = spec.commandLine().getOut();
            if (r.prepared() != null) {
                r.prepared().notes().forEach(w::println);
            }
            w.printf("sampled %d jobs (%d already had raw samples)%n", r.sampled(), r.skipped());
            int code = Collect.print(w, r.collect(), remote == null ? r.collect().results().toString()
                    : Collect.inside(remote, "results.csv"));
            w.printf(java.util.Locale.ROOT, "done in %.1f s%n", (System.nanoTime() - start) / 1e9);
            return code;
        }
    }

    /** {@code campaign collect}. */
    @Command(name = "collect", mixinStandardHelpOptions = true,
            description = {"For every job whose raw samples are present (from the reference sampler, or placed as "
                    + "jobs.csv names them from a device): un-gauge, audit (every energy unchanged bit for bit, reported "
                    + "energies within tolerance, every manifest re-derived), decode by the plan's rule, and write "
                    + "DIR/results.csv (logical energies; run_us from each job's schedule) and DIR/audit.txt.",
                "A job that fails its audit is listed and left out, the others go on, and the exit code is 1. "
                    + "Collecting again gives the same bytes."})
    static final class Collect implements Callable<Integer> {
        @Spec
        CommandSpec spec;

        @Parameters(index = "0", paramLabel = "DIR",
                description = "a prepared campaign folder: a local path, or with --engine spark a Hadoop URI")
        String dir;

        @Mixin
        WorkOptions work;

        @Mixin
        EngineOptions engine;

        @Override
        public Integer call() throws Exception {
            CampaignCollectStep.Result r;
            if (isUri(dir)) {
                engine.requireSpark(dir);
                try (CampaignEngine e = engine.open(work.threads())) {
                    r = SparkStart.collect(dir, e, progress(spec, work.quiet));
                }
                return print(spec.commandLine().getOut(), r, inside(dir, "results.csv"));
            }
            try (CampaignEngine e = engine.open(work.threads())) {
                r = CampaignCollectStep.run(new CampaignCollectStep.Request(Path.of(dir), work.threads()), e,
                        progress(spec, work.quiet));
            }
            return print(spec.commandLine().getOut(), r, r.results().toString());
        }

        static String inside(String uri, String name) {
            return (uri.endsWith("/") ? uri : uri + "/") + name;
        }

        static int print(PrintWriter w, CampaignCollectStep.Result r, String results) {
            w.printf("collected %d of %d jobs (%d without raw samples): %d reads in %d rows of %s%n", r.collected(),
                    r.jobs(), r.missing(), r.reads(), r.rows(), results);
            if (r.allPassed()) {
                w.println("audit: every check holds (energies unchanged bit for bit under every un-gauge)");
                return Main.DONE;
            }
            w.printf("audit: %d failed; their reads are left out of the table:%n", r.failures().size());
            r.failures().forEach(f -> w.println("FAILED " + f));
            return Main.CHECK_FAILED;
        }
    }

    /** {@code --threads T} and {@code --quiet} of every campaign verb. */
    static final class WorkOptions {
        @Mixin
        ThreadsOption threads;

        @Option(names = "--quiet", description = "no progress lines")
        boolean quiet;

        int threads() {
            return threads.count();
        }
    }

    /** {@code --engine local|spark}, {@code --master URL}, {@code --jobs-per-task N} of run and collect. */
    static final class EngineOptions {
        /** A class every Spark installation has; absent when obverse runs from its own jar alone. */
        static final String SPARK_PROBE = "org.apache.spark.api.java.JavaSparkContext";

        @Option(names = "--engine", paramLabel = "local|spark", defaultValue = "local",
                description = "where the jobs run: local (this process's threads; the default) or spark (Apache Spark "
                        + "tasks; launch obverse through spark-submit); never changes the output")
        String name;

        @Option(names = "--master", paramLabel = "URL",
                description = "with --engine spark: the Spark master (local[2], spark://host:7077, yarn …); default: "
                        + "the one spark-submit sets")
        String master;

        @Option(names = "--jobs-per-task", paramLabel = "N",
                description = "with --engine spark: jobs in one Spark task (default 1); never changes the output")
        Integer jobsPerTask;

        CampaignEngine open(int threads) {
            switch (name) {
                case "local" -> {
                    if (master != null || jobsPerTask != null) {
                        throw new org.obverse.io.BadInputException((master != null ? "--master" : "--jobs-per-task")
                                + " has a meaning only with --engine spark");
                    }
                    return CampaignEngine.local(threads);
                }
                case "spark" -> {
                    if (jobsPerTask != null && jobsPerTask < 1) {
                        throw new org.obverse.io.BadInputException("--jobs-per-task " + jobsPerTask
                                + ": need at least 1");
                    }
                    if (!sparkPresent()) {
                        throw new org.obverse.io.BadInputException("--engine spark: Apache Spark is not on the class "
                                + "path; launch through spark-submit: spark-submit --class org.obverse.cli.Main "
                                + "obverse-cli.jar campaign ... --engine spark (README: Campaigns on Spark)");
                    }
                    return SparkStart.start(master, jobsPerTask == null ? 1 : jobsPerTask);
                }
                default -> throw new org.obverse.io.BadInputException("--engine " + name + ": use local or spark");
            }
        }

        /** A folder on a Hadoop file system is for the Spark engine only. */
        void requireSpark(String uri) {
            if (!"spark".equals(name)) {
                throw new org.obverse.io.BadInputException(uri + ": a campaign folder on a Hadoop file system (hdfs://, "
                        + "s3a:// …) is run by the Spark engine; give --engine spark, or a local folder");
            }
        }

        static boolean sparkPresent() {
            try {
                Class.forName(SPARK_PROBE, false, CampaignCommand.class.getClassLoader());
                return true;
            } catch (ClassNotFoundException | LinkageError e) {
                return false;
            }
        }
    }

    /** Kept apart so the Spark engine's class is touched only once Spark is known to be there. */
    static final class SparkStart {
        private SparkStart() {
        }

        static CampaignEngine start(String master, int jobsPerTask) {
            return org.obverse.campaign.spark.SparkCampaignEngine.start(master, jobsPerTask);
        }

        static CampaignRunStep.Result run(Path plan, String uri, boolean force, int threads, CampaignEngine engine,
                                          StepProgress progress) throws java.io.IOException {
            return org.obverse.campaign.spark.HadoopCampaign.run(plan, uri, force, threads, engine, progress);
        }

        static CampaignCollectStep.Result collect(String uri, CampaignEngine engine, StepProgress progress)
                throws java.io.IOException {
            return org.obverse.campaign.spark.HadoopCampaign.collect(uri, engine, progress);
        }
    }

    /**
     * Whether a folder argument is a URI with a scheme (hdfs://, s3a://, file:/ …) rather than a
     * local path; two letters at least, so a drive letter stays a path.
     */
    static boolean isUri(String folder) {
        return folder != null && folder.matches("^[A-Za-z][A-Za-z0-9+.-]+:/.*");
    }
}
