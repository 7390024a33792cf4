package org.obverse.campaign;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.function.IntConsumer;
import org.obverse.anneal.AnnealSchedule;
import org.obverse.anneal.EnergyScales;
import org.obverse.anneal.PathIntegralSettings;
import org.obverse.anneal.SamplerSettings;
import org.obverse.io.BadInputException;
import org.obverse.io.codec.PreparedCodec;
import org.obverse.io.table.EnergyScalesTable;
import org.obverse.io.codec.CampaignPlan;
import org.obverse.io.codec.CampaignPlanCodec;
import org.obverse.io.codec.ControlErrorsCodec;
import org.obverse.io.table.JobTable;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.samples.SampleCoding;
import org.obverse.io.samples.SampleFiles;
import org.obverse.io.samples.SampleReader;
import org.obverse.io.codec.ScheduleCodec;
import org.obverse.model.VariableIndex;

/**
 * Samples every job of a campaign folder with the plan's sampler into the raw file the job
 * expects ({@code raw/JOB.npy} and {@code raw/JOB.energies.npy}), skipping jobs whose raw file
 * is already there with the right shape, then collects. Jobs run on a pool of threads, one job
 * a thread at a time; each job's reads come from its own recorded seed, so the files — and the
 * results table — are the same bytes on any thread count, and a run interrupted and run again
 * gives the same bytes as one that never stopped (each raw file appears whole, by rename).
 */
public final class CampaignRunStep {
    private CampaignRunStep() {
    }

    /**
     * Run a campaign. source is a plan file (prepared into out first where out does not exist
     * yet) or an already prepared folder (out then null).
     */
    public record Request(Path source, Path out, boolean force, int threads) {
    }

    /**
     * What was run.
     *
     * @param folder   the campaign folder
     * @param prepared the prepare step's result where this run prepared the folder, else null
     * @param sampled  jobs sampled now
     * @param skipped  jobs whose raw samples were already there
     * @param collect  the collect step's result
     */
    public record Result(Path folder, CampaignPrepareStep.Result prepared, int sampled, int skipped,
                         CampaignCollectStep.Result collect) {
    }

    public static Result run(Request r, StepProgress progress) throws IOException {
        return run(r, CampaignEngine.local(r.threads()), progress);
    }

    /** Run a campaign, its jobs sampled and collected by the given engine. */
    public static Result run(Request r, CampaignEngine engine, StepProgress progress) throws IOException {
        Path dir;
        CampaignPrepareStep.Result prepared = null;
        if (Files.isDirectory(r.source())) {
            if (r.out() != null) {
                throw BadInputException.at(r.source(), "", "is a campaign folder, so --out has no meaning",
                        "run 'obverse campaign run DIR' alone, or give a plan file with --out");
            }
            dir = r.source();
        } else {
            if (r.out() == null) {
                throw BadInputException.at(r.source(), "", "is a plan, and a plan needs a folder to run in",
                        "give --out DIR (a new folder, or the folder this plan was prepared into)");
            }
            dir = r.out();
            if (Files.exists(dir) && CampaignFolder.isPrepared(dir) && !r.force()) {
                String now = CampaignPrepareStep.inputsHash(CampaignPlanCodec.read(r.source()));
                String then = PreparedCodec.inputsSha256(dir.resolve(CampaignFolder.PREPARED));
                if (!now.equals(then)) {
                    throw BadInputException.at(dir, "", "was prepared from another plan or other input files",
                            "give a new --out folder, or --force to prepare this one anew (its samples are lost)");
                }
            } else {
                prepared = CampaignPrepareStep.run(new CampaignPrepareStep.Request(r.source(), dir, r.force(),
                        r.threads()), progress);
            }
        }
        return runPrepared(CampaignFolder.open(dir), prepared, engine, FolderStore.local(), r.threads(), progress);
    }

    /**
     * Run a prepared campaign folder: sample every job the store does not have yet with the
     * engine, then collect. The folder is read here (plan, jobs, problems); the store says which
     * jobs are done and takes the tables.
     *
     * @param prepared the prepare step's result where the caller prepared the folder just now, else null
     */
    public static Result runPrepared(CampaignFolder folder, CampaignPrepareStep.Result prepared, CampaignEngine engine,
                                     FolderStore store, int threads, StepProgress progress) throws IOException {
        CampaignPlan plan = folder.plan();
        List<JobTable.Job> jobs = folder.jobs();
        if (plan.sampler().external()) {
            throw BadInputException.at(folder.resolve(CampaignFolder.PLAN), "sampler", "is external: the raw samples "
                    + "come from a device", "place each job's raw file as jobs.csv names it, then run 'obverse campaign "
                    + "collect " + store.describe(folder, "") + "'");
        }
        store.removeStaleParts(folder);
        List<JobTable.Job> todo = new ArrayList<>();
        boolean[] done = store.sampled(folder, jobs);
        for (int k = 0; k < done.length; k++) {
            if (!done[k]) {
                todo.add(jobs.get(k));
            }
        }
        baseSettings(plan); // reads the sampler's files (errors, energy scales) before any work: a bad one stops here
        long work = 0;
        for (JobTable.Job j : todo) {
            work += (long) j.reads() * (long) Math.ceil(j.runUs() * plan.sampler().sweepsPerUs());
        }
        IntConsumer tick = todo.isEmpty() ? null : progress.start("sampling", todo.size(), work);
        if (!todo.isEmpty()) {
            engine.sample(folder, todo, tick);
        }
        CampaignCollectStep.Result collected = CampaignCollectStep.run(folder, engine, store, progress);
        return new Result(folder.dir(), prepared, todo.size(), jobs.size() - todo.size(), collected);
    }

