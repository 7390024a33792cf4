package org.obverse.spectrum;

import org.obverse.anneal.EnergyScales;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;
import org.obverse.model.IsingProblem;
import org.obverse.spectrum.SectorBasis.Sector;
import org.obverse.testsupport.QuietTest;

/**
 * Closed forms of the anneal Hamiltonian H(s) = -(A/2) Σ σˣ + (B/2) H_P(σᶻ) for one, two and
 * three spins, each derived in the comment beside it (standard two- and four-level quantum
 * mechanics), checked with both solvers.
 */
class ClosedFormSpectrumTest extends QuietTest {
    private static final double TOL = 1e-10;
    private static final EnergyScales LINEAR = EnergyScales.illustrative();

    private static SpectrumSettings settings(SolverChoice solver, Sector sector) {
        return SpectrumSettings.defaults().withSolver(solver).withSector(sector);
    }

    /*
     * One spin with field h: H = -(A/2) σˣ + (B h/2) σᶻ = [[Bh/2, -A/2], [-A/2, -Bh/2]], whose
     * eigenvalues are ±(1/2)√(A² + (Bh)²): the gap is √(A² + (Bh)²). With the linear schedule
     * the minimum of (1-s)² + h² s² lies at s* = 1/(1 + h²), where Δmin = |h|/√(1 + h²).
     */
    @Test
    void oneSpinWithFieldHasTheTwoLevelGap() {
        double h = 0.7;
        IsingProblem p = IsingProblem.builder().field(0, h).build();
        for (SolverChoice solver : new SolverChoice[] {SolverChoice.DENSE, SolverChoice.LANCZOS}) {
            AnnealSpectrum spectrum = AnnealSpectrum.of(p, LINEAR, settings(solver, Sector.REACHABLE));
            assertThat(spectrum.basis().dimension()).isEqualTo(2);
            for (double s : new double[] {0.0, 0.13, 0.5, 0.77, 1.0}) {
                double a = 1 - s;
                double b = s;
                double[] e = spectrum.levels(s);
                double half = 0.5 * Math.sqrt(a * a + b * b * h * h);
                assertThat(e[0]).isCloseTo(-half, within(TOL));
                assertThat(e[1]).isCloseTo(half, within(TOL));
                assertThat(spectrum.gap(s)).isCloseTo(Math.sqrt(a * a + b * b * h * h), within(TOL));
            }
            MinimumGap min = spectrum.analyse(ScanSettings.defaults()).minimum();
            assertThat(min.sStar()).isCloseTo(1 / (1 + h * h), within(1e-5));
            assertThat(min.gapMin()).isCloseTo(Math.abs(h) / Math.sqrt(1 + h * h), within(1e-9));
        }
    }

    /*
     * Two spins, J = -1, no fields. H_P = -s1 s2. Full space: the odd states (|↑↑⟩ − |↓↓⟩)/√2 and
     * (|↑↓⟩ − |↓↑⟩)/√2 are annihilated by σˣ_1 + σˣ_2, so they keep their diagonal energies -B/2
     * and +B/2. The even states e1 = (|↑↑⟩ + |↓↓⟩)/√2, e2 = (|↑↓⟩ + |↓↑⟩)/√2 satisfy
     * (σˣ_1 + σˣ_2) e1 = 2 e2, so the even block is [[-B/2, -A], [-A, B/2]] with eigenvalues
     * ±√(A² + B²/4). All four: -√(A² + B²/4), -B/2, +B/2, +√(A² + B²/4). The anneal starts in
     * the even sector and stays there, so the relevant gap is 2√(A² + B²/4) and never small
     * (with A = 1 - s, B = s it is least at s = 0.8, where it equals 2√(0.04 + 0.16) ≈ 0.894),
     * while the naive full-space E1 - E0 = √(A² + B²/4) - B/2 closes at s = 1.
     */
    @Test
    void twoFerromagneticSpinsKeepOnlyTheOuterLevelsReachable() {
        IsingProblem p = IsingProblem.builder().coupling(0, 1, -1.0).build();
        for (SolverChoice solver : new SolverChoice[] {SolverChoice.DENSE, SolverChoice.LANCZOS}) {
            AnnealSpectrum reachable = AnnealSpectrum.of(p, LINEAR, settings(solver, Sector.REACHABLE));
            AnnealSpectrum full = AnnealSpectrum.of(p, LINEAR, settings(solver, Sector.FULL));
            assertThat(reachable.basis().dimension()).isEqualTo(2);
            assertThat(reachable.relevantLevel()).isEqualTo(1);
            assertThat(full.basis().dimension()).isEqualTo(4);
            for (double s : new double[] {0.0, 0.21, 0.5, 0.8, 0.97, 1.0}) {
                double a = 1 - s;
                double b = s;
                double r = Math.sqrt(a * a + b * b / 4);
                double[] all = full.levels(s);
                double[] expected = sorted(-r, -b / 2, b / 2, r);
                for (int i = 0; i < 4; i++) {
                    assertThat(all[i]).as("full level %d at s = %s", i, s).isCloseTo(expected[i], within(TOL));
                }
                double[] even = reachable.levels(s);
                assertThat(even).hasSize(2);
                assertThat(even[0]).isCloseTo(-r, within(TOL));
                assertThat(even[1]).isCloseTo(r, within(TOL));
                assertThat(reachable.gap(s)).isCloseTo(2 * r, within(TOL));
            }
            // The naive gap closes at s = 1: √(0 + 1/4) - 1/2 = 0.
            double[] atEnd = full.levels(1.0);
            assertThat(atEnd[1] - atEnd[0]).isCloseTo(0.0, within(TOL));
            MinimumGap min = reachable.analyse(ScanSettings.defaults()).minimum();
            // d/ds [(1-s)² + s²/4] = 0 at s = 0.8.
            assertThat(min.sStar()).isCloseTo(0.8, within(1e-5));
            assertThat(min.gapMin()).isCloseTo(2 * Math.sqrt(0.2), within(1e-9));
        }
    }

