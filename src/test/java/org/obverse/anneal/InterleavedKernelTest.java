package org.obverse.anneal;

import static org.assertj.core.api.Assertions.assertThat;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.obverse.model.IsingProblem;
import org.obverse.problems.SpinGlasses;
import org.obverse.random.RandomStreams;
import org.obverse.random.StreamPurpose;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

/**
 * The four-read integer kernel and the signed-field double kernel against the kernels they stand
 * in for (common practice, no source: an optimisation must not change a single decision). The
 * oracle behind all of them is Metropolis as written (Metropolis et al., J. Chem. Phys. 21,
 * 1087 (1953)): u = nextDouble() of Commons RNG's XO_RO_SHI_RO_128_PP against
 * StrictMath.exp(−β ΔE) on every uphill move ({@link MetropolisKernels#sweepExactExponential}).
 */
class InterleavedKernelTest extends QuietTest {

    @Test
    void fourReadKernelEqualsEachReadSweptAlone() {
        Seeds.forEachCase(16, 10100, (rng, seed) -> {
            IsingProblem grid = SpinGlasses.cellGrid(1 + rng.nextInt(3), 1 + rng.nextInt(3),
                    SpinGlasses.Couplings.PLUS_MINUS_ONE, rng);
            // Couplings up to ±40 in some cases: fields beyond a byte, negative lanes.
            int scale = rng.nextBoolean() ? 3 : 40;
            IntegerGlass glass = IntegerGlass.on(grid, rng, scale, scale);
            IsingProblem p = glass.grid;
            int n = glass.n;
            int[] start = glass.start;
            int[] neighbour = glass.neighbour;
            int[] intCoupling = glass.intCoupling;
            double[] coupling = glass.coupling;
            int[] intFields = glass.intFields;
            double[] fields = glass.fields;
            int bound = MetropolisKernels.integerFieldBound(n, start, coupling, fields, 1 << 12);
            assertThat(bound).isBetween(0, MetropolisKernels.FOUR_FIELD_LIMIT);
            int degree = MetropolisKernels.maxDegree(n, start);
            boolean padded = rng.nextBoolean();
            int d = padded ? degree : 0;
            int[] rowNeighbour = padded ? MetropolisKernels.padded(n, start, neighbour, degree, true) : neighbour;
            int[] rowCoupling = padded ? MetropolisKernels.padded(n, start, intCoupling, degree, false) : intCoupling;
            int[] terms = MetropolisKernels.interleavedTerms(rowNeighbour, rowCoupling);
            int four = MetropolisKernels.FOUR;

            // Each read: the exact reference (generator object) beside the four-read kernel.
            byte[][] ref = new byte[four][];
            double[][] refField = new double[four][n];
            UniformRandomProvider[] g = new UniformRandomProvider[four];
            byte[] spins = new byte[four * n];
            long[] states = new long[2 * four];
            for (int i = 0; i < four; i++) {
                ref[i] = ExponentialBracketTest.randomSpins(n, rng);
                for (int k = 0; k < n; k++) {
                    spins[four * k + i] = ref[i][k];
                }
                MetropolisKernels.localFields(n, start, neighbour, coupling, fields, ref[i], refField[i]);
                long[] raw = {rng.nextLong(), rng.nextLong()};
                g[i] = RandomSource.XO_RO_SHI_RO_128_PP.create(raw.clone());
                states[2 * i] = raw[0];
                states[2 * i + 1] = raw[1];
            }
            long[] field = new long[n];
            MetropolisKernels.packedLocalFields(n, start, neighbour, intCoupling, intFields, spins, field);
            long[] thresholds = new long[bound + 1];
            for (int sweep = 0; sweep < 200; sweep++) {
                double beta = sweep == 0 ? 0.0 : 0.04 * sweep * rng.nextDouble() / Math.max(1, scale / 3);
                MetropolisKernels.integerThresholds(beta, thresholds);
                for (int i = 0; i < four; i++) {
                    MetropolisKernels.sweepExactExponential(n, start, neighbour, coupling, ref[i], refField[i], beta, g[i]);
                }
                MetropolisKernels.sweepIntegerFour(n, d, start, terms, spins, field, states, thresholds);
                for (int i = 0; i < four; i++) {
                    for (int k = 0; k < n; k++) {
                        assertThat(spins[four * k + i]).as("read %d, spin %d, sweep %d, padded %s", i, k, sweep, padded)
                                .isEqualTo(ref[i][k]);
                    }
                }
            }
            for (int i = 0; i < four; i++) {
                for (int k = 0; k < n; k++) {
                    assertThat((double) MetropolisKernels.fieldLane(field[k], i)).as("field %d of read %d", k, i)
                            .isEqualTo(refField[i][k]);
                }
                // The same number of draws: each state agrees with its own generator's.
                long[] state = {states[2 * i], states[2 * i + 1]};
                assertThat(XoroshiroState.next(state)).as("state of read %d", i).isEqualTo(g[i].nextLong());
            }
        });
    }

