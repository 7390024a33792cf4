package org.obverse.stats;

import java.util.Arrays;

/**
 * The outcome of a {@link HierarchicalBootstrap}: the statistic on the data as observed and its
 * value in every replicate, per setting and per compared pair. The headline value of a
 * statistic is the median of its replicates ({@link #headline}) and its bands are type-7
 * percentiles of the same replicates ({@link #band}), so the headline lies inside every band
 * that contains the 50th percentile; replicates whose value is undefined (NaN: no drawn
 * instance was run under the setting) are left out of both.
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
    public double observedTts(int setting) {
        return pointTts[setting];
    }

    /** The quantile over instances of success probability for a setting, on the observed data. */
    public double observedP(int setting) {
        return pointP[setting];
    }

    /** The quantile over instances of TTS_reference / TTS_setting for a pair, on the observed data. */
    public double observedRatio(int pair) {
        return pointRatio[pair];
    }

    /** The quantile over instances of TTS_reference − TTS_setting for a pair, on the observed data. */
    public double observedDifference(int pair) {
        return pointDiff[pair];
    }

    /** The fraction of instances where the setting is faster than the reference, on the observed data. */
    public double observedImproved(int pair) {
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
     * The headline value of a statistic: the median (type 7) of its replicate values, NaN left
     * out; NaN when every value is NaN.
     */
    public static double headline(double[] replicates) {
        return band(replicates, 0.5, 0.5)[0];
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
     * The best of a group of settings: the setting whose headline TTS (median of its replicates)
     * is least (ties go to the earlier setting in the given order), how often each setting has
     * the least TTS statistic in a replicate (ties go to the earlier setting; replicates where
     * none is defined are left out), and the least TTS statistic over the group: its headline
     * (median over replicates of the per-replicate least), its band, and its observed value.
     */
    public Sweep sweep(int[] settings, double lo, double hi) {
        if (settings.length == 0) {
            throw new IllegalArgumentException("a sweep needs at least one setting");
        }
        int best = -1;
        double bestHeadline = Double.NaN;
        double observedLeast = Double.NaN;
        for (int s : settings) {
            double h = headline(tts[s]);
            if (!Double.isNaN(h) && (best < 0 || h < bestHeadline)) {
                best = s;
                bestHeadline = h;
            }
            if (!Double.isNaN(pointTts[s]) && !(pointTts[s] >= observedLeast)) {
                observedLeast = pointTts[s];
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
        return new Sweep(best, headline(least), b[0], b[1], observedLeast, wins);
    }

    /**
     * The best setting of a group.
     *
     * @param best          the setting index with the least headline TTS (−1 if none is defined)
     * @param leastTts      headline of the least TTS statistic over the group (median over replicates)
     * @param bandLow       low end of the band of the least TTS statistic over replicates
     * @param bandHigh      high end of that band
     * @param observedLeast the least TTS statistic over the group on the observed data
     * @param bestFraction  per setting (in the given order), the fraction of replicates where it is least
     */
    public record Sweep(int best, double leastTts, double bandLow, double bandHigh, double observedLeast,
            double[] bestFraction) {
    }
}
