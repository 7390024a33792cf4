package org.obverse.spectrum;

import org.obverse.anneal.EnergyScales;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;
import org.obverse.gauge.Gauge;
import org.obverse.gauge.GaugeTransform;
import org.obverse.model.IsingProblem;
import org.obverse.spectrum.SectorBasis.Sector;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

/**
 * Invariances of the anneal spectrum over generated problems (standard quantum mechanics):
 * gauges are unitary equivalences, an energy shift of H_P moves every level by the same
 * amount, and scaling A and B together scales H(s).
 */
class SpectrumPropertyTest extends QuietTest {
    private static final double TOL = 1e-10;

    /*
     * U = ∏_{g_i = −1} σˣ_i gives U σᶻ_i U = g_i σᶻ_i and U σˣ_i U = σˣ_i (REFERENCES.md,
     * "Spin-reversal algebra"), so U H(s) U = H'(s): identical spectra, in the full space and in
     * the reachable sector (U fixes |+…+⟩ and commutes with every component flip).
     */
    @Test
    void randomGaugesLeaveTheSpectrumUnchanged() {
        Seeds.forEachCase(20, 7100, (rng, seed) -> {
            int n = 2 + rng.nextInt(7);
            IsingProblem p = TestProblems.random(rng, n, 0.4, rng.nextBoolean());
            IsingProblem gauged = TestProblems.gauged(p, TestProblems.randomGauge(rng, n));
            Sector sector = rng.nextBoolean() ? Sector.FULL : Sector.REACHABLE;
            SolverChoice solver = rng.nextBoolean() ? SolverChoice.DENSE : SolverChoice.LANCZOS;
            SpectrumSettings settings = SpectrumSettings.defaults().withSector(sector).withSolver(solver)
                    .withLevels(Math.min(5, 1 << (n - 1)));
            double[] s = {rng.nextDouble(), rng.nextDouble(), rng.nextDouble()};
            SpectrumCheck.Comparison c = SpectrumCheck.sameSpectrum(p, gauged, EnergyScales.illustrative(),
                    settings, s, TOL);
            assertThat(c.same()).as("%s worst %s", c.reason(), c.worstDifference()).isTrue();
            assertThat(c.worstDifference()).isLessThan(TOL);
        });
    }

    /* The project's own gauge transform gives the problem built by definition, and passes the default check. */
    @Test
    void theGaugePackagesTransformPassesTheDefaultCheck() {
        Seeds.forEachCase(5, 7400, (rng, seed) -> {
            int n = 3 + rng.nextInt(6);
            IsingProblem p = TestProblems.random(rng, n, 0.4, true);
            int[] g = TestProblems.randomGauge(rng, n);
            IsingProblem viaGauge = GaugeTransform.apply(p, Gauge.ofSigns(g));
            assertThat(viaGauge).isEqualTo(TestProblems.gauged(p, g));
            assertThat(SpectrumCheck.fits(p, SpectrumSettings.defaults())).isTrue();
            SpectrumCheck.Comparison c = SpectrumCheck.sameSpectrum(p, viaGauge);
            assertThat(c.same()).as(c.reason()).isTrue();
        });
    }

    /* The check has power: changing one coupling's sign on a frustrated triangle is no gauge. */
    @Test
    void theCheckRejectsAProblemThatIsNotAGauge() {
        IsingProblem triangle = IsingProblem.builder().coupling(0, 1, 1.0).coupling(0, 2, 1.0)
                .coupling(1, 2, 1.0).field(0, 0.3).build();
        IsingProblem other = IsingProblem.builder().coupling(0, 1, -1.0).coupling(0, 2, 1.0)
                .coupling(1, 2, 1.0).field(0, 0.3).build();
        SpectrumCheck.Comparison c = SpectrumCheck.sameSpectrum(triangle, other, EnergyScales.illustrative(),
                SpectrumSettings.defaults(), new double[] {0.5, 0.9}, TOL);
        assertThat(c.same()).isFalse();
        assertThat(c.worstDifference()).isGreaterThan(0.01);
        assertThat(c.reason()).contains("differs");
    }

