package org.obverse.anneal;

import static org.assertj.core.api.Assertions.assertThat;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.obverse.model.IsingProblem;
import org.obverse.problems.SpinGlasses;
import org.obverse.random.RandomStreams;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

/**
 * The fast kernels on a bare generator state against the reference paths (common practice, no
 * source: an optimisation must not change a single decision). The oracle for the exact kernels
 * is Metropolis as written (Metropolis et al., J. Chem. Phys. 21, 1087 (1953)): u =
 * nextDouble() of Commons RNG's XO_RO_SHI_RO_128_PP compared with StrictMath.exp(−β ΔE) on
 * every uphill move ({@link MetropolisKernels#sweepExactExponential}); for the multi-spin
 * kernels it is the generator-object sweep.
 */
class BranchFreeKernelTest extends QuietTest {

    @Test
    void bareStateDrawsTheWordsOfTheCommonsGenerator() {
        // The algorithm of Blackman & Vigna, ACM TOMS 47(4) (2021), as Commons RNG implements it.
        Seeds.forEachCase(200, 9600, (rng, seed) -> {
            long s = rng.nextLong();
            long tag = rng.nextInt(8);
            long index = rng.nextInt(1 << 20);
            long[] state = RandomStreams.state(s, tag, index);
            UniformRandomProvider g = RandomStreams.generator(s, tag, index);
            long[] raw = {rng.nextLong(), rng.nextLong()};
            UniformRandomProvider h = RandomSource.XO_RO_SHI_RO_128_PP.create(raw.clone());
            for (int i = 0; i < 500; i++) {
                assertThat(XoroshiroState.next(state)).as("word %d", i).isEqualTo(g.nextLong());
                assertThat(XoroshiroState.next(raw)).as("raw word %d", i).isEqualTo(h.nextLong());
            }
        });
    }

    @Test
    void branchFreeIntegerKernelTakesTheExactDecisions() {
        Seeds.forEachCase(12, 9700, (rng, seed) -> {
            IntegerGlass glass = IntegerGlass.random(rng, 3, 2);
            IsingProblem p = glass.grid;
            int n = glass.n;
            int[] start = glass.start;
            int[] neighbour = glass.neighbour;
            int[] intCoupling = glass.intCoupling;
            double[] coupling = glass.coupling;
            int[] intFields = glass.intFields;
            double[] fields = glass.fields;
            int bound = MetropolisKernels.integerFieldBound(n, start, coupling, fields, 1 << 12);
            int degree = MetropolisKernels.maxDegree(n, start);
            int[] padNeighbour = MetropolisKernels.padded(n, start, neighbour, degree, true);
            int[] padCoupling = MetropolisKernels.padded(n, start, intCoupling, degree, false);
            byte[] ref = ExponentialBracketTest.randomSpins(n, rng);
            byte[] rows = ref.clone();
            byte[] pad = ref.clone();
            double[] fRef = new double[n];
            int[] fRows = new int[n];
            int[] fPad = new int[n];
            MetropolisKernels.localFields(n, start, neighbour, coupling, fields, ref, fRef);
            MetropolisKernels.localFields(n, start, neighbour, intCoupling, intFields, rows, fRows);
            MetropolisKernels.localFields(n, start, neighbour, intCoupling, intFields, pad, fPad);
            long[] raw = {rng.nextLong(), rng.nextLong()};
            UniformRandomProvider g = RandomSource.XO_RO_SHI_RO_128_PP.create(raw.clone());
            long[] stRows = raw.clone();
            long[] stPad = raw.clone();
            long[] thresholds = new long[bound + 1];
            for (int sweep = 0; sweep < 300; sweep++) {
                // beta from 0 (every move taken) to about 8 (almost none uphill).
                double beta = sweep == 0 ? 0.0 : 0.027 * sweep * rng.nextDouble();
                MetropolisKernels.integerThresholds(beta, thresholds);
                MetropolisKernels.sweepExactExponential(n, start, neighbour, coupling, ref, fRef, beta, g);
                MetropolisKernels.sweepIntegerBranchFree(n, 0, start, neighbour, intCoupling, rows, fRows, thresholds,
                        stRows);
                MetropolisKernels.sweepIntegerBranchFree(n, degree, start, padNeighbour, padCoupling, pad, fPad,
                        thresholds, stPad);
                assertThat(rows).as("rows, sweep %d", sweep).isEqualTo(ref);
                assertThat(pad).as("padded, sweep %d", sweep).isEqualTo(ref);
            }
            assertThat(fPad).isEqualTo(fRows);
            // The same number of draws: the states agree with the generator's.
            long next = g.nextLong();
            assertThat(XoroshiroState.next(stRows)).isEqualTo(next);
            assertThat(XoroshiroState.next(stPad)).isEqualTo(next);
        });
    }

    @Test
    void laneSweepEqualsOneWordSweepsBitForBit() {
        // Lanes from 1 to 70 (short vector loops and long ones), spins with up to 15 terms (the
        // one-lane path for more than three uphill levels), fields or none, the cell grid.
        Seeds.forEachCase(60, 9970, (rng, seed) -> {
            IsingProblem p = rng.nextInt(3) == 0
                    ? SpinGlasses.cellGrid(1 + rng.nextInt(3), 1 + rng.nextInt(3), SpinGlasses.Couplings.PLUS_MINUS_ONE, rng)
                    : MultiSpinFourWordTest.randomPlusMinus(rng);
            MultiSpinCoding coding = MultiSpinCoding.of(p);
            LaneCheck.lanesEqualBlocksAlone(coding, rng);
        });
    }
}
