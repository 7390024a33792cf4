package org.obverse.anneal;

import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.model.IsingProblem;
import org.obverse.problems.SpinGlasses;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

class IntegerKernelTest extends QuietTest {
    @Test
    void integerKernelGivesTheSameSpinsAsExactMetropolis() {
        // The oracle is Metropolis as written (Metropolis et al., J. Chem. Phys. 21, 1087
        // (1953)): u = nextDouble() against StrictMath.exp(-beta dE) on every uphill move.
        // With the same random numbers the integer kernel must take every decision the same
        // way, so spins agree after each sweep and both generators end in the same state.
        Seeds.forEachCase(12, 9400, (rng, seed) -> {
            // Border cells have fewer neighbours, so the padded layout really pads.
            IntegerGlass glass = IntegerGlass.on(SpinGlasses.cellGrid(2, 3, SpinGlasses.Couplings.PLUS_MINUS_ONE, rng), rng, 3, 2);
            IsingProblem p = glass.grid;
            int n = glass.n;
            int[] start = glass.start;
            int[] neighbour = glass.neighbour;
            int[] intCoupling = glass.intCoupling;
            double[] coupling = glass.coupling;
            int[] intFields = glass.intFields;
            double[] fields = glass.fields;
            int bound = MetropolisKernels.integerFieldBound(n, start, coupling, fields, 1 << 12);
            assertThat(bound).isPositive();
            byte[] a = ExponentialBracketTest.randomSpins(n, rng);
            byte[] b = a.clone();
            byte[] c = a.clone();
            int degree = MetropolisKernels.maxDegree(n, start);
            int[] padNeighbour = MetropolisKernels.padded(n, start, neighbour, degree, true);
            int[] padCoupling = MetropolisKernels.padded(n, start, intCoupling, degree, false);
            int[] fc = new int[n];
            int[] fa = new int[n];
            double[] fb = new double[n];
            MetropolisKernels.localFields(n, start, neighbour, intCoupling, intFields, a, fa);
            MetropolisKernels.localFields(n, start, neighbour, coupling, fields, b, fb);
            MetropolisKernels.localFields(n, start, neighbour, intCoupling, intFields, c, fc);
            long[] thresholds = new long[bound + 1];
            UniformRandomProvider ra = Seeds.rng(seed + 1);
            UniformRandomProvider rb = Seeds.rng(seed + 1);
            UniformRandomProvider rc = Seeds.rng(seed + 1);
            for (int sweep = 0; sweep < 400; sweep++) {
                // beta from 0 (every move taken) to about 8 (almost none uphill).
                double beta = sweep == 0 ? 0.0 : 0.02 * sweep * rng.nextDouble();
                MetropolisKernels.integerThresholds(beta, thresholds);
                MetropolisKernels.sweepInteger(n, start, neighbour, intCoupling, a, fa, thresholds, ra);
                MetropolisKernels.sweepExactExponential(n, start, neighbour, coupling, b, fb, beta, rb);
                MetropolisKernels.sweepIntegerPadded(n, degree, padNeighbour, padCoupling, c, fc, thresholds, rc);
                assertThat(a).as("sweep %d", sweep).isEqualTo(b);
                assertThat(c).as("padded, sweep %d", sweep).isEqualTo(b);
            }
            assertThat(fc).isEqualTo(fa);
            long next = rb.nextLong();
            assertThat(ra.nextLong()).isEqualTo(next);
            assertThat(rc.nextLong()).isEqualTo(next);
        });
    }

    @Test
    void thresholdsCountTheUniformsBelowTheExponential() {
        // u = m 2^-53 is below exp(-x) exactly for m < threshold: check on both sides of the
        // boundary (closed form: the count of m with m 2^-53 < p is ceil(p 2^53)).
        Seeds.forEachCase(5, 9500, (rng, seed) -> {
            long[] t = new long[20];
            double beta = 3.0 * rng.nextDouble();
            MetropolisKernels.integerThresholds(beta, t);
            for (int v = 1; v < t.length; v++) {
                double p = StrictMath.exp(-(beta * (2.0 * v)));
                assertThat(t[v] * 0x1p-53 >= p).as("v %d", v).isTrue();
                if (t[v] > 0) {
                    assertThat((t[v] - 1) * 0x1p-53 < p).as("v %d", v).isTrue();
                }
            }
        });
    }

    @Test
    void nonIntegerOrLargeProblemsAreLeftToTheDoubleKernel() {
        // The integer kernel is only exact where every local field is an exact integer.
        int[] start = {0, 1, 2};
        assertThat(MetropolisKernels.integerFieldBound(2, start, new double[] {1.0, 1.0}, new double[] {0.5, 0}, 100))
                .isEqualTo(-1);
        assertThat(MetropolisKernels.integerFieldBound(2, start, new double[] {2.0, 2.0}, new double[] {3.0, 0}, 100))
                .isEqualTo(5);
        assertThat(MetropolisKernels.integerFieldBound(2, start, new double[] {2.0, 2.0}, new double[] {3.0, 0}, 4))
                .isEqualTo(-1);
    }
}
