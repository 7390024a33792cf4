package org.obverse.io.codec;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import org.obverse.anneal.EnergyScales;
import org.obverse.io.json.JsonFiles;
import org.obverse.spectrum.ChainCouplingScan;
import org.obverse.spectrum.GapDip;
import org.obverse.spectrum.MinimumGap;
import org.obverse.spectrum.PauseWindow;
import org.obverse.spectrum.ScanSettings;
import org.obverse.spectrum.SpectrumAnalysis;

/**
 * A spectrum folder's {@code summary.json} ({@value #FORMAT}, spec/spectrum.md): the schedule and
 * scan settings, then for one problem its sector, solver, minimum gap, pause window and dips, or
 * for a chain-coupling sweep one entry per coupling. obverse writes the summary for people and
 * scripts and reads none back, so this codec only writes.
 */
public final class SpectrumSummaryCodec {
    /** The format tag. */
    public static final String FORMAT = "obverse.spectrum/1";

    private SpectrumSummaryCodec() {
    }

    /**
     * The analysed problem of a single run.
     *
     * @param file               the problem's file name
     * @param spins              its spins
     * @param couplers           its couplers
     * @param sectorDimension    the dimension of the sector solved in
     * @param symmetryComponents the field-free components of the problem
     * @param solver             the solver's name
     * @param solverTolerance    its residual tolerance
     * @param levels             levels solved per grid point
     * @param relevantLevel      the level of the relevant gap
     * @param groundDegeneracy   the degeneracy of the problem's ground level
     * @param groundEnergy       the problem's ground energy
     */
    public record Problem(String file, int spins, int couplers, int sectorDimension, int symmetryComponents,
                          String solver, double solverTolerance, int levels, int relevantLevel, int groundDegeneracy,
                          double groundEnergy) {
    }

    /**
     * The summary of one problem's spectrum.
     *
     * @param dipMinDepth the least depth a dip needs to count
     * @param seconds     the time the scan took (rounded to milliseconds in the file)
     */
    public static String single(EnergyScales sched, ScanSettings scan, Problem p, SpectrumAnalysis a,
                                double dipMinDepth, double seconds) {
        ObjectNode summary = base(sched, scan);
        summary.put("problem", p.file());
        summary.put("spins", p.spins());
        summary.put("couplers", p.couplers());
        summary.put("sector", "reachable");
        summary.put("sector_dimension", p.sectorDimension());
        summary.put("symmetry_components", p.symmetryComponents());
        summary.put("solver", p.solver());
        summary.put("solver_tolerance", p.solverTolerance());
        summary.put("levels", p.levels());
        summary.put("relevant_level", p.relevantLevel());
        summary.put("ground_degeneracy", p.groundDegeneracy());
        summary.put("ground_energy", p.groundEnergy());
        putAnalysis(summary, a.minimum(), a.pause());
        putDips(summary, a.dips(), a.suggestedDip(), dipMinDepth);
        summary.put("seconds", Math.round(seconds * 1000) / 1000.0);
        return JsonFiles.text(summary);
    }

    /** The summary of a chain-coupling sweep: the file names of its inputs and one entry per coupling. */
    public static String sweep(EnergyScales sched, ScanSettings scan, String logical, String chains, String device,
                               List<ChainCouplingScan.Row> rows, double seconds) {
        ObjectNode summary = base(sched, scan);
        summary.put("logical", logical);
        summary.put("chains", chains);
        summary.put("device", device);
        ArrayNode arr = summary.putArray("chain_scan");
        for (ChainCouplingScan.Row row : rows) {
            ObjectNode o = arr.addObject();
            o.put("chain_coupling", row.chainCoupling());
            o.put("spins", row.spins());
            putAnalysis(o, row.minimum(), row.pause());
            putDips(o, row.dips(), row.suggestedDip(), Double.NaN);
        }
        summary.put("seconds", Math.round(seconds * 1000) / 1000.0);
        return JsonFiles.text(summary);
    }

    private static ObjectNode base(EnergyScales sched, ScanSettings scan) {
        ObjectNode s = JsonFiles.newObject();
        s.put("format", FORMAT);
        s.put("hamiltonian", "H(s) = -(A(s)/2) sum_i X_i + (B(s)/2) H_P(Z)");
        s.put("schedule", sched.name());
        s.put("schedule_illustrative", sched.isIllustrative());
        s.put("schedule_units", sched.units());
        s.put("grid_points", scan.points());
        s.put("pause_from_ratio", scan.pauseFromRatio());
        s.put("pause_to_ratio", scan.pauseToRatio());
        s.put("pause_tolerance", scan.pauseTolerance());
        s.put("pause_rule", "heuristic: from the first s after a dip where the gap reaches pause_from_ratio times the"
                + " dip's gap to the first where it reaches pause_to_ratio times it, cut at the crest before the next"
                + " dip; the suggested window follows the interior dip with the smallest gap (s* and gap_min where there"
                + " is none); after Chen & Lidar, Phys. Rev. Applied 14, 014100 (2020). See spec/spectrum.md");
        return s;
    }

    private static void putAnalysis(ObjectNode o, MinimumGap m, PauseWindow pw) {
        o.put("s_star", m.sStar());
        o.put("s_star_tolerance", m.sTolerance());
        o.put("gap_min", m.gapMin());
        o.put("gap_min_tolerance", m.gapTolerance());
        o.put("minimum_at_edge", m.atEdge());
        o.put("pause_from", pw.from());
        o.put("pause_to", pw.to());
        o.put("pause_from_capped", pw.fromCapped());
        o.put("pause_to_capped", pw.toCapped());
    }

    // The dips after the existing keys; the floor where it is known (a single problem).
    private static void putDips(ObjectNode o, List<GapDip> dips, int suggested, double floor) {
        ArrayNode arr = o.putArray("dips");
        for (GapDip dip : dips) {
            ObjectNode d = arr.addObject();
            d.put("s", dip.s());
            d.put("s_tolerance", dip.sTolerance());
            d.put("gap", dip.gap());
            d.put("gap_tolerance", dip.gapTolerance());
            d.put("depth", dip.depth());
            d.put("at_end", dip.atEnd());
            d.put("pause_from", dip.pause().from());
            d.put("pause_to", dip.pause().to());
            d.put("pause_from_capped", dip.pause().fromCapped());
            d.put("pause_to_capped", dip.pause().toCapped());
        }
        if (suggested >= 0) {
            o.put("suggested_dip", suggested);
        } else {
            o.putNull("suggested_dip");
        }
        if (!Double.isNaN(floor)) {
            o.put("dip_min_depth", floor);
        }
    }
}
