package org.obverse.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.obverse.campaign.ScoreStep;
import org.obverse.campaign.StepProgress;
import picocli.CommandLine.Option;

/**
 * The options shared by {@code score} and {@code report}: what to read and how to score it.
 * Only parses; the scoring itself is {@link ScoreStep}.
 */
final class ScoringOptions {
    @Option(names = "--results", required = true, paramLabel = "R", description = "results table (CSV, spec/results.md)")
    Path results;

    @Option(names = "--ground", paramLabel = "G",
            description = "ground energies (CSV instance,ground_energy); without it the best energy seen is used and marked best_seen")
    Path ground;

    @Option(names = "--target", defaultValue = "0.99", description = "TTS target probability (default ${DEFAULT-VALUE})")
    double target;

    @Option(names = "--confidence", defaultValue = "0.95",
            description = "confidence of the binomial intervals (default ${DEFAULT-VALUE})")
    double confidence;

    @Option(names = "--quantile", defaultValue = "0.5",
            description = "quantile over instances that is reported and bootstrapped (default ${DEFAULT-VALUE}, the median)")
    double quantile;

    @Option(names = "--band", split = ",", defaultValue = "0.35,0.65", paramLabel = "LO,HI",
            description = "inner bootstrap band as fractions (default ${DEFAULT-VALUE})")
    double[] band;

    @Option(names = "--outer-band", split = ",", defaultValue = "0.05,0.95", paramLabel = "LO,HI",
            description = "outer bootstrap band as fractions (default ${DEFAULT-VALUE})")
    double[] outerBand;

    @Option(names = "--replicates", defaultValue = "1000", description = "bootstrap replicates (default ${DEFAULT-VALUE})")
    int replicates;

    @Option(names = "--seed", defaultValue = "1", description = "bootstrap seed (default ${DEFAULT-VALUE})")
    long seed;

    @Option(names = "--threads", defaultValue = "2", description = "worker threads; results do not depend on it (default ${DEFAULT-VALUE})")
    int threads;

    @Option(names = "--compare", arity = "2", paramLabel = "SETTING",
            description = "compare setting A against setting B instance by instance (repeatable: --compare A B)")
    List<String> compare = new ArrayList<>();

    @Option(names = "--sweep", paramLabel = "NAME",
            description = "swept parameter: an extra numeric column of the results table, or NAME=value in the setting labels")
    String sweep;

    @Option(names = "--abs-tol", defaultValue = "1e-9", description = "absolute success tolerance (default ${DEFAULT-VALUE})")
    double absoluteTolerance;

    @Option(names = "--rel-tol", defaultValue = "1e-9", description = "relative success tolerance (default ${DEFAULT-VALUE})")
    double relativeTolerance;

    /** How deep the bootstrap resamples, as spelled on the command line. */
    enum Depth { instances, gauges, reads }

    @Option(names = "--resample", defaultValue = "reads",
            description = "deepest level the bootstrap resamples: instances, gauges (and instances) or reads "
                    + "(and gauges and instances; the default)")
    Depth resample;

    @Option(names = "--quiet", description = "no progress lines")
    boolean quiet;

    /** The scoring request these options describe; progress goes to err unless --quiet. */
    ScoreStep.Request request(PrintWriter err) {
        List<ScoreStep.Comparison> pairs = new ArrayList<>();
        for (int k = 0; k + 1 < compare.size(); k += 2) {
            pairs.add(new ScoreStep.Comparison(compare.get(k), compare.get(k + 1)));
        }
        StepProgress progress = (phase, total, work) -> Progress.of(err, phase, total, work, quiet);
        return new ScoreStep.Request(results, ground, target, confidence, quantile, band, outerBand, replicates, seed,
                threads, pairs, sweep, absoluteTolerance, relativeTolerance, depth(resample), progress);
    }

    /** Scores the campaign as these options ask. */
    ScoreStep.Result score(PrintWriter err) throws IOException {
        return ScoreStep.run(request(err));
    }

    private static ScoreStep.Depth depth(Depth d) {
        return switch (d) {
            case instances -> ScoreStep.Depth.INSTANCES;
            case gauges -> ScoreStep.Depth.GAUGES;
            case reads -> ScoreStep.Depth.READS;
        };
    }
}
