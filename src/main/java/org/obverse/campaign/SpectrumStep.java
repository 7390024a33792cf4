package org.obverse.campaign;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.function.IntConsumer;
import org.obverse.anneal.EnergyScales;
import org.obverse.anneal.InvalidEnergyScalesException;
import org.obverse.device.DeviceLimits;
import org.obverse.embed.ChainEmbedder;
import org.obverse.embed.ChainStrength;
import org.obverse.embed.Chains;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.codec.ChainList;
import org.obverse.io.codec.ChainsCodec;
import org.obverse.io.table.CsvReader;
import org.obverse.io.codec.DeviceCodec;
import org.obverse.io.json.JsonFiles;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.model.IsingProblem;
import org.obverse.report.Figure;
import org.obverse.report.LevelsPlot;
import org.obverse.spectrum.AnnealSpectrum;
import org.obverse.spectrum.ChainCouplingScan;
import org.obverse.spectrum.GapDip;
import org.obverse.spectrum.GapScan;
import org.obverse.spectrum.MinimumGap;
import org.obverse.spectrum.PauseWindow;
import org.obverse.spectrum.ScanSettings;
import org.obverse.spectrum.SectorBasis;
import org.obverse.spectrum.SpectrumAnalysis;
import org.obverse.spectrum.SpectrumSettings;

/**
 * The spectrum of the anneal for one problem file, or for a logical problem re-embedded at a
 * sweep of chain couplings, written into a fresh folder all or nothing (spec/spectrum.md).
 * One problem: {@code levels.csv}, {@code gap.csv}, {@code summary.json} (the global minimum,
 * every dip of the gap and the suggested pause window), {@code levels.png} and {@code gap.png}.
 * A sweep: {@code chain_scan.csv}, {@code summary.json} and {@code chain_scan.png}. Reports the
 * grid points solved through {@link StepProgress}.
 */
public final class SpectrumStep {
    /** The name of the scan phase as reported to {@link StepProgress}. */
    public static final String SCAN_PHASE = "spectrum scan";

    private SpectrumStep() {
    }

    /**
     * A chain-coupling sweep: the logical problem, its chains, the device, the couplings to
     * sweep and the scale of the logical terms (null: the largest that fits, as {@code embed}).
     */
    public record Sweep(Path logical, Path chains, Path device, double[] chainCouplings, Double scale) {
    }

    /**
     * What to analyse: exactly one of problem and sweep; the energy-scales table (null: the
     * illustrative pair) and its units; how to solve and scan; where to write. progress may be
     * null.
     */
    public record Request(Path problem, Sweep sweep, Path energyScales, String energyUnits,
                          SpectrumSettings spectrum, ScanSettings scan, Path out, boolean force,
                          StepProgress progress) {
    }

    /** The analysed problem of a single run: its size, sector and solver, and the analysis. */
    public record Single(int spins, int sectorDimension, int symmetryComponents, String solver, int levels,
                        int relevantLevel, SpectrumAnalysis analysis) {
    }

    /** What was computed and written: single (one problem) or rows (a sweep), the other null. */
    public record Result(EnergyScales scales, Single single, List<ChainCouplingScan.Row> rows, double seconds,
                         Path out) {
    }

    /** The files a run reads: the output may be none of them, nor hold nor lie inside one. */
    static List<Path> inputs(Request r) {
        return r.sweep() == null ? AtomicOutput.inputs(r.problem(), r.energyScales())
                : AtomicOutput.inputs(r.problem(), r.energyScales(), r.sweep().logical(), r.sweep().chains(),
                        r.sweep().device());
    }

    public static Result run(Request r) throws IOException {
        if ((r.problem() == null) == (r.sweep() == null)) {
            throw new IllegalArgumentException("give either a problem or a chain-coupling sweep");
        }
        AtomicOutput.checkTarget(r.out(), r.force(), inputs(r));
        EnergyScales scales = r.energyScales() == null ? EnergyScales.illustrative()
                : readEnergyScales(r.energyScales(), r.energyUnits());
        StepProgress progress = r.progress() == null ? StepProgress.NONE : r.progress();
        try {
            if (r.problem() != null) {
                return single(r, ProblemCodec.read(r.problem()).spin(), scales, progress);
            }
            return sweep(r, scales, progress);
        } catch (IllegalStateException e) {
            // The eigensolver gave up (its message says what to change): a setting to fix, not a crash.
            throw BadInputException.at(r.problem() != null ? r.problem() : r.sweep().logical(), "",
                    e.getMessage(), "");
        }
    }

