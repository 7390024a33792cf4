package org.obverse.anneal;

/**
 * How the reference sampler runs: the method (simulated annealing, or the path-integral
 * sampler with its {@link PathIntegralSettings}), the anneal schedule, sweeps per microsecond
 * of schedule time, the inverse-temperature range (or automatic; simulated annealing only),
 * the control-error model, the kernel (simulated annealing only) and the number of worker
 * threads. Immutable; {@code with…} methods return changed copies.
 *
 * <p>Defaults: a linear 1 µs anneal (practitioners report that without a pause the shortest
 * anneal, 1 µs, gave the best time-to-solution: a fact of the trade, no further source),
 * 1000 sweeps per µs, automatic β range, no control errors, the exact kernel, 2 threads
 * (or fewer where the machine has fewer cores), simulated annealing.
 */
public final class SamplerSettings {
    /** Default sweeps per microsecond of schedule time. */
    public static final double DEFAULT_SWEEPS_PER_MICROSECOND = 1000.0;

    /** Which Metropolis kernel runs the reads. */
    public enum Kernel {
        /** One read at a time, maintained local fields, bracketing exponential table. */
        EXACT("exact"),
        /** 64 reads a word; only for problems with one coupling magnitude (see {@link MultiSpinCoding}). */
        MULTI_SPIN("multi-spin"),
        /**
         * 64 reads a word on the same problems, with twelve random words drawn at every spin
         * visit (see {@link SteadyMultiSpin}): faster in vector lanes, other reads for a seed.
         */
        MULTI_SPIN_STEADY("multi-spin-steady");

        private final String label;

        Kernel(String label) {
            this.label = label;
        }

        /** The name commands and campaign plans use. */
        public String label() {
            return label;
        }

        /** The kernel of that name, or null. */
        public static Kernel byLabel(String label) {
            for (Kernel k : values()) {
                if (k.label.equals(label)) {
                    return k;
                }
            }
            return null;
        }

        /** Every name, as "a, b or c" for messages. */
        public static String labels() {
            Kernel[] v = values();
            StringBuilder b = new StringBuilder();
            for (int i = 0; i < v.length; i++) {
                b.append(i == 0 ? "" : i == v.length - 1 ? " or " : ", ").append(v[i].label);
            }
            return b.toString();
        }
    }

    /** Which sampling method runs the reads. */
    public enum Method {
        /** Simulated annealing: classical Metropolis sweeps, β following the schedule ({@link ReferenceSampler}). */
        SIMULATED_ANNEALING("sa"),
        /** Simulated quantum annealing of H(s) by path-integral Monte Carlo ({@link PathIntegralSampler}). */
        PATH_INTEGRAL("sqa");

        private final String label;

        Method(String label) {
            this.label = label;
        }

        /** The short name used in files and on the command line: {@code sa} or {@code sqa}. */
        public String label() {
            return label;
        }

        /** The method with this short name, or null where none has it. */
        public static Method fromLabel(String label) {
            for (Method m : values()) {
                if (m.label.equals(label)) {
                    return m;
                }
            }
            return null;
        }
    }

    private final AnnealSchedule schedule;
    private final double sweepsPerMicrosecond;
    private final double betaHot;
    private final double betaCold;
    private final ControlErrors errors;
    private final Kernel kernel;
    private final int threads;
    // Null for simulated annealing.
    private final PathIntegralSettings pathIntegral;

    private SamplerSettings(AnnealSchedule schedule, double sweepsPerMicrosecond, double betaHot, double betaCold,
                            ControlErrors errors, Kernel kernel, int threads) {
        this(schedule, sweepsPerMicrosecond, betaHot, betaCold, errors, kernel, threads, null);
    }

    private SamplerSettings(AnnealSchedule schedule, double sweepsPerMicrosecond, double betaHot, double betaCold,
                            ControlErrors errors, Kernel kernel, int threads, PathIntegralSettings pathIntegral) {
        this.schedule = schedule;
        this.sweepsPerMicrosecond = sweepsPerMicrosecond;
        this.betaHot = betaHot;
        this.betaCold = betaCold;
        this.errors = errors;
        this.kernel = kernel;
        this.threads = threads;
        this.pathIntegral = pathIntegral;
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
        return new SamplerSettings(s, sweepsPerMicrosecond, betaHot, betaCold, errors, kernel, threads, pathIntegral);
    }

