package org.obverse.stats;

import java.util.List;
import java.util.Objects;

/**
 * How a campaign is summarised: the TTS target, the confidence of the binomial intervals,
 * the bootstrapped quantile over instances, the inner and outer percentile bands, the
 * bootstrap's seed, replicates, threads and resampling scheme, the compared setting pairs, and
 * the groups of settings among which a best setting is sought.
 *
 * @param target      TTS target (default 0.99)
 * @param confidence  confidence level of the binomial intervals (default 0.95)
 * @param quantile    quantile over instances (default 0.5, the median)
 * @param band        inner band percentiles as fractions (default 0.35, 0.65)
 * @param outerBand   outer band percentiles as fractions (default 0.05, 0.95)
 * @param seed        bootstrap seed
 * @param replicates  bootstrap replicates
 * @param threads     worker threads
 * @param resampling  which levels a replicate redraws
 * @param pairs       compared pairs {setting, reference} (indices into the campaign's settings)
 * @param sweepGroups groups of settings (indices) in each of which the best is sought; empty: no sweep
 */
public record SummaryOptions(double target, double confidence, double quantile, double[] band, double[] outerBand,
        long seed, int replicates, int threads, Resampling resampling, List<int[]> pairs, List<int[]> sweepGroups) {

    /** Validates once. */
    public SummaryOptions {
        checkBand("band", band);
        checkBand("outer band", outerBand);
        if (!(confidence > 0) || !(confidence < 1)) {
            throw new IllegalArgumentException("confidence must be in (0, 1), got " + confidence);
        }
        Objects.requireNonNull(resampling, "resampling");
        pairs = List.copyOf(pairs);
        sweepGroups = List.copyOf(sweepGroups);
        for (int[] g : sweepGroups) {
            if (g.length == 0) {
                throw new IllegalArgumentException("a sweep group needs at least one setting");
            }
        }
    }

    private static void checkBand(String name, double[] b) {
        if (b.length != 2 || !(b[0] >= 0) || !(b[1] <= 1) || !(b[0] <= b[1])) {
            throw new IllegalArgumentException(name + " must be two fractions 0 <= lo <= hi <= 1, got "
                    + java.util.Arrays.toString(b));
        }
    }

    /** The defaults: 99 % target, 95 % intervals, median, bands 35–65 and 5–95, 1000 replicates over instances. */
    public static SummaryOptions defaults(long seed) {
        return new SummaryOptions(TimeToSolution.DEFAULT_TARGET, 0.95, 0.5, new double[] {0.35, 0.65},
                new double[] {0.05, 0.95}, seed, 1000, Math.max(1, Math.min(2, Runtime.getRuntime().availableProcessors())),
                Resampling.INSTANCES, List.of(), List.of());
    }

    /** The bootstrap plan these options imply. */
    public BootstrapPlan plan() {
        return new BootstrapPlan(seed, replicates, quantile, target, resampling, threads, pairs);
    }
}
