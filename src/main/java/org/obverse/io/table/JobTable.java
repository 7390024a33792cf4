package org.obverse.io.table;

import org.obverse.io.BadInputException;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * A campaign folder's {@code jobs.csv} (spec/campaign.md): one row per job — one (instance,
 * chain coupling, schedule, gauge) — naming the files a device submission takes and the raw
 * samples file it must give back, bound by content hashes. Paths are relative to the campaign
 * folder. Written once by the prepare step; read by run and collect.
 */
public final class JobTable {
    /** The columns, in order. */
    public static final List<String> COLUMNS = List.of("job", "instance", "chain_coupling", "schedule", "anneal_us",
            "pause_s", "pause_us", "run_us", "gauged", "gauge", "reads", "seed", "problem", "problem_sha256",
            "manifest", "schedule_file", "schedule_sha256", "raw");

    private JobTable() {
    }

    /**
     * One job.
     *
     * @param id             the job's name, also the stem of its raw file
     * @param instance       the logical instance
     * @param chainCoupling  the chain coupling it was embedded with
     * @param schedule       the schedule's name
     * @param annealUs       the anneal time, or NaN where a listed schedule does not show it
     * @param pauseS         the pause location, NaN for none
     * @param pauseUs        the pause duration, NaN for none
     * @param runUs          the time of one anneal, pause included: the run time of TTS
     * @param gauged         whether the problem is gauged (false: the ungauged reference)
     * @param gauge          the gauge's index in its manifest, −1 for none
     * @param reads          reads to take
     * @param seed           the sampler's seed for this job
     * @param problem        the problem to submit (relative path)
     * @param problemSha256  its canonical content hash
     * @param manifest       the gauge manifest the problem belongs to (relative), or "" for none
     * @param scheduleFile   the schedule as (t_us, s) points (relative path)
     * @param scheduleSha256 the SHA-256 of that file's bytes
     * @param raw            the raw samples file the job expects (relative path, .npy)
     */
    public record Job(String id, String instance, double chainCoupling, String schedule, double annealUs, double pauseS,
                      double pauseUs, double runUs, boolean gauged, int gauge, int reads, long seed, String problem,
                      String problemSha256, String manifest, String scheduleFile, String scheduleSha256, String raw) {
    }

    /** The text of a job table. */
    public static String text(List<Job> jobs) {
        StringBuilder s = new StringBuilder(String.join(",", COLUMNS)).append('\n');
        for (Job j : jobs) {
            s.append(j.id()).append(',').append(CsvReader.quote(j.instance())).append(',').append(j.chainCoupling())
                    .append(',').append(j.schedule()).append(',').append(number(j.annealUs())).append(',')
                    .append(number(j.pauseS())).append(',').append(number(j.pauseUs())).append(',').append(j.runUs())
                    .append(',').append(j.gauged() ? "yes" : "no").append(',').append(j.gauge() < 0 ? "" : j.gauge())
                    .append(',').append(j.reads()).append(',').append(j.seed()).append(',')
                    .append(CsvReader.quote(j.problem())).append(',').append(j.problemSha256()).append(',')
                    .append(CsvReader.quote(j.manifest())).append(',').append(CsvReader.quote(j.scheduleFile()))
                    .append(',').append(j.scheduleSha256()).append(',').append(CsvReader.quote(j.raw())).append('\n');
        }
        return s.toString();
    }

    /** Empty for NaN (a value that does not apply), else the shortest round-trip decimal. */
    public static String number(double v) {
        return Double.isNaN(v) ? "" : Double.toString(v);
    }

    /** Reads a job table. */
    public static List<Job> read(Path file) throws IOException {
        List<Job> out = new ArrayList<>();
        try (CsvReader csv = CsvReader.open(file)) {
            int[] c = csv.require("a campaign job table", COLUMNS.toArray(new String[0]));
            String[] r;
            while ((r = csv.record()) != null) {
                out.add(new Job(r[c[0]], r[c[1]], number(csv, c[2], r[c[2]], false), r[c[3]],
                        number(csv, c[4], r[c[4]], true), number(csv, c[5], r[c[5]], true),
                        number(csv, c[6], r[c[6]], true), number(csv, c[7], r[c[7]], false),
                        yesNo(csv, c[8], r[c[8]]), r[c[9]].isEmpty() ? -1 : (int) whole(csv, c[9], r[c[9]], 0, Integer.MAX_VALUE),
                        (int) whole(csv, c[10], r[c[10]], 1, Integer.MAX_VALUE), whole(csv, c[11], r[c[11]], Long.MIN_VALUE,
                        Long.MAX_VALUE), r[c[12]], r[c[13]], r[c[14]], r[c[15]], r[c[16]], r[c[17]]));
            }
        }
        if (out.isEmpty()) {
            throw BadInputException.at(file, "", "lists no jobs", "prepare the campaign again");
        }
        return out;
    }

    private static double number(CsvReader csv, int col, String text, boolean mayBeEmpty) {
        if (text.isEmpty() && mayBeEmpty) {
            return Double.NaN;
        }
        try {
            double v = Double.parseDouble(text);
            if (Double.isFinite(v)) {
                return v;
            }
        } catch (NumberFormatException e) {
            // reported below
        }
        throw csv.error(col, text, "is not a finite number", "prepare the campaign again rather than editing jobs.csv");
    }

    private static long whole(CsvReader csv, int col, String text, long lo, long hi) {
        try {
            long v = Long.parseLong(text);
            if (v >= lo && v <= hi) {
                return v;
            }
        } catch (NumberFormatException e) {
            // reported below
        }
        throw csv.error(col, text, "is not a whole number in [" + lo + ", " + hi + "]",
                "prepare the campaign again rather than editing jobs.csv");
    }

    private static boolean yesNo(CsvReader csv, int col, String text) {
        if (text.equals("yes") || text.equals("no")) {
            return text.equals("yes");
        }
        throw csv.error(col, text, "is not yes or no", "prepare the campaign again rather than editing jobs.csv");
    }
}
