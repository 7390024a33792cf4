package org.obverse.anneal;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.stat.inference.ChiSquareTest;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.spectrum.AnnealSpectrum;
import org.obverse.spectrum.SectorBasis;
import org.obverse.spectrum.SolverChoice;
import org.obverse.spectrum.SpectrumSettings;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/**
 * The path-integral sampler against exact quantum statistics. Protocol (pause and quench,
 * Marshall, Venturelli, Hen &amp; Rieffel, Phys. Rev. Applied 11, 044083, 2019): a ramp to
 * s_p, a pause of {@value #PAUSE_SWEEPS} sweeps there, and a quench to s = 1 within half a
 * sweep, which takes no sweep, so each read is one slice of the path integral at s_p.
 *
 * <p><b>Tolerance.</b> The reads are independent (each its own generator and random start), so
 * the empirical distribution p̂ of N reads over the d = 2ⁿ z states is that of N i.i.d. draws
 * from the sampler's law p̃. Then E|p̂_x − p̃_x| ≤ √(p̃_x(1 − p̃_x)/N) and, by Cauchy–Schwarz with
 * Σ p̃_x(1 − p̃_x) ≤ 1 − 1/d, E TV(p̂, p̃) ≤ ½√((d − 1)/N). TV(p̂, p̃) changes by at most 1/N when
 * one read changes, so McDiarmid's inequality (McDiarmid, Surveys in Combinatorics, 1989) gives
 * P(TV(p̂, p̃) ≥ E TV + t) ≤ exp(−2Nt²): with t = √(ln(1/δ)/(2N)) the statistical part
 * ε_stat = ½√((d − 1)/N) + √(ln(1/δ)/(2N)) is exceeded with probability at most δ = 10⁻⁶ per
 * check (about twenty checks here: a false-failure rate below 2·10⁻⁵; the seeds are fixed, so a
 * pass is reproducible). After a long pause p̃ is the slice marginal p_P of the P-slice
 * Trotter approximant (the chi-square test below checks that alone); its distance from the
 * exact thermal diagonal q, the Trotter error ε_P = TV(p_P, q) = O(1/P²), is computed exactly
 * by {@link ExactThermalStates#trotter}. So the check is TV(p̂, q) ≤ ε_stat + ε_P, and by the
 * triangle inequality a sampler of p_P fails it with probability at most δ.
 */
class PathIntegralThermalStateTest extends QuietTest {
    private static final double DELTA = 1e-6;
    private static final int PAUSE_SWEEPS = 120;
    /** Sweeps per µs: one sweep is 0.2 µs, so the 0.1 µs quench takes none. */
    private static final double RATE = 5.0;

    /** A test case: a problem, energy scales, a pause point, a temperature, a slice count. */
    private record Case(String name, IsingProblem problem, EnergyScales scales, double pauseAt, double temperature,
                        int slices) {
        double a() {
            return scales.a(pauseAt);
        }

        double b() {
            return scales.b(pauseAt);
        }

        Case withSlices(int p) {
            return new Case(name + ", P = " + p, problem, scales, pauseAt, temperature, p);
        }
    }

    /** n spins, fields in [−1, 1] and couplings in [−1, 1] on 60 % of the pairs (two decimals). */
    static IsingProblem generated(long seed, int n) {
        UniformRandomProvider rng = Seeds.rng(seed);
        IsingBuilder b = IsingProblem.builder();
        for (int i = 0; i < n; i++) {
            b.field(i, Math.round((2 * rng.nextDouble() - 1) * 100) / 100.0);
        }
        for (int i = 0; i < n; i++) {
            for (int j = i + 1; j < n; j++) {
                if (rng.nextDouble() < 0.6) {
                    b.coupling(i, j, Math.round((2 * rng.nextDouble() - 1) * 100) / 100.0);
                }
            }
        }
        return b.build();
    }

    /** A frustrated ring of five integer couplings with two fields: runs on the integer kernel. */
    static IsingProblem integerRing() {
        return IsingProblem.builder().coupling(0, 1, 1).coupling(1, 2, -1).coupling(2, 3, 1).coupling(3, 4, 1)
                .coupling(0, 4, 2).field(1, 1).field(3, -1).build();
    }

    /** A tabulated schedule shaped like a device's (A falling fast, B rising): our own numbers. */
    static EnergyScales table() {
        double[] s = {0.0, 0.2, 0.4, 0.6, 0.8, 1.0};
        double[] a = {2.0, 1.2, 0.6, 0.25, 0.06, 0.0};
        double[] b = {0.05, 0.4, 0.9, 1.5, 2.2, 3.0};
        return EnergyScales.fromTable("test table", "test units", s, a, b);
    }

