package org.obverse.anneal;

import java.math.BigDecimal;
import java.math.MathContext;
import java.util.Arrays;
import org.apache.commons.math3.stat.inference.ChiSquareTest;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.problems.SpinGlasses;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The steady multi-spin kernel ({@link SteadyMultiSpin}): its lane form against its one-block
 * form, the one-block form against the rule written out read by read, its thresholds against
 * exp(−β ΔE), and its reads against the exact Boltzmann distribution of small problems by full
 * enumeration (Metropolis et al., J. Chem. Phys. 21, 1087, 1953; chi-square by commons-math3
 * as the oracle), plus independence of the reads and of the thread count.
 */
class SteadyMultiSpinTest extends QuietTest {

    @Test
    void laneSweepEqualsOneBlockSweepsBitForBit() {
        // Lanes 1 to 70, spins with more than six neighbours (the one-lane path), the cell grid
        // and spins with at most six neighbours, with and without fields (the padded lane path,
        // three and four uphill levels), beta 0 (every uphill move taken) to 20 (nearly none).
        Seeds.forEachCase(60, 12_500, (rng, seed) -> {
            IsingProblem p = rng.nextInt(3) == 0
                    ? SpinGlasses.cellGrid(1 + rng.nextInt(3), 1 + rng.nextInt(3), SpinGlasses.Couplings.PLUS_MINUS_ONE, rng)
                    : MultiSpinFourWordTest.randomPlusMinus(rng);
            if (rng.nextBoolean() && p.edgeCount() > 0) {
                // Fields ±c on some spins: seven terms at a grid spin (four uphill levels).
                double c = Math.abs(p.coupling(0));
                double[] h = new double[p.size()];
                for (int k = 0; k < h.length; k++) {
                    h[k] = p.degree(k) <= 6 && rng.nextInt(3) > 0 ? (rng.nextBoolean() ? c : -c) : 0;
                }
                p = IsingProblem.of(p.variables(), h, p.edgeUs(), p.edgeVs(), p.couplings(), 0.0);
            }
            SteadyMultiSpin kernel = SteadyMultiSpin.of(p);
            LaneCheck.lanesEqualBlocksAlone(kernel, rng);
        });
    }

    @Test
    void oneBlockSweepFollowsTheRuleReadByRead() {
        // The rule written out independently, read by read: read r's uniform U is bit r of the
        // words drawn, most significant first; an uphill read flips where U < P as unsigned
        // 64-bit integers, P = floor(exp(-beta dE) 2^63) 2; the block draws max(12, the words
        // up to the last bit where an uphill read's U first differs from its P) words, 64 at most.
        Seeds.forEachCase(80, 13_100, (rng, seed) -> {
            IsingProblem p = MultiSpinFourWordTest.randomPlusMinus(rng);
            SteadyMultiSpin kernel = SteadyMultiSpin.of(p);
            int n = p.size();
            double c = Math.abs(p.edgeCount() > 0 ? p.coupling(0) : p.field(0));
            long[] bits = new long[n];
            for (int k = 0; k < n; k++) {
                bits[k] = rng.nextLong();
            }
            long[] state = {rng.nextLong(), rng.nextLong()};
            long[] expectBits = bits.clone();
            long[] expectState = state.clone();
            double beta = rng.nextInt(4) == 0 ? 4 * rng.nextDouble() : rng.nextDouble();
            long[] thresholds = new long[MultiSpinCoding.thresholdLength()];
            kernel.thresholds(beta, thresholds);
            kernel.sweep(bits, thresholds, state);
            for (int k = 0; k < n; k++) {
                long[] words = new long[64];
                long[] probe = expectState.clone();
                for (int j = 0; j < 64; j++) {
                    words[j] = XoroshiroState.next(probe);
                }
                int used = SteadyMultiSpin.FIXED_WORDS;
                long flips = 0;
                for (int r = 0; r < 64; r++) {
                    double f = p.field(k);
                    for (int q = p.adjacencyStarts()[k]; q < p.adjacencyStarts()[k + 1]; q++) {
                        f += p.coupling(p.adjacencyEdges()[q]) * spin(expectBits[p.adjacencyVariables()[q]], r);
                    }
                    double dE = -2 * spin(expectBits[k], r) * f; // E = sum h s + sum J s s
                    if (dE <= 0) {
                        flips |= 1L << r;
                        continue;
                    }
                    long steps = Math.round(dE / (2 * c));
                    long threshold = ((long) (StrictMath.exp(-beta * 2.0 * c * steps) * 0x1p63)) << 1;
                    long u = 0;
                    for (int j = 0; j < 64; j++) {
                        u |= ((words[j] >>> r) & 1L) << (63 - j);
                    }
                    if (Long.compareUnsigned(u, threshold) < 0) {
                        flips |= 1L << r;
                    }
                    int firstDifference = u == threshold ? 64 : Long.numberOfLeadingZeros(u ^ threshold) + 1;
                    used = Math.max(used, firstDifference);
                }
                expectBits[k] ^= flips;
                for (int j = 0; j < used; j++) {
                    XoroshiroState.next(expectState);
                }
            }
            assertThat(bits).as("spins after one sweep, beta %s", beta).containsExactly(expectBits);
            assertThat(state).as("generator state after one sweep").containsExactly(expectState);
        });
    }

