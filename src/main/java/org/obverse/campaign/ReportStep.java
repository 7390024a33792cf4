package org.obverse.campaign;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import org.obverse.device.CellLattice;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.codec.DeviceCodec;
import org.obverse.io.BadInputException;
import org.obverse.io.table.MagnetisationTable;
import org.obverse.io.table.ScoreFiles;
import org.obverse.report.CampaignPlots;
import org.obverse.report.Figure;
import org.obverse.report.HtmlReport;
import org.obverse.report.ReportPlots;
import org.obverse.stats.BiasDiagnostics;

/**
 * Scores a campaign as {@link ScoreStep} does and writes a report folder, all or nothing:
 * {@code report.html} (self-contained), {@code plots/*.png} and {@code *.svg}, the score CSV
 * files and {@code scores.json}; with magnetisation (and correlation) tables, the bias maps of
 * the qubits (and couplers). Plots are drawn with AWT: callers without a display set
 * {@code java.awt.headless}.
 */
public final class ReportStep {
    /** The page's file name inside the output folder. */
    public static final String PAGE = "report.html";

    private ReportStep() {
    }

    /**
     * What to report. magnetisation, correlations and series may be null; alpha is the
     * family-wise false-positive rate of the bias flags; balanced says every qubit (coupler) is
     * flipped in exactly half of the gauges; series names extra columns of the results table
     * (comma separated) whose combined values become one line each in the setting plots.
     */
    public record Request(ScoreStep.Request scoring, Path magnetisation, Path correlations, double alpha,
                          boolean balanced, String series, Path out, boolean force, Path device) {
        /** Without a device file (the bias map is drawn by qubit id). */
        public Request(ScoreStep.Request scoring, Path magnetisation, Path correlations, double alpha,
                       boolean balanced, String series, Path out, boolean force) {
            this(scoring, magnetisation, correlations, alpha, balanced, series, out, force, null);
        }

        public Request {
            Objects.requireNonNull(scoring, "scoring");
            Objects.requireNonNull(out, "out");
        }
    }

    /** What was written: the scores, the page, how many plots, and the bias results (null when not asked). */
    public record Result(ScoreStep.Result scored, Path page, int figureCount, BiasDiagnostics.Result bias,
                         BiasDiagnostics.Result couplerBias) {
    }

    private static List<Path> inputs(Request r) {
        List<Path> in = new ArrayList<>(r.scoring().results());
        in.addAll(AtomicOutput.inputs(r.scoring().ground(), r.magnetisation(), r.correlations(), r.device()));
        return in;
    }