    /* H_P + c adds (B/2)·c to H(s): every level moves by that, so every gap is unchanged. */
    @Test
    void anEnergyShiftMovesNoGap() {
        Seeds.forEachCase(20, 7200, (rng, seed) -> {
            int n = 2 + rng.nextInt(7);
            IsingProblem p = TestProblems.random(rng, n, 0.4, rng.nextBoolean());
            double shift = rng.nextDouble() * 20 - 10;
            IsingProblem shifted = p.withOffset(p.offset() + shift);
            SpectrumSettings settings = SpectrumSettings.defaults();
            AnnealSpectrum a = AnnealSpectrum.of(p, EnergyScales.illustrative(), settings);
            AnnealSpectrum b = AnnealSpectrum.of(shifted, EnergyScales.illustrative(), settings);
            double s = rng.nextDouble();
            double[] la = a.levels(s);
            double[] lb = b.levels(s);
            for (int i = 0; i < la.length; i++) {
                assertThat(lb[i] - la[i]).isCloseTo(0.5 * s * shift, within(TOL * 20));
                assertThat(lb[i] - lb[0]).isCloseTo(la[i] - la[0], within(TOL * 20));
            }
            assertThat(b.gap(s)).isCloseTo(a.gap(s), within(TOL * 20));
        });
    }

    /* H(s) is linear in (A, B): scaling both by λ scales every level, hence every gap, by λ. */
    @Test
    void scalingTheScheduleScalesEveryGap() {
        Seeds.forEachCase(20, 7300, (rng, seed) -> {
            int n = 2 + rng.nextInt(7);
            IsingProblem p = TestProblems.random(rng, n, 0.4, rng.nextBoolean());
            double factor = 0.1 + rng.nextDouble() * 9.9;
            EnergyScales base = EnergyScales.fromTable("table", "GHz", new double[] {0, 0.3, 0.7, 1},
                    new double[] {5, 2, 0.4, 0}, new double[] {0.1, 1, 3, 6});
            EnergyScales scaled = base.scaled(factor);
            SpectrumSettings settings = SpectrumSettings.defaults();
            AnnealSpectrum a = AnnealSpectrum.of(p, base, settings);
            AnnealSpectrum b = AnnealSpectrum.of(p, scaled, settings);
            double s = rng.nextDouble();
            double[] la = a.levels(s);
            double[] lb = b.levels(s);
            for (int i = 1; i < la.length; i++) {
                assertThat(lb[i] - lb[0]).isCloseTo(factor * (la[i] - la[0]), within(TOL * 100 * factor));
            }
            assertThat(b.gap(s)).isCloseTo(factor * a.gap(s), within(TOL * 100 * factor));
        });
    }

    /*
     * Two disconnected ferromagnetic pairs without fields: each pair's flip is a symmetry, so
     * the reachable sector has 2^(4 − 2) = 4 states and, as a sum of two independent pairs, its
     * levels are sums of one level of each pair's even block, ±√(A² + B²/4) (see
     * ClosedFormSpectrumTest): −2r, 0, 0, +2r with r = √(A² + B²/4).
     */
    @Test
    void eachFieldFreeComponentHalvesTheSector() {
        IsingProblem p = IsingProblem.builder().coupling(0, 1, -1.0).coupling(2, 3, -1.0).build();
        AnnealSpectrum spectrum = AnnealSpectrum.of(p, EnergyScales.illustrative(), SpectrumSettings.defaults());
        assertThat(spectrum.basis().dimension()).isEqualTo(4);
        assertThat(spectrum.basis().symmetryComponents()).isEqualTo(2);
        double s = 0.37;
        double r = Math.sqrt((1 - s) * (1 - s) + s * s / 4);
        double[] e = spectrum.levels(s);
        assertThat(e[0]).isCloseTo(-2 * r, within(TOL));
        assertThat(e[1]).isCloseTo(0.0, within(TOL));
        assertThat(e[2]).isCloseTo(0.0, within(TOL));
        assertThat(e[3]).isCloseTo(2 * r, within(TOL));
    }
}
