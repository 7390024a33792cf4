package org.obverse.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.obverse.campaign.ScoreStep;
import org.obverse.campaign.StepProgress;
import org.obverse.io.BadInputException;
import org.obverse.stats.Resampling;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/**
 * The options shared by {@code score} and {@code report}: what to read and how to score it.
 * Only parses; the scoring itself is {@link ScoreStep}.
 */
final class ScoringOptions {
    @Parameters(arity = "0..*", paramLabel = "DIR|TABLE",
            description = "a campaign folder (its results.csv and ground.csv) or a results table; several are read as one")
    List<Path> positional = new ArrayList<>();

    @Option(names = "--results", paramLabel = "R",
            description = "results table (CSV, spec/results.md) or campaign folder; repeatable: several are read as one, "
                    + "a gauge found in two of them is refused")
    List<Path> results = new ArrayList<>();

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

    @Mixin
    ThreadsOption threads;

    @Option(names = "--compare", arity = "2", paramLabel = "SETTING",
            description = "compare setting A against reference setting B instance by instance: TTS_B / TTS_A, "
                    + "TTS_B - TTS_A, fraction where A is faster (repeatable: --compare A B)")
    List<String> compare = new ArrayList<>();

    @Option(names = "--baseline", paramLabel = "COLUMN=VALUE",
            description = "the settings whose COLUMN has VALUE are baselines (pause_s= : the rows with an empty pause_s); "
                    + "every other setting is compared with the baseline that agrees with it on the other setting columns")
    String baseline;

    @Option(names = "--sweep", paramLabel = "NAME",
            description = "swept parameter (repeatable): a column of the results table constant within each setting, "
                    + "or NAME=value in the setting labels; the best setting is sought among the settings that agree "
                    + "on every other setting column")
    List<String> sweep = new ArrayList<>();

    @Option(names = "--abs-tol", defaultValue = "1e-9", description = "absolute success tolerance (default ${DEFAULT-VALUE})")
    double absoluteTolerance;

    @Option(names = "--rel-tol", defaultValue = "1e-9", description = "relative success tolerance (default ${DEFAULT-VALUE})")
    double relativeTolerance;

    @Option(names = "--resample", defaultValue = "instances", paramLabel = "SCHEME",
            description = "what a bootstrap replicate redraws: instances (default: instances with replacement, each "
                    + "keeping its reads as observed), instances-then-gauges, gauges-only (instances fixed) or "
                    + "reads-only (instances and gauges fixed); spec/results.md")
    String resample;

    @Option(names = "--quiet", description = "no progress lines")
    boolean quiet;

    /** The scoring request these options describe; progress goes to err unless --quiet. */
    ScoreStep.Request request(PrintWriter err) {
        List<ScoreStep.Comparison> pairs = new ArrayList<>();
        for (int k = 0; k + 1 < compare.size(); k += 2) {
            pairs.add(new ScoreStep.Comparison(compare.get(k), compare.get(k + 1)));
        }
        StepProgress progress = (phase, total, work) -> Progress.of(err, phase, total, work, quiet);
        List<Path> inputs = new ArrayList<>(positional);
        inputs.addAll(results);
        if (inputs.isEmpty()) {
            throw new BadInputException("no results to score: give a campaign folder, a results table, or --results R");
        }
        Resampling scheme;
        try {
            scheme = Resampling.of(resample);
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--resample: " + e.getMessage());
        }
        return new ScoreStep.Request(inputs, ground, target, confidence, quantile, band, outerBand, replicates, seed,
                threads.count(), pairs, baseline, sweep, absoluteTolerance, relativeTolerance, scheme, progress);
    }

    /** Every file or folder read (results tables, campaign folders, ground energies): an output must not overlap them. */
    List<Path> inputs() {
        List<Path> in = new ArrayList<>(positional);
        in.addAll(results);
        if (ground != null) {
            in.add(ground);
        }
        return in;
    }

        /** Scores the campaign as these options ask. */
    ScoreStep.Result score(PrintWriter err) throws IOException {
        return ScoreStep.run(request(err));
    }
}
