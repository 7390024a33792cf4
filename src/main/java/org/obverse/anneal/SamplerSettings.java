package org.obverse.anneal;

/**
 * How the reference sampler runs: the anneal schedule, sweeps per microsecond of schedule
 * time, the inverse-temperature range (or automatic), the control-error model, the kernel
 * and the number of worker threads. Immutable; {@code with…} methods return changed copies.
 *
 * <p>Defaults: a linear 1 µs anneal (practitioners report that without a pause the shortest
 * anneal, 1 µs, gave the best time-to-solution: a fact of the trade, no further source),
 * 1000 sweeps per µs, automatic β range, no control errors, the exact kernel, 2 threads
 * (or fewer where the machine has fewer cores).
 */
public final class SamplerSettings {
    /** Default sweeps per microsecond of schedule time. */
    public static final double DEFAULT_SWEEPS_PER_MICROSECOND = 1000.0;

    /** Which Metropolis kernel runs the reads. */
    public enum Kernel {
        /** One read at a time, maintained local fields, bracketing exponential table. */
        EXACT,
        /** 64 reads a word; only for problems with one coupling magnitude (see {@link MultiSpinCoding}). */
        MULTI_SPIN
    }

    private final AnnealSchedule schedule;
    private final double sweepsPerMicrosecond;
    private final double betaHot;
    private final double betaCold;
    private final ControlErrors errors;
    private final Kernel kernel;
    private final int threads;

    private SamplerSettings(AnnealSchedule schedule, double sweepsPerMicrosecond, double betaHot, double betaCold,
                            ControlErrors errors, Kernel kernel, int threads) {
        this.schedule = schedule;
        this.sweepsPerMicrosecond = sweepsPerMicrosecond;
        this.betaHot = betaHot;
        this.betaCold = betaCold;
        this.errors = errors;
        this.kernel = kernel;
        this.threads = threads;
    }

    /** The defaults. */
    public static SamplerSettings defaults() {
        return new SamplerSettings(AnnealSchedule.linear(1.0), DEFAULT_SWEEPS_PER_MICROSECOND, Double.NaN,
                Double.NaN, ControlErrors.NONE, Kernel.EXACT, Math.max(1, Math.min(2,
                        Runtime.getRuntime().availableProcessors())));
    }

    public SamplerSettings withSchedule(AnnealSchedule s) {
        if (s == null) {
            throw new IllegalArgumentException("schedule must not be null");
        }
        return new SamplerSettings(s, sweepsPerMicrosecond, betaHot, betaCold, errors, kernel, threads);
    }

    /** Sweeps per µs of schedule time, a finite number &gt; 0. */
    public SamplerSettings withSweepsPerMicrosecond(double v) {
        if (!(v > 0) || !Double.isFinite(v)) {
            throw new IllegalArgumentException("sweeps per microsecond " + v + " must be a finite number > 0");
        }
        return new SamplerSettings(schedule, v, betaHot, betaCold, errors, kernel, threads);
    }

    /** A fixed β range: β(s) = hot·(cold/hot)^s; need 0 &lt; hot ≤ cold, finite. */
    public SamplerSettings withBetaRange(double hot, double cold) {
        if (!(hot > 0) || !(cold >= hot) || !Double.isFinite(cold)) {
            throw new IllegalArgumentException("beta range [" + hot + ", " + cold + "] needs 0 < hot <= cold, finite");
        }
        return new SamplerSettings(schedule, sweepsPerMicrosecond, hot, cold, errors, kernel, threads);
    }

    /** The β range chosen from each problem (see {@link BetaRange#automatic}). */
    public SamplerSettings withAutomaticBetaRange() {
        return new SamplerSettings(schedule, sweepsPerMicrosecond, Double.NaN, Double.NaN, errors, kernel, threads);
    }

    public SamplerSettings withErrors(ControlErrors e) {
        if (e == null) {
            throw new IllegalArgumentException("errors must not be null; use ControlErrors.NONE");
        }
        return new SamplerSettings(schedule, sweepsPerMicrosecond, betaHot, betaCold, e, kernel, threads);
    }

    public SamplerSettings withKernel(Kernel k) {
        if (k == null) {
            throw new IllegalArgumentException("kernel must not be null");
        }
        return new SamplerSettings(schedule, sweepsPerMicrosecond, betaHot, betaCold, errors, k, threads);
    }

    /** Worker threads, at least 1; the output never depends on it. */
    public SamplerSettings withThreads(int t) {
        if (t < 1) {
            throw new IllegalArgumentException("threads " + t + " must be at least 1");
        }
        return new SamplerSettings(schedule, sweepsPerMicrosecond, betaHot, betaCold, errors, kernel, t);
    }

    public AnnealSchedule schedule() {
        return schedule;
    }

    public double sweepsPerMicrosecond() {
        return sweepsPerMicrosecond;
    }

    /** Whether the β range is chosen from each problem. */
    public boolean automaticBeta() {
        return Double.isNaN(betaHot);
    }

    public double betaHot() {
        return betaHot;
    }

    public double betaCold() {
        return betaCold;
    }

    public ControlErrors errors() {
        return errors;
    }

    public Kernel kernel() {
        return kernel;
    }

    public int threads() {
        return threads;
    }

    /** The most sweeps a read may take (the sampler holds one β per sweep: 80 MB at the limit). */
    public static final long MAX_SWEEPS = 10_000_000L;

    /**
     * Sweeps per read as asked for: the run time times sweeps per µs, rounded, at least 1,
     * computed without overflow ({@link Long#MAX_VALUE} for a product beyond it).
     */
    public long sweepCount() {
        double v = Math.rint(schedule.runTimeMicros() * sweepsPerMicrosecond);
        if (!(v < 0x1p63)) {
            return Long.MAX_VALUE;
        }
        return Math.max(1L, (long) v);
    }

    /**
     * Sweeps per read: {@link #sweepCount()}.
     *
     * @throws IllegalArgumentException where it exceeds {@link #MAX_SWEEPS}
     */
    public int sweeps() {
        long n = sweepCount();
        if (n > MAX_SWEEPS) {
            throw new IllegalArgumentException("a run of " + schedule.runTimeMicros() + " us at " + sweepsPerMicrosecond
                    + " sweeps per us needs " + (n == Long.MAX_VALUE ? "more than 2^63" : String.valueOf(n))
                    + " sweeps a read, more than the limit " + MAX_SWEEPS);
        }
        return (int) n;
    }
}
