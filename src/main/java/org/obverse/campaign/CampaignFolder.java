package org.obverse.campaign;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.obverse.io.BadInputException;
import org.obverse.io.codec.CampaignPlan;
import org.obverse.io.codec.CampaignPlanCodec;
import org.obverse.io.table.JobTable;

/**
 * The layout of a prepared campaign folder (spec/campaign.md), shared by prepare, run and
 * collect. Everything a job needs sits inside the folder, so it can be moved or handed to
 * whoever runs the device:
 *
 * <pre>
 * plan.json                     the plan, its paths pointing into inputs/
 * prepared.json                 hash of the plan and its inputs as prepared
 * inputs/                       copies of the logical problems, device, chains, error model …
 * inputs/NAME.chains.json       the chains of instance NAME (given, or found once per structure)
 * embedded/NAME/V=v.json        instance NAME embedded at chain coupling v
 * gauges/NAME/V=v/              its gauge manifest and gauged problems
 * schedules/S.csv               schedule S as (t_us, s) points
 * jobs.csv                      one row per job
 * ground.csv                    instance, ground_energy, ground_source
 * raw/JOB.npy                   raw samples of a job, in the device frame (+ JOB.energies.npy)
 * decoded/JOB.npy               logical samples of a job's kept reads (+ JOB.kept.npy, JOB.broken.npy)
 * results.csv, audit.txt        written by collect
 * </pre>
 */
public final class CampaignFolder {
    public static final String PLAN = "plan.json";
    public static final String PREPARED = "prepared.json";
    public static final String JOBS = "jobs.csv";
    public static final String GROUND = "ground.csv";
    public static final String RESULTS = "results.csv";
    public static final String AUDIT = "audit.txt";
    public static final String RAW = "raw";
    public static final String DECODED = "decoded";

    private final Path dir;

    private CampaignFolder(Path dir) {
        this.dir = dir;
    }

    /** A prepared folder; refuses a folder without a plan and job table. */
    public static CampaignFolder open(Path dir) {
        if (!Files.isDirectory(dir)) {
            throw BadInputException.at(dir, "", Files.exists(dir) ? "is not a folder" : "no such folder",
                    "give a campaign folder made by 'obverse campaign prepare'");
        }
        for (String f : new String[] {PLAN, JOBS, GROUND}) {
            if (!Files.isRegularFile(dir.resolve(f))) {
                throw BadInputException.at(dir, "", "has no " + f + ", so it is not a prepared campaign folder",
                        "prepare it with 'obverse campaign prepare PLAN --out DIR'");
            }
        }
        return new CampaignFolder(dir);
    }

    /** Whether dir looks like a prepared campaign folder. */
    public static boolean isPrepared(Path dir) {
        return Files.isRegularFile(dir.resolve(PLAN)) && Files.isRegularFile(dir.resolve(JOBS));
    }

    public Path dir() {
        return dir;
    }

    public Path resolve(String relative) {
        return dir.resolve(relative);
    }

    /** The folder's own plan (paths into inputs/). */
    public CampaignPlan plan() {
        return CampaignPlanCodec.read(dir.resolve(PLAN));
    }

    public List<JobTable.Job> jobs() throws IOException {
        return JobTable.read(dir.resolve(JOBS));
    }

    /** A job's raw samples and their energies, relative to the folder, in the order they are written (samples last). */
    public static List<String> rawFiles(JobTable.Job j) {
        String raw = j.raw();
        int dot = raw.lastIndexOf('.');
        return List.of((dot > raw.lastIndexOf('/') ? raw.substring(0, dot) : raw) + ".energies.npy", raw);
    }

    /** The files collecting a job writes, relative to the folder. */
    public static List<String> decodedFiles(JobTable.Job j) {
        String d = DECODED + "/" + j.id();
        return List.of(d + ".npy", d + ".kept.npy", d + ".broken.npy");
    }

    /** The chains file of an instance. */
    static String chainsFile(String instance) {
        return "inputs/" + instance + ".chains.json";
    }

    /** The embedded problem of an instance at a chain coupling. */
    static String embeddedFile(String instance, double chainCoupling) {
        return "embedded/" + instance + "/V=" + chainCoupling + ".json";
    }

    /** The gauge folder of an instance at a chain coupling. */
    static String gaugeFolder(String instance, double chainCoupling) {
        return "gauges/" + instance + "/V=" + chainCoupling;
    }

    /** The setting label of a job's rows: chain coupling, schedule, and whether gauged. */
    static String setting(double chainCoupling, String schedule, boolean gauged) {
        return "V=" + chainCoupling + " " + schedule + (gauged ? " gauged" : " no gauge");
    }
}
