package org.obverse.spectrum;

import org.obverse.anneal.EnergyScales;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;
import org.obverse.model.IsingProblem;
import org.obverse.spectrum.SectorBasis.Sector;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

/**
 * Differential checks: the matrix-free Lanczos solver against EJML's dense symmetric
 * eigendecomposition (the oracle for the dense case), and both against an independent
 * construction of H(s) diagonalised by commons-math3 ({@link ReferenceHamiltonian}).
 */
class SolverAgreementTest extends QuietTest {
    private static final double TOL = 1e-10;

    /* Random problems of 3..8 spins, with and without fields, at random s and at s = 0, 1 (degenerate). */
    @Test
    void lanczosAgreesWithDense() {
        Seeds.forEachCase(30, 9100, (rng, seed) -> {
            int n = 3 + rng.nextInt(6);
            boolean fields = rng.nextBoolean();
            IsingProblem p = TestProblems.random(rng, n, 0.4, fields);
            Sector sector = rng.nextInt(4) == 0 ? Sector.FULL : Sector.REACHABLE;
            SpectrumSettings base = SpectrumSettings.defaults().withLevels(2 + rng.nextInt(6)).withSector(sector);
            EnergyScales schedule = EnergyScales.illustrative();
            AnnealSpectrum dense = AnnealSpectrum.of(p, schedule, base.withSolver(SolverChoice.DENSE));
            AnnealSpectrum lanczos = AnnealSpectrum.of(p, schedule, base.withSolver(SolverChoice.LANCZOS));
            double[] sValues = {0.0, 1.0, rng.nextDouble(), rng.nextDouble()};
            for (double s : sValues) {
                double[] d = dense.levels(s);
                double[] l = lanczos.levels(s);
                assertThat(l).hasSameSizeAs(d);
                for (int i = 0; i < d.length; i++) {
                    assertThat(l[i]).as("n=%d fields=%s level %d at s=%s", n, fields, i, s)
                            .isCloseTo(d[i], within(TOL));
                }
            }
        });
    }

    /*
     * Massive degeneracy: couplings ±1 and fields 0 or ±0.5 give many equal problem energies, so
     * at s = 1 (diagonal), near it (split levels) and at s = 0 (the pure driver) Lanczos must
     * find every copy of a degenerate level, up to ten levels.
     */
    @Test
    void lanczosFindsEveryCopyOfDegenerateLevels() {
        Seeds.forEachCase(40, 9500, (rng, seed) -> {
            int n = 3 + rng.nextInt(6);
            org.obverse.model.IsingBuilder b = IsingProblem.builder();
            for (int k = 0; k < n; k++) {
                b.variable(k);
                if (k > 0) {
                    b.coupling(rng.nextInt(k), k, rng.nextBoolean() ? 1.0 : -1.0);
                }
                int f = rng.nextInt(4);
                if (f == 1) {
                    b.field(k, 0.5);
                } else if (f == 2) {
                    b.field(k, -0.5);
                }
            }
            IsingProblem p = b.build();
            SpectrumSettings base = SpectrumSettings.defaults().withLevels(2 + rng.nextInt(9))
                    .withSector(rng.nextBoolean() ? Sector.FULL : Sector.REACHABLE);
            EnergyScales schedule = EnergyScales.illustrative();
            AnnealSpectrum dense = AnnealSpectrum.of(p, schedule, base.withSolver(SolverChoice.DENSE));
            AnnealSpectrum lanczos = AnnealSpectrum.of(p, schedule, base.withSolver(SolverChoice.LANCZOS));
            for (double s : new double[] {0.0, 1.0, 0.999, rng.nextDouble()}) {
                double[] d = dense.levels(s);
                double[] l = lanczos.levels(s);
                assertThat(l).hasSameSizeAs(d);
                for (int i = 0; i < d.length; i++) {
                    assertThat(l[i]).as("n=%d level %d of %d at s=%s", n, i, d.length, s).isCloseTo(d[i], within(TOL));
                }
            }
        });
    }

