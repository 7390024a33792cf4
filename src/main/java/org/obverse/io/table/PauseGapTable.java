package org.obverse.io.table;

/**
 * The report's {@code pause_gap.csv} (spec/results.md): for a path-integral campaign, one row per
 * (instance, chain coupling, pause) with its reads, successes and success probability beside the
 * relevant gap at the pause location and the last dip of the gap before it. A value that does not
 * apply (no pause, no dip) is an empty cell; any other number is the shortest round-trip decimal.
 * obverse writes the table for people and reads none back.
 */
public final class PauseGapTable {
    /** The header line, newline included. */
    public static final String HEADER = "instance,chain_coupling,anneal_us,pause_s,pause_us,reads,successes,p_success,"
            + "gap_at_pause,dip_before_s,dip_before_gap\n";

    private PauseGapTable() {
    }

    /**
     * One row; NaN where a value does not apply.
     *
     * @param pauseS       the pause location, NaN for the no-pause baseline
     * @param pauseUs      the pause duration, NaN for the baseline
     * @param gapAtPause   the relevant gap at pauseS, NaN for the baseline
     * @param dipBeforeS   the location of the last dip at or before pauseS, NaN for none
     * @param dipBeforeGap the gap at that dip, NaN for none
     */
    public record Row(String instance, double chainCoupling, double annealUs, double pauseS, double pauseUs, long reads,
                      long successes, double pSuccess, double gapAtPause, double dipBeforeS, double dipBeforeGap) {
    }

    /** One row as a line of the table, newline included. */
    public static String line(Row r) {
        return CsvReader.quote(r.instance()) + "," + r.chainCoupling() + "," + r.annealUs() + ","
                + JobTable.number(r.pauseS()) + "," + JobTable.number(r.pauseUs()) + "," + r.reads() + ","
                + r.successes() + "," + r.pSuccess() + "," + JobTable.number(r.gapAtPause()) + ","
                + JobTable.number(r.dipBeforeS()) + "," + JobTable.number(r.dipBeforeGap()) + "\n";
    }
}
