package org.obverse.report;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Base64;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.obverse.io.table.ScoreFiles;
import org.obverse.stats.BiasDiagnostics;
import org.obverse.stats.Campaign;
import org.obverse.stats.CampaignScoring;
import org.obverse.stats.CampaignSummary;
import org.obverse.stats.CellScore;
import org.obverse.stats.Quantiles;
import org.obverse.stats.SuccessRule;

/**
 * The HTML report: one self-contained page (the plots are embedded as PNG data URIs; each
 * links to its SVG file beside the page) with the inputs and conventions, the per-setting
 * table, the plots, comparisons, the sweep's best value, the gauge spread and the bias map.
 */
public final class HtmlReport {
    private HtmlReport() {
    }

    /** What the page is about. */
    public record Inputs(String results, String ground, SuccessRule rule, List<String> sweep, String baseline,
            String magnetisation, String correlations) {
    }

    /** The page. */
    public static String page(CampaignSummary summary, ScoreFiles.Tables tables, Inputs inputs, List<Figure> figures,
            BiasDiagnostics.Result bias, List<Integer> qubitIds, BiasDiagnostics.Result couplerBias,
            List<int[]> couplers) {
        Campaign c = summary.campaign();
        var o = summary.options();
        StringBuilder h = new StringBuilder(1 << 16);
        h.append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
                .append("<title>Campaign scores: ").append(esc(inputs.results())).append("</title>\n<style>\n")
                .append("body{font-family:system-ui,Segoe UI,Helvetica,Arial,sans-serif;max-width:1100px;margin:2em auto;")
                .append("padding:0 1em;color:#222;line-height:1.45}\n")
                .append("table{border-collapse:collapse;margin:0.6em 0 1.2em;font-size:0.92em}\n")
                .append("th,td{border:1px solid #ccc;padding:0.25em 0.6em;text-align:right;white-space:nowrap}\n")
                .append("th{background:#eef2f7}td.l,th.l{text-align:left}\n")
                .append("figure{margin:1.2em 0}figure img{max-width:100%;height:auto;border:1px solid #ddd}\n")
                .append("figcaption{font-size:0.9em;color:#444;max-width:860px}\n.flag{color:#b22;font-weight:bold}\n")
                .append("code{background:#f4f4f4;padding:0 0.2em}\n</style>\n</head>\n<body>\n");
        h.append("<h1>Campaign scores</h1>\n");
        long given = 0;
        for (int i = 0; i < c.instanceCount(); i++) {
            given += c.groundGiven(i) ? 1 : 0;
        }
        h.append("<ul>\n<li>Results table: <code>").append(esc(inputs.results())).append("</code> — ")
                .append(c.instanceCount()).append(" instances, ").append(c.settingCount()).append(" settings, ")
                .append(c.gaugeSlots()).append(" (instance, setting, gauge) groups.</li>\n");
        h.append("<li>Ground energies: ").append(inputs.ground() == null
                ? "none given: each instance's <b>best energy seen</b> over all settings is used (marked "
                        + "<code>best_seen</code>), so success means matching the best found, not a proven ground state."
                : "<code>" + esc(inputs.ground()) + "</code> (" + given + " of " + c.instanceCount() + " instances).")
                .append("</li>\n");
        h.append("<li>Success: energy ≤ ground + ").append(num(inputs.rule().absolute())).append(" + ")
                .append(num(inputs.rule().relative())).append(" · |ground|.</li>\n");
        h.append("<li>TTS at a ").append(num(100 * o.target())).append(" % target: t_run · ln(1 − target) / ln(1 − p);")
                .append(" t_run when p ≥ target; ∞ when p = 0 (Rønnow et al., Science 345, 420, 2014).</li>\n");
        h.append("<li>Over instances: the ").append(o.quantile() == 0.5 ? "median" : num(o.quantile()) + " quantile")
                .append(" (Hyndman–Fan type 7; ∞ sorts above every finite value and a positive interpolation weight on")
                .append(" ∞ gives ∞).</li>\n");
        h.append("<li>Headline values are the median of the bootstrap replicates; bands are percentiles of the same ")
                .append("replicates (so every headline lies inside its bands); the statistic on the observed data is in ")
                .append("the <code>observed_…</code> columns. Bootstrap <code>--resample ").append(o.resampling().label())
                .append("</code>: ").append(esc(o.resampling().description())).append("; ")
                .append(o.replicates()).append(" replicates, seed ").append(o.seed()).append(", percentiles ")
                .append(num(100 * o.band()[0])).append("–").append(num(100 * o.band()[1])).append(" and ")
                .append(num(100 * o.outerBand()[0])).append("–").append(num(100 * o.outerBand()[1]))
                .append(o.resampling().drawsInstances() && c.instanceCount() < 8 ? ". <b>Only " + c.instanceCount()
                        + " instances:</b> an instance bootstrap of so few is coarse (an inner band may be one instance's "
                        + "value wide); <code>--resample gauges-only</code> shows how well these instances were measured"
                        : "")
                .append(". Binomial intervals per instance at ").append(num(100 * o.confidence()))
                .append(" % (Wilson and Clopper–Pearson) are in <code>instances.csv</code>.</li>\n</ul>\n");

        h.append("<h2>Settings</h2>\n<table>\n<tr><th>#</th><th class=\"l\">setting</th><th>instances</th><th>solved</th>")
                .append("<th>TTS (µs)</th><th>inner band</th><th>outer band</th><th>p</th>")
                .append("<th>inner band</th><th>outer band</th></tr>\n");
        int number = 0;
        for (Map<String, Object> r : tables.settings()) {
            h.append("<tr><td>").append(++number).append("</td><td class=\"l\">").append(esc((String) r.get("setting"))).append("</td><td>")
                    .append(r.get("instances")).append("</td><td>").append(r.get("solved_instances")).append("</td><td>")
                    .append(num((Double) r.get("tts_us"))).append("</td><td>")
                    .append(range(r, "tts_band_low_us", "tts_band_high_us")).append("</td><td>")
                    .append(range(r, "tts_outer_low_us", "tts_outer_high_us")).append("</td><td>")
                    .append(num((Double) r.get("p_success"))).append("</td><td>")
                    .append(range(r, "p_success_band_low", "p_success_band_high")).append("</td><td>")
                    .append(range(r, "p_success_outer_low", "p_success_outer_high")).append("</td></tr>\n");
        }
        h.append("</table>\n");
        h.append("<h2>Figures</h2>\n<ol>\n");
        for (Figure f : figures) {
            h.append("<li><a href=\"#fig-").append(f.name()).append("\"><code>").append(f.name())
                    .append("</code></a></li>\n");
        }
        h.append("</ol>\n");
        figure(h, figures, "tts");
        figure(h, figures, "success");
        boolean campaign = figures.stream().anyMatch(f -> f.name().startsWith("pause-") || f.name().startsWith("heat-")
                || f.name().startsWith("coupling-"));
        if (campaign) {
            h.append("<h2>Pause and chain coupling</h2>\n");
            for (Figure f : figures) {
                if (f.name().startsWith("pause-") || f.name().startsWith("heat-") || f.name().startsWith("coupling-")) {
                    figure(h, figures, f.name());
                }
            }
        }

        if (!tables.sweep().isEmpty()) {
            h.append("<h2>Best setting of the sweep over ").append(esc(String.join(" × ", inputs.sweep())))
                    .append("</h2>\n<p>Within each group of settings that agree on every other setting column: the setting ")
                    .append("with the least headline TTS, the least TTS over the group (median over replicates, bands), ")
                    .append("and the fraction of replicates in which that setting is the least.</p>\n<table>\n")
                    .append("<tr><th class=\"l\">group</th><th>candidates</th><th class=\"l\">best setting</th>")
                    .append("<th>least TTS (µs)</th><th>inner band</th><th>outer band</th><th>best in</th></tr>\n");
            for (Map<String, Object> s : tables.sweep()) {
                h.append("<tr><td class=\"l\">").append(esc((String) s.get("group"))).append("</td><td>")
                        .append(s.get("candidates")).append("</td><td class=\"l\">")
                        .append(esc((String) s.get("best_setting"))).append("</td><td>")
                        .append(num((Double) s.get("least_tts_us"))).append("</td><td>")
                        .append(range(s, "least_tts_band_low_us", "least_tts_band_high_us")).append("</td><td>")
                        .append(range(s, "least_tts_outer_low_us", "least_tts_outer_high_us")).append("</td><td>")
                        .append(num(100 * (Double) s.get("best_fraction"))).append(" %</td></tr>\n");
            }
            h.append("</table>\n");
        }
        comparisons(h, "Comparisons, instance by instance", tables.comparisons(), figures, "compare-");
        comparisons(h, "Against the baseline " + (inputs.baseline() == null ? "" : inputs.baseline()), tables.baseline(),
                figures, "baseline");

        h.append("<h2>Gauges</h2>\n<p>Per setting, over every gauge of every instance: the success probability of ")
                .append("single gauges. Pooled is Σ successes / Σ reads; when success is rare a few lucky gauges pull ")
                .append("the pooled and mean figures above the median.</p>\n<table>\n<tr><th class=\"l\">setting</th>")
                .append("<th>gauges</th><th>pooled p</th><th>mean over gauges</th><th>min</th><th>q1</th>")
                .append("<th>median</th><th>q3</th><th>max</th><th>instances with median-gauge p = 0 &lt; pooled p</th></tr>\n");
        for (int s = 0; s < c.settingCount(); s++) {
            double[] v = CampaignScoring.gaugeSuccess(c, s);
            if (v.length == 0) {
                continue;
            }
            long succ = 0;
            long reads = 0;
            int lucky = 0;
            for (CellScore cs : summary.cells()) {
                if (cs.setting() == s) {
                    succ += cs.successes();
                    reads += cs.reads();
                    if (cs.gaugeP()[2] == 0 && cs.pSuccess() > 0) {
                        lucky++;
                    }
                }
            }
            double[] q = Quantiles.of(v, 0, 0.25, 0.5, 0.75, 1);
            h.append("<tr><td class=\"l\">").append(esc(c.settings().get(s))).append("</td><td>").append(v.length)
                    .append("</td><td>").append(num((double) succ / reads)).append("</td><td>")
                    .append(num(Arrays.stream(v).average().orElse(Double.NaN))).append("</td>");
            for (double x : q) {
                h.append("<td>").append(num(x)).append("</td>");
            }
            h.append("<td>").append(lucky).append("</td></tr>\n");
        }
        h.append("</table>\n");
        figure(h, figures, "gauges");

        h.append("<h2>Bias of the qubits</h2>\n");
        if (bias == null) {
            h.append("<p>No magnetisation table was given (<code>--magnetisation</code>, spec/results.md), so there is ")
                    .append("no bias map.</p>\n");
        } else {
            h.append("<p>From <code>").append(esc(inputs.magnetisation())).append("</code>: ")
                    .append(bias.items().size()).append(" qubits; ").append(bias.flagged().size())
                    .append(" flagged at |z| &gt; ").append(num(bias.threshold())).append(" (family-wise false-positive ")
                    .append("rate ").append(num(bias.alpha())).append(", Bonferroni).</p>\n");
            figure(h, figures, "bias");
            h.append("<table>\n<tr><th>rank</th><th>qubit</th><th>gauges</th><th>reads</th><th>bias</th>")
                    .append("<th>standard error</th><th>z</th><th class=\"l\">flagged</th></tr>\n");
            List<BiasDiagnostics.Item> top = new ArrayList<>(bias.items().subList(0, Math.min(20, bias.items().size())));
            int rank = 1;
            for (BiasDiagnostics.Item it : top) {
                h.append("<tr><td>").append(rank++).append("</td><td>").append(qubitIds.get(it.item())).append("</td><td>")
                        .append(it.gauges()).append("</td><td>").append(it.reads()).append("</td><td>")
                        .append(num(it.bias())).append("</td><td>").append(num(it.stdError())).append("</td><td>")
                        .append(num(it.z())).append("</td><td class=\"l\">")
                        .append(it.flagged() ? "<span class=\"flag\">yes</span>" : it.flipped() ? "no" : "not tested (never flipped)")
                        .append("</td></tr>\n");
            }
            h.append("</table>\n");
        }
        if (couplerBias != null) {
            h.append("<h2>Bias of the couplers</h2>\n<p>From <code>").append(esc(inputs.correlations()))
                    .append("</code>: ").append(couplerBias.items().size()).append(" couplers; ")
                    .append(couplerBias.flagged().size()).append(" flagged at |z| &gt; ").append(num(couplerBias.threshold()))
                    .append(" (family-wise false-positive rate ").append(num(couplerBias.alpha())).append(").</p>\n");
            figure(h, figures, "coupler-bias");
            h.append("<table>\n<tr><th>rank</th><th>coupler</th><th>gauges</th><th>reads</th><th>bias</th>")
                    .append("<th>standard error</th><th>z</th><th class=\"l\">flagged</th></tr>\n");
            int rank = 1;
            for (BiasDiagnostics.Item it : couplerBias.items().subList(0, Math.min(20, couplerBias.items().size()))) {
                int[] pair = couplers.get(it.item());
                h.append("<tr><td>").append(rank++).append("</td><td>").append(pair[0]).append("–").append(pair[1])
                        .append("</td><td>").append(it.gauges()).append("</td><td>").append(it.reads()).append("</td><td>")
                        .append(num(it.bias())).append("</td><td>").append(num(it.stdError())).append("</td><td>")
                        .append(num(it.z())).append("</td><td class=\"l\">")
                        .append(it.flagged() ? "<span class=\"flag\">yes</span>" : it.flipped() ? "no" : "not tested (never flipped)")
                        .append("</td></tr>\n");
            }
            h.append("</table>\n");
        }
        h.append("<p style=\"color:#666;font-size:0.85em\">Per-instance figures: <code>instances.csv</code>; per setting: ")
                .append("<code>settings.csv</code>; plots as SVG in <code>plots/</code>. Formats: spec/results.md.</p>\n");
        h.append("</body>\n</html>\n");
        return h.toString();
    }