    private static Result single(Request r, IsingProblem p, EnergyScales sched, StepProgress progress)
            throws IOException {
        AnnealSpectrum spectrum = AnnealSpectrum.of(p, sched, r.spectrum());
        SectorBasis basis = spectrum.basis();
        ScanSettings scan = r.scan();
        IntConsumer done = progress.start(SCAN_PHASE, scan.points(), work(scan.points(), basis.dimension()));
        long start = System.nanoTime();
        SpectrumAnalysis a = spectrum.analyse(scan, done);
        double seconds = (System.nanoTime() - start) / 1e9;
        GapScan g = a.scan();
        MinimumGap m = a.minimum();
        PauseWindow pw = a.pause();
        ObjectNode summary = summaryBase(sched, scan);
        summary.put("problem", r.problem().getFileName().toString());
        summary.put("spins", p.size());
        summary.put("couplers", p.edgeCount());
        summary.put("sector", "reachable");
        summary.put("sector_dimension", basis.dimension());
        summary.put("symmetry_components", basis.symmetryComponents());
        summary.put("solver", spectrum.solver().name());
        summary.put("solver_tolerance", spectrum.solver().tolerance());
        summary.put("levels", spectrum.levelCount());
        summary.put("relevant_level", spectrum.relevantLevel());
        summary.put("ground_degeneracy", basis.groundDegeneracy());
        summary.put("ground_energy", basis.minimumEnergy());
        putAnalysis(summary, m, pw);
        putDips(summary, a.dips(), a.suggestedDip(), spectrum.dipDepthFloor(g, scan));
        summary.put("seconds", Math.round(seconds * 1000) / 1000.0);
        String unit = sched.isIllustrative() ? "problem units" : sched.units();
        String title = r.problem().getFileName() + " — "
                + (sched.isIllustrative() ? "illustrative schedule" : sched.name());
        double[][] rows = new double[g.points()][];
        for (int k = 0; k < g.points(); k++) {
            rows[k] = g.levels(k);
        }
        double[] dipS = new double[a.dips().size()];
        double[] dipGap = new double[a.dips().size()];
        for (int k = 0; k < dipS.length; k++) {
            dipS[k] = a.dips().get(k).s();
            dipGap[k] = a.dips().get(k).gap();
        }
        Figure levelsPng = LevelsPlot.levels(title, g.s(), rows, spectrum.relevantLevel(), m.sStar(), pw.from(),
                pw.to(), unit, dipS);
        Figure gapPng = LevelsPlot.gap(title, g.s(), g.gaps(), m.sStar(), m.gapMin(), pw.from(), pw.to(), unit,
                dipS, dipGap);
        AtomicOutput.writeDirectory(r.out(), r.force(), inputs(r), dir -> {
            Files.writeString(dir.resolve("levels.csv"), levelsCsv(g));
            Files.writeString(dir.resolve("gap.csv"), gapCsv(g));
            Files.writeString(dir.resolve("summary.json"), JsonFiles.text(summary));
            Files.write(dir.resolve("levels.png"), levelsPng.png());
            Files.write(dir.resolve("gap.png"), gapPng.png());
        });
        Single single = new Single(p.size(), basis.dimension(), basis.symmetryComponents(), spectrum.solver().name(),
                spectrum.levelCount(), spectrum.relevantLevel(), a);
        return new Result(sched, single, null, seconds, r.out());
    }

