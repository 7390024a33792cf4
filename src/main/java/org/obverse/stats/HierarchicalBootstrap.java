package org.obverse.stats;

import java.util.Arrays;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ForkJoinPool;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.IntConsumer;
import java.util.stream.IntStream;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

/**
 * The hierarchical bootstrap of a campaign (Efron and Tibshirani, An Introduction to the
 * Bootstrap, Chapman &amp; Hall 1993; over instances as in Rønnow et al., Science 345, 420,
 * 2014). One replicate: draw as many instances as there are, uniformly with replacement;
 * for each drawn instance and each setting it was run under, draw its gauges with
 * replacement; for each drawn gauge, redraw its successes as Binomial(reads, p̂) with p̂ its
 * observed success rate (exact inversion, {@link BinomialSampler}); pool the drawn gauges
 * into p* and TTS*. The replicate's statistic is the chosen quantile over the drawn instances
 * (type 7, {@link Quantiles}) of TTS* and of p*, and for each pair of settings the quantile of
 * the instance-wise ratio TTS*_A / TTS*_B and difference TTS*_A − TTS*_B, and the fraction of
 * instances where A is faster. The same drawn instances serve every setting (a paired design).
 *
 * <p>Ratio and difference with infinite TTS: equal values (including ∞ and ∞) give ratio 1
 * and difference 0 (a tie); ∞ against a finite value gives ratio ∞ or 0 and difference ±∞.
 *
 * <p>Reproducible to the last digit: replicate r draws only from a XO_RO_SHI_RO_128_PP
 * stream seeded from (seed, r) by SplitMix64 mixing, and writes only its own slot, so the
 * result does not depend on the thread count. Memory: one sampler per gauge slot; the table
 * itself is never needed row by row. Cost per replicate: about one uniform and one binomial
 * draw per (instance, setting, gauge).
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
        BinomialSampler[] samplers = new BinomialSampler[slots];
        for (int k = 0; k < slots; k++) {
            samplers[k] = BinomialSampler.of(campaign.reads(k), (double) campaign.successes(k) / campaign.reads(k));
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
        Replicate point = new Replicate(campaign, samplers, runMean, logMiss, plan);
        point.evaluate(identity, null, false, pointTts, pointP, pointRatio, pointDiff, pointImproved);

        AtomicInteger done = new AtomicInteger();
        IntConsumer one = r -> {
            UniformRandomProvider rng = stream(plan.seed(), r);
            int[] drawn = new int[nI];
            for (int j = 0; j < nI; j++) {
                drawn[j] = rng.nextInt(nI);
            }
            double[] t = new double[nS];
            double[] p = new double[nS];
            double[] ra = new double[nP];
            double[] di = new double[nP];
            double[] im = new double[nP];
            new Replicate(campaign, samplers, runMean, logMiss, plan).evaluate(drawn, rng, true, t, p, ra, di, im);
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

    /** The generator of replicate r: XO_RO_SHI_RO_128_PP seeded by SplitMix64 from (seed, r). */
    public static UniformRandomProvider stream(long seed, int replicate) {
        long z = mix(seed ^ 0x6a09e667f3bcc909L) + replicate * 0x9e3779b97f4a7c15L;
        long a = mix(z);
        long b = mix(z + 0x9e3779b97f4a7c15L);
        if ((a | b) == 0) {
            b = 1;
        }
        return RandomSource.XO_RO_SHI_RO_128_PP.create(new long[] {a, b});
    }

    private static long mix(long x) {
        long z = x + 0x9e3779b97f4a7c15L;
        z = (z ^ (z >>> 30)) * 0xbf58476d1ce4e5b9L;
        z = (z ^ (z >>> 27)) * 0x94d049bb133111ebL;
        return z ^ (z >>> 31);
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

        Replicate(Campaign campaign, BinomialSampler[] samplers, double[] runMean, double logMiss, BootstrapPlan plan) {
            this.campaign = campaign;
            this.samplers = samplers;
            this.runMean = runMean;
            this.logMiss = logMiss;
            this.plan = plan;
        }

        void evaluate(int[] drawn, UniformRandomProvider rng, boolean resample, double[] ttsOut, double[] pOut,
                double[] ratioOut, double[] diffOut, double[] improvedOut) {
            int nI = drawn.length;
            int nS = campaign.settingCount();
            double[][] tts = new double[nS][nI];
            double[][] p = new double[nS][nI];
            boolean gauges = resample && plan.resampleGauges();
            boolean reads = resample && plan.resampleReads();
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
                    long succ = 0;
                    long total = 0;
                    for (int k = 0; k < g; k++) {
                        int slot = gauges ? from + rng.nextInt(g) : from + k;
                        succ += reads ? samplers[slot].sample(rng) : campaign.successes(slot);
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
                    r[n] = ratio(ta, tb);
                    d[n] = difference(ta, tb);
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
