package org.obverse.stats;

import java.util.List;

/**
 * What a hierarchical bootstrap computes and how.
 *
 * @param seed           the seed; replicate r draws from its own stream derived from (seed, r)
 * @param replicates     number of bootstrap replicates (≥ 1)
 * @param quantile       the quantile over instances that is bootstrapped (0.5: the median)
 * @param target         the TTS target (0.99 by default)
 * @param resampleGauges whether each drawn instance's gauges are resampled with replacement
 * @param resampleReads  whether each drawn gauge's successes are redrawn as Binomial(reads, p̂)
 * @param threads        worker threads (results do not depend on it)
 * @param pairs          setting pairs (a, b) compared instance by instance (A/B ratio and A − B)
 */
public record BootstrapPlan(long seed, int replicates, double quantile, double target, boolean resampleGauges,
        boolean resampleReads, int threads, List<int[]> pairs) {

    /** Validates once. */
    public BootstrapPlan {
        if (replicates < 1) {
            throw new IllegalArgumentException("replicates must be >= 1, got " + replicates);
        }
        if (!(quantile >= 0) || !(quantile <= 1)) {
            throw new IllegalArgumentException("quantile must be in [0, 1], got " + quantile);
        }
        if (!(target > 0) || !(target < 1)) {
            throw new IllegalArgumentException("target must be in (0, 1), got " + target);
        }
        if (threads < 1) {
            throw new IllegalArgumentException("threads must be >= 1, got " + threads);
        }
        pairs = List.copyOf(pairs);
        for (int[] p : pairs) {
            if (p.length != 2) {
                throw new IllegalArgumentException("a pair names two settings, got " + p.length);
            }
        }
    }

    /** The median over instances, 99 % target, full hierarchy, both cores, no pairs. */
    public static BootstrapPlan of(long seed, int replicates) {
        return new BootstrapPlan(seed, replicates, 0.5, TimeToSolution.DEFAULT_TARGET, true, true,
                Math.max(1, Math.min(2, Runtime.getRuntime().availableProcessors())), List.of());
    }

    /** The same plan with other pairs. */
    public BootstrapPlan withPairs(List<int[]> newPairs) {
        return new BootstrapPlan(seed, replicates, quantile, target, resampleGauges, resampleReads, threads, newPairs);
    }

    /** The same plan on another number of threads. */
    public BootstrapPlan withThreads(int newThreads) {
        return new BootstrapPlan(seed, replicates, quantile, target, resampleGauges, resampleReads, newThreads, pairs);
    }
}
