package org.obverse.stats;

import java.util.Arrays;

/**
 * The outcome of a {@link HierarchicalBootstrap}: the statistic on the data as observed (the
 * point estimate) and its value in every replicate, per setting and per compared pair. Bands
 * are type-7 percentiles of the replicate values ({@link Quantiles}), replicates whose value is
 * undefined (NaN: no drawn instance was run under the setting) left out.
 *
 * <p>The arrays are owned by this object; accessors return them without copying for speed and
 * callers must not modify them.
 */
public final class BootstrapResult {
    private final BootstrapPlan plan;
    private final double[] pointTts;
    private final double[] pointP;
    private final double[] pointRatio;
    private final double[] pointDiff;
    private final double[] pointImproved;
    private final double[][] tts;
    private final double[][] p;
    private final double[][] ratio;
    private final double[][] diff;
    private final double[][] improved;

    BootstrapResult(BootstrapPlan plan, double[] pointTts, double[] pointP, double[] pointRatio, double[] pointDiff,
            double[] pointImproved, double[][] tts, double[][] p, double[][] ratio, double[][] diff,
            double[][] improved) {
        this.plan = plan;
        this.pointTts = pointTts;
        this.pointP = pointP;
        this.pointRatio = pointRatio;
        this.pointDiff = pointDiff;
        this.pointImproved = pointImproved;
        this.tts = tts;
        this.p = p;
        this.ratio = ratio;
        this.diff = diff;
        this.improved = improved;
    }

    public BootstrapPlan plan() {
        return plan;
    }

    /** The quantile over instances of TTS for a setting, on the observed data. */
    public double tts(int setting) {
        return pointTts[setting];
    }

    /** The quantile over instances of success probability for a setting, on the observed data. */
    public double pSuccess(int setting) {
        return pointP[setting];
    }

    /** The quantile over instances of TTS_A / TTS_B for a pair, on the observed data. */
    public double ratio(int pair) {
        return pointRatio[pair];
    }

    /** The quantile over instances of TTS_A − TTS_B for a pair, on the observed data. */
    public double difference(int pair) {
        return pointDiff[pair];
    }

    /** The fraction of instances where A is faster than B, on the observed data. */
    public double improvedFraction(int pair) {
        return pointImproved[pair];
    }

    /** Replicate values of the TTS statistic for a setting. */
    public double[] ttsReplicates(int setting) {
        return tts[setting];
    }

    /** Replicate values of the success statistic for a setting. */
    public double[] pReplicates(int setting) {
        return p[setting];
    }

    /** Replicate values of the ratio statistic for a pair. */
    public double[] ratioReplicates(int pair) {
        return ratio[pair];
    }

    /** Replicate values of the difference statistic for a pair. */
    public double[] differenceReplicates(int pair) {
        return diff[pair];
    }

    /** Replicate values of the improved fraction for a pair. */
    public double[] improvedReplicates(int pair) {
        return improved[pair];
    }

    /**
     * The percentile band [Q(lo), Q(hi)] (type 7) of replicate values, NaN left out; both NaN
     * when every value is NaN.
     */
    public static double[] band(double[] replicates, double lo, double hi) {
        double[] v = Arrays.stream(replicates).filter(x -> !Double.isNaN(x)).sorted().toArray();
        if (v.length == 0) {
            return new double[] {Double.NaN, Double.NaN};
        }
        if (!(lo >= 0) || !(hi <= 1) || !(lo <= hi)) {
            throw new IllegalArgumentException("band needs 0 <= lo <= hi <= 1, got " + lo + ", " + hi);
        }
        return new double[] {Quantiles.sorted(v, 0, v.length, lo), Quantiles.sorted(v, 0, v.length, hi)};
    }

    /**
     * A sweep over settings (in the given order, e.g. ascending swept value): the setting
     * with the least TTS statistic on the observed data, the band of the least TTS statistic
     * over the replicates, and how often each setting is the least in a replicate (ties go to
     * the earlier setting; replicates where none is defined are left out).
     */
    public Sweep sweep(int[] settings, double lo, double hi) {
        if (settings.length == 0) {
            throw new IllegalArgumentException("a sweep needs at least one setting");
        }
        int best = -1;
        for (int s : settings) {
            if (!Double.isNaN(pointTts[s]) && (best < 0 || pointTts[s] < pointTts[best])) {
                best = s;
            }
        }
        int reps = plan.replicates();
        double[] least = new double[reps];
        double[] wins = new double[settings.length];
        int counted = 0;
        for (int r = 0; r < reps; r++) {
            int arg = -1;
            for (int k = 0; k < settings.length; k++) {
                double v = tts[settings[k]][r];
                if (!Double.isNaN(v) && (arg < 0 || v < tts[settings[arg]][r])) {
                    arg = k;
                }
            }
            least[r] = arg < 0 ? Double.NaN : tts[settings[arg]][r];
            if (arg >= 0) {
                wins[arg]++;
                counted++;
            }
        }
        for (int k = 0; k < wins.length; k++) {
            wins[k] = counted == 0 ? Double.NaN : wins[k] / counted;
        }
        double[] b = band(least, lo, hi);
        return new Sweep(best, best < 0 ? Double.NaN : pointTts[best], b[0], b[1], wins);
    }

    /**
     * The best setting of a sweep.
     *
     * @param best          the setting index with the least TTS statistic (−1 if none is defined)
     * @param tts           its TTS statistic
     * @param bandLow       low end of the band of the least TTS statistic over replicates
     * @param bandHigh      high end of that band
     * @param bestFraction  per swept setting (in sweep order), the fraction of replicates where it is best
     */
    public record Sweep(int best, double tts, double bandLow, double bandHigh, double[] bestFraction) {
    }
}