    private static Result sweep(Request r, EnergyScales sched, StepProgress progress) throws IOException {
        Sweep sw = r.sweep();
        IsingProblem q = ProblemCodec.read(sw.logical()).spin();
        ChainList list = ChainsCodec.read(sw.chains());
        Chains c = Chains.of(list.logicalIds(), list.qubitGroups());
        DeviceLimits d = DeviceCodec.read(sw.device());
        double sc = sw.scale() == null ? Double.NaN : sw.scale();
        ChainCouplingScan.EmbeddedFamily family = v -> {
            try {
                return ChainEmbedder.embed(q, c, d, ChainStrength.uniform(v), sc).physical();
            } catch (IllegalArgumentException e) {
                throw BadInputException.at(sw.chains(), "chain coupling " + v, e.getMessage(),
                        "choose chain couplings inside the device's coupling range");
            }
        };
        long dimension = 1;
        for (double v : sw.chainCouplings()) {
            // Refuses a bad value before any spectrum is computed.
            dimension = Math.max(dimension, 1L << Math.min(20, family.at(v).size()));
        }
        ScanSettings scan = r.scan();
        int total = sw.chainCouplings().length * scan.points();
        IntConsumer done = progress.start(SCAN_PHASE, total, work(total, dimension));
        long start = System.nanoTime();
        List<ChainCouplingScan.Row> rows = ChainCouplingScan.run(family, sw.chainCouplings(), sched, r.spectrum(),
                scan, done);
        double seconds = (System.nanoTime() - start) / 1e9;
        ObjectNode summary = summaryBase(sched, scan);
        summary.put("logical", sw.logical().getFileName().toString());
        summary.put("chains", sw.chains().getFileName().toString());
        summary.put("device", sw.device().getFileName().toString());
        ArrayNode arr = summary.putArray("chain_scan");
        StringBuilder csv = new StringBuilder("chain_coupling,spins,s_star,s_star_tolerance,gap_min,gap_min_tolerance,"
                + "pause_from,pause_to\n");
        double[] x = new double[rows.size()];
        double[] sStar = new double[rows.size()];
        double[] gapMin = new double[rows.size()];
        for (int i = 0; i < rows.size(); i++) {
            ChainCouplingScan.Row row = rows.get(i);
            ObjectNode o = arr.addObject();
            o.put("chain_coupling", row.chainCoupling());
            o.put("spins", row.spins());
            putAnalysis(o, row.minimum(), row.pause());
            putDips(o, row.dips(), row.suggestedDip(), Double.NaN);
            csv.append(row.chainCoupling()).append(',').append(row.spins()).append(',').append(row.minimum().sStar())
                    .append(',').append(row.minimum().sTolerance()).append(',').append(row.minimum().gapMin())
                    .append(',').append(row.minimum().gapTolerance()).append(',').append(row.pause().from())
                    .append(',').append(row.pause().to()).append('\n');
            x[i] = row.chainCoupling();
            sStar[i] = row.minimum().sStar();
            gapMin[i] = row.minimum().gapMin();
        }
        summary.put("seconds", Math.round(seconds * 1000) / 1000.0);
        Figure plot = LevelsPlot.chainScan(sw.logical().getFileName() + " — " + (sched.isIllustrative()
                ? "illustrative schedule" : sched.name()), x, sStar, gapMin);
        AtomicOutput.writeDirectory(r.out(), r.force(), inputs(r), dir -> {
            Files.writeString(dir.resolve("chain_scan.csv"), csv.toString());
            Files.writeString(dir.resolve("summary.json"), JsonFiles.text(summary));
            Files.write(dir.resolve("chain_scan.png"), plot.png());
        });
        return new Result(sched, null, rows, seconds, r.out());
    }

    // About a thousand products of H(s) with a vector per grid point, each touching every state.
    private static long work(long points, long dimension) {
        return points * dimension * 1000L;
    }

    private static ObjectNode summaryBase(EnergyScales sched, ScanSettings scan) {
        ObjectNode s = JsonFiles.MAPPER.createObjectNode();
        s.put("format", "obverse.spectrum/1");
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

    private static String levelsCsv(GapScan g) {
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

    private static String gapCsv(GapScan g) {
        StringBuilder b = new StringBuilder("s,gap\n");
        for (int r = 0; r < g.points(); r++) {
            b.append(g.s(r)).append(',').append(g.gap(r)).append('\n');
        }
        return b.toString();
    }

    /**
     * Reads an energy-scales table: CSV with columns s, A, B (others ignored); a bad table is
     * refused naming the file and line (exit 2).
     */
    public static EnergyScales readEnergyScales(Path file, String units) throws IOException {
        List<double[]> rows = new ArrayList<>();
        List<Long> lineOf = new ArrayList<>();
        try (CsvReader in = CsvReader.open(file)) {
            int[] col = in.require("a schedule table", "s", "A", "B");
            String[] rec;
            while ((rec = in.record()) != null) {
                double[] v = new double[3];
                for (int k = 0; k < 3; k++) {
                    String text = rec[col[k]].trim();
                    try {
                        v[k] = Double.parseDouble(text);
                    } catch (NumberFormatException e) {
                        throw in.error(col[k], text, "is not a number", "give s, A and B as decimal numbers");
                    }
                }
                rows.add(v);
                lineOf.add(in.line());
            }
        }
        int n = rows.size();
        double[] s = new double[n];
        double[] a = new double[n];
        double[] b = new double[n];
        for (int i = 0; i < n; i++) {
            s[i] = rows.get(i)[0];
            a[i] = rows.get(i)[1];
            b[i] = rows.get(i)[2];
        }
        try {
            return EnergyScales.fromTable(file.getFileName().toString(), units, s, a, b);
        } catch (InvalidEnergyScalesException e) {
            String place = e.row() >= 0 ? "line " + lineOf.get(e.row()) : "";
            String msg = e.getMessage().replaceFirst("^row \\d+: ", "");
            throw BadInputException.at(file, place, msg, "fix the schedule table (columns s,A,B; s from 0 to 1,"
                    + " strictly increasing; A, B >= 0)");
        }
    }
}
