package org.obverse.campaign;

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
import org.obverse.io.table.EnergyScalesTable;
import org.obverse.io.codec.DeviceCodec;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.SpectrumSummaryCodec;
import org.obverse.io.table.SpectrumTables;
import org.obverse.model.IsingProblem;
import org.obverse.report.Figure;
import org.obverse.report.LevelsPlot;
import org.obverse.spectrum.AnnealSpectrum;
import org.obverse.spectrum.ChainCouplingScan;
import org.obverse.spectrum.GapScan;
import org.obverse.spectrum.MinimumGap;
import org.obverse.spectrum.PauseWindow;
import org.obverse.spectrum.ScanSettings;
import org.obverse.spectrum.SectorBasis;
import org.obverse.spectrum.SolverNotConvergedException;
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

    /**
     * Computes and writes the spectrum.
     *
     * @throws org.obverse.spectrum.SpectrumLimitException where the problem is too large for the solver
     * @throws SolverNotConvergedException where the iterative solver gave up; both say what is wrong and
     *     leave naming the setting to change to the caller
     */
    public static Result run(Request r) throws IOException {
        if ((r.problem() == null) == (r.sweep() == null)) {
            throw new IllegalArgumentException("give either a problem or a chain-coupling sweep");
        }
        AtomicOutput.checkTarget(r.out(), r.force(), inputs(r));
        EnergyScales scales = r.energyScales() == null ? EnergyScales.illustrative()
                : EnergyScalesTable.read(r.energyScales(), r.energyUnits());
        StepProgress progress = r.progress() == null ? StepProgress.NONE : r.progress();
        try {
            if (r.problem() != null) {
                return single(r, ProblemCodec.read(r.problem()).spin(), scales, progress);
            }
            return sweep(r, scales, progress);
        } catch (SolverNotConvergedException e) {
            throw e; // the settings that did not converge are the caller's to name
        } catch (IllegalStateException e) {
            // The eigensolver failed on this problem: say which problem.
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
        String summary = SpectrumSummaryCodec.single(sched, scan, new SpectrumSummaryCodec.Problem(
                r.problem().getFileName().toString(), p.size(), p.edgeCount(), basis.dimension(),
                basis.symmetryComponents(), spectrum.solver().name(), spectrum.solver().tolerance(),
                spectrum.levelCount(), spectrum.relevantLevel(), basis.groundDegeneracy(), basis.minimumEnergy()), a,
                spectrum.dipDepthFloor(g, scan), seconds);
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
            Files.writeString(dir.resolve("levels.csv"), SpectrumTables.levels(g));
            Files.writeString(dir.resolve("gap.csv"), SpectrumTables.gap(g));
            Files.writeString(dir.resolve("summary.json"), summary);
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
        String summary = SpectrumSummaryCodec.sweep(sched, scan, sw.logical().getFileName().toString(),
                sw.chains().getFileName().toString(), sw.device().getFileName().toString(), rows, seconds);
        double[] x = new double[rows.size()];
        double[] sStar = new double[rows.size()];
        double[] gapMin = new double[rows.size()];
        for (int i = 0; i < rows.size(); i++) {
            ChainCouplingScan.Row row = rows.get(i);
            x[i] = row.chainCoupling();
            sStar[i] = row.minimum().sStar();
            gapMin[i] = row.minimum().gapMin();
        }
        Figure plot = LevelsPlot.chainScan(sw.logical().getFileName() + " — " + (sched.isIllustrative()
                ? "illustrative schedule" : sched.name()), x, sStar, gapMin);
        AtomicOutput.writeDirectory(r.out(), r.force(), inputs(r), dir -> {
            Files.writeString(dir.resolve("chain_scan.csv"), SpectrumTables.chainScan(rows));
            Files.writeString(dir.resolve("summary.json"), summary);
            Files.write(dir.resolve("chain_scan.png"), plot.png());
        });
        return new Result(sched, null, rows, seconds, r.out());
    }

    // About a thousand products of H(s) with a vector per grid point, each touching every state.
    private static long work(long points, long dimension) {
        return points * dimension * 1000L;
    }
}
