package org.obverse.cli;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.obverse.device.DeviceLimits;
import org.obverse.embed.ChainEmbedder;
import org.obverse.embed.ChainStrength;
import org.obverse.embed.Chains;
import org.obverse.io.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.ChainList;
import org.obverse.io.ChainsCodec;
import org.obverse.io.CsvReader;
import org.obverse.io.DeviceCodec;
import org.obverse.io.JsonFiles;
import org.obverse.io.ProblemCodec;
import org.obverse.model.IsingProblem;
import org.obverse.report.Figure;
import org.obverse.report.LevelsPlot;
import org.obverse.anneal.EnergyScales;
import org.obverse.spectrum.AnnealSpectrum;
import org.obverse.spectrum.ChainCouplingScan;
import org.obverse.spectrum.GapScan;
import org.obverse.anneal.InvalidEnergyScalesException;
import org.obverse.spectrum.MinimumGap;
import org.obverse.spectrum.PauseWindow;
import org.obverse.spectrum.ScanSettings;
import org.obverse.spectrum.SectorBasis;
import org.obverse.spectrum.SolverChoice;
import org.obverse.spectrum.SpectrumAnalysis;
import org.obverse.spectrum.SpectrumSettings;
import picocli.CommandLine.ArgGroup;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
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

    @Option(names = "--out", required = true, paramLabel = "DIR", description = "the output directory")
    Path out;

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

    @Option(names = "--force", description = "replace an existing output directory")
    boolean force;

    @Override
    public Integer call() throws Exception {
        AtomicOutput.checkTarget(out, force, inputs());
        EnergyScales sched = schedule == null ? EnergyScales.illustrative() : readSchedule(schedule, scheduleUnits);
        SpectrumSettings settings = new SpectrumSettings(levels, solverChoice(solver), tolerance,
                SectorBasis.Sector.REACHABLE);
        ScanSettings scan = new ScanSettings(points, sTolerance, fromRatio, toRatio, 1e-4);
        PrintWriter w = spec.commandLine().getOut();
        w.printf("schedule: %s%s%n", sched.name(), sched.isIllustrative() ? "" : " (" + sched.units() + ")");
        try {
            if (input.problem != null) {
                return single(ProblemCodec.read(input.problem).spin(), sched, settings, scan, w);
            }
            return sweep(sched, settings, scan, w);
        } catch (IllegalStateException e) {
            // The eigensolver gave up (its message says what to change): a setting to fix, not a crash.
            throw BadInputException.at(input.problem != null ? input.problem : input.sweep.logical, "",
                    e.getMessage(), "");
        }
    }

    private int single(IsingProblem p, EnergyScales sched, SpectrumSettings settings, ScanSettings scan,
                       PrintWriter w) throws IOException {
        AnnealSpectrum spectrum = AnnealSpectrum.of(p, sched, settings);
        SectorBasis basis = spectrum.basis();
        w.printf("%d spins; reachable sector of %d states (%d field-free component%s); %s solver; %d levels, relevant"
                        + " level E%d%n", p.size(), basis.dimension(), basis.symmetryComponents(),
                basis.symmetryComponents() == 1 ? "" : "s", spectrum.solver().name(), spectrum.levelCount(),
                spectrum.relevantLevel());
        long start = System.nanoTime();
        SpectrumAnalysis a = spectrum.analyse(scan);
        double seconds = (System.nanoTime() - start) / 1e9;
        GapScan g = a.scan();
        MinimumGap m = a.minimum();
        PauseWindow pw = a.pause();
        ObjectNode summary = summaryBase(sched, settings, scan);
        summary.put("problem", input.problem.getFileName().toString());
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
        summary.put("seconds", Math.round(seconds * 1000) / 1000.0);
        String unit = sched.isIllustrative() ? "problem units" : sched.units();
        String title = input.problem.getFileName() + " — " + (sched.isIllustrative() ? "illustrative schedule" : sched.name());
        double[][] rows = new double[g.points()][];
        for (int r = 0; r < g.points(); r++) {
            rows[r] = g.levels(r);
        }
        Figure levelsPng = LevelsPlot.levels(title, g.s(), rows, spectrum.relevantLevel(), m.sStar(), pw.from(), pw.to(), unit);
        Figure gapPng = LevelsPlot.gap(title, g.s(), g.gaps(), m.sStar(), m.gapMin(), pw.from(), pw.to(), unit);
        AtomicOutput.writeDirectory(out, force, inputs(), dir -> {
            Files.writeString(dir.resolve("levels.csv"), levelsCsv(g));
            Files.writeString(dir.resolve("gap.csv"), gapCsv(g));
            Files.writeString(dir.resolve("summary.json"), JsonFiles.text(summary));
            Files.write(dir.resolve("levels.png"), levelsPng.png());
            Files.write(dir.resolve("gap.png"), gapPng.png());
        });
        w.printf(Locale.ROOT, "s* = %.6f (+- %.1g), gap_min = %.9g (+- %.1g)%s%n", m.sStar(), m.sTolerance(), m.gapMin(),
                m.gapTolerance(), m.atEdge() ? " at the end of the anneal: no interior minimum" : "");
        w.printf(Locale.ROOT, "pause window (heuristic): s from %.4f to %.4f%s%n", pw.from(), pw.to(),
                pw.toCapped() ? " (cut at the end: the gap never reached " + toRatio + " * gap_min)" : "");
        w.printf(Locale.ROOT, "%d grid points in %.1f s; wrote %s%n", g.points(), seconds, out);
        return Main.DONE;
    }

    private int sweep(EnergyScales sched, SpectrumSettings settings, ScanSettings scan, PrintWriter w)
            throws IOException {
        Sweep sw = input.sweep;
        IsingProblem q = ProblemCodec.read(sw.logical).spin();
        ChainList list = ChainsCodec.read(sw.chains);
        Chains c = Chains.of(list.logicalIds(), list.qubitGroups());
        DeviceLimits d = DeviceCodec.read(sw.device);
        double sc = sw.scale == null ? Double.NaN : sw.scale;
        ChainCouplingScan.EmbeddedFamily family = v -> {
            try {
                return ChainEmbedder.embed(q, c, d, ChainStrength.uniform(v), sc).physical();
            } catch (IllegalArgumentException e) {
                throw BadInputException.at(sw.chains, "chain coupling " + v, e.getMessage(),
                        "choose chain couplings inside the device's coupling range");
            }
        };
        for (double v : sw.couplings) {
            family.at(v); // refuse a bad value before any spectrum is computed
        }
        long start = System.nanoTime();
        List<ChainCouplingScan.Row> rows = ChainCouplingScan.run(family, sw.couplings, sched, settings, scan);
        double seconds = (System.nanoTime() - start) / 1e9;
        ObjectNode summary = summaryBase(sched, settings, scan);
        summary.put("logical", sw.logical.getFileName().toString());
        summary.put("chains", sw.chains.getFileName().toString());
        summary.put("device", sw.device.getFileName().toString());
        ArrayNode arr = summary.putArray("chain_scan");
        StringBuilder csv = new StringBuilder("chain_coupling,spins,s_star,s_star_tolerance,gap_min,gap_min_tolerance,"
                + "pause_from,pause_to\n");
        double[] x = new double[rows.size()];
        double[] sStar = new double[rows.size()];
        double[] gapMin = new double[rows.size()];
        List<String> lines = new ArrayList<>();
        for (int i = 0; i < rows.size(); i++) {
            ChainCouplingScan.Row r = rows.get(i);
            ObjectNode o = arr.addObject();
            o.put("chain_coupling", r.chainCoupling());
            o.put("spins", r.spins());
            putAnalysis(o, r.minimum(), r.pause());
            csv.append(r.chainCoupling()).append(',').append(r.spins()).append(',').append(r.minimum().sStar())
                    .append(',').append(r.minimum().sTolerance()).append(',').append(r.minimum().gapMin()).append(',')
                    .append(r.minimum().gapTolerance()).append(',').append(r.pause().from()).append(',')
                    .append(r.pause().to()).append('\n');
            x[i] = r.chainCoupling();
            sStar[i] = r.minimum().sStar();
            gapMin[i] = r.minimum().gapMin();
            lines.add(String.format(Locale.ROOT, "chain coupling %s: %d spins, s* = %.6f, gap_min = %.6g, pause %.4f to %.4f",
                    r.chainCoupling(), r.spins(), r.minimum().sStar(), r.minimum().gapMin(), r.pause().from(),
                    r.pause().to()));
        }
        summary.put("seconds", Math.round(seconds * 1000) / 1000.0);
        Figure plot = LevelsPlot.chainScan(sw.logical.getFileName() + " — " + (sched.isIllustrative()
                ? "illustrative schedule" : sched.name()), x, sStar, gapMin);
        AtomicOutput.writeDirectory(out, force, inputs(), dir -> {
            Files.writeString(dir.resolve("chain_scan.csv"), csv.toString());
            Files.writeString(dir.resolve("summary.json"), JsonFiles.text(summary));
            Files.write(dir.resolve("chain_scan.png"), plot.png());
        });
        for (String line : lines) {
            w.println(line);
        }
        w.printf(Locale.ROOT, "%d chain couplings in %.1f s; wrote %s%n", rows.size(), seconds, out);
        return Main.DONE;
    }

    private static ObjectNode summaryBase(EnergyScales sched, SpectrumSettings settings, ScanSettings scan) {
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
        s.put("pause_rule", "heuristic: from the first s after s* where the gap reaches pause_from_ratio * gap_min to"
                + " the first where it reaches pause_to_ratio * gap_min; after Chen & Lidar, Phys. Rev. Applied 14,"
                + " 014100 (2020). See spec/spectrum.md");
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

    private java.util.List<Path> inputs() {
        return input.sweep == null ? AtomicOutput.inputs(input.problem, schedule)
                : AtomicOutput.inputs(input.problem, schedule, input.sweep.logical, input.sweep.chains, input.sweep.device);
    }

    /** Reads a schedule table: CSV with columns s, A, B (others ignored); errors name the line. */
    static EnergyScales readSchedule(Path file, String units) throws IOException {
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
