package org.obverse.anneal;

import static org.assertj.core.api.Assertions.assertThat;

import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.problems.SpinGlasses;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

/**
 * The four-word sweep against four one-word sweeps, on bare generator states (common practice,
 * no source: a reorganisation must not change a single bit, nor the number of draws): random ±c problems whose spins have from 0 to
 * 15 terms (so the fused three-level path and the one-word path for more levels both run),
 * fields or none, inverse temperatures from 0 to large, and the K4,4 cell grid.
 */
class MultiSpinFourWordTest extends QuietTest {

    @Test
    void fourWordSweepEqualsFourOneWordSweepsBitForBit() {
        Seeds.forEachCase(120, 9100, (rng, seed) -> {
            IsingProblem p = rng.nextInt(4) == 0
                    ? SpinGlasses.cellGrid(1 + rng.nextInt(3), 1 + rng.nextInt(3), SpinGlasses.Couplings.PLUS_MINUS_ONE, rng)
                    : randomPlusMinus(rng);
            MultiSpinCoding coding = MultiSpinCoding.of(p);
            int n = p.size();
            long[][] one = new long[4][n];
            long[][] four = new long[4][n];
            for (int w = 0; w < 4; w++) {
                for (int k = 0; k < n; k++) {
                    one[w][k] = rng.nextLong();
                }
                four[w] = one[w].clone();
            }
            long[][] a = new long[4][];
            long[] b = new long[8];
            for (int w = 0; w < 4; w++) {
                a[w] = new long[] {rng.nextLong(), rng.nextLong()};
                b[2 * w] = a[w][0];
                b[2 * w + 1] = a[w][1];
            }
            long[] thresholds = new long[MultiSpinCoding.thresholdLength()];
            int sweeps = 1 + rng.nextInt(6);
            for (int t = 0; t < sweeps; t++) {
                double beta = rng.nextInt(5) == 0 ? 0.0 : rng.nextDouble() * 3;
                coding.thresholds(beta, thresholds);
                for (int w = 0; w < 4; w++) {
                    coding.sweep(one[w], thresholds, a[w]);
                }
                coding.sweep4(four[0], four[1], four[2], four[3], thresholds, b);
                for (int w = 0; w < 4; w++) {
                    assertThat(four[w]).as("word %d after sweep %d", w, t).containsExactly(one[w]);
                }
            }
            // Both consumed the same number of draws: the next ones agree.
            for (int w = 0; w < 4; w++) {
                long[] fourState = {b[2 * w], b[2 * w + 1]};
                assertThat(XoroshiroState.next(fourState)).isEqualTo(XoroshiroState.next(a[w]));
            }
        });
    }

    static IsingProblem randomPlusMinus(UniformRandomProvider rng) {
        int n = 2 + rng.nextInt(30);
        double c = rng.nextBoolean() ? 1.0 : 0.5;
        int maxDegree = 1 + rng.nextInt(14);
        int[] degree = new int[n];
        IsingBuilder b = IsingProblem.builder();
        boolean fields = rng.nextBoolean();
        for (int k = 0; k < n; k++) {
            b.variable(k);
            if (fields && rng.nextInt(3) > 0) {
                b.field(k, rng.nextBoolean() ? c : -c);
                degree[k]++;
            }
        }
        double density = rng.nextDouble();
        for (int u = 0; u < n; u++) {
            for (int v = u + 1; v < n; v++) {
                boolean first = u == 0 && v == 1 && degree[0] < maxDegree; // at least one term
                if ((first || rng.nextDouble() < density) && degree[u] < maxDegree && degree[v] < maxDegree) {
                    b.coupling(u, v, rng.nextBoolean() ? c : -c);
                    degree[u]++;
                    degree[v]++;
                }
            }
        }
        return b.build();
    }
}
