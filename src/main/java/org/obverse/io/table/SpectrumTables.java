package org.obverse.io.table;

import java.util.List;
import org.obverse.spectrum.ChainCouplingScan;
import org.obverse.spectrum.GapScan;

/**
 * The CSV tables of a spectrum folder (spec/spectrum.md): {@code levels.csv} (s and the lowest
 * levels E0, E1, … of H(s) per grid point), {@code gap.csv} (s and the relevant gap) and, for a
 * chain-coupling sweep, {@code chain_scan.csv} (one row per chain coupling: s*, gap_min and the
 * pause window). Numbers are the shortest round-trip decimals. obverse writes these tables for
 * people and plots and reads none of them back.
 */
public final class SpectrumTables {
    /** The columns of chain_scan.csv, in order. */
    public static final List<String> CHAIN_SCAN_COLUMNS = List.of("chain_coupling", "spins", "s_star",
            "s_star_tolerance", "gap_min", "gap_min_tolerance", "pause_from", "pause_to");

    private SpectrumTables() {
    }

    /** levels.csv: {@code s,E0,E1,…}, one row per grid point. */
    public static String levels(GapScan g) {
        StringBuilder b = new StringBuilder("s");
        for (int i = 0; i < g.levelCount(); i++) {
            b.append(",E").append(i);
        }
        b.append('\n');
        for (int r = 0; r < g.points(); r++) {
            b.append(g.s(r));
            for (double e : g.levels(r)) {
                b.append(',').append(e);
            }
            b.append('\n');
        }
        return b.toString();
    }

    /** gap.csv: {@code s,gap}, one row per grid point. */
    public static String gap(GapScan g) {
        StringBuilder b = new StringBuilder("s,gap\n");
        for (int r = 0; r < g.points(); r++) {
            b.append(g.s(r)).append(',').append(g.gap(r)).append('\n');
        }
        return b.toString();
    }

    /** chain_scan.csv: one row per chain coupling of a sweep, in the order given. */
    public static String chainScan(List<ChainCouplingScan.Row> rows) {
        StringBuilder b = new StringBuilder(String.join(",", CHAIN_SCAN_COLUMNS)).append('\n');
        for (ChainCouplingScan.Row row : rows) {
            b.append(row.chainCoupling()).append(',').append(row.spins()).append(',').append(row.minimum().sStar())
                    .append(',').append(row.minimum().sTolerance()).append(',').append(row.minimum().gapMin())
                    .append(',').append(row.minimum().gapTolerance()).append(',').append(row.pause().from())
                    .append(',').append(row.pause().to()).append('\n');
        }
        return b.toString();
    }
}