    /** Reads, scores, draws and writes the folder; nothing is written when any of it fails. */
    public static Result run(Request r) throws IOException {
        AtomicOutput.checkTarget(r.out(), r.force(), inputs(r));
        if (!(r.alpha() > 0) || !(r.alpha() < 1)) {
            throw new BadInputException("--alpha must be in (0, 1), got " + r.alpha() + " (see --help)");
        }
        BiasDiagnostics.Result bias = null;
        List<Integer> qubits = List.of();
        if (r.magnetisation() != null) {
            MagnetisationTable.Loaded m = MagnetisationTable.read(r.magnetisation());
            try {
                bias = BiasDiagnostics.diagnose(m.sums(), m.reads(), m.signs(), r.alpha(), r.balanced());
            } catch (IllegalArgumentException e) {
                throw BadInputException.at(r.magnetisation(), "", e.getMessage(), "check the sums against the reads");
            }
            qubits = m.qubits();
        }
        BiasDiagnostics.Result couplerBias = null;
        List<int[]> couplers = List.of();
        if (r.correlations() != null) {
            MagnetisationTable.Couplers m = MagnetisationTable.readCouplers(r.correlations());
            try {
                couplerBias = BiasDiagnostics.diagnose(m.sums(), m.reads(), m.signs(), r.alpha(), r.balanced());
            } catch (IllegalArgumentException e) {
                throw BadInputException.at(r.correlations(), "", e.getMessage(), "check the sums against the reads");
            }
            couplers = m.couplers();
        }
        ScoreStep.Result scored = ScoreStep.run(r.scoring());
        ScoreFiles.Tables tables = ScoreFiles.tables(scored.scores());
        ReportPlots.Axis axis = ReportPlots.Axis.of(scored.scores());
        if (r.series() != null) {
            axis = axis.withGroups(groups(scored.results().get(0), scored, r.series()));
        }
        List<Figure> figures = new ArrayList<>(CampaignPlots.all(scored.scores(), tables));
        if (figures.isEmpty()) {
            // No pause or chain-coupling grid: TTS and success against the settings or the swept value.
            figures.add(ReportPlots.tts(scored.summary(), axis));
            figures.add(ReportPlots.success(scored.summary(), axis));
        }
        figures.add(ReportPlots.gaugeSpread(scored.summary()));
        // A scatter per --compare pair; baseline pairs are drawn together (pause-delta figures).
        for (int k = 0; k < scored.compareCount(); k++) {
            figures.add(ReportPlots.comparison(scored.summary(), k));
        }
        if (bias != null) {
            CellLattice lattice = r.device() == null ? null : DeviceCodec.lattice(r.device());
            figures.add(lattice == null ? ReportPlots.biasMap(bias, qubits) : ReportPlots.biasGrid(bias, qubits, lattice));
        }
        if (couplerBias != null) {
            figures.add(ReportPlots.couplerMap(couplerBias, couplers.size()));
        }
        // A campaign on the path-integral sampler: success against the pause location beside the gap.
        List<String> pauseGapTables = new ArrayList<>();
        for (Path folder : campaignFolders(r.scoring().results())) {
            PauseGapStep.Result pg = PauseGapStep.run(new PauseGapStep.Request(folder, PAUSE_GAP_FIGURES));
            if (pg.skipped() == null) {
                figures.addAll(pg.figures());
                pauseGapTables.add(pg.table());
            }
        }
        String results = String.join(", ", scored.results().stream().map(Path::toString).toList());
        String ground = scored.ground() == null ? null : scored.ground().toString();
        String html = HtmlReport.page(scored.summary(), tables, new HtmlReport.Inputs(results, ground, scored.rule(),
                scored.sweep(), scored.baseline(), r.magnetisation() == null ? null : r.magnetisation().toString(),
                r.correlations() == null ? null : r.correlations().toString()), figures, bias, qubits, couplerBias,
                couplers);
        String json = ScoreFiles.json(scored.scores(), tables);
        AtomicOutput.writeDirectory(r.out(), r.force(), inputs(r), dir -> {
            Files.writeString(dir.resolve(PAGE), html);
            Path plots = Files.createDirectories(dir.resolve("plots"));
            for (Figure f : figures) {
                Files.write(plots.resolve(f.name() + ".png"), f.png());
                Files.writeString(plots.resolve(f.name() + ".svg"), f.svg());
            }
            ScoreFiles.writeCsv(dir, tables);
            for (int k = 0; k < pauseGapTables.size(); k++) {
                Files.writeString(dir.resolve(k == 0 ? "pause_gap.csv" : "pause_gap-" + k + ".csv"),
                        pauseGapTables.get(k));
            }
            Files.writeString(dir.resolve("scores.json"), json);
        });
        return new Result(scored, r.out().resolve(PAGE), figures.size(), bias, couplerBias);
    }

    /** Figures of success against the pause location beside the gap, at most, per campaign folder. */
    static final int PAUSE_GAP_FIGURES = 6;

    /** The prepared campaign folders among the scored inputs (a folder, or the folder of its results.csv). */
    private static List<Path> campaignFolders(List<Path> inputs) {
        List<Path> out = new ArrayList<>();
        for (Path p : inputs) {
            Path folder = Files.isDirectory(p) ? p : p.toAbsolutePath().getParent();
            if (folder != null && CampaignFolder.isPrepared(folder)
                    && (Files.isDirectory(p) || p.getFileName().toString().equals(CampaignFolder.RESULTS))
                    && !out.contains(folder)) {
                out.add(folder);
            }
        }
        return out;
    }

    /** For each setting, its values of the named columns (comma separated), as "name = value, …". */
    private static String[] groups(Path results, ScoreStep.Result scored, String names) {
        List<String> settings = scored.summary().campaign().settings();
        String[] out = new String[settings.size()];
        java.util.Arrays.fill(out, "");
        for (String name : names.split(",")) {
            String n = name.trim();
            Map<String, String> column = scored.loaded().settingValues().get(n);
            if (column == null || settings.stream().anyMatch(s -> column.get(s) == null)) {
                throw BadInputException.at(results, "--series " + n, "is not an extra column of the table, or it "
                        + "takes more than one value within a setting", "name a column that is constant within each setting");
            }
            for (int s = 0; s < out.length; s++) {
                out[s] += (out[s].isEmpty() ? "" : ", ") + n + " = " + column.get(settings.get(s));
            }
        }
        return out;
    }
}
