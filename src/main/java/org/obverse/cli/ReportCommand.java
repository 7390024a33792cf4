package org.obverse.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.obverse.io.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.MagnetisationTable;
import org.obverse.io.ScoreFiles;
import org.obverse.report.Figure;
import org.obverse.report.HtmlReport;
import org.obverse.report.ReportPlots;
import org.obverse.stats.BiasDiagnostics;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code obverse report}: a self-contained HTML page with the scores and their plots. */
@Command(name = "report", mixinStandardHelpOptions = true,
        description = {"Scores a campaign as 'score' does and writes DIR/report.html (self-contained: plots embedded "
                + "as PNG) with DIR/plots/*.png and *.svg, and the score CSV files: TTS and success against the "
                + "setting with bootstrap bands, per-gauge success, comparisons, and the bias map of the qubits "
                + "when --magnetisation is given (and of the couplers with --correlations)."})
public final class ReportCommand implements Callable<Integer> {
    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Mixin
    ScoringOptions scoring;

    @Option(names = "--out", required = true, paramLabel = "DIR", description = "output directory")
    Path out;

    @Option(names = "--magnetisation", paramLabel = "M",
            description = "device-frame magnetisation per qubit and gauge (CSV qubit,gauge,reads,sum_spin[,sign])")
    Path magnetisation;

    @Option(names = "--correlations", paramLabel = "C",
            description = "device-frame coupler correlations per gauge (CSV qubit_a,qubit_b,gauge,reads,sum_product[,sign])")
    Path correlations;

    @Option(names = "--alpha", defaultValue = "0.01",
            description = "family-wise false-positive rate of the bias flags (default ${DEFAULT-VALUE})")
    double alpha;

    @Option(names = "--balanced-gauges",
            description = "the gauges flip every qubit (coupler) in exactly half of them: without a sign column, use "
                    + "the read-based error alone (more power); otherwise the gauge scatter is allowed for")
    boolean balanced;

    @Option(names = "--series", paramLabel = "NAME",
            description = "draw the setting plots as one line per value of this extra column of the results table "
                    + "(e.g. gauged = yes / no against a swept chain coupling)")
    String series;

    @Option(names = "--force", description = "replace an existing output directory")
    boolean force;

    /** The value of column name for each setting, as "name = value". */
    private String[] groups(ScoringOptions.Scored scored, String name) {
        java.util.Map<String, String> column = scored.loaded().settingValues().get(name);
        if (column == null) {
            throw BadInputException.at(scoring.results, "--series " + name, "is not an extra column of the table, or it "
                    + "takes more than one value within a setting", "name a column that is constant within each setting");
        }
        List<String> settings = scored.summary().campaign().settings();
        String[] out = new String[settings.size()];
        for (int s = 0; s < out.length; s++) {
            out[s] = name + " = " + column.get(settings.get(s));
        }
        return out;
    }

    @Override
    public Integer call() throws Exception {
        System.setProperty("java.awt.headless", "true");
        AtomicOutput.checkTarget(out, force);
        if (!(alpha > 0) || !(alpha < 1)) {
            throw new BadInputException("--alpha must be in (0, 1), got " + alpha + " (see --help)");
        }
        BiasDiagnostics.Result bias = null;
        List<Integer> qubits = List.of();
        if (magnetisation != null) {
            MagnetisationTable.Loaded m = MagnetisationTable.read(magnetisation);
            try {
                bias = BiasDiagnostics.diagnose(m.sums(), m.reads(), m.signs(), alpha, balanced);
            } catch (IllegalArgumentException e) {
                throw BadInputException.at(magnetisation, "", e.getMessage(), "check the sums against the reads");
            }
            qubits = m.qubits();
        }
        BiasDiagnostics.Result couplerBias = null;
        List<int[]> couplers = List.of();
        if (correlations != null) {
            MagnetisationTable.Couplers m = MagnetisationTable.readCouplers(correlations);
            try {
                couplerBias = BiasDiagnostics.diagnose(m.sums(), m.reads(), m.signs(), alpha, balanced);
            } catch (IllegalArgumentException e) {
                throw BadInputException.at(correlations, "", e.getMessage(), "check the sums against the reads");
            }
            couplers = m.couplers();
        }
        ScoringOptions.Scored scored = scoring.score(spec.commandLine().getErr());
        ScoreFiles.Tables tables = ScoreFiles.tables(scored.summary(), scored.sweepName());
        ReportPlots.Axis axis = ReportPlots.Axis.of(scored.summary(), scored.sweepName());
        if (series != null) {
            axis = axis.withGroups(groups(scored, series));
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
        String html = HtmlReport.page(scored.summary(), tables, new HtmlReport.Inputs(scoring.results.toString(),
                scoring.ground == null ? null : scoring.ground.toString(), scored.rule(), scored.sweepName(),
                magnetisation == null ? null : magnetisation.toString(),
                correlations == null ? null : correlations.toString()), figures, bias, qubits, couplerBias, couplers);
        String json = ScoreFiles.json(scored.summary(), tables, scored.rule(), scoring.results.toString(),
                scoring.ground == null ? null : scoring.ground.toString(), scored.sweepName());
        AtomicOutput.writeDirectory(out, force, dir -> {
            Files.writeString(dir.resolve("report.html"), html);
            Path plots = Files.createDirectories(dir.resolve("plots"));
            for (Figure f : figures) {
                Files.write(plots.resolve(f.name() + ".png"), f.png());
                Files.writeString(plots.resolve(f.name() + ".svg"), f.svg());
            }
            ScoreFiles.writeCsv(dir, tables);
            Files.writeString(dir.resolve("scores.json"), json);
        });
        spec.commandLine().getOut().println("wrote " + out.resolve("report.html") + " (" + figures.size() + " plots"
                + (bias == null ? "" : ", " + bias.flagged().size() + " qubit(s) flagged")
                + (couplerBias == null ? "" : ", " + couplerBias.flagged().size() + " coupler(s) flagged") + ")");
        return Main.DONE;
    }
}
