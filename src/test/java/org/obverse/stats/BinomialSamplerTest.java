package org.obverse.stats;

import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.distribution.ChiSquaredDistribution;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

/** The exact binomial sampler against the binomial distribution of commons-math3. */
class BinomialSamplerTest extends QuietTest {
    @Test
    void chiSquareGoodnessOfFit() {
        // Each case: chi-square test at level 1e-4; over 7 cases the chance of a false failure
        // is below 7e-4 (Bonferroni). Cells with expected count < 5 are merged into their neighbours.
        long[][] cases = {{10, 30}, {1000, 2}, {1000, 500}, {1000, 990}, {100_000, 3}, {7, 100}, {1_000_000, 400}};
        int draws = 20_000;
        int c = 0;
        for (long[] k : cases) {
            long n = k[0];
            double p = k[1] / 1000.0;
            UniformRandomProvider rng = Seeds.rng(4242 + c++);
            BinomialSampler s = BinomialSampler.of(n, p);
            BinomialDistribution ref = new BinomialDistribution(null, (int) n, p);
            int span = (int) Math.min(n, (long) (n * p + 12 * Math.sqrt(n * p * (1 - p)) + 20));
            int lowest = (int) Math.max(0, (long) (n * p - 12 * Math.sqrt(n * p * (1 - p)) - 20));
            long[] counts = new long[span - lowest + 1];
            for (int i = 0; i < draws; i++) {
                long x = s.sample(rng);
                assertThat(x).isBetween(0L, n);
                counts[(int) Math.max(0, Math.min(span, x) - lowest)]++;
            }
            // Bins: x <= lowest, each x in between, x >= span; merged until each expects >= 5.
            double chi = 0;
            int bins = 0;
            double expAcc = 0;
            double obsAcc = 0;
            for (int x = lowest; x <= span; x++) {
                double mass = x == lowest ? ref.cumulativeProbability(x)
                        : x == span ? 1 - ref.cumulativeProbability(x - 1) : ref.probability(x);
                expAcc += draws * mass;
                obsAcc += counts[x - lowest];
                boolean restSmall = x < span && draws * (1 - ref.cumulativeProbability(x)) < 5;
                if ((expAcc >= 5 && !restSmall) || x == span) {
                    chi += (obsAcc - expAcc) * (obsAcc - expAcc) / Math.max(expAcc, 1e-300);
                    bins++;
                    expAcc = 0;
                    obsAcc = 0;
                }
            }
            int dof = bins - 1;
            if (dof >= 1) {
                double pValue = 1 - new ChiSquaredDistribution(null, dof).cumulativeProbability(chi);
                assertThat(pValue).as("n=%s p=%s chi=%s dof=%s", n, p, chi, dof).isGreaterThan(1e-4);
            }
        }
    }

    @Test
    void degenerateAndReproducible() {
        UniformRandomProvider rng = Seeds.rng(1);
        assertThat(BinomialSampler.of(50, 0).sample(rng)).isZero();
        assertThat(BinomialSampler.of(50, 1).sample(rng)).isEqualTo(50);
        assertThat(BinomialSampler.of(0, 0.3).sample(rng)).isZero();
        BinomialSampler s = BinomialSampler.of(1000, 0.37);
        UniformRandomProvider a = Seeds.rng(9);
        UniformRandomProvider b = Seeds.rng(9);
        for (int i = 0; i < 100; i++) {
            assertThat(s.sample(a)).isEqualTo(s.sample(b));
        }
    }

    @Test
    void meanAndVarianceOverManyDraws() {
        // n = 1000, p = 0.2: mean 200, variance 160. With 40 000 draws the sample mean has
        // standard error 0.063; a 6-sigma bound fails by chance with probability ~2e-9.
        UniformRandomProvider rng = Seeds.rng(5);
        BinomialSampler s = BinomialSampler.of(1000, 0.2);
        double sum = 0;
        double sq = 0;
        int m = 40_000;
        for (int i = 0; i < m; i++) {
            double x = s.sample(rng);
            sum += x;
            sq += x * x;
        }
        double mean = sum / m;
        double var = sq / m - mean * mean;
        assertThat(mean).isBetween(200 - 6 * 0.0633, 200 + 6 * 0.0633);
        assertThat(var).isBetween(150.0, 170.0);
    }
}
