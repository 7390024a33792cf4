package org.obverse.stats;

/**
 * Time to solution: the expected time to see the target at least once with a chosen
 * confidence (the target, 0.99 by default), TTS = t_run · ln(1 − target) / ln(1 − p),
 * with TTS = t_run when p ≥ target (one run suffices) and TTS = +∞ when p = 0
 * (Rønnow et al., "Defining and detecting quantum speedup", Science 345, 420, 2014).
 */
public final class TimeToSolution {
    /** The default target: 99 %. */
    public static final double DEFAULT_TARGET = 0.99;

    private TimeToSolution() {
    }

    /**
     * TTS for success probability p per run of length runTime (any unit; the result has it).
     *
     * @throws IllegalArgumentException if p is outside [0, 1], target outside (0, 1) or runTime not finite and ≥ 0
     */
    public static double of(double p, double runTime, double target) {
        if (!(p >= 0) || !(p <= 1)) {
            throw new IllegalArgumentException("success probability must be in [0, 1], got " + p);
        }
        if (!(target > 0) || !(target < 1)) {
            throw new IllegalArgumentException("target must be in (0, 1), got " + target);
        }
        if (!(runTime >= 0) || Double.isInfinite(runTime)) {
            throw new IllegalArgumentException("run time must be finite and >= 0, got " + runTime);
        }
        return kernel(p, runTime, Math.log1p(-target));
    }

    /** TTS at the default target of 99 %. */
    public static double of(double p, double runTime) {
        return of(p, runTime, DEFAULT_TARGET);
    }

    /** Unchecked kernel: {@code logMiss} is ln(1 − target). Callers guarantee 0 ≤ p ≤ 1. */
    static double kernel(double p, double runTime, double logMiss) {
        if (p <= 0) {
            return Double.POSITIVE_INFINITY;
        }
        // p >= target  <=>  ln(1 - p) <= ln(1 - target); compare in the log domain.
        double logFail = Math.log1p(-p);
        if (logFail <= logMiss) {
            return runTime;
        }
        return runTime * logMiss / logFail;
    }
}