    private static List<Case> cases() {
        EnergyScales linear = EnergyScales.illustrative();
        List<Case> c = new ArrayList<>();
        c.add(new Case("generated 5 spins, seed 1", generated(1, 5), linear, 0.3, 0.1, 16));
        c.add(new Case("generated 5 spins, seed 2", generated(2, 5), linear, 0.5, 0.2, 16));
        c.add(new Case("generated 4 spins, seed 3", generated(3, 4), linear, 0.4, 0.05, 32));
        c.add(new Case("integer ring, table", integerRing(), table(), 0.3, 0.3, 12));
        return c;
    }

    static SamplerSettings pauseAndQuench(EnergyScales scales, double pauseAt, double temperature, int slices) {
        // Ramp at 0.5 per µs (pauseAt·10 sweeps), pause, quench in 0.1 µs (half a sweep: none).
        AnnealSchedule schedule = AnnealSchedule.withPauseAndQuench(2.0, pauseAt, PAUSE_SWEEPS / RATE, 0.1);
        return SamplerSettings.defaults().withSchedule(schedule).withSweepsPerMicrosecond(RATE)
                .withPathIntegral(new PathIntegralSettings(scales, temperature, slices));
    }

    private static SampledReads sample(Case c, int reads, long seed) {
        return ReferenceSampler.of(pauseAndQuench(c.scales(), c.pauseAt(), c.temperature(), c.slices()))
                .sample(c.problem(), reads, seed);
    }

    /** Counts of the reads over the z states (bit i set: spin i is +1). */
    static long[] counts(SampledReads s) {
        int n = s.variables().size();
        long[] h = new long[1 << n];
        for (int r = 0; r < s.reads(); r++) {
            int x = 0;
            for (int k = 0; k < n; k++) {
                x |= (s.samples().spin(r, k) > 0 ? 1 : 0) << k;
            }
            h[x]++;
        }
        return h;
    }

    static double[] empirical(SampledReads s) {
        long[] c = counts(s);
        double[] p = new double[c.length];
        for (int x = 0; x < c.length; x++) {
            p[x] = (double) c[x] / s.reads();
        }
        return p;
    }

    /** ε_stat of the class comment. */
    static double statisticalBound(int states, int reads) {
        return 0.5 * Math.sqrt((states - 1.0) / reads) + Math.sqrt(Math.log(1 / DELTA) / (2.0 * reads));
    }

    @Test
    void readsAfterAPauseMatchTheExactThermalStateAndNotTheClassicalOne() {
        int reads = 4000;
        long seed = 901;
        for (Case c : cases()) {
            int d = 1 << c.problem().size();
            double[] q = ExactThermalStates.thermal(c.problem(), c.a(), c.b(), c.temperature());
            double[] trotter = ExactThermalStates.trotter(c.problem(), c.a(), c.b(), c.temperature(), c.slices());
            double[] classical = ExactThermalStates.classical(c.problem(), c.b(), c.temperature());
            double tolerance = statisticalBound(d, reads) + ExactThermalStates.totalVariation(trotter, q);
            double[] seen = empirical(sample(c, reads, seed++));
            assertThat(ExactThermalStates.totalVariation(seen, q)).as("%s: TV(reads, thermal state)", c.name())
                    .isLessThanOrEqualTo(tolerance);
            // The same check with the classical Boltzmann distribution of (B/2)·H_P as the
            // reference must fail: the cases are chosen where the two differ (TV ≥ 0.25).
            assertThat(ExactThermalStates.totalVariation(q, classical)).as("%s: TV(thermal, classical)", c.name())
                    .isGreaterThan(0.25);
            assertThat(ExactThermalStates.totalVariation(seen, classical)).as("%s: TV(reads, classical)", c.name())
                    .isGreaterThan(tolerance);
        }
    }

    @Test
    void classicalReadsAreRejectedByTheQuantumCheck() {
        // The sampler with one slice draws from the classical Boltzmann distribution of
        // (B/2)·H_P (no driver): its reads pass the check against that distribution and fail
        // the check against the thermal state with the tolerance a 16-slice run is allowed.
        int reads = 4000;
        Case c = cases().get(0);
        int d = 1 << c.problem().size();
        double[] q = ExactThermalStates.thermal(c.problem(), c.a(), c.b(), c.temperature());
        double[] classical = ExactThermalStates.classical(c.problem(), c.b(), c.temperature());
        double trotter16 = ExactThermalStates.totalVariation(
                ExactThermalStates.trotter(c.problem(), c.a(), c.b(), c.temperature(), 16), q);
        double[] seen = empirical(sample(c.withSlices(1), reads, 77));
        assertThat(ExactThermalStates.totalVariation(seen, classical)).isLessThanOrEqualTo(statisticalBound(d, reads));
        assertThat(ExactThermalStates.totalVariation(seen, q)).isGreaterThan(statisticalBound(d, reads) + trotter16);
    }

