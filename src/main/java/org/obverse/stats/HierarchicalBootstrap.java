package org.obverse.stats;

import java.util.Arrays;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ForkJoinPool;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.IntConsumer;
import java.util.stream.IntStream;
import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.random.LegacyStreams;

/**
 * The bootstrap of a campaign over its levels instances → gauges → reads ({@link Resampling};
 * the default redraws instances only, Davison and Hinkley 1997 §3.8; over instances as in
 * Rønnow et al., Science 345, 420, 2014). One replicate: draw as many instances as there are,
 * uniformly with replacement (or take each once); for each drawn instance and each setting it
 * was run under, pool its gauges (drawn with replacement where the scheme says so, their
 * successes redrawn as Binomial(reads, p̂) by exact inversion where it says so) into p* and
 * TTS*. The replicate's statistic is the chosen quantile over the drawn instances (type 7,
 * {@link Quantiles}) of TTS* and of p*, and for each pair {setting, reference} the quantile of
 * the instance-wise ratio TTS*_reference / TTS*_setting and difference TTS*_reference −
 * TTS*_setting, and the fraction of instances where the setting is faster. The same drawn
 * instances serve every setting (a paired design).
 *
 * <p>Ratio and difference with infinite TTS: equal values (including ∞ and ∞) give ratio 1
 * and difference 0 (a tie); ∞ against a finite value gives ratio ∞ or 0 and difference ±∞.
 *
 * <p>Reproducible to the last digit: replicate r draws only from a XO_RO_SHI_RO_128_PP
 * stream seeded from (seed, r) by SplitMix64 mixing, and writes only its own slot, so the
 * result does not depend on the thread count. Cost: where a scheme redraws nothing inside an
 * instance, each cell's p and TTS are computed once and a replicate only draws instance
 * indices; binomial tables are built once per gauge and only when reads are redrawn.
 */
public final class HierarchicalBootstrap {
    private HierarchicalBootstrap() {
    }

