package org.obverse.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.obverse.io.BadInputException;
import org.obverse.io.table.EnergyScalesTable;
import org.obverse.anneal.EnergyScales;
import org.obverse.campaign.SpectrumStep;
import org.obverse.campaign.StepProgress;
import org.obverse.spectrum.ChainCouplingScan;
import org.obverse.spectrum.GapDip;
import org.obverse.spectrum.MinimumGap;
import org.obverse.spectrum.PauseWindow;
import org.obverse.spectrum.ScanSettings;
import org.obverse.spectrum.SectorBasis;
import org.obverse.spectrum.SolverChoice;
import org.obverse.spectrum.SolverNotConvergedException;
import org.obverse.spectrum.SpectrumLimitException;
import org.obverse.spectrum.SpectrumAnalysis;
import org.obverse.spectrum.SpectrumSettings;
import picocli.CommandLine.ArgGroup;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code obverse spectrum}: exact low levels along the anneal, the minimum gap and a pause window. */
@Command(name = "spectrum", mixinStandardHelpOptions = true,
        description = {"Computes the lowest levels of H(s) = -(A(s)/2) sum_i X_i + (B(s)/2) H_P(Z) on a grid of s in the "
                + "sector the anneal can reach, the relevant gap (ground level to the first reachable level that does not "
                + "end in the ground manifold), its minimum s*, gap_min, and a suggested pause window (a heuristic; see "
                + "spec/spectrum.md).",
            "Writes DIR/levels.csv, DIR/gap.csv, DIR/summary.json, DIR/levels.png and DIR/gap.png. With --logical, "
                + "--chains, --device and --chain-couplings it re-embeds the logical problem at each chain coupling and "
                + "writes DIR/chain_scan.csv, DIR/chain_scan.png and DIR/summary.json instead.",
            "Without --energy-scales it uses the illustrative pair A(s) = 1 - s, B(s) = s, which is no device's schedule."})