    private static void comparisons(StringBuilder h, String title, List<Map<String, Object>> rows,
            List<Figure> figures, String figurePrefix) {
        if (rows.isEmpty()) {
            return;
        }
        h.append("<h2>").append(esc(title)).append("</h2>\n<p>Per instance, ΔTTS = TTS<sub>reference</sub> − ")
                .append("TTS<sub>setting</sub> (positive: the setting is faster) and the ratio TTS<sub>reference</sub> / ")
                .append("TTS<sub>setting</sub> (above 1: faster); the table gives their median over instances ")
                .append("(headline: median of the bootstrap replicates) with the inner band, the fraction of instances ")
                .append("the setting improves, and the two-sided sign test on the untied instances.</p>\n<table>\n")
                .append("<tr><th class=\"l\">setting</th><th class=\"l\">reference</th><th>paired</th><th>faster</th>")
                .append("<th>slower</th><th>tied</th><th>sign test p</th><th>ΔTTS (µs)</th><th>inner band</th>")
                .append("<th>ratio</th><th>inner band</th><th>fraction improved</th><th>inner band</th></tr>\n");
        for (Map<String, Object> r : rows) {
            h.append("<tr><td class=\"l\">").append(esc((String) r.get("setting"))).append("</td><td class=\"l\">")
                    .append(esc((String) r.get("reference"))).append("</td><td>").append(r.get("paired"))
                    .append("</td><td>").append(r.get("setting_faster")).append("</td><td>")
                    .append(r.get("reference_faster")).append("</td><td>").append(r.get("ties")).append("</td><td>")
                    .append(num((Double) r.get("sign_test_p"))).append("</td><td>")
                    .append(num((Double) r.get("tts_reference_minus_setting_us"))).append("</td><td>")
                    .append(range(r, "tts_reference_minus_setting_band_low_us", "tts_reference_minus_setting_band_high_us"))
                    .append("</td><td>").append(num((Double) r.get("tts_ratio_reference_over_setting"))).append("</td><td>")
                    .append(range(r, "tts_ratio_reference_over_setting_band_low", "tts_ratio_reference_over_setting_band_high"))
                    .append("</td><td>").append(num((Double) r.get("fraction_setting_faster"))).append("</td><td>")
                    .append(range(r, "fraction_setting_faster_band_low", "fraction_setting_faster_band_high"))
                    .append("</td></tr>\n");
        }
        h.append("</table>\n<p>Ties (equal TTS, including both infinite) are left out of the sign test; a ratio of ")
                .append("two infinite TTS counts as 1.</p>\n");
        for (Figure f : figures) {
            if (f.name().startsWith(figurePrefix)) {
                figure(h, figures, f.name());
            }
        }
    }