    /** Runs the plan; progress (may be null) receives the count of finished replicates. */
    public static BootstrapResult run(Campaign campaign, BootstrapPlan plan, IntConsumer progress) {
        int nI = campaign.instanceCount();
        int nS = campaign.settingCount();
        if (nI == 0) {
            throw new IllegalArgumentException("campaign has no instances");
        }
        for (int[] pair : plan.pairs()) {
            for (int s : pair) {
                if (s < 0 || s >= nS) {
                    throw new IllegalArgumentException("setting index " + s + " is not in [0, " + nS + ")");
                }
            }
        }
        int slots = campaign.gaugeSlots();
        Resampling scheme = plan.resampling();
        boolean needSamplers = scheme.drawsReads() || scheme.drawsGauges();
        BinomialSampler[] samplers = new BinomialSampler[needSamplers ? slots : 0];
        for (int c = 0; needSamplers && c < nI * nS; c++) {
            // Under gauges-only only one-gauge cells redraw reads; build only the tables used.
            boolean used = scheme.drawsReads()
                    || (scheme == Resampling.GAUGES_ONLY && campaign.gaugeTo(c) - campaign.gaugeFrom(c) == 1);
            for (int k = campaign.gaugeFrom(c); used && k < campaign.gaugeTo(c); k++) {
                samplers[k] = BinomialSampler.of(campaign.reads(k), (double) campaign.successes(k) / campaign.reads(k));
            }
        }
        double[] runMean = new double[nI * nS];
        for (int c = 0; c < nI * nS; c++) {
            long reads = 0;
            double run = 0;
            for (int k = campaign.gaugeFrom(c); k < campaign.gaugeTo(c); k++) {
                reads += campaign.reads(k);
                run += campaign.runTimeSum(k);
            }
            runMean[c] = reads == 0 ? Double.NaN : run / reads;
        }
        double logMiss0 = Math.log1p(-plan.target());
        // Each cell's pooled p and TTS as observed, computed once: a replicate that redraws
        // nothing inside an instance only looks them up.
        double[] cellP = new double[nI * nS];
        double[] cellTts = new double[nI * nS];
        for (int c = 0; c < nI * nS; c++) {
            long succ = 0;
            long total = 0;
            for (int k = campaign.gaugeFrom(c); k < campaign.gaugeTo(c); k++) {
                succ += campaign.successes(k);
                total += campaign.reads(k);
            }
            cellP[c] = total == 0 ? Double.NaN : (double) succ / total;
            cellTts[c] = total == 0 ? Double.NaN : TimeToSolution.kernel(cellP[c], runMean[c], logMiss0);
        }
        double logMiss = Math.log1p(-plan.target());
        int nP = plan.pairs().size();
        int reps = plan.replicates();
        double[][] tts = new double[nS][reps];
        double[][] ps = new double[nS][reps];
        double[][] ratio = new double[nP][reps];
        double[][] diff = new double[nP][reps];
        double[][] improved = new double[nP][reps];

        // The point estimates: the statistic on the data as observed.
        int[] identity = new int[nI];
        Arrays.setAll(identity, i -> i);
        double[] pointTts = new double[nS];
        double[] pointP = new double[nS];
        double[] pointRatio = new double[nP];
        double[] pointDiff = new double[nP];
        double[] pointImproved = new double[nP];
        Replicate point = new Replicate(campaign, samplers, runMean, logMiss, plan, cellP, cellTts);
        point.evaluate(identity, null, false, pointTts, pointP, pointRatio, pointDiff, pointImproved);

        AtomicInteger done = new AtomicInteger();
        IntConsumer one = r -> {
            UniformRandomProvider rng = stream(plan.seed(), r);
            int[] drawn = new int[nI];
            for (int j = 0; j < nI; j++) {
                drawn[j] = scheme.drawsInstances() ? rng.nextInt(nI) : j;
            }
            double[] t = new double[nS];
            double[] p = new double[nS];
            double[] ra = new double[nP];
            double[] di = new double[nP];
            double[] im = new double[nP];
            new Replicate(campaign, samplers, runMean, logMiss, plan, cellP, cellTts).evaluate(drawn, rng, true, t, p, ra, di, im);
            for (int s = 0; s < nS; s++) {
                tts[s][r] = t[s];
                ps[s][r] = p[s];
            }
            for (int q = 0; q < nP; q++) {
                ratio[q][r] = ra[q];
                diff[q][r] = di[q];
                improved[q][r] = im[q];
            }
            int d = done.incrementAndGet();
            if (progress != null) {
                progress.accept(d);
            }
        };
        if (plan.threads() == 1) {
            for (int r = 0; r < reps; r++) {
                one.accept(r);
            }
        } else {
            ForkJoinPool pool = new ForkJoinPool(plan.threads());
            try {
                pool.submit(() -> IntStream.range(0, reps).parallel().forEach(one)).get();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("bootstrap interrupted", e);
            } catch (ExecutionException e) {
                if (e.getCause() instanceof RuntimeException re) {
                    throw re;
                }
                throw new IllegalStateException(e.getCause());
            } finally {
                pool.shutdown();
            }
        }
        return new BootstrapResult(plan, pointTts, pointP, pointRatio, pointDiff, pointImproved, tts, ps, ratio,
                diff, improved);
    }

    /** The generator of replicate r ({@link LegacyStreams#bootstrapReplicate}). */
    public static UniformRandomProvider stream(long seed, int replicate) {
        return LegacyStreams.bootstrapReplicate(seed, replicate);
    }

    /** Ratio of two TTS values with the tie rule (equal values, including ∞ = ∞, give 1). */
    public static double ratio(double a, double b) {
        return a == b ? 1.0 : a / b;
    }

    /** Difference of two TTS values with the tie rule (equal values give 0). */
    public static double difference(double a, double b) {
        return a == b ? 0.0 : a - b;
    }

    /** One replicate's work buffers. */
    private static final class Replicate {
        private final Campaign campaign;
        private final BinomialSampler[] samplers;
        private final double[] runMean;
        private final double logMiss;
        private final BootstrapPlan plan;
        private final double[] cellP;
        private final double[] cellTts;