    /** Whether a job's raw file is present with one row per read and one column per qubit. */
    static boolean done(CampaignFolder folder, JobTable.Job j, Map<String, VariableIndex> variables)
            throws IOException {
        Path raw = folder.resolve(j.raw());
        if (!Files.isRegularFile(raw) || !Files.isRegularFile(energiesOf(raw))) {
            return false;
        }
        VariableIndex ids = variables.computeIfAbsent(j.problem(),
                p -> ProblemCodec.read(folder.resolve(p)).variables());
        try (SampleReader in = SampleFiles.open(raw, ids)) {
            return in.reads() == j.reads();
        } catch (BadInputException e) {
            return false;
        }
    }

    /** {@code raw/j00001.npy} → {@code raw/j00001.energies.npy}. */
    static Path energiesOf(Path raw) {
        return SampleStep.beside(raw, ".energies.npy");
    }

    /** The sampler the plan names: sa (the reference sampler) or sqa (the path-integral sampler). */
    public static SamplerSettings baseSettings(CampaignPlan plan) throws IOException {
        CampaignPlan.Sampler s = plan.sampler();
        SamplerSettings settings = SamplerSettings.defaults().withSweepsPerMicrosecond(s.sweepsPerUs()).withThreads(1);
        if (s.errors() != null) {
            settings = settings.withErrors(ControlErrorsCodec.read(s.errors()));
        }
        if (s.kind().equals("sqa")) {
            EnergyScales scales = s.energyScales() == null ? EnergyScales.illustrative()
                    : EnergyScalesTable.read(s.energyScales(), s.energyUnits());
            return settings.withPathIntegral(new PathIntegralSettings(scales, s.temperature(), s.slices()));
        }
        SamplerSettings.Kernel kernel = SamplerSettings.Kernel.byLabel(s.kernel());
        if (kernel != null) {
            settings = settings.withKernel(kernel);
        }
        return settings;
    }

    /**
     * Samples one job into its raw file (energies first, samples last, each whole by rename): the
     * work of one job on any engine. Its bytes depend only on the job's seed, so doing it twice
     * rewrites the same bytes.
     *
     * @param settings the plan's {@link #baseSettings}, with the thread count this job may use
     */
    public static void sampleJob(CampaignFolder folder, JobTable.Job job, SamplerSettings settings)
            throws IOException {
        sampleJob(folder, job, settings, ProblemCodec.read(folder.resolve(job.problem())),
                ScheduleCodec.readTable(folder.resolve(job.scheduleFile())));
    }

    private static void sampleJob(CampaignFolder folder, JobTable.Job j, SamplerSettings settings, ProblemFile pf,
                                  AnnealSchedule a) throws IOException {
        // Energies first, samples last: a job counts as done only once its samples file appears.
        SampleStep.sampleInto(pf, settings.withSchedule(a), j.reads(), j.seed(), folder.resolve(j.raw()),
                SampleCoding.SPIN, true);
    }

    /** The local engine's sampling: a pool of threads, one job a thread at a time. */
    static void sampleOnThreads(CampaignFolder folder, List<JobTable.Job> todo, int threads, IntConsumer tick)
            throws IOException {
        if (todo.isEmpty()) {
            return;
        }
        SamplerSettings base = baseSettings(folder.plan());
        Map<String, ProblemFile> problems = new ConcurrentHashMap<>();
        Map<String, AnnealSchedule> schedules = new ConcurrentHashMap<>();
        int workers = Math.min(threads, todo.size());
        // Fewer jobs than threads: each job splits its reads (never changes the output).
        SamplerSettings perJob = base.withThreads(Math.max(1, threads / workers));
        JobThreads.run("sampling", todo.size(), workers, tick, k -> {
            JobTable.Job j = todo.get(k);
            ProblemFile pf = problems.computeIfAbsent(j.problem(), p -> ProblemCodec.read(folder.resolve(p)));
            AnnealSchedule a = schedules.computeIfAbsent(j.scheduleFile(), f -> readSchedule(folder.resolve(f)));
            sampleJob(folder, j, perJob, pf, a);
            return null;
        });
    }

    private static AnnealSchedule readSchedule(Path file) {
        try {
            return ScheduleCodec.readTable(file);
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }
}