    @Test
    void readsFollowTheTrotterDistributionExactly() {
        // Chi-square goodness of fit (commons-math3 as the oracle) against the slice marginal
        // p_P computed by matrix products: this checks the slice coupling and the moves
        // without any Trotter tolerance. Expected counts below 5 are pooled. p < 1e-4 fails: a
        // correct sampler fails with probability 1e-4 per check (three checks).
        int reads = 8000;
        List<Case> all = cases();
        Case[] picked = {all.get(0), all.get(3), all.get(2).withSlices(6)};
        long seed = 3100;
        for (Case c : picked) {
            double[] trotter = ExactThermalStates.trotter(c.problem(), c.a(), c.b(), c.temperature(), c.slices());
            long[] observed = counts(sample(c, reads, seed++));
            List<Double> expected = new ArrayList<>();
            List<Long> seen = new ArrayList<>();
            double poolExpected = 0;
            long poolSeen = 0;
            for (int x = 0; x < trotter.length; x++) {
                double e = trotter[x] * reads;
                if (e < 5) {
                    poolExpected += e;
                    poolSeen += observed[x];
                } else {
                    expected.add(e);
                    seen.add(observed[x]);
                }
            }
            if (poolExpected >= 5 || expected.isEmpty()) {
                expected.add(poolExpected);
                seen.add(poolSeen);
            } else if (poolExpected > 0) {
                int last = expected.size() - 1;
                expected.set(last, expected.get(last) + poolExpected);
                seen.set(last, seen.get(last) + poolSeen);
            }
            double p = new ChiSquareTest().chiSquareTest(expected.stream().mapToDouble(Double::doubleValue).toArray(),
                    seen.stream().mapToLong(Long::longValue).toArray());
            assertThat(p).as("%s: chi-square p-value against the %d-slice Trotter distribution", c.name(), c.slices())
                    .isGreaterThan(1e-4);
        }
    }

    @Test
    void trotterErrorFallsAsOneOverPSquared() {
        // The symmetric Trotter product errs by O(ε²) overall, ε = 1/(PT) (Suzuki, Prog. Theor.
        // Phys. 56, 1454, 1976): doubling P divides the error by about 4. One slice is the
        // classical Boltzmann distribution exactly.
        for (Case c : cases()) {
            double[] q = ExactThermalStates.thermal(c.problem(), c.a(), c.b(), c.temperature());
            double[] one = ExactThermalStates.trotter(c.problem(), c.a(), c.b(), c.temperature(), 1);
            double[] classical = ExactThermalStates.classical(c.problem(), c.b(), c.temperature());
            assertThat(ExactThermalStates.totalVariation(one, classical)).isLessThan(1e-12);
            double previous = ExactThermalStates.totalVariation(
                    ExactThermalStates.trotter(c.problem(), c.a(), c.b(), c.temperature(), 16), q);
            for (int p = 32; p <= 128; p *= 2) {
                double e = ExactThermalStates.totalVariation(
                        ExactThermalStates.trotter(c.problem(), c.a(), c.b(), c.temperature(), p), q);
                assertThat(e / previous).as("%s: error ratio P = %d / %d", c.name(), p, p / 2).isBetween(0.2, 0.3);
                previous = e;
            }
        }
    }

    @Test
    void theOracleHamiltonianIsTheSpectrumCommandsHamiltonian() {
        // The sampler is checked against ExactThermalStates; this ties that matrix to the
        // levels `spectrum` computes (whole space, dense solver), so the two verbs use one H(s).
        IsingProblem p = generated(5, 4);
        for (EnergyScales scales : new EnergyScales[] {EnergyScales.illustrative(), table()}) {
            AnnealSpectrum spectrum = AnnealSpectrum.of(p, scales, new SpectrumSettings(16, SolverChoice.DENSE, 1e-12,
                    SectorBasis.Sector.FULL));
            for (double s : new double[] {0.1, 0.45, 0.9}) {
                double[] ours = ExactThermalStates.levels(p, scales.a(s), scales.b(s));
                double[] theirs = spectrum.levels(s);
                for (int k = 0; k < ours.length; k++) {
                    assertThat(ours[k]).as("level %d at s = %s", k, s).isCloseTo(theirs[k], within(1e-9));
                }
            }
        }
    }

