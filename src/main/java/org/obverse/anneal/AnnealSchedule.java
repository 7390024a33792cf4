package org.obverse.anneal;

import java.util.Arrays;

/**
 * A forward anneal schedule: the anneal fraction s(t), piecewise linear through points
 * (t_k, s_k) with t in microseconds, from s = 0 at t = 0 to s = 1 at the end. A flat segment
 * is a pause; a steep final segment is a quench. Immutable.
 *
 * <p>Rules checked once by {@link #of}: at least two points; t_0 = 0 and times strictly
 * increasing; every s within [0, 1]; s_0 = 0 and the last s = 1; s never decreasing (a forward
 * anneal); every slope at most the slope limit (per microsecond).
 */
public final class AnnealSchedule {
    /**
     * Default slope limit: a full sweep of s in 0.1 µs. Our emulation's own bound (a quench
     * faster than this is refused); real machines state their own.
     */
    public static final double DEFAULT_MAX_SLOPE_PER_MICROSECOND = 10.0;

    private final double[] times;
    private final double[] fractions;

    private AnnealSchedule(double[] times, double[] fractions) {
        this.times = times;
        this.fractions = fractions;
    }

    /** A schedule through the points, with the default slope limit. Arrays are copied. */
    public static AnnealSchedule of(double[] timesMicros, double[] fractions) {
        return of(timesMicros, fractions, DEFAULT_MAX_SLOPE_PER_MICROSECOND);
    }

    /**
     * A schedule through the points (t_k in µs, s_k), with slopes at most maxSlope per µs.
     *
     * @throws IllegalArgumentException naming the rule and the point that breaks it
     */
    public static AnnealSchedule of(double[] timesMicros, double[] fractions, double maxSlope) {
        if (timesMicros.length != fractions.length) {
            throw new IllegalArgumentException("schedule has " + timesMicros.length + " times but "
                    + fractions.length + " values of s");
        }
        if (timesMicros.length < 2) {
            throw new IllegalArgumentException("schedule needs at least 2 points, has " + timesMicros.length);
        }
        if (!(maxSlope > 0) || !Double.isFinite(maxSlope)) {
            throw new IllegalArgumentException("slope limit " + maxSlope + " must be a finite number > 0");
        }
        for (int k = 0; k < timesMicros.length; k++) {
            double t = timesMicros[k];
            double s = fractions[k];
            if (!Double.isFinite(t) || !Double.isFinite(s)) {
                throw new IllegalArgumentException("schedule point " + k + " (" + t + ", " + s + ") is not finite");
            }
            if (s < 0.0 || s > 1.0) {
                throw new IllegalArgumentException("schedule point " + k + ": s = " + s + " is outside [0, 1]");
            }
            if (k == 0) {
                continue;
            }
            double dt = t - timesMicros[k - 1];
            if (!(dt > 0)) {
                throw new IllegalArgumentException("schedule point " + k + ": time " + t
                        + " µs does not increase (previous " + timesMicros[k - 1] + " µs)");
            }
            double ds = s - fractions[k - 1];
            if (ds < 0) {
                throw new IllegalArgumentException("schedule point " + k + ": s falls from " + fractions[k - 1]
                        + " to " + s + "; a forward anneal never decreases s");
            }
            if (ds / dt > maxSlope) {
                throw new IllegalArgumentException("schedule point " + k + ": slope " + (ds / dt)
                        + " per µs exceeds the limit " + maxSlope + " per µs");
            }
        }
        if (timesMicros[0] != 0.0) {
            throw new IllegalArgumentException("schedule must start at t = 0, starts at " + timesMicros[0] + " µs");
        }
        if (fractions[0] != 0.0) {
            throw new IllegalArgumentException("a forward anneal starts at s = 0, this one at s = " + fractions[0]);
        }
        if (fractions[fractions.length - 1] != 1.0) {
            throw new IllegalArgumentException("a forward anneal ends at s = 1, this one at s = "
                    + fractions[fractions.length - 1]);
        }
        return new AnnealSchedule(timesMicros.clone(), fractions.clone());
    }

    /** s rises linearly from 0 to 1 over the anneal time. */
    public static AnnealSchedule linear(double annealMicros) {
        return of(new double[] {0.0, annealMicros}, new double[] {0.0, 1.0});
    }

    /**
     * A linear anneal of annealMicros with a pause of pauseMicros held at s = pauseAt
     * (0 &lt; pauseAt &lt; 1); the run lasts annealMicros + pauseMicros.
     */
    public static AnnealSchedule withPause(double annealMicros, double pauseAt, double pauseMicros) {
        checkPause(pauseAt, pauseMicros);
        double tp = pauseAt * annealMicros;
        return of(new double[] {0.0, tp, tp + pauseMicros, annealMicros + pauseMicros},
                new double[] {0.0, pauseAt, pauseAt, 1.0});
    }

    /**
     * A linear ramp at 1/annealMicros up to s = pauseAt, a pause of pauseMicros, then a quench
     * from pauseAt to 1 in quenchMicros.
     */
    public static AnnealSchedule withPauseAndQuench(double annealMicros, double pauseAt, double pauseMicros,
                                                    double quenchMicros) {
        checkPause(pauseAt, pauseMicros);
        double tp = pauseAt * annealMicros;
        return of(new double[] {0.0, tp, tp + pauseMicros, tp + pauseMicros + quenchMicros},
                new double[] {0.0, pauseAt, pauseAt, 1.0});
    }

    private static void checkPause(double pauseAt, double pauseMicros) {
        if (!(pauseAt > 0.0 && pauseAt < 1.0)) {
            throw new IllegalArgumentException("pause location s_p = " + pauseAt + " must lie strictly inside (0, 1)");
        }
        if (!(pauseMicros > 0.0) || !Double.isFinite(pauseMicros)) {
            throw new IllegalArgumentException("pause duration " + pauseMicros + " µs must be a finite number > 0");
        }
    }

    /** Total run time of one anneal in µs (pause included): the t_run of time-to-solution. */
    public double runTimeMicros() {
        return times[times.length - 1];
    }

    /** s at time t (µs); clamped to the ends outside [0, run time]. */
    public double fractionAt(double t) {
        if (t <= 0.0) {
            return fractions[0];
        }
        int last = times.length - 1;
        if (t >= times[last]) {
            return fractions[last];
        }
        int k = Arrays.binarySearch(times, t);
        if (k >= 0) {
            return fractions[k];
        }
        int hi = -k - 1;
        int lo = hi - 1;
        double w = (t - times[lo]) / (times[hi] - times[lo]);
        return fractions[lo] + w * (fractions[hi] - fractions[lo]);
    }

    /** Number of points. */
    public int pointCount() {
        return times.length;
    }

    /** Time of point k (µs). */
    public double time(int k) {
        return times[k];
    }

    /** s of point k. */
    public double fraction(int k) {
        return fractions[k];
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof AnnealSchedule && Arrays.equals(times, ((AnnealSchedule) o).times)
                && Arrays.equals(fractions, ((AnnealSchedule) o).fractions);
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(times) + Arrays.hashCode(fractions);
    }

    @Override
    public String toString() {
        StringBuilder b = new StringBuilder("AnnealSchedule[");
        for (int k = 0; k < times.length; k++) {
            b.append(k == 0 ? "" : ", ").append('(').append(times[k]).append(" µs, ").append(fractions[k]).append(')');
        }
        return b.append(']').toString();
    }
}
