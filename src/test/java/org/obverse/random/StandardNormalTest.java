package org.obverse.random;

import org.apache.commons.math3.distribution.ChiSquaredDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.stat.inference.KolmogorovSmirnovTest;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The polar draws: the numbers the two former samplers gave (anneal's control-error offsets
 * and problems' spin-glass couplings, which pinned sampler reads and problems depend on), and
 * their distribution against N(0, 1) with commons-math3 3.6.1 as the oracle.
 */
class StandardNormalTest extends QuietTest {
    /** Draws per case of the distribution checks. */
    private static final int DRAWS = 20_000;
    /** A check fails below this p-value. */
    private static final double ALPHA = 1e-4;

    @Test
    void givesTheGoldenValuesOfTheFormerSamplers() {
        // Printed by anneal.StreamSeeds.gaussian(generator(2026, 3, 4)) (commit f4fe974).
        UniformRandomProvider rng = RandomStreams.generator(2026, 3, 4);
        assertThat(StandardNormal.draw(rng)).isEqualTo(0x1.97d5bb0f64f06p-1);
        assertThat(StandardNormal.draw(rng)).isEqualTo(0x1.d9e9609efb7dcp-1);
        assertThat(StandardNormal.draw(rng)).isEqualTo(0x1.91ec706830635p-4);
    }

    @Test
    void matchesTheFormerPolarSamplersBitForBit() {
        Seeds.forEachCase(200, 5_000, (rng, seed) -> {
            long s = rng.nextLong();
            UniformRandomProvider ours = RandomStreams.generator(s, 1, 0);
            UniformRandomProvider former = RandomStreams.generator(s, 1, 0);
            for (int i = 0; i < 32; i++) {
                assertThat(Double.doubleToRawLongBits(StandardNormal.draw(ours)))
                        .isEqualTo(Double.doubleToRawLongBits(formerPolar(former)));
            }
        });
    }

    @Test
    void meanVarianceAndShapeAgreeWithTheStandardNormal() {
        // Under N(0, 1) (commons-math3's NormalDistribution and ChiSquaredDistribution): the
        // mean of n draws is N(0, 1/n); (n − 1)·s² is χ²(n − 1); the Kolmogorov–Smirnov
        // statistic against the normal's CDF has the p-value commons-math3 computes. Each
        // two-sided check fails with probability ALPHA = 1e-4 for a correct sampler: three
        // checks over 5 cases give a false-failure rate of about 1.5e-3 (seeds are fixed, so
        // a pass stays a pass).
        NormalDistribution normal = new NormalDistribution(null, 0, 1);
        ChiSquaredDistribution chi2 = new ChiSquaredDistribution(null, DRAWS - 1);
        Seeds.forEachCase(5, 5_500, (rng, seed) -> {
            double[] x = new double[DRAWS];
            double sum = 0;
            for (int i = 0; i < DRAWS; i++) {
                x[i] = StandardNormal.draw(rng);
                sum += x[i];
            }
            double mean = sum / DRAWS;
            double squares = 0;
            for (double v : x) {
                squares += (v - mean) * (v - mean);
            }
            double z = (mean - normal.getMean()) / Math.sqrt(normal.getNumericalVariance() / DRAWS);
            double pMean = 2 * normal.cumulativeProbability(-Math.abs(z));
            double below = chi2.cumulativeProbability(squares / normal.getNumericalVariance());
            double pVariance = 2 * Math.min(below, 1 - below);
            double pShape = new KolmogorovSmirnovTest().kolmogorovSmirnovTest(normal, x);
            assertThat(pMean).as("mean %s", mean).isGreaterThan(ALPHA);
            assertThat(pVariance).as("variance %s", squares / (DRAWS - 1)).isGreaterThan(ALPHA);
            assertThat(pShape).as("Kolmogorov–Smirnov").isGreaterThan(ALPHA);
        });
    }

    // anneal.StreamSeeds.gaussian and problems.SpinGlasses.gaussian as they stood before the move
    // (the two were the same code).
    private static double formerPolar(UniformRandomProvider rng) {
        while (true) {
            double x = 2.0 * rng.nextDouble() - 1.0;
            double y = 2.0 * rng.nextDouble() - 1.0;
            double r = x * x + y * y;
            if (r > 0.0 && r < 1.0) {
                return x * StrictMath.sqrt(-2.0 * StrictMath.log(r) / r);
            }
        }
    }
}