    /** ⟨σᶻ⟩ in the thermal state of one spin, H = −(A/2)σˣ + (B/2)·h·σᶻ: −(b/r)·tanh(r/T). */
    static double singleSpinMagnetisation(double a, double b, double h, double temperature) {
        // Derived here: with α = A/2, η = B·h/2 and r = √(α² + η²), H = −ασˣ + ησᶻ has levels ±r
        // and e^{−H/T} = cosh(r/T)·1 − sinh(r/T)·H/r; Tr σᶻH = 2η, Z = 2cosh(r/T).
        double alpha = a / 2;
        double eta = b * h / 2;
        double r = Math.hypot(alpha, eta);
        return -(eta / r) * Math.tanh(r / temperature);
    }

    /**
     * ⟨s⟩ of the P-slice path integral of one spin: a periodic Ising chain of P spins with
     * coupling K = −½ ln tanh(εα) and field term εη, ε = 1/(PT). Transfer matrix (symmetric
     * split of the field) with eigenvalues λ± = e^K cosh(εη) ± R, R = √(e^{2K} sinh²(εη) + e^{−2K}):
     * ⟨s⟩ = −[(λ₊^P − λ₋^P)/(λ₊^P + λ₋^P)]·e^K sinh(εη)/R (the one-dimensional Ising model in a
     * field, Baxter, Exactly Solved Models in Statistical Mechanics, Academic Press 1982, §2.2;
     * derived here for this chain).
     */
    static double singleSpinTrotterMagnetisation(double a, double b, double h, double temperature, int slices) {
        double eps = 1.0 / (slices * temperature);
        double alpha = a / 2;
        double eta = b * h / 2;
        double k = -0.5 * Math.log(Math.tanh(eps * alpha));
        double root = Math.sqrt(Math.exp(2 * k) * Math.pow(Math.sinh(eps * eta), 2) + Math.exp(-2 * k));
        double plus = Math.exp(k) * Math.cosh(eps * eta) + root;
        double minus = Math.exp(k) * Math.cosh(eps * eta) - root;
        double ratio = Math.pow(minus / plus, slices);
        return -((1 - ratio) / (1 + ratio)) * Math.exp(k) * Math.sinh(eps * eta) / root;
    }

    @Test
    void oneSpinMatchesTheClosedForm() {
        // Hoeffding (Hoeffding, J. Am. Stat. Assoc. 58, 13, 1963): the mean of N independent ±1
        // reads lies within √(2 ln(2/δ)/N) of its expectation except with probability δ = 1e-6.
        int reads = 10_000;
        double stat = Math.sqrt(2 * Math.log(2 / DELTA) / reads);
        Object[][] cases = {
            {EnergyScales.illustrative(), 0.3, 1.0, 0.2, 16},
            {EnergyScales.illustrative(), 0.6, -0.5, 0.1, 8},
            {table(), 0.4, 0.7, 0.25, 12},
        };
        long seed = 4400;
        for (Object[] c : cases) {
            EnergyScales scales = (EnergyScales) c[0];
            double sp = (double) c[1];
            double h = (double) c[2];
            double t = (double) c[3];
            int slices = (int) c[4];
            double a = scales.a(sp);
            double b = scales.b(sp);
            IsingProblem p = IsingProblem.builder().field(0, h).build();
            double exact = singleSpinMagnetisation(a, b, h, t);
            double trotter = singleSpinTrotterMagnetisation(a, b, h, t, slices);
            // The closed forms against the matrices of ExactThermalStates (bit 0 set: s = +1).
            double[] q = ExactThermalStates.thermal(p, a, b, t);
            double[] qp = ExactThermalStates.trotter(p, a, b, t, slices);
            assertThat(q[1] - q[0]).isCloseTo(exact, within(1e-12));
            assertThat(qp[1] - qp[0]).isCloseTo(trotter, within(1e-12));
            SampledReads s = ReferenceSampler.of(pauseAndQuench(scales, sp, t, slices)).sample(p, reads, seed++);
            double mean = 0;
            for (int r = 0; r < reads; r++) {
                mean += s.samples().spin(r, 0);
            }
            mean /= reads;
            String label = "h " + h + " at s " + sp + ", T " + t + ", P " + slices;
            assertThat(mean).as(label + ": against the Trotter value").isCloseTo(trotter, within(stat));
            assertThat(mean).as(label + ": against the exact value").isCloseTo(exact,
                    within(stat + Math.abs(trotter - exact)));
            double classical = -Math.tanh(b * h / 2 / t);
            assertThat(Math.abs(mean - classical)).as(label + ": the classical value is rejected")
                    .isGreaterThan(stat + Math.abs(trotter - exact));
        }
    }
}