    @Test
    void packedFieldsKeepEveryLane() {
        // The packed form against plain ints: packing, lane by lane reading, and linearity
        // (adding packed changes adds lane by lane) up to the limit, negative lanes included.
        Seeds.forEachCase(20, 10150, (rng, seed) -> {
            int lim = MetropolisKernels.FOUR_FIELD_LIMIT;
            int[] f = new int[4];
            int[] d = new int[4];
            for (int i = 0; i < 4; i++) {
                f[i] = rng.nextInt(2 * lim + 1) - lim;
            }
            for (int t = 0; t < 2000; t++) {
                for (int i = 0; i < 4; i++) {
                    d[i] = rng.nextInt(2 * lim + 1) - lim - f[i];
                    d[i] = Math.max(-lim - f[i], Math.min(lim - f[i], d[i]));
                }
                long packed = MetropolisKernels.packFields(f[0], f[1], f[2], f[3]);
                long delta = (long) d[0] + ((long) d[1] << 16) + ((long) d[2] << 32) + ((long) d[3] << 48);
                long sum = packed + delta;
                for (int i = 0; i < 4; i++) {
                    assertThat(MetropolisKernels.fieldLane(packed, i)).as("lane %d", i).isEqualTo(f[i]);
                    assertThat(MetropolisKernels.fieldLane(sum, i)).as("lane %d after adding", i).isEqualTo(f[i] + d[i]);
                    f[i] += d[i];
                }
            }
        });
    }

    @Test
    void bitsBracketDecidesAsTheExactComparison() {
        // u = m·2⁻⁵³ against StrictMath.exp(−x), with m on and next to the scaled exponential.
        Seeds.forEachCase(5, 10200, (rng, seed) -> {
            for (int t = 0; t < 200_000; t++) {
                double x = rng.nextInt(4) == 0 ? rng.nextInt(1100) * ExponentialBracket.STEP : 40.0 * rng.nextDouble();
                if (x == 0.0) {
                    continue;
                }
                double exact = StrictMath.exp(-x);
                long near = (long) Math.floor(exact * 0x1p53) + rng.nextInt(5) - 2;
                long m = rng.nextBoolean() ? rng.nextLong() >>> 11 : Math.max(0, Math.min((1L << 53) - 1, near));
                double u = m * 0x1p-53;
                assertThat(ExponentialBracket.acceptsBits(x, m)).as("x %s, m %d", x, m).isEqualTo(u < exact);
                assertThat(ExponentialBracket.acceptsBits(x, m)).as("x %s, m %d", x, m)
                        .isEqualTo(ExponentialBracket.accepts(x, u));
            }
        });
    }

    @Test
    void scaledBracketDecidesAsTheExactComparison() {
        // x = c·g and its table index from (32c)·g, as the signed kernel computes them, against
        // u < StrictMath.exp(−x); c and g over many magnitudes, subnormal products included.
        Seeds.forEachCase(5, 10250, (rng, seed) -> {
            for (int t = 0; t < 200_000; t++) {
                double c = Math.scalb(rng.nextDouble() + 0.5, rng.nextInt(20) - 10);
                double g = rng.nextInt(20) == 0 ? Math.scalb(rng.nextDouble(), -1060) : Math.scalb(rng.nextDouble(), rng.nextInt(16) - 8);
                double x = c * g;
                double exact = StrictMath.exp(-x);
                long near = (long) Math.floor(exact * 0x1p53) + rng.nextInt(5) - 2;
                long m = rng.nextBoolean() ? rng.nextLong() >>> 11 : Math.max(0, Math.min((1L << 53) - 1, near));
                assertThat(ExponentialBracket.acceptsBits(x, (c / ExponentialBracket.STEP) * g, m))
                        .as("c %s, g %s, m %d", c, g, m).isEqualTo(m * 0x1p-53 < exact);
            }
        });
    }