public final class SpectrumCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @ArgGroup(exclusive = true, multiplicity = "1")
    Input input;

    /** Either one problem or a chain-coupling sweep of a logical one. */
    static final class Input {
        @Option(names = "--problem", paramLabel = "P", description = "the problem (obverse.problem/1; binary is converted to spin)")
        Path problem;

        @ArgGroup(exclusive = false)
        Sweep sweep;
    }

    /** The chain-coupling sweep. */
    static final class Sweep {
        @Option(names = "--logical", required = true, paramLabel = "Q", description = "the logical problem to re-embed")
        Path logical;

        @Option(names = "--chains", required = true, paramLabel = "C", description = "its chains (obverse.chains/1)")
        Path chains;

        @Option(names = "--device", required = true, paramLabel = "D", description = "the device with its working graph")
        Path device;

        @Option(names = "--chain-couplings", required = true, split = ",", paramLabel = "V1,V2,...",
                description = "chain couplings to sweep, in device units (negative holds a chain together)")
        double[] couplings;

        @Option(names = "--scale", paramLabel = "S",
                description = "multiply the logical terms by S (default: the largest that fits, as embed does)")
        Double scale;
    }

    @Option(names = "--energy-scales", paramLabel = "F",
            description = "CSV with header s,A,B: s strictly increasing from 0 to 1, A and B >= 0 (default: the illustrative pair)")
    Path schedule;

    @Option(names = "--energy-units", paramLabel = "U", defaultValue = "units of the energy-scales table (not stated)",
            description = "the energy units of A and B in the table, as you state them")
    String scheduleUnits;

    @Mixin
    OutputFolderOption output;

    @Option(names = "--levels", defaultValue = "4", paramLabel = "K",
            description = "levels per s (2..64; raised to include the relevant level) (default ${DEFAULT-VALUE})")
    int levels;

    @Option(names = "--points", defaultValue = "101", paramLabel = "N",
            description = "points of the uniform s grid on [0, 1] (default ${DEFAULT-VALUE})")
    int points;

    @Option(names = "--solver", defaultValue = "auto", paramLabel = "auto|dense|lanczos",
            description = "dense: EJML, up to 2^12 states; lanczos: matrix-free, up to 2^20; auto: dense up to 2^8 "
                    + "(default ${DEFAULT-VALUE})")
    String solver;

    @Option(names = "--tolerance", defaultValue = "1e-12", paramLabel = "T",
            description = "Lanczos residual tolerance relative to max(1, |H|) (default ${DEFAULT-VALUE})")
    double tolerance;

    @Option(names = "--s-tolerance", defaultValue = "1e-6", paramLabel = "T",
            description = "refine s* to this (default ${DEFAULT-VALUE})")
    double sTolerance;

    @Option(names = "--pause-from-ratio", defaultValue = "1.1", paramLabel = "R",
            description = "the pause starts where the gap first reaches R * gap_min after s* (default ${DEFAULT-VALUE})")
    double fromRatio;

    @Option(names = "--pause-to-ratio", defaultValue = "2.0", paramLabel = "R",
            description = "the pause ends where the gap first reaches R * gap_min (default ${DEFAULT-VALUE})")
    double toRatio;

    @Mixin
    ForceOption force;

    @Override
    public Integer call() throws Exception {
        SpectrumSettings settings = new SpectrumSettings(levels, solverChoice(solver), tolerance,
                SectorBasis.Sector.REACHABLE);
        ScanSettings scan = new ScanSettings(points, sTolerance, fromRatio, toRatio, 1e-4);
        SpectrumStep.Sweep sweep = input.sweep == null ? null : new SpectrumStep.Sweep(input.sweep.logical,
                input.sweep.chains, input.sweep.device, input.sweep.couplings, input.sweep.scale);
        PrintWriter err = spec.commandLine().getErr();
        StepProgress progress = (phase, total, work) -> Progress.of(err, phase, total, work, false);
        SpectrumStep.Result r;
        try {
            r = SpectrumStep.run(new SpectrumStep.Request(input.problem, sweep, schedule, scheduleUnits, settings, scan,
                    output.path(), force.on(), progress));
        } catch (SpectrumLimitException e) {
            // The core says the problem is too large for the solver; the flag that picks another is ours to name.
            throw new BadInputException(e.getMessage() + (e.solver().equals("dense") ? " or --solver lanczos" : ""), e);
        } catch (SolverNotConvergedException e) {
            throw BadInputException.at(input.problem != null ? input.problem : input.sweep.logical, "", e.getMessage(),
                    "use --solver dense for a small problem or a looser --tolerance");
        }
        PrintWriter w = spec.commandLine().getOut();
        EnergyScales sched = r.scales();
        w.printf("schedule: %s%s%n", sched.name(), sched.isIllustrative() ? "" : " (" + sched.units() + ")");
        if (r.single() != null) {
            printSingle(w, r.single(), r.seconds());
        } else {
            printSweep(w, r.rows(), r.seconds());
        }
        return Main.DONE;
    }

    private void printSingle(PrintWriter w, SpectrumStep.Single one, double seconds) {
        w.printf("%d spins; reachable sector of %d states (%d field-free component%s); %s solver; %d levels, relevant"
                        + " level E%d%n", one.spins(), one.sectorDimension(), one.symmetryComponents(),
                one.symmetryComponents() == 1 ? "" : "s", one.solver(), one.levels(), one.relevantLevel());
        SpectrumAnalysis a = one.analysis();
        MinimumGap m = a.minimum();
        PauseWindow pw = a.pause();
        boolean interior = a.suggestedDip() >= 0;
        w.printf(Locale.ROOT, "s* = %.6f (+- %.1g), gap_min = %.9g (+- %.1g)%s%n", m.sStar(), m.sTolerance(), m.gapMin(),
                m.gapTolerance(), !m.atEdge() ? "" : interior ? " at the end of the anneal; see the dips before it"
                        : " at the end of the anneal: no interior minimum");
        for (int k = 0; k < a.dips().size(); k++) {
            GapDip d = a.dips().get(k);
            w.printf(Locale.ROOT, "dip %d: s = %.6f, gap = %.9g, depth %.3g%s%n", k + 1, d.s(), d.gap(), d.depth(),
                    d.atEnd() ? " (at the end: levels that merge as s -> 1)"
                            : String.format(Locale.ROOT, ", pause window %.4f to %.4f", d.pause().from(),
                            d.pause().to()));
        }
        // Where the suggested dip is not the global minimum, its window is measured against its own gap.
        boolean ownGap = interior && a.dips().get(a.suggestedDip()).s() != m.sStar();
        String after = interior && a.dips().size() > 1 ? ", after dip " + (a.suggestedDip() + 1) + ": the smallest"
                + " interior gap" : "";
        w.printf(Locale.ROOT, "pause window (heuristic%s): s from %.4f to %.4f%s%n", after, pw.from(), pw.to(),
                pw.toCapped() ? " (cut" + (pw.to() < 1 ? " before the next dip" : " at the end") + ": the gap never"
                        + " reached " + toRatio + (ownGap ? " times the dip's gap)" : " * gap_min)") : "");
        w.printf(Locale.ROOT, "%d grid points in %.1f s; wrote %s%n", a.scan().points(), seconds, output.path());
    }

    private void printSweep(PrintWriter w, List<ChainCouplingScan.Row> rows, double seconds) {
        for (ChainCouplingScan.Row r : rows) {
            w.println(String.format(Locale.ROOT, "chain coupling %s: %d spins, s* = %.6f, gap_min = %.6g, pause %.4f"
                            + " to %.4f", r.chainCoupling(), r.spins(), r.minimum().sStar(), r.minimum().gapMin(),
                    r.pause().from(), r.pause().to()));
        }
        w.printf(Locale.ROOT, "%d chain couplings in %.1f s; wrote %s%n", rows.size(), seconds, output.path());
    }

    private static SolverChoice solverChoice(String name) {
        switch (name) {
            case "auto":
                return SolverChoice.AUTO;
            case "dense":
                return SolverChoice.DENSE;
            case "lanczos":
                return SolverChoice.LANCZOS;
            default:
                throw new BadInputException("--solver '" + name + "' is not one of auto, dense, lanczos");
        }
    }

    /** Reads an energy-scales table (kept here for the verbs that read the same table). */
    static EnergyScales readSchedule(Path file, String units) throws IOException {
        return EnergyScalesTable.read(file, units);
    }
}