    /* Full-space levels equal the independent commons-math3 oracle's lowest ones. */
    @Test
    void fullSpectrumMatchesIndependentOracle() {
        Seeds.forEachCase(20, 9200, (rng, seed) -> {
            int n = 2 + rng.nextInt(6);
            IsingProblem p = TestProblems.random(rng, n, 0.5, rng.nextBoolean());
            double s = rng.nextDouble();
            double[] oracle = ReferenceHamiltonian.eigenvalues(ReferenceHamiltonian.full(p, 1 - s, s));
            SpectrumSettings settings = SpectrumSettings.defaults().withLevels(Math.min(6, 1 << n))
                    .withSector(Sector.FULL).withSolver(SolverChoice.LANCZOS);
            double[] e = AnnealSpectrum.of(p, EnergyScales.illustrative(), settings).levels(s);
            for (int i = 0; i < e.length; i++) {
                assertThat(e[i]).isCloseTo(oracle[i], within(TOL));
            }
        });
    }

    /* For connected problems without fields, the reachable sector is the oracle's even sector of the global flip. */
    @Test
    void reachableSectorMatchesOracleEvenSector() {
        Seeds.forEachCase(20, 9300, (rng, seed) -> {
            int n = 2 + rng.nextInt(6);
            IsingProblem p = TestProblems.random(rng, n, 0.5, false);
            double s = rng.nextDouble();
            double[] oracle = ReferenceHamiltonian.eigenvalues(ReferenceHamiltonian.even(p, 1 - s, s));
            for (SolverChoice solver : new SolverChoice[] {SolverChoice.DENSE, SolverChoice.LANCZOS}) {
                SpectrumSettings settings = SpectrumSettings.defaults().withLevels(Math.min(5, oracle.length))
                        .withSolver(solver);
                AnnealSpectrum spectrum = AnnealSpectrum.of(p, EnergyScales.illustrative(), settings);
                assertThat(spectrum.basis().dimension()).isEqualTo(1 << (n - 1));
                double[] e = spectrum.levels(s);
                for (int i = 0; i < e.length; i++) {
                    assertThat(e[i]).isCloseTo(oracle[i], within(TOL));
                }
            }
        });
    }

    /* A larger case: 10 spins with fields (dimension 1024), where the dense solve still takes about a second. */
    @Test
    void lanczosAgreesWithDenseAtTheDenseLimit() {
        Seeds.forEachCase(1, 9400, (rng, seed) -> {
            IsingProblem p = TestProblems.random(rng, 10, 0.3, true);
            SpectrumSettings settings = SpectrumSettings.defaults().withLevels(4);
            EnergyScales schedule = EnergyScales.illustrative();
            double s = 0.4;
            double[] d = AnnealSpectrum.of(p, schedule, settings.withSolver(SolverChoice.DENSE)).levels(s);
            double[] l = AnnealSpectrum.of(p, schedule, settings.withSolver(SolverChoice.LANCZOS)).levels(s);
            for (int i = 0; i < d.length; i++) {
                assertThat(l[i]).isCloseTo(d[i], within(TOL));
            }
        });
    }