    private static int spin(long word, int read) {
        return ((word >>> read) & 1L) == 1L ? 1 : -1;
    }

    @Test
    void acceptanceIsExpOfMinusBetaDeltaEWithinTwoToMinus63() {
        // The kernel flips an uphill read where U < P for U uniform on the 2^64 integers (the
        // rule above), so the acceptance is exactly P / 2^64: P of the 2^64 values lie below P.
        // That differs from exp(-beta dE) by less than 2^-63 (the truncation) plus StrictMath.exp's
        // own error (1 ulp; Math.exp here, the reference, adds another); checked in exact
        // decimal arithmetic for every level and many beta.
        Seeds.forEachCase(200, 13_400, (rng, seed) -> {
            double c = rng.nextBoolean() ? 1.0 : 0.25 + rng.nextDouble();
            IsingProblem p = IsingProblem.builder().coupling(0, 1, c).build();
            SteadyMultiSpin kernel = SteadyMultiSpin.of(p);
            double beta = rng.nextInt(3) == 0 ? 10 * rng.nextDouble() : rng.nextDouble();
            long[] thresholds = new long[MultiSpinCoding.thresholdLength()];
            kernel.thresholds(beta, thresholds);
            BigDecimal two64 = new BigDecimal(2).pow(64);
            BigDecimal bound = BigDecimal.ONE.divide(new BigDecimal(2).pow(63));
            for (int d = 1; d <= MultiSpinCoding.MAX_TERMS; d++) {
                for (int m = 0; 2 * m < d; m++) {
                    double e = Math.exp(-beta * 2 * c * (d - 2 * m));
                    BigDecimal acceptance = new BigDecimal(Long.toUnsignedString(thresholds[d * 8 + m]))
                            .divide(two64, MathContext.DECIMAL128);
                    BigDecimal error = acceptance.subtract(new BigDecimal(e)).abs();
                    assertThat(error).as("d %d, m %d, beta %s", d, m, beta)
                            .isLessThanOrEqualTo(bound.add(new BigDecimal(2 * Math.ulp(e))));
                }
            }
        });
    }

    /** A ±1 problem on n spins: a ring plus random chords, fields ±1 on about half the spins if asked. */
    private static IsingProblem smallGlass(int n, boolean fields, UniformRandomProvider rng) {
        IsingBuilder b = IsingProblem.builder();
        for (int k = 0; k < n; k++) {
            b.coupling(k, (k + 1) % n, rng.nextBoolean() ? 1 : -1);
            if (fields && rng.nextBoolean()) {
                b.field(k, rng.nextBoolean() ? 1 : -1);
            }
        }
        for (int chord = 0; chord < n / 2; chord++) {
            int u = rng.nextInt(n);
            int v = rng.nextInt(n);
            if (u != v && (u - v + n) % n != 1 && (v - u + n) % n != 1) {
                b.coupling(Math.min(u, v), Math.max(u, v), rng.nextBoolean() ? 1 : -1);
            }
        }
        return b.build();
    }

    private static SampledReads steady(IsingProblem p, double beta, int sweeps, int reads, long seed, int threads) {
        SamplerSettings s = SamplerSettings.defaults().withKernel(SamplerSettings.Kernel.MULTI_SPIN_STEADY)
                .withBetaRange(beta, beta).withSweepsPerMicrosecond(sweeps).withThreads(threads);
        return ReferenceSampler.of(s).sample(p, reads, seed);
    }

