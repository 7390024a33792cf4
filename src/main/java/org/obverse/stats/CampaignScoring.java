package org.obverse.stats;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Per-cell scores of a campaign: success probability with Wilson and Clopper–Pearson
 * intervals, TTS pooled over gauges and as the median over gauges, residual energy, and the
 * spread of per-gauge success. The pooled and the gauge-median figures can disagree when
 * success is rare: a few lucky gauges pull the pooled mean up while the median stays at zero.
 */
public final class CampaignScoring {
    private CampaignScoring() {
    }

    /** Scores every (instance, setting) that was run, instance-major. */
    public static List<CellScore> cells(Campaign campaign, double target, double confidence) {
        if (!(target > 0) || !(target < 1)) {
            throw new IllegalArgumentException("target must be in (0, 1), got " + target);
        }
        if (!(confidence > 0) || !(confidence < 1)) {
            throw new IllegalArgumentException("confidence must be in (0, 1), got " + confidence);
        }
        List<CellScore> out = new ArrayList<>();
        for (int i = 0; i < campaign.instanceCount(); i++) {
            for (int s = 0; s < campaign.settingCount(); s++) {
                if (campaign.has(i, s)) {
                    out.add(cell(campaign, i, s, target, confidence));
                }
            }
        }
        return out;
    }

    /** The score of one cell that was run. */
    public static CellScore cell(Campaign campaign, int instance, int setting, double target, double confidence) {
        int c = campaign.cell(instance, setting);
        int from = campaign.gaugeFrom(c);
        int to = campaign.gaugeTo(c);
        if (to <= from) {
            throw new IllegalArgumentException("instance " + campaign.instances().get(instance)
                    + " was not run under setting " + campaign.settings().get(setting));
        }
        long reads = 0;
        long succ = 0;
        double residual = 0;
        long answered = 0;
        double run = 0;
        long broken = 0;
        double minEnergy = Double.POSITIVE_INFINITY;
        int g = to - from;
        double[] gaugeP = new double[g];
        double[] gaugeTts = new double[g];
        double logMiss = Math.log1p(-target);
        for (int k = from; k < to; k++) {
            reads += campaign.reads(k);
            succ += campaign.successes(k);
            residual += campaign.residualSum(k);
            answered += campaign.answered(k);
            run += campaign.runTimeSum(k);
            broken += campaign.brokenSum(k);
            minEnergy = Math.min(minEnergy, campaign.minEnergy(k));
            double p = (double) campaign.successes(k) / campaign.reads(k);
            gaugeP[k - from] = p;
            gaugeTts[k - from] = TimeToSolution.kernel(p, campaign.runTimeSum(k) / campaign.reads(k), logMiss);
        }
        double p = (double) succ / reads;
        double runTime = run / reads;
        BinomialInterval cp = BinomialInterval.clopperPearson(succ, reads, confidence);
        double mean = 0;
        for (double v : gaugeP) {
            mean += v;
        }
        mean /= g;
        Arrays.sort(gaugeP);
        double[] five = {gaugeP[0], Quantiles.sorted(gaugeP, 0, g, 0.25), Quantiles.sorted(gaugeP, 0, g, 0.5),
            Quantiles.sorted(gaugeP, 0, g, 0.75), gaugeP[g - 1]};
        Arrays.sort(gaugeTts);
        return new CellScore(instance, setting, g, reads, succ, p,
                BinomialInterval.wilson(succ, reads, confidence), cp, runTime,
                TimeToSolution.kernel(p, runTime, logMiss),
                TimeToSolution.kernel(cp.upper(), runTime, logMiss),
                TimeToSolution.kernel(cp.lower(), runTime, logMiss),
                answered == 0 ? Double.NaN : residual / answered, minEnergy, (double) broken / reads, five, mean,
                Quantiles.sorted(gaugeTts, 0, g, 0.5));
    }

    /** Per-gauge success of every gauge of every instance run under a setting (for plots). */
    public static double[] gaugeSuccess(Campaign campaign, int setting) {
        int count = 0;
        for (int i = 0; i < campaign.instanceCount(); i++) {
            int c = campaign.cell(i, setting);
            count += campaign.gaugeTo(c) - campaign.gaugeFrom(c);
        }
        double[] out = new double[count];
        int n = 0;
        for (int i = 0; i < campaign.instanceCount(); i++) {
            int c = campaign.cell(i, setting);
            for (int k = campaign.gaugeFrom(c); k < campaign.gaugeTo(c); k++) {
                out[n++] = (double) campaign.successes(k) / campaign.reads(k);
            }
        }
        return out;
    }
}
