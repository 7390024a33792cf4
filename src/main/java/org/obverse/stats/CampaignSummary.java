package org.obverse.stats;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.function.IntConsumer;

/**
 * Everything a score report holds: per-cell scores, per-setting quantiles over instances
 * with bootstrap bands, instance-wise comparisons of a setting against a reference, and the
 * best setting of each sweep group. Every banded value is given twice: the headline (median of
 * the bootstrap replicates, inside its bands) and the statistic on the observed data. Built
 * once from a {@link Campaign}; immutable.
 */
public final class CampaignSummary {
    /**
     * A headline value (median of bootstrap replicates), its inner and outer bands, and the
     * statistic on the observed data.
     */
    public record Banded(double headline, double[] band, double[] outer, double observed) {
        /** From replicates and the observed value. */
        static Banded of(double[] replicates, double observed, double[] in, double[] out) {
            return new Banded(BootstrapResult.headline(replicates), BootstrapResult.band(replicates, in[0], in[1]),
                    BootstrapResult.band(replicates, out[0], out[1]), observed);
        }
    }

    /**
     * One setting over its instances.
     *
     * @param setting   index of the setting
     * @param instances instances run under it
     * @param solved    instances with at least one success
     * @param tts       the quantile over instances of pooled TTS
     * @param p         the quantile over instances of pooled success probability
     */
    public record SettingRow(int setting, int instances, int solved, Banded tts, Banded p) {
    }

    /**
     * A setting against a reference (e.g. a baseline), instance by instance.
     *
     * @param setting   index of the setting
     * @param reference index of the reference setting
     * @param counts    instance-wise counts and sign test ("faster": the setting's TTS is less)
     * @param ratio     quantile over instances of TTS_reference / TTS_setting (> 1: the setting is faster)
     * @param saved     quantile over instances of TTS_reference − TTS_setting (> 0: the setting is faster)
     * @param improved  fraction of instances where the setting is faster
     */
    public record ComparisonRow(int setting, int reference, SettingComparison counts, Banded ratio, Banded saved,
            Banded improved) {
    }

    private final Campaign campaign;
    private final SummaryOptions options;
    private final List<CellScore> cells;
    private final BootstrapResult bootstrap;
    private final List<SettingRow> settings;
    private final List<ComparisonRow> comparisons;
    private final List<BootstrapResult.Sweep> sweeps;
    private final List<BootstrapResult.Sweep> sweepsOuter;

    private CampaignSummary(Campaign campaign, SummaryOptions options, List<CellScore> cells, BootstrapResult bootstrap,
            List<SettingRow> settings, List<ComparisonRow> comparisons, List<BootstrapResult.Sweep> sweeps,
            List<BootstrapResult.Sweep> sweepsOuter) {
        this.campaign = campaign;
        this.options = options;
        this.cells = List.copyOf(cells);
        this.bootstrap = bootstrap;
        this.settings = List.copyOf(settings);
        this.comparisons = List.copyOf(comparisons);
        this.sweeps = List.copyOf(sweeps);
        this.sweepsOuter = List.copyOf(sweepsOuter);
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
            rows.add(new SettingRow(s, present[s], solved[s], Banded.of(boot.ttsReplicates(s), boot.observedTts(s), in,
                    out), Banded.of(boot.pReplicates(s), boot.observedP(s), in, out)));
        }
        List<ComparisonRow> cmp = new ArrayList<>();
        for (int k = 0; k < options.pairs().size(); k++) {
            int a = options.pairs().get(k)[0];
            int b = options.pairs().get(k)[1];
            cmp.add(new ComparisonRow(a, b, SettingComparison.of(tts[a], tts[b]),
                    Banded.of(boot.ratioReplicates(k), boot.observedRatio(k), in, out),
                    Banded.of(boot.differenceReplicates(k), boot.observedDifference(k), in, out),
                    Banded.of(boot.improvedReplicates(k), boot.observedImproved(k), in, out)));
        }
        List<BootstrapResult.Sweep> sw = new ArrayList<>();
        List<BootstrapResult.Sweep> swOut = new ArrayList<>();
        for (int[] group : options.sweepGroups()) {
            sw.add(boot.sweep(group, in[0], in[1]));
            swOut.add(boot.sweep(group, out[0], out[1]));
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

    /** The best of each sweep group (in the order of {@link SummaryOptions#sweepGroups()}) with the inner band. */
    public List<BootstrapResult.Sweep> sweeps() {
        return sweeps;
    }

    /** The same with the outer band. */
    public List<BootstrapResult.Sweep> sweepsOuter() {
        return sweepsOuter;
    }
}
