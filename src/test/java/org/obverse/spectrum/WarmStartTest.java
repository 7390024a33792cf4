package org.obverse.spectrum;

import org.obverse.anneal.EnergyScales;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.Arrays;
import java.util.Comparator;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
import org.junit.jupiter.api.Test;
import org.obverse.model.IsingProblem;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

/**
 * The warm-started Lanczos solves of a scan: the same levels as independent cold solves and
 * as EJML's dense symmetric eigendecomposition (the oracle), and no level missed whatever the
 * start vectors are.
 */
class WarmStartTest extends QuietTest {
    private static final double TOL = 1e-10;

    /* Random 10-spin problems with fields (2^10 states): a warm-started scan against cold solves and dense. */
    @Test
    void warmScanMatchesColdSolves() {
        Seeds.forEachCase(2, 9900, (rng, seed) -> {
            IsingProblem p = TestProblems.random(rng, 10, 0.3, true);
            SpectrumSettings base = SpectrumSettings.defaults().withLevels(4);
            EnergyScales schedule = EnergyScales.illustrative();
            AnnealSpectrum lanczos = AnnealSpectrum.of(p, schedule, base.withSolver(SolverChoice.LANCZOS));
            AnnealSpectrum dense = AnnealSpectrum.of(p, schedule, base.withSolver(SolverChoice.DENSE));
            double[] grid = ScanSettings.defaults().withPoints(21).grid();
            GapScan scan = lanczos.scan(grid);
            // s = 0 (the pure driver, degenerate), the clustered start, mid-anneal and the end.
            // Dense (EJML) as the outside oracle at two of them.
            for (int r : new int[] {0, 1, 2, 10, 19, 20}) {
                double s = scan.s(r);
                double[] warm = scan.levels(r);
                double[] cold = lanczos.levels(s);
                assertThat(warm).hasSameSizeAs(cold);
                for (int i = 0; i < warm.length; i++) {
                    assertThat(warm[i]).as("level %d at s=%s (cold)", i, s).isCloseTo(cold[i], within(TOL));
                }
                if (r == 1 || r == 10) {
                    double[] oracle = dense.levels(s);
                    for (int i = 0; i < warm.length; i++) {
                        assertThat(warm[i]).as("level %d at s=%s (dense)", i, s).isCloseTo(oracle[i], within(TOL));
                    }
                }
            }
        });
    }

    /*
     * Adversarial start vectors: the exact eigenvectors of levels 4..7 (from EJML), which span
     * nothing of the wanted four. The confirmation run must still find the lowest four.
     */
    @Test
    void excitedStartVectorsStillGiveTheLowestLevels() {
        Seeds.forEachCase(5, 9950, (rng, seed) -> {
            int n = 6 + rng.nextInt(3);
            IsingProblem p = TestProblems.random(rng, n, 0.4, rng.nextBoolean());
            SectorBasis basis = SectorBasis.of(p, SectorBasis.Sector.FULL);
            double s = 0.05 + 0.9 * rng.nextDouble();
            AnnealOperator op = AnnealOperator.of(basis, 1 - s, s);
            DMatrixRMaj h = DenseLevelSolver.matrix(op);
            int d = h.numRows;
            EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(d, true, true);
            assertThat(eig.decompose(h.copy())).isTrue();
            Integer[] order = new Integer[d];
            for (int i = 0; i < d; i++) {
                order[i] = i;
            }
            Arrays.sort(order, Comparator.comparingDouble(i -> eig.getEigenvalue(i).getReal()));
            double[][] start = new double[4][d];
            for (int c = 0; c < 4; c++) {
                DMatrixRMaj v = eig.getEigenVector(order[4 + c]);
                for (int i = 0; i < d; i++) {
                    start[c][i] = v.get(i, 0);
                }
            }
            LanczosLevelSolver.Solution got = LanczosLevelSolver.create().lowestWithVectors(op, 4, start);
            assertThat(got.values()).hasSize(4);
            for (int i = 0; i < 4; i++) {
                double expected = eig.getEigenvalue(order[i]).getReal();
                assertThat(got.values()[i]).as("level %d at s=%s", i, s).isCloseTo(expected, within(TOL));
                // The returned vector is an eigenvector of its level: ‖Hv − λv‖ small.
                double[] v = got.vectors()[i];
                double[] hv = new double[d];
                op.apply(v, hv);
                double r2 = 0.0;
                for (int j = 0; j < d; j++) {
                    double e = hv[j] - got.values()[i] * v[j];
                    r2 += e * e;
                }
                assertThat(Math.sqrt(r2)).as("residual of vector %d", i).isLessThan(1e-8);
            }
        });
    }