    @Test
    void signedKernelTakesTheDecisionsOfTheDoubleKernel() {
        // Gaussian couplings and fields (inexact sums, where rounding could part the two forms),
        // β from 0 (every move taken) to hot enough that few uphill moves are.
        Seeds.forEachCase(16, 10300, (rng, seed) -> {
            IsingProblem p = SpinGlasses.cellGrid(1 + rng.nextInt(3), 1 + rng.nextInt(3),
                    SpinGlasses.Couplings.GAUSSIAN, rng);
            int n = p.size();
            ExponentialBracketTest.Csr csr = ExponentialBracketTest.Csr.of(p);
            double[] fields = new double[n];
            for (int k = 0; k < n; k++) {
                fields[k] = rng.nextBoolean() ? 0.0 : rng.nextDouble() * 2 - 1;
            }
            byte[] ref = ExponentialBracketTest.randomSpins(n, rng);
            byte[] spins = ref.clone();
            double[] refField = new double[n];
            double[] field = new double[n];
            double[] spin = new double[n];
            MetropolisKernels.localFields(n, csr.start, csr.neighbour, csr.coupling, fields, ref, refField);
            MetropolisKernels.localFields(n, csr.start, csr.neighbour, csr.coupling, fields, spins, field);
            MetropolisKernels.signedFields(n, spins, spin, field);
            long[] raw = {rng.nextLong(), rng.nextLong()};
            UniformRandomProvider g = RandomSource.XO_RO_SHI_RO_128_PP.create(raw.clone());
            long[] state = raw;
            for (int sweep = 0; sweep < 200; sweep++) {
                double beta = sweep == 0 ? 0.0 : 0.05 * sweep * rng.nextDouble();
                MetropolisKernels.sweepExactExponential(n, csr.start, csr.neighbour, csr.coupling, ref, refField, beta, g);
                MetropolisKernels.sweepSigned(n, csr.start, csr.neighbour, csr.coupling, spin, field, beta, state);
                for (int k = 0; k < n; k++) {
                    assertThat(spin[k]).as("spin %d, sweep %d", k, sweep).isEqualTo((double) ref[k]);
                    // g = s·f exactly (a zero may carry either sign).
                    assertThat(field[k] == ref[k] * refField[k]).as("field %d, sweep %d: %s against %s", k, sweep,
                            field[k], ref[k] * refField[k]).isTrue();
                }
            }
            assertThat(XoroshiroState.next(state)).isEqualTo(g.nextLong());
        });
    }

    @Test
    void samplerReadsEqualMetropolisAsWrittenReadByRead() {
        // The whole exact path (integer reads in fours, the last one to three alone, signed fields for
        // the rest, both thread counts) against each read run alone on its own generator with
        // the reference kernel.
        Seeds.forEachCase(8, 10400, (rng, seed) -> {
            boolean gaussian = rng.nextBoolean();
            IsingProblem base = SpinGlasses.cellGrid(1 + rng.nextInt(2), 1 + rng.nextInt(2),
                    gaussian ? SpinGlasses.Couplings.GAUSSIAN : SpinGlasses.Couplings.PLUS_MINUS_ONE, rng);
            int n = base.size();
            double[] fields = new double[n];
            double[] couplings = base.couplings().clone();
            for (int k = 0; k < n; k++) {
                fields[k] = gaussian ? rng.nextDouble() - 0.5 : rng.nextInt(5) - 2;
            }
            for (int e = 0; e < couplings.length; e++) {
                couplings[e] *= gaussian ? 1.0 : 1 + rng.nextInt(3);
            }
            IsingProblem p = IsingProblem.of(base.variables(), fields, base.edgeUs(), base.edgeVs(), couplings, 0.0);
            int reads = 1 + rng.nextInt(140);
            long sampleSeed = rng.nextLong();
            SamplerSettings settings = SamplerSettings.defaults().withThreads(1 + rng.nextInt(2));
            SampledReads got = ReferenceSampler.of(settings).sample(p, reads, sampleSeed);
            double[] range = BetaRange.automatic(p);
            double[] betas = BetaRange.perSweep(settings, range[0], range[1]);
            ExponentialBracketTest.Csr csr = ExponentialBracketTest.Csr.of(p);
            byte[] s = new byte[n];
            double[] f = new double[n];
            for (int r = 0; r < reads; r++) {
                UniformRandomProvider g = RandomStreams.generator(sampleSeed, StreamPurpose.READS, r);
                ReadByRead.randomSpins(s, g);
                MetropolisKernels.localFields(n, csr.start, csr.neighbour, csr.coupling, fields, s, f);
                for (double beta : betas) {
                    MetropolisKernels.sweepExactExponential(n, csr.start, csr.neighbour, csr.coupling, s, f, beta, g);
                }
                for (int k = 0; k < n; k++) {
                    assertThat(got.samples().spin(r, k)).as("read %d of %d, spin %d, gaussian %s", r, reads, k, gaussian)
                            .isEqualTo(s[k]);
                }
                assertThat(got.energies()[r]).as("energy of read %d", r).isEqualTo(p.energy(s));
            }
        });
    }
}