        Replicate(Campaign campaign, BinomialSampler[] samplers, double[] runMean, double logMiss, BootstrapPlan plan,
                double[] cellP, double[] cellTts) {
            this.campaign = campaign;
            this.samplers = samplers;
            this.runMean = runMean;
            this.logMiss = logMiss;
            this.plan = plan;
            this.cellP = cellP;
            this.cellTts = cellTts;
        }

        void evaluate(int[] drawn, UniformRandomProvider rng, boolean resample, double[] ttsOut, double[] pOut,
                double[] ratioOut, double[] diffOut, double[] improvedOut) {
            int nI = drawn.length;
            int nS = campaign.settingCount();
            double[][] tts = new double[nS][nI];
            double[][] p = new double[nS][nI];
            Resampling scheme = plan.resampling();
            boolean gauges = resample && scheme.drawsGauges();
            boolean reads = resample && scheme.drawsReads();
            for (int s = 0; s < nS; s++) {
                for (int j = 0; j < nI; j++) {
                    int c = campaign.cell(drawn[j], s);
                    int from = campaign.gaugeFrom(c);
                    int g = campaign.gaugeTo(c) - from;
                    if (g == 0) {
                        tts[s][j] = Double.NaN;
                        p[s][j] = Double.NaN;
                        continue;
                    }
                    if (!gauges && !reads) {
                        p[s][j] = cellP[c];
                        tts[s][j] = cellTts[c];
                        continue;
                    }
                    // Gauges-only: a cell with one gauge has no gauge level; its reads are its next stage.
                    boolean redraw = reads || (gauges && g == 1 && scheme == Resampling.GAUGES_ONLY);
                    long succ = 0;
                    long total = 0;
                    for (int k = 0; k < g; k++) {
                        int slot = gauges && g > 1 ? from + rng.nextInt(g) : from + k;
                        succ += redraw ? samplers[slot].sample(rng) : campaign.successes(slot);
                        total += campaign.reads(slot);
                    }
                    double pj = (double) succ / total;
                    p[s][j] = pj;
                    tts[s][j] = TimeToSolution.kernel(pj, runMean[c], logMiss);
                }
            }
            double q = plan.quantile();
            double[] work = new double[nI];
            for (int s = 0; s < nS; s++) {
                ttsOut[s] = quantileOfPresent(tts[s], work, q);
                pOut[s] = quantileOfPresent(p[s], work, q);
            }
            for (int k = 0; k < plan.pairs().size(); k++) {
                int a = plan.pairs().get(k)[0];
                int b = plan.pairs().get(k)[1];
                double[] r = new double[nI];
                double[] d = new double[nI];
                int n = 0;
                int better = 0;
                for (int j = 0; j < nI; j++) {
                    double ta = tts[a][j];
                    double tb = tts[b][j];
                    if (Double.isNaN(ta) || Double.isNaN(tb)) {
                        continue;
                    }
                    // a is the setting, b the reference: ratio TTS_b / TTS_a, difference TTS_b − TTS_a.
                    r[n] = ratio(tb, ta);
                    d[n] = difference(tb, ta);
                    if (ta < tb) {
                        better++;
                    }
                    n++;
                }
                ratioOut[k] = n == 0 ? Double.NaN : sortedQuantile(r, n, q);
                diffOut[k] = n == 0 ? Double.NaN : sortedQuantile(d, n, q);
                improvedOut[k] = n == 0 ? Double.NaN : (double) better / n;
            }
        }

        private static double quantileOfPresent(double[] values, double[] work, double q) {
            int n = 0;
            for (double v : values) {
                if (!Double.isNaN(v)) {
                    work[n++] = v;
                }
            }
            return n == 0 ? Double.NaN : sortedQuantile(work, n, q);
        }

        private static double sortedQuantile(double[] values, int n, double q) {
            Arrays.sort(values, 0, n);
            return Quantiles.sorted(values, 0, n, q);
        }
    }
}
