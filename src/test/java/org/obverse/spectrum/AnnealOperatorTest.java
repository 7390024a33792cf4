package org.obverse.spectrum;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.spectrum.SectorBasis.Sector;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

/** The matrix-free product against the dense matrix (EJML's product as the oracle), and threads against one. */
class AnnealOperatorTest extends QuietTest {
    @Test
    void productEqualsTheDenseMatrixTimesTheVector() {
        Seeds.forEachCase(30, 5100, (rng, seed) -> {
            int n = 1 + rng.nextInt(11);
            IsingBuilder b = IsingProblem.builder();
            // Several components, some with fields and some without, so anchors flip several bits.
            for (int k = 0; k < n; k++) {
                b.variable(k);
                if (k > 0 && rng.nextInt(4) != 0) {
                    b.coupling(rng.nextInt(k), k, rng.nextDouble() * 2 - 1);
                }
                if (rng.nextInt(3) == 0) {
                    b.field(k, rng.nextDouble() * 2 - 1);
                }
            }
            IsingProblem p = b.build();
            SectorBasis basis = SectorBasis.of(p, rng.nextBoolean() ? Sector.REACHABLE : Sector.FULL);
            AnnealOperator op = AnnealOperator.of(basis, rng.nextDouble() * 3, rng.nextDouble() * 3);
            int d = op.dimension();
            DMatrixRMaj h = DenseLevelSolver.matrix(op);
            DMatrixRMaj x = new DMatrixRMaj(d, 1);
            for (int i = 0; i < d; i++) {
                x.set(i, 0, rng.nextDouble() - 0.5);
            }
            DMatrixRMaj expected = new DMatrixRMaj(d, 1);
            CommonOps_DDRM.mult(h, x, expected);
            double[] y = new double[d];
            op.apply(x.data.clone(), y);
            for (int i = 0; i < d; i++) {
                assertThat(y[i]).isCloseTo(expected.get(i, 0), within(1e-12));
            }
            // The matrix is symmetric: the sector's driver is a sum of involutions b -> b ^ mask.
            assertThat(org.ejml.dense.row.MatrixFeatures_DDRM.isSymmetric(h, 0.0)).isTrue();
        });
    }

    /* Chunks over threads write disjoint ranges in a fixed order: bit for bit equal to one thread. */
    @Test
    void threadsGiveTheSameProductBitForBit() {
        Seeds.forEachCase(2, 5200, (rng, seed) -> {
            IsingProblem p = TestProblems.random(rng, 16, 0.15, true);
            AnnealOperator op = AnnealOperator.of(SectorBasis.of(p, Sector.REACHABLE), 0.7, 0.3);
            double[] x = new double[op.dimension()];
            for (int i = 0; i < x.length; i++) {
                x[i] = rng.nextDouble() - 0.5;
            }
            double[] both = new double[x.length];
            double[] one = new double[x.length];
            op.apply(x, both);
            op.applySingleThreaded(x, one);
            assertThat(both).containsExactly(one);
        });
    }
}