    /*
     * The basis size is a cost trade-off, never an accuracy one: for any minimum basis (6, the
     * former default 12, today's 16, 24) the levels equal EJML's dense eigendecomposition (the
     * oracle) at s = 0 (the pure driver: binomially degenerate levels), at s = 1 (diagonal) and
     * at random s, with and without fields, up to ten levels.
     */
    @Test
    void everyBasisSizeAgreesWithDense() {
        int[] bases = {6, 12, LanczosLevelSolver.DEFAULT_MINIMUM_BASIS, 24};
        Seeds.forEachCase(24, 9600, (rng, seed) -> {
            int n = 3 + rng.nextInt(6);
            IsingProblem p = TestProblems.random(rng, n, 0.4, rng.nextBoolean());
            SectorBasis basis = SectorBasis.of(p, rng.nextBoolean() ? Sector.FULL : Sector.REACHABLE);
            int count = Math.min(basis.dimension(), 2 + rng.nextInt(9));
            LanczosLevelSolver solver = LanczosLevelSolver.create().withMinimumBasis(bases[rng.nextInt(bases.length)]);
            for (double s : new double[] {0.0, 1.0, rng.nextDouble()}) {
                AnnealOperator op = AnnealOperator.of(basis, 1 - s, s);
                double[] d = DenseLevelSolver.create().lowest(op, count);
                LanczosLevelSolver.Solution l = solver.lowestWithVectors(op, count, null);
                assertThat(l.values()).hasSameSizeAs(d);
                for (int i = 0; i < d.length; i++) {
                    assertThat(l.values()[i]).as("n=%d level %d of %d at s=%s", n, i, d.length, s)
                            .isCloseTo(d[i], within(TOL));
                }
                assertThat(l.products()).as("products").isPositive();
            }
        });
    }

    /*
     * The pure driver at s = 0 in the full space: levels -(A/2)(n - 2j) with multiplicity
     * C(n, j) (j flipped spins; the spectrum of a sum of commuting Pauli X, any quantum
     * mechanics text, e.g. Sakurai and Napolitano, Modern Quantum Mechanics, 2nd ed., 2011):
     * the Lanczos solver returns every copy, for every basis size. A solver that keeps one
     * copy of a repeated level (as a single-vector Krylov run without restart from fresh
     * directions does) fails here.
     */
    @Test
    void driverLevelsComeWithTheirBinomialMultiplicity() {
        int[] bases = {6, 12, LanczosLevelSolver.DEFAULT_MINIMUM_BASIS, 24};
        Seeds.forEachCase(12, 9700, (rng, seed) -> {
            int n = 4 + rng.nextInt(7);
            IsingProblem p = TestProblems.random(rng, n, 0.4, rng.nextBoolean());
            SectorBasis basis = SectorBasis.of(p, Sector.FULL);
            int count = Math.min(1 + n + 3, basis.dimension());
            LanczosLevelSolver solver = LanczosLevelSolver.create().withMinimumBasis(bases[rng.nextInt(bases.length)]);
            double[] l = solver.lowest(AnnealOperator.of(basis, 1.0, 0.0), count);
            assertThat(l).hasSize(count);
            for (int i = 0; i < count; i++) {
                int flipped = i == 0 ? 0 : (i <= n ? 1 : 2);
                assertThat(l[i]).as("n=%d level %d", n, i).isCloseTo(-0.5 * (n - 2 * flipped), within(TOL));
            }
        });
    }

    /*
     * A start from the eigenvectors of a converged cold solve needs fewer products than the cold
     * start from a random vector, and both give EJML's dense levels (the warm start along a scan
     * rests on this; common practice, no source).
     */
    @Test
    void exactStartVectorsSaveProducts() {
        Seeds.forEachCase(6, 9750, (rng, seed) -> {
            IsingProblem p = TestProblems.random(rng, 9, 0.4, true);
            SectorBasis basis = SectorBasis.of(p, Sector.FULL);
            double s = 0.2 + 0.6 * rng.nextDouble();
            AnnealOperator op = AnnealOperator.of(basis, 1 - s, s);
            LanczosLevelSolver.Solution cold = LanczosLevelSolver.create().lowestWithVectors(op, 4, null);
            LanczosLevelSolver.Solution warm = LanczosLevelSolver.create().lowestWithVectors(op, 4, cold.vectors());
            double[] d = DenseLevelSolver.create().lowest(op, 4);
            for (int i = 0; i < 4; i++) {
                assertThat(warm.values()[i]).as("warm level %d", i).isCloseTo(d[i], within(TOL));
                assertThat(cold.values()[i]).as("cold level %d", i).isCloseTo(d[i], within(TOL));
            }
            assertThat(warm.products()).as("warm products").isLessThan(cold.products());
        });
    }
}