    /** Sweeps per µs of schedule time, a finite number &gt; 0. */
    public SamplerSettings withSweepsPerMicrosecond(double v) {
        if (!(v > 0) || !Double.isFinite(v)) {
            throw new IllegalArgumentException("sweeps per microsecond " + v + " must be a finite number > 0");
        }
        return new SamplerSettings(schedule, v, betaHot, betaCold, errors, kernel, threads, pathIntegral);
    }

    /** A fixed β range: β(s) = hot·(cold/hot)^s; need 0 &lt; hot ≤ cold, finite. */
    public SamplerSettings withBetaRange(double hot, double cold) {
        if (!(hot > 0) || !(cold >= hot) || !Double.isFinite(cold)) {
            throw new IllegalArgumentException("beta range [" + hot + ", " + cold + "] needs 0 < hot <= cold, finite");
        }
        return new SamplerSettings(schedule, sweepsPerMicrosecond, hot, cold, errors, kernel, threads, pathIntegral);
    }

    /** The β range chosen from each problem (see {@link BetaRange#automatic}). */
    public SamplerSettings withAutomaticBetaRange() {
        return new SamplerSettings(schedule, sweepsPerMicrosecond, Double.NaN, Double.NaN, errors, kernel, threads,
                pathIntegral);
    }

    public SamplerSettings withErrors(ControlErrors e) {
        if (e == null) {
            throw new IllegalArgumentException("errors must not be null; use ControlErrors.NONE");
        }
        return new SamplerSettings(schedule, sweepsPerMicrosecond, betaHot, betaCold, e, kernel, threads, pathIntegral);
    }

    public SamplerSettings withKernel(Kernel k) {
        if (k == null) {
            throw new IllegalArgumentException("kernel must not be null");
        }
        return new SamplerSettings(schedule, sweepsPerMicrosecond, betaHot, betaCold, errors, k, threads, pathIntegral);
    }

    /** Worker threads, at least 1; the output never depends on it. */
    public SamplerSettings withThreads(int t) {
        if (t < 1) {
            throw new IllegalArgumentException("threads " + t + " must be at least 1");
        }
        return new SamplerSettings(schedule, sweepsPerMicrosecond, betaHot, betaCold, errors, kernel, t, pathIntegral);
    }

    /**
     * The path-integral sampler with these settings in place of simulated annealing (the
     * schedule, sweeps per µs, errors and threads stay shared; the β range and kernel are
     * simulated annealing's own and do not apply).
     */
    public SamplerSettings withPathIntegral(PathIntegralSettings p) {
        if (p == null) {
            throw new IllegalArgumentException("path-integral settings must not be null; use withSimulatedAnnealing()");
        }
        return new SamplerSettings(schedule, sweepsPerMicrosecond, betaHot, betaCold, errors, kernel, threads, p);
    }

    /** Simulated annealing (the default method). */
    public SamplerSettings withSimulatedAnnealing() {
        return new SamplerSettings(schedule, sweepsPerMicrosecond, betaHot, betaCold, errors, kernel, threads, null);
    }

    /** The sampling method. */
    public Method method() {
        return pathIntegral == null ? Method.SIMULATED_ANNEALING : Method.PATH_INTEGRAL;
    }

    /** The path-integral settings, or null under simulated annealing. */
    public PathIntegralSettings pathIntegral() {
        return pathIntegral;
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
     * computed without overflow ({@link Long#MAX_VALUE} for a product beyond it). The path
     * integral's count (whole sweeps per segment) is within one a segment of it.
     */
    public long sweepCount() {
        double v = Math.rint(schedule.runTimeMicros() * sweepsPerMicrosecond);
        if (!(v < 0x1p63)) {
            return Long.MAX_VALUE;
        }
        return Math.max(1L, (long) v);
    }

    /**
     * Sweeps per read. Simulated annealing: the run time times sweeps per µs, rounded, at
     * least 1. Path integral: the sum over the schedule's segments of each one's whole sweeps
     * ({@link PathIntegralSampler#sweepFractions}).
     *
     * @throws IllegalArgumentException where {@link #sweepCount()} exceeds {@link #MAX_SWEEPS}
     */
    public int sweeps() {
        long n = sweepCount();
        if (n > MAX_SWEEPS) {
            throw new IllegalArgumentException("a run of " + schedule.runTimeMicros() + " us at " + sweepsPerMicrosecond
                    + " sweeps per us needs " + (n == Long.MAX_VALUE ? "more than 2^63" : String.valueOf(n))
                    + " sweeps a read, more than the limit " + MAX_SWEEPS);
        }
        if (pathIntegral != null) {
            return PathIntegralSampler.sweepFractions(schedule, sweepsPerMicrosecond).length;
        }
        return (int) n;
    }
}
