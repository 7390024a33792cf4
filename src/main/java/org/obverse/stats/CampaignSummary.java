package org.obverse.stats;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.function.IntConsumer;

/**
 * Everything a score report holds: per-cell scores, per-setting quantiles over instances
 * with bootstrap bands, instance-wise comparisons of setting pairs, and the best setting of a
 * sweep. Built once from a {@link Campaign}; immutable.
 */
public final class CampaignSummary {
    /**
     * One setting over its instances.
     *
     * @param setting   index of the setting
     * @param instances instances run under it
     * @param solved    instances with at least one success
     * @param tts       the quantile over instances of pooled TTS
     * @param ttsBand   inner bootstrap band of it
     * @param ttsOuter  outer bootstrap band of it
     * @param p         the quantile over instances of pooled success probability
     * @param pBand     inner bootstrap band of it
     * @param pOuter    outer bootstrap band of it
     */
    public record SettingRow(int setting, int instances, int solved, double tts, double[] ttsBand, double[] ttsOuter,
            double p, double[] pBand, double[] pOuter) {
    }

    /**
     * A against B.
     *
     * @param a            index of setting A
     * @param b            index of setting B
     * @param counts       instance-wise counts and sign test
     * @param ratio        quantile over instances of TTS_A / TTS_B
     * @param ratioBand    inner band of it
     * @param ratioOuter   outer band of it
     * @param difference   quantile over instances of TTS_A − TTS_B
     * @param differenceBand inner band of it
     * @param improvedBand inner band of the fraction improved
     */
    public record ComparisonRow(int a, int b, SettingComparison counts, double ratio, double[] ratioBand,
            double[] ratioOuter, double difference, double[] differenceBand, double[] improvedBand) {
    }

    private final Campaign campaign;
    private final SummaryOptions options;
    private final List<CellScore> cells;
    private final BootstrapResult bootstrap;
    private final List<SettingRow> settings;
    private final List<ComparisonRow> comparisons;
    private final BootstrapResult.Sweep sweep;
    private final BootstrapResult.Sweep sweepOuter;

    private CampaignSummary(Campaign campaign, SummaryOptions options, List<CellScore> cells, BootstrapResult bootstrap,
            List<SettingRow> settings, List<ComparisonRow> comparisons, BootstrapResult.Sweep sweep,
            BootstrapResult.Sweep sweepOuter) {
        this.campaign = campaign;
        this.options = options;
        this.cells = List.copyOf(cells);
        this.bootstrap = bootstrap;
        this.settings = List.copyOf(settings);
        this.comparisons = List.copyOf(comparisons);
        this.sweep = sweep;
        this.sweepOuter = sweepOuter;
    }

    /** Scores and bootstraps a campaign; progress (may be null) gets finished replicates. */
    public static CampaignSummary of(Campaign campaign, SummaryOptions options, IntConsumer progress) {
        List<CellScore> cells = CampaignScoring.cells(campaign, options.target(), options.confidence());
        BootstrapResult boot = HierarchicalBootstrap.run(campaign, options.plan(), progress);
        int nS = campaign.settingCount();
        int nI = campaign.instanceCount();
        double[][] tts = new double[nS][nI];
        for (double[] row : tts) {
            Arrays.fill(row, Double.NaN);
        }
        int[] present = new int[nS];
        int[] solved = new int[nS];
        for (CellScore c : cells) {
            tts[c.setting()][c.instance()] = c.tts();
            present[c.setting()]++;
            if (c.successes() > 0) {
                solved[c.setting()]++;
            }
        }
        double[] in = options.band();
        double[] out = options.outerBand();
        List<SettingRow> rows = new ArrayList<>();
        for (int s = 0; s < nS; s++) {
            rows.add(new SettingRow(s, present[s], solved[s], boot.tts(s),
                    BootstrapResult.band(boot.ttsReplicates(s), in[0], in[1]),
                    BootstrapResult.band(boot.ttsReplicates(s), out[0], out[1]), boot.pSuccess(s),
                    BootstrapResult.band(boot.pReplicates(s), in[0], in[1]),
                    BootstrapResult.band(boot.pReplicates(s), out[0], out[1])));
        }
        List<ComparisonRow> cmp = new ArrayList<>();
        for (int k = 0; k < options.pairs().size(); k++) {
            int a = options.pairs().get(k)[0];
            int b = options.pairs().get(k)[1];
            cmp.add(new ComparisonRow(a, b, SettingComparison.of(tts[a], tts[b]), boot.ratio(k),
                    BootstrapResult.band(boot.ratioReplicates(k), in[0], in[1]),
                    BootstrapResult.band(boot.ratioReplicates(k), out[0], out[1]), boot.difference(k),
                    BootstrapResult.band(boot.differenceReplicates(k), in[0], in[1]),
                    BootstrapResult.band(boot.improvedReplicates(k), in[0], in[1])));
        }
        BootstrapResult.Sweep sw = null;
        BootstrapResult.Sweep swOut = null;
        if (options.sweepOrder() != null) {
            sw = boot.sweep(options.sweepOrder(), in[0], in[1]);
            swOut = boot.sweep(options.sweepOrder(), out[0], out[1]);
        }
        return new CampaignSummary(campaign, options, cells, boot, rows, cmp, sw, swOut);
    }

    public Campaign campaign() {
        return campaign;
    }

    public SummaryOptions options() {
        return options;
    }

    public List<CellScore> cells() {
        return cells;
    }

    public BootstrapResult bootstrap() {
        return bootstrap;
    }

    public List<SettingRow> settings() {
        return settings;
    }

    public List<ComparisonRow> comparisons() {
        return comparisons;
    }

    /** The sweep with the inner band, or null without a sweep. */
    public BootstrapResult.Sweep sweep() {
        return sweep;
    }

    /** The sweep with the outer band, or null without a sweep. */
    public BootstrapResult.Sweep sweepOuter() {
        return sweepOuter;
    }
}
