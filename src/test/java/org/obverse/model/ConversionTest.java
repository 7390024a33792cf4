package org.obverse.model;

import org.junit.jupiter.api.Test;
import org.obverse.testsupport.Generated;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

class ConversionTest extends QuietTest {

    /**
     * Glover, Kochenberger & Du, "Quantum Bridge Analytics I: a tutorial on formulating and using
     * QUBO models", 4OR 17, 335 (2019), arXiv:1811.11538, §2 opening example (values from memory
     * of the tutorial): minimise y = -5x1 - 3x2 - 8x3 - 6x4 + 4x1x2 + 8x1x3 + 2x2x3 + 10x3x4;
     * the optimum is y = -11 at x = (1, 0, 0, 1). Checked here by brute force over all 16
     * assignments in both the binary and the converted spin form.
     */
    @Test
    void publishedWorkedQuboKeepsItsOptimumThroughTheSpinForm() {
        BinaryProblem q = BinaryProblem.builder()
                .term(1, 1, -5).term(2, 2, -3).term(3, 3, -8).term(4, 4, -6)
                .term(1, 2, 4).term(1, 3, 8).term(2, 3, 2).term(3, 4, 10)
                .build();
        IsingProblem s = q.toIsing();
        double best = Double.POSITIVE_INFINITY;
        int bestMask = -1;
        for (int mask = 0; mask < 16; mask++) {
            byte[] x = new byte[4];
            byte[] spins = new byte[4];
            for (int k = 0; k < 4; k++) {
                x[k] = (byte) ((mask >>> k) & 1);
                spins[k] = (byte) (2 * x[k] - 1);
            }
            double eb = q.energy(x);
            assertThat(s.energy(spins)).isEqualTo(eb); // dyadic values: exact
            if (eb < best) {
                best = eb;
                bestMask = mask;
            }
        }
        assertThat(best).isEqualTo(-11.0);
        assertThat(bestMask).isEqualTo(0b1001);
    }

    /**
     * Closed form (common practice, derivation here): for J_ij = 1 on all pairs,
     * Σ_{i<j} s_i s_j = (M² − n) / 2 with M = Σ s_i; M² is smallest (0 or 1) at balance, so
     * the ground energy is −⌊n/2⌋.
     */
    @Test
    void allToAllAntiferromagnetHasGroundEnergyMinusHalfN() {
        for (int n = 2; n <= 12; n++) {
            IsingBuilder b = IsingProblem.builder();
            for (int i = 0; i < n; i++) {
                for (int j = i + 1; j < n; j++) {
                    b.coupling(i, j, 1.0);
                }
            }
            IsingProblem p = b.build();
            double best = Double.POSITIVE_INFINITY;
            byte[] s = new byte[n];
            for (int mask = 0; mask < (1 << n); mask++) {
                for (int k = 0; k < n; k++) {
                    s[k] = (byte) (((mask >>> k) & 1) * 2 - 1);
                }
                best = Math.min(best, p.energy(s));
            }
            assertThat(best).as("n = %d", n).isEqualTo(-(double) (n / 2));
        }
    }

    @Test
    void spinToBinaryAndBackPreservesEveryEnergy() {
        Seeds.forEachCase(200, 1000, (rng, seed) -> {
            IsingProblem p = Generated.isingProblem(rng, 12, 0.35);
            BinaryProblem q = p.toBinary();
            IsingProblem back = q.toIsing();
            for (int t = 0; t < 20; t++) {
                byte[] s = new byte[p.size()];
                byte[] x = new byte[p.size()];
                for (int k = 0; k < s.length; k++) {
                    s[k] = (byte) (rng.nextBoolean() ? 1 : -1);
                    x[k] = (byte) ((1 + s[k]) / 2);
                }
                double e = p.energy(s);
                double tol = 1e-12 * (1 + Math.abs(e) + p.size() + p.edgeCount());
                assertThat(q.energy(x)).isCloseTo(e, within(tol));
                assertThat(back.energy(s)).isCloseTo(e, within(tol));
            }
        });
    }

    @Test
    void builderRefusesBadTermsAndNamesThem() {
        assertThatThrownBy(() -> IsingProblem.builder().coupling(3, 3, 1.0).build())
                .isInstanceOf(InvalidProblemException.class).hasMessageContaining("(3, 3)").hasMessageContaining("itself");
        assertThatThrownBy(() -> IsingProblem.builder().coupling(1, 2, 1.0).coupling(2, 1, 0.5))
                .hasMessageContaining("(2, 1)").hasMessageContaining("twice");
        assertThatThrownBy(() -> IsingProblem.builder().field(4, Double.NaN))
                .hasMessageContaining("field of 4").hasMessageContaining("not a finite number");
        assertThatThrownBy(() -> IsingProblem.builder().field(-1, 1.0)).hasMessageContaining("negative");
        assertThatThrownBy(() -> BinaryProblem.builder().term(0, 0, 1).term(0, 0, 2)).hasMessageContaining("twice");
    }

    @Test
    void sparseIdsKeepTheirPositionsInAscendingOrder() {
        IsingProblem p = IsingProblem.builder().coupling(900, 7, -1.5).field(42, 0.25).variable(3).build();
        assertThat(p.variables().toArray()).containsExactly(3, 7, 42, 900);
        assertThat(p.edgeCount()).isEqualTo(1);
        assertThat(p.variables().id(p.edgeU(0))).isEqualTo(7);
        assertThat(p.variables().id(p.edgeV(0))).isEqualTo(900);
        assertThat(p.field(2)).isEqualTo(0.25);
        assertThat(p.edgeBetween(3, 1)).isEqualTo(0);
        assertThat(p.edgeBetween(0, 1)).isEqualTo(-1);
    }
}