    private static void figure(StringBuilder h, List<Figure> figures, String name) {
        for (Figure f : figures) {
            if (f.name().equals(name)) {
                h.append("<figure id=\"fig-").append(f.name()).append("\"><img alt=\"").append(esc(f.caption())).append("\" src=\"data:image/png;base64,")
                        .append(Base64.getEncoder().encodeToString(f.png())).append("\">\n<figcaption>")
                        .append(esc(f.caption())).append(" <a href=\"plots/").append(f.name()).append(".svg\">SVG</a>")
                        .append("</figcaption></figure>\n");
            }
        }
    }

    private static String range(Map<String, Object> r, String lo, String hi) {
        return "[" + num((Double) r.get(lo)) + ", " + num((Double) r.get(hi)) + "]";
    }

    static String num(double v) {
        if (Double.isNaN(v)) {
            return "–";
        }
        if (Double.isInfinite(v)) {
            return v > 0 ? "∞" : "−∞";
        }
        if (v == Math.rint(v) && Math.abs(v) < 1e9) {
            return String.format(Locale.ROOT, "%d", (long) v);
        }
        String t = String.format(Locale.ROOT, "%.4g", v);
        if (!t.contains("e") && t.contains(".")) {
            t = t.replaceAll("0+$", "");
            if (t.endsWith(".")) {
                t = t.substring(0, t.length() - 1);
            }
        }
        return t;
    }

    static String esc(String s) {
        if (s == null) {
            return "";
        }
        StringBuilder b = new StringBuilder(s.length());
        for (char ch : s.toCharArray()) {
            switch (ch) {
                case '<' -> b.append("&lt;");
                case '>' -> b.append("&gt;");
                case '&' -> b.append("&amp;");
                case '"' -> b.append("&quot;");
                default -> b.append(ch);
            }
        }
        return b.toString();
    }
}