    @Test
    void smallProblemsAreSampledFromTheBoltzmannDistribution() {
        // 8 to 12 spins, with and without fields, at a fixed beta: each read is its own chain
        // from a random start, 150 sweeps, so the reads are independent draws from the chain's
        // law after 150 sweeps, which on these sizes is the Boltzmann law to far below the
        // sampling noise. Full enumeration gives the exact law. Checks: chi-square (states with
        // an expected count below 5 pooled) at p > 1e-4 (four checks: a false failure below 4e-4,
        // fixed seeds, so reproducible), and the total-variation distance against the bound
        // E[TV] <= (1/2) sum_s sqrt(p_s / N) plus 0.02 (McDiarmid: exceeded with probability
        // below exp(-2 (0.02)^2 N) < 1e-20): common practice for testing a sampler, no source.
        int[][] cases = {{8, 0}, {10, 1}, {11, 0}, {12, 1}};
        for (int[] cs : cases) {
            int n = cs[0];
            boolean fields = cs[1] == 1;
            long seed = 14_000 + n;
            IsingProblem p = smallGlass(n, fields, Seeds.rng(seed));
            double beta = 0.35;
            int reads = 64 * 1024;
            SampledReads s = steady(p, beta, 150, reads, seed, 2);
            int states = 1 << n;
            long[] observed = new long[states];
            for (int r = 0; r < reads; r++) {
                int code = 0;
                for (int k = 0; k < n; k++) {
                    code |= (s.samples().spin(r, k) > 0 ? 1 : 0) << k;
                }
                observed[code]++;
            }
            double[] prob = new double[states];
            double z = 0;
            byte[] spins = new byte[n];
            for (int code = 0; code < states; code++) {
                for (int k = 0; k < n; k++) {
                    spins[k] = (byte) (((code >>> k) & 1) == 1 ? 1 : -1);
                }
                prob[code] = Math.exp(-beta * p.energy(spins));
                z += prob[code];
            }
            double tv = 0;
            double tvBound = 0;
            double pooledExpected = 0;
            long pooledObserved = 0;
            double[] expected = new double[states + 1];
            long[] seen = new long[states + 1];
            int cells = 0;
            for (int code = 0; code < states; code++) {
                prob[code] /= z;
                tv += 0.5 * Math.abs(observed[code] / (double) reads - prob[code]);
                tvBound += 0.5 * Math.sqrt(prob[code] / reads);
                double e = prob[code] * reads;
                if (e < 5) {
                    pooledExpected += e;
                    pooledObserved += observed[code];
                } else {
                    expected[cells] = e;
                    seen[cells++] = observed[code];
                }
            }
            if (pooledExpected > 0) {
                expected[cells] = pooledExpected;
                seen[cells++] = pooledObserved;
            }
            double pValue = new ChiSquareTest().chiSquareTest(Arrays.copyOf(expected, cells), Arrays.copyOf(seen, cells));
            assertThat(pValue).as("%d spins, fields %s, seed %d: chi-square p-value", n, fields, seed).isGreaterThan(1e-4);
            assertThat(tv).as("%d spins, fields %s, seed %d: total variation", n, fields, seed)
                    .isLessThan(tvBound + 0.02);
        }
    }

    @Test
    void readsOfOneWordAndOfNeighbouringBlocksAreUncorrelated() {
        // Reads share random words (bit r of each word is read r's) and lanes share loops; the
        // energies of read pairs (r, r+1) within a word and (r, r+64) across blocks must be
        // uncorrelated: |Pearson r| below 5 standard errors 5/sqrt(pairs) (common practice, no source).
        IsingProblem p = smallGlass(10, true, Seeds.rng(14_500));
        int reads = 64 * 1024;
        SampledReads s = steady(p, 0.35, 150, reads, 14_501, 1);
        double[] e = s.energies();
        for (int lag : new int[] {1, 7, 64, 65}) {
            int pairs = 0;
            double sx = 0;
            double sy = 0;
            double sxx = 0;
            double syy = 0;
            double sxy = 0;
            for (int r = 0; r + lag < reads; r += 2 * lag) {
                double x = e[r];
                double y = e[r + lag];
                sx += x;
                sy += y;
                sxx += x * x;
                syy += y * y;
                sxy += x * y;
                pairs++;
            }
            double cov = sxy / pairs - sx / pairs * sy / pairs;
            double corr = cov / Math.sqrt((sxx / pairs - sx * sx / pairs / pairs) * (syy / pairs - sy * sy / pairs / pairs));
            assertThat(Math.abs(corr)).as("lag %d, %d pairs", lag, pairs).isLessThan(5 / Math.sqrt(pairs));
        }
    }

    @Test
    void readsDependOnNeitherTheThreadCountNorTheReadCount() {
        IsingProblem p = SpinGlasses.cellGrid(2, 2, SpinGlasses.Couplings.PLUS_MINUS_ONE, Seeds.rng(14_600));
        SamplerSettings base = SamplerSettings.defaults().withKernel(SamplerSettings.Kernel.MULTI_SPIN_STEADY)
                .withSweepsPerMicrosecond(50);
        SampledReads one = ReferenceSampler.of(base.withThreads(1)).sample(p, 5000, 9);
        for (int threads : new int[] {2, 3}) {
            SampledReads many = ReferenceSampler.of(base.withThreads(threads)).sample(p, 5000, 9);
            assertThat(many.samples().toSpins()).as("%d threads", threads).isEqualTo(one.samples().toSpins());
            assertThat(many.energies()).as("%d threads", threads).isEqualTo(one.energies());
        }
        // The first 200 reads of a 200-read run are those of the 5,000-read run (the rule is per block).
        SampledReads few = ReferenceSampler.of(base.withThreads(2)).sample(p, 200, 9);
        byte[] all = one.samples().toSpins();
        assertThat(few.samples().toSpins()).isEqualTo(Arrays.copyOf(all, 200 * p.size()));
        // And they are not the first multi-spin kernel's reads (other draws).
        SampledReads old = ReferenceSampler.of(base.withKernel(SamplerSettings.Kernel.MULTI_SPIN)).sample(p, 200, 9);
        assertThat(old.samples().toSpins()).isNotEqualTo(few.samples().toSpins());
    }
}
