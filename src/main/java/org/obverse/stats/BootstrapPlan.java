package org.obverse.stats;

import java.util.List;
import java.util.Objects;

/**
 * What a campaign bootstrap computes and how.
 *
 * @param seed        the seed; replicate r draws from its own stream derived from (seed, r)
 * @param replicates  number of bootstrap replicates (≥ 1)
 * @param quantile    the quantile over instances that is bootstrapped (0.5: the median)
 * @param target      the TTS target (0.99 by default)
 * @param resampling  which levels a replicate redraws
 * @param threads     worker threads (results do not depend on it)
 * @param pairs       setting pairs {setting, reference} compared instance by instance:
 *                    TTS_reference / TTS_setting, TTS_reference − TTS_setting, and the fraction
 *                    of instances where the setting is faster
 */
public record BootstrapPlan(long seed, int replicates, double quantile, double target, Resampling resampling,
        int threads, List<int[]> pairs) {

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
        Objects.requireNonNull(resampling, "resampling");
        pairs = List.copyOf(pairs);
        for (int[] p : pairs) {
            if (p.length != 2) {
                throw new IllegalArgumentException("a pair names two settings, got " + p.length);
            }
        }
    }

    /** The median over instances, 99 % target, instances resampled, both cores, no pairs. */
    public static BootstrapPlan of(long seed, int replicates) {
        return new BootstrapPlan(seed, replicates, 0.5, TimeToSolution.DEFAULT_TARGET, Resampling.INSTANCES,
                Math.max(1, Math.min(2, Runtime.getRuntime().availableProcessors())), List.of());
    }

    /** The same plan with other pairs. */
    public BootstrapPlan withPairs(List<int[]> newPairs) {
        return new BootstrapPlan(seed, replicates, quantile, target, resampling, threads, newPairs);
    }

    /** The same plan on another number of threads. */
    public BootstrapPlan withThreads(int newThreads) {
        return new BootstrapPlan(seed, replicates, quantile, target, resampling, newThreads, pairs);
    }

    /** The same plan with another resampling scheme. */
    public BootstrapPlan withResampling(Resampling scheme) {
        return new BootstrapPlan(seed, replicates, quantile, target, scheme, threads, pairs);
    }
}
