package org.obverse.cli;

import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.obverse.campaign.ReportStep;
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

    @Mixin
    OutputFolderOption output;

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
                    + "(e.g. gauged = yes / no against a swept chain coupling); repeatable: one line per combination")
    java.util.List<String> series = new java.util.ArrayList<>();

    @Option(names = "--device", paramLabel = "D",
            description = "device file: when it records a cell lattice (device lattice), the bias map draws each qubit "
                    + "at its cell-grid position")
    Path device;

    @Mixin
    ForceOption force;

    @Override
    public Integer call() throws Exception {
        System.setProperty("java.awt.headless", "true");
        ReportStep.Result r = ReportStep.run(new ReportStep.Request(scoring.request(spec.commandLine().getErr()),
                magnetisation, correlations, alpha, balanced, series.isEmpty() ? null : String.join(",", series), output.path(), force.on(), device));
        spec.commandLine().getOut().println("wrote " + r.page() + " (" + r.figureCount() + " plots"
                + (r.bias() == null ? "" : ", " + r.bias().flagged().size() + " qubit(s) flagged")
                + (r.couplerBias() == null ? "" : ", " + r.couplerBias().flagged().size() + " coupler(s) flagged") + ")");
        return Main.DONE;
    }
}