    /*
     * Three spins on an antiferromagnetic triangle, J = +1 on each edge, no fields: frustrated,
     * six degenerate ground states of energy -1 (one spin against the other two) and |↑↑↑⟩,
     * |↓↓↓⟩ at +3. Even sector: e0 = (|↑↑↑⟩ + |↓↓↓⟩)/√2 and e_i = the even pair with spin i
     * alone. σˣ_j e0 = e_j, σˣ_i e_i = e0, σˣ_j e_i = e_k (k the third spin), so Σσˣ = J₄ - I
     * (all ones minus identity) and H = -(A/2)(J₄ - I) + (B/2) diag(3, -1, -1, -1). On the two
     * vectors with e0-part 0 and zero sum, J₄ - I acts as -1: level (A - B)/2, twice. On
     * {e0, (e1 + e2 + e3)/√3} H = [[3B/2, -√3 A/2], [-√3 A/2, -B/2 - A]], trace B - A,
     * determinant -(3/4)(A + B)², so λ± = ((B - A) ± √((B - A)² + 3(A + B)²))/2. Three sector
     * states hold the ground energy, so the relevant level is E_3 and the relevant gap is
     * λ+ - λ- = √((B - A)² + 3(A + B)²).
     */
    @Test
    void frustratedTriangleSkipsTheGroundManifold() {
        IsingProblem p = IsingProblem.builder().coupling(0, 1, 1.0).coupling(0, 2, 1.0).coupling(1, 2, 1.0).build();
        for (SolverChoice solver : new SolverChoice[] {SolverChoice.DENSE, SolverChoice.LANCZOS}) {
            AnnealSpectrum spectrum = AnnealSpectrum.of(p, LINEAR, settings(solver, Sector.REACHABLE));
            assertThat(spectrum.basis().groundDegeneracy()).isEqualTo(3);
            assertThat(spectrum.relevantLevel()).isEqualTo(3);
            for (double s : new double[] {0.0, 0.3, 0.5, 0.9, 1.0}) {
                double a = 1 - s;
                double b = s;
                double root = Math.sqrt((b - a) * (b - a) + 3 * (a + b) * (a + b));
                double[] expected = sorted((b - a - root) / 2, (a - b) / 2, (a - b) / 2, (b - a + root) / 2);
                double[] e = spectrum.levels(s);
                for (int i = 0; i < 4; i++) {
                    assertThat(e[i]).as("level %d at s = %s", i, s).isCloseTo(expected[i], within(TOL));
                }
                assertThat(spectrum.gap(s)).isCloseTo(root, within(TOL));
            }
        }
    }

    /* A lone spin without a field: the reachable sector is the single state |+⟩, so there is no gap. */
    @Test
    void problemWithoutAnExcitedLevelIsRefused() {
        IsingProblem p = IsingProblem.builder().variable(0).build();
        assertThatThrownBy(() -> AnnealSpectrum.of(p, LINEAR, SpectrumSettings.defaults()))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("no excited level");
    }

    private static double[] sorted(double... v) {
        double[] c = v.clone();
        java.util.Arrays.sort(c);
        return c;
    }
}