    /*
     * The driver start vectors. At s = 0 they are exact eigenvectors of the pure driver with the
     * closed-form levels −(A/2)(n − 2j) (j flipped spins, binomial degeneracy C(n, j)) in the
     * full space; at s = 1e-4 their Rayleigh quotients match EJML's dense levels to second
     * order in B (first-order degenerate perturbation theory: Sakurai and Napolitano, Modern
     * Quantum Mechanics, 2nd ed., 2011, §5.2). In the reachable sector: against dense at both.
     */
    @Test
    void driverStartVectorsAreTheDriversEigenvectors() {
        Seeds.forEachCase(10, 9980, (rng, seed) -> {
            int n = 4 + rng.nextInt(5);
            IsingProblem p = TestProblems.random(rng, n, 0.4, rng.nextBoolean());
            SectorBasis.Sector sector = rng.nextBoolean() ? SectorBasis.Sector.FULL : SectorBasis.Sector.REACHABLE;
            SectorBasis basis = SectorBasis.of(p, sector);
            int count = Math.min(basis.dimension(), 2 + rng.nextInt(n + 2));
            double[][] v = DriverStart.vectors(basis, count);
            assertThat(v).hasNumberOfRows(count);
            int d = basis.dimension();
            for (int i = 0; i < count; i++) {
                for (int j = 0; j <= i; j++) {
                    assertThat(Vectors.dot(v[i], v[j], d)).as("<v%d|v%d>", i, j).isCloseTo(i == j ? 1.0 : 0.0, within(1e-12));
                }
            }
            // The one-vector seed is the normalised sum of the vectors.
            double[] seedVector = DriverStart.seed(basis, count);
            for (int b = 0; b < d; b++) {
                double sum = 0.0;
                for (double[] vi : v) {
                    sum += vi[b];
                }
                assertThat(seedVector[b]).as("seed[%d]", b).isCloseTo(sum / Math.sqrt(count), within(1e-12));
            }
            for (double s : new double[] {0.0, 1e-4}) {
                AnnealOperator op = AnnealOperator.of(basis, 1 - s, s);
                double[] oracle = DenseLevelSolver.create().lowest(op, count);
                double[] hv = new double[d];
                for (int i = 0; i < count; i++) {
                    op.apply(v[i], hv);
                    double quotient = Vectors.dot(v[i], hv, d);
                    assertThat(quotient).as("Rayleigh quotient %d at s=%s", i, s).isCloseTo(oracle[i], within(s == 0 ? 1e-12 : 1e-5));
                    if (s == 0.0) {
                        double r2 = 0.0;
                        for (int b = 0; b < d; b++) {
                            double e = hv[b] - quotient * v[i][b];
                            r2 += e * e;
                        }
                        assertThat(Math.sqrt(r2)).as("driver residual %d", i).isLessThan(1e-12);
                        if (sector == SectorBasis.Sector.FULL) {
                            int flipped = i == 0 ? 0 : (i <= n ? 1 : 2);
                            assertThat(quotient).isCloseTo(-0.5 * (n - 2 * flipped), within(1e-12));
                        }
                    }
                }
            }
        });
    }
}
