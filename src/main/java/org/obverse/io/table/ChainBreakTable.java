package org.obverse.io.table;

import org.obverse.embed.Chains;
import org.obverse.embed.DecodedSamples;

/**
 * The decode step's {@code chains.csv} (spec/chains.md): one line per chain in logical order,
 * {@code logical_id,length,broken_reads,broken_fraction}, where broken_fraction is broken_reads
 * over all reads (0.0 for no reads). obverse writes the table for people and reads none back.
 */
public final class ChainBreakTable {
    /** The columns, in order. */
    public static final String HEADER = "logical_id,length,broken_reads,broken_fraction";

    private ChainBreakTable() {
    }

    /** The table of the chains used in one decode and the breaks each had. */
    public static String text(DecodedSamples d, Chains used) {
        StringBuilder csv = new StringBuilder(HEADER).append('\n');
        long[] breaks = d.breaksPerChain();
        for (int k = 0; k < breaks.length; k++) {
            csv.append(used.logicalId(k)).append(',').append(used.length(k)).append(',').append(breaks[k]).append(',')
                    .append(d.reads() == 0 ? 0.0 : (double) breaks[k] / d.reads()).append('\n');
        }
        return csv.toString();
    }
}
