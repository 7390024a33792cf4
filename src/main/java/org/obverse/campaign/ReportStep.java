package org.obverse.campaign;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import org.obverse.io.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.MagnetisationTable;
import org.obverse.io.ScoreFiles;
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
     * flipped in exactly half of the gauges; series names an extra column of the results table
     * whose values become one line each in the setting plots.
     */
    public record Request(ScoreStep.Request scoring, Path magnetisation, Path correlations, double alpha,
                          boolean balanced, String series, Path out, boolean force) {
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
        return AtomicOutput.inputs(r.scoring().results(), r.scoring().ground(), r.magnetisation(), r.correlations());
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
        ScoreFiles.Tables tables = ScoreFiles.tables(scored.summary(), scored.sweepName());
        ReportPlots.Axis axis = ReportPlots.Axis.of(scored.summary(), scored.sweepName());
        if (r.series() != null) {
            axis = axis.withGroups(groups(r.scoring().results(), scored, r.series()));
        }
        List<Figure> figures = new ArrayList<>();
        figures.add(ReportPlots.tts(scored.summary(), axis));
        figures.add(ReportPlots.success(scored.summary(), axis));
        figures.add(ReportPlots.gaugeSpread(scored.summary()));
        for (int k = 0; k < scored.summary().comparisons().size(); k++) {
            figures.add(ReportPlots.comparison(scored.summary(), k));
        }
        if (bias != null) {
            figures.add(ReportPlots.biasMap(bias, qubits));
        }
        if (couplerBias != null) {
            figures.add(ReportPlots.couplerMap(couplerBias, couplers.size()));
        }
        String results = r.scoring().results().toString();
        String ground = r.scoring().ground() == null ? null : r.scoring().ground().toString();
        String html = HtmlReport.page(scored.summary(), tables, new HtmlReport.Inputs(results, ground, scored.rule(),
                scored.sweepName(), r.magnetisation() == null ? null : r.magnetisation().toString(),
                r.correlations() == null ? null : r.correlations().toString()), figures, bias, qubits, couplerBias,
                couplers);
        String json = ScoreFiles.json(scored.summary(), tables, scored.rule(), results, ground, scored.sweepName());
        AtomicOutput.writeDirectory(r.out(), r.force(), inputs(r), dir -> {
            Files.writeString(dir.resolve(PAGE), html);
            Path plots = Files.createDirectories(dir.resolve("plots"));
            for (Figure f : figures) {
                Files.write(plots.resolve(f.name() + ".png"), f.png());
                Files.writeString(plots.resolve(f.name() + ".svg"), f.svg());
            }
            ScoreFiles.writeCsv(dir, tables);
            Files.writeString(dir.resolve("scores.json"), json);
        });
        return new Result(scored, r.out().resolve(PAGE), figures.size(), bias, couplerBias);
    }

    /** The value of column name for each setting, as "name = value". */
    private static String[] groups(Path results, ScoreStep.Result scored, String name) {
        Map<String, String> column = scored.loaded().settingValues().get(name);
        if (column == null) {
            throw BadInputException.at(results, "--series " + name, "is not an extra column of the table, or it "
                    + "takes more than one value within a setting", "name a column that is constant within each setting");
        }
        List<String> settings = scored.summary().campaign().settings();
        String[] out = new String[settings.size()];
        for (int s = 0; s < out.length; s++) {
            out[s] = name + " = " + column.get(settings.get(s));
        }
        return out;
    }
}
