package org.obverse.anneal;

import org.apache.commons.math3.stat.inference.ChiSquareTest;
import org.junit.jupiter.api.Test;
import org.obverse.model.BinaryProblem;
import org.obverse.model.IsingProblem;
import org.obverse.samples.SampleBlock;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

/**
 * The path-integral sampler's contract: seeded and independent of the thread count, the
 * integer and double kernels giving the same reads, the energies of the problem bit for bit,
 * the sweeps placed per segment of the schedule (a segment shorter than a sweep takes none),
 * validation, and what simulated annealing does with short segments (stated in
 * spec/sampling.md).
 */
class PathIntegralSamplerTest extends QuietTest {
    private static SamplerSettings sqa(AnnealSchedule schedule, double rate, double temperature, int slices) {
        return SamplerSettings.defaults().withSchedule(schedule).withSweepsPerMicrosecond(rate)
                .withPathIntegral(new PathIntegralSettings(EnergyScales.illustrative(), temperature, slices));
    }

    private static byte[] rows(SampledReads s) {
        return s.samples().toSpins();
    }

    @Test
    void readsDoNotDependOnTheThreadCountAndEnergiesAreTheProblemsOwn() {
        Seeds.forEachCase(3, 610, (rng, seed) -> {
            IsingProblem p = PathIntegralThermalStateTest.generated(seed, 7);
            SamplerSettings s = sqa(AnnealSchedule.withPause(1.0, 0.4, 0.5), 40, 0.2, 6);
            SampledReads one = ReferenceSampler.of(s.withThreads(1)).sample(p, 150, seed);
            SampledReads two = ReferenceSampler.of(s.withThreads(2)).sample(p, 150, seed);
            SampledReads three = PathIntegralSampler.of(s.withThreads(3)).sample(p, 150, seed);
            assertThat(rows(two)).isEqualTo(rows(one));
            assertThat(rows(three)).isEqualTo(rows(one));
            byte[] row = new byte[p.size()];
            for (int r = 0; r < one.reads(); r++) {
                one.samples().unpackRows(r, 1, row);
                assertThat(Double.doubleToRawLongBits(one.energies()[r]))
                        .isEqualTo(Double.doubleToRawLongBits(p.energy(row)));
                assertThat(two.energies()[r]).isEqualTo(one.energies()[r]);
            }
            assertThat(one.sweeps()).isEqualTo(60).isEqualTo(s.sweeps());
            assertThat(one.runTimeMicros()).isEqualTo(1.5);
            // Another seed gives other reads.
            SampledReads other = ReferenceSampler.of(s).sample(p, 150, seed + 1000);
            assertThat(rows(other)).isNotEqualTo(rows(one));
        });
    }

    @Test
    void aFixedSeedGivesThePinnedReads() {
        // Golden vector (our own run of this version, kept so that a change in the order of
        // draws or moves shows): the integer ring, 3 sweeps of ramp, 10 at s = 0.3, no sweep in
        // the quench; T = 0.2, P = 6, seed 42. Read r is row r (bit k set: spin k is +1).
        String pinned = "+--+- -+++- +-+-- +--+- +-++- -+-+- +--+- --++- +-+-- -++++ +-+-+ -++++";
        double[] energies = {-8, 0, -2, -8, -4, 0, -8, 2, -2, -2, 0, -2};
        SamplerSettings s = SamplerSettings.defaults()
                .withSchedule(AnnealSchedule.withPauseAndQuench(2.0, 0.3, 2.0, 0.1)).withSweepsPerMicrosecond(5)
                .withPathIntegral(new PathIntegralSettings(EnergyScales.illustrative(), 0.2, 6));
        IsingProblem ring = PathIntegralThermalStateTest.integerRing();
        for (boolean integer : new boolean[] {true, false}) {
            SampledReads r = PathIntegralSampler.of(s, integer).sample(ring, 12, 42);
            StringBuilder b = new StringBuilder();
            for (int i = 0; i < r.reads(); i++) {
                b.append(i == 0 ? "" : " ");
                for (int k = 0; k < ring.size(); k++) {
                    b.append(r.samples().spin(i, k) > 0 ? '+' : '-');
                }
            }
            assertThat(b.toString()).isEqualTo(pinned);
            assertThat(r.energies()).containsExactly(energies);
            assertThat(r.sweeps()).isEqualTo(13);
        }
    }

    @Test
    void integerAndDoubleKernelsGiveTheSameReads() {
        IsingProblem ring = PathIntegralThermalStateTest.integerRing();
        // A ramp (a table per sweep), a pause at s = 0.3, and a hold at s = 1 where A = 0
        // (chain weight +∞: slice moves that break an aligned chain are refused).
        AnnealSchedule schedule = AnnealSchedule.of(new double[] {0, 0.3, 0.8, 1.2, 1.6},
                new double[] {0, 0.3, 0.3, 1, 1});
        for (int slices : new int[] {1, 2, 5}) {
            SamplerSettings s = sqa(schedule, 50, 0.25, slices);
            assertThat(PathIntegralSampler.of(s, true).runsInteger(ring)).isTrue();
            assertThat(PathIntegralSampler.of(s, false).runsInteger(ring)).isFalse();
            SampledReads integer = PathIntegralSampler.of(s, true).sample(ring, 130, 5);
            SampledReads doubles = PathIntegralSampler.of(s, false).sample(ring, 130, 5);
            assertThat(rows(integer)).as("%d slices", slices).isEqualTo(rows(doubles));
        }
        // Non-integer terms run the double kernel.
        SamplerSettings s = sqa(schedule, 50, 0.25, 4);
        assertThat(PathIntegralSampler.of(s).runsInteger(PathIntegralThermalStateTest.generated(1, 5))).isFalse();
    }

    @Test
    void sweepsArePlacedPerSegmentAndAShortQuenchTakesNone() {
        // One segment: the midpoints (k + ½)/S, where simulated annealing puts its sweeps too.
        double[] linear = PathIntegralSampler.sweepFractions(AnnealSchedule.linear(1.0), 1000);
        assertThat(linear).hasSize(1000);
        assertThat(linear[0]).isCloseTo(0.0005, within(1e-15));
        assertThat(linear[999]).isCloseTo(0.9995, within(1e-15));
        // Ramp 0.6 µs to s = 0.3 (3 sweeps), pause 1 µs (5 sweeps at 0.3), quench in 0.1 µs:
        // half a sweep, so none.
        AnnealSchedule quenched = AnnealSchedule.withPauseAndQuench(2.0, 0.3, 1.0, 0.1);
        double[] s = PathIntegralSampler.sweepFractions(quenched, 5);
        assertThat(s).hasSize(8);
        assertThat(s[2]).isCloseTo(0.25, within(1e-15));
        for (int k = 3; k < 8; k++) {
            assertThat(s[k]).isEqualTo(0.3);
        }
        // A quench of 1.5 sweeps takes one, at its middle.
        double[] slow = PathIntegralSampler.sweepFractions(AnnealSchedule.withPauseAndQuench(2.0, 0.3, 1.0, 0.3), 5);
        assertThat(slow).hasSize(9);
        assertThat(slow[8]).isCloseTo(0.65, within(1e-12));
        // The reads after a quench of 0.4 or 0.75 of a sweep are the same: the state at the pause.
        IsingProblem p = PathIntegralThermalStateTest.generated(4, 5);
        SampledReads a = ReferenceSampler.of(sqa(AnnealSchedule.withPauseAndQuench(2.0, 0.3, 1.0, 0.08), 5, 0.2, 4))
                .sample(p, 70, 3);
        SampledReads b = ReferenceSampler.of(sqa(AnnealSchedule.withPauseAndQuench(2.0, 0.3, 1.0, 0.15), 5, 0.2, 4))
                .sample(p, 70, 3);
        assertThat(rows(b)).isEqualTo(rows(a));
        assertThat(a.sweeps()).isEqualTo(8);
        // No segment as long as a sweep: refused.
        assertThatThrownBy(() -> PathIntegralSampler.sweepFractions(AnnealSchedule.linear(1.0), 0.5))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("no sweep");
    }

    @Test
    void simulatedAnnealingRunsAQuenchShorterThanHalfASweepAsNoSweep() {
        // Simulated annealing places sweep k of S at t_k = (k + ½)·T/S over the whole run, so a
        // final quench of d µs holds ⌈d·S/T + ½⌉ − 1 sweep midpoints: none below half a sweep
        // period, one (at an s partway up the quench) from half to one and a half.
        double hot = 0.1;
        double cold = 10.0;
        double pauseBeta = hot * Math.pow(cold / hot, 0.5);
        // T = 5.08 µs, S = round(25.4) = 25: the quench is 0.39 of a period.
        SamplerSettings shortQuench = SamplerSettings.defaults()
                .withSchedule(AnnealSchedule.withPauseAndQuench(2.0, 0.5, 4.0, 0.08)).withSweepsPerMicrosecond(5);
        double[] betas = BetaRange.perSweep(shortQuench, hot, cold);
        assertThat(betas).hasSize(25);
        assertThat(betas[24]).isCloseTo(pauseBeta, within(1e-12));
        // T = 5.15 µs, S = 26: the quench is 0.76 of a period and holds one sweep.
        SamplerSettings longer = SamplerSettings.defaults()
                .withSchedule(AnnealSchedule.withPauseAndQuench(2.0, 0.5, 4.0, 0.15)).withSweepsPerMicrosecond(5);
        double[] more = BetaRange.perSweep(longer, hot, cold);
        assertThat(more).hasSize(26);
        assertThat(more[25]).isGreaterThan(pauseBeta * 1.5).isLessThan(cold);
        assertThat(more[24]).isCloseTo(pauseBeta, within(1e-12));
    }

    @Test
    void atAZeroDriverLineMovesSampleTheClassicalDistribution() {
        // At s = 1 of the illustrative pair A = 0: the slices lock together (infinite chain
        // weight) and only line moves change the state; the thermal state of H(1) = (1/2)·H_P
        // is then the classical Boltzmann distribution exactly. Chi-square against it
        // (commons-math3), p < 1e-4 fails: a correct sampler fails with probability 1e-4.
        IsingProblem p = PathIntegralThermalStateTest.generated(6, 4);
        double t = 0.4;
        AnnealSchedule hold = AnnealSchedule.of(new double[] {0, 1, 21}, new double[] {0, 1, 1});
        int reads = 6000;
        SampledReads s = ReferenceSampler.of(sqa(hold, 5, t, 8)).sample(p, reads, 12);
        double[] expected = ExactThermalStates.classical(p, 1.0, t);
        long[] seen = PathIntegralThermalStateTest.counts(s);
        for (int x = 0; x < expected.length; x++) {
            expected[x] *= reads;
        }
        assertThat(new ChiSquareTest().chiSquareTest(expected, seen)).isGreaterThan(1e-4);
    }

    @Test
    void controlErrorsAndBinaryProblemsRunAsInSimulatedAnnealing() {
        IsingProblem p = PathIntegralThermalStateTest.generated(8, 6);
        SamplerSettings s = sqa(AnnealSchedule.withPause(1.0, 0.5, 0.5), 40, 0.2, 4);
        ControlErrors errors = ControlErrors.of(99, 0.1, 0.05, 0.02, 0.01);
        SampledReads clean = ReferenceSampler.of(s).sample(p, 80, 1);
        SampledReads noisy = ReferenceSampler.of(s.withErrors(errors).withThreads(1)).sample(p, 80, 1);
        SampledReads noisy2 = ReferenceSampler.of(s.withErrors(errors).withThreads(2)).sample(p, 80, 1);
        assertThat(rows(noisy)).isNotEqualTo(rows(clean)).isEqualTo(rows(noisy2));
        byte[] row = new byte[p.size()];
        for (int r = 0; r < noisy.reads(); r++) {
            noisy.samples().unpackRows(r, 1, row);
            assertThat(noisy.energies()[r]).isEqualTo(p.energy(row));
        }
        BinaryProblem q = BinaryProblem.builder().term(0, 0, -1).term(1, 1, 2).term(0, 1, -3).build();
        SampledReads bin = ReferenceSampler.of(s).sample(q, 64, 2);
        byte[] x = new byte[2];
        SampleBlock b = bin.samples();
        for (int r = 0; r < bin.reads(); r++) {
            x[0] = (byte) ((b.spin(r, 0) + 1) >> 1);
            x[1] = (byte) ((b.spin(r, 1) + 1) >> 1);
            assertThat(bin.energies()[r]).isEqualTo(q.energy(x));
        }
    }

    @Test
    void settingsRefuseBadValuesWithOneClearMessage() {
        EnergyScales linear = EnergyScales.illustrative();
        for (double t : new double[] {0.0, -1.0, Double.NaN, Double.POSITIVE_INFINITY}) {
            assertThatThrownBy(() -> new PathIntegralSettings(linear, t, 8))
                    .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("temperature");
        }
        for (int p : new int[] {0, -3, PathIntegralSettings.MAX_SLICES + 1}) {
            assertThatThrownBy(() -> new PathIntegralSettings(linear, 0.1, p))
                    .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("slice count " + p);
        }
        assertThatThrownBy(() -> new PathIntegralSettings(null, 0.1, 8)).isInstanceOf(IllegalArgumentException.class);
        SamplerSettings s = SamplerSettings.defaults().withPathIntegral(new PathIntegralSettings(linear, 0.1, 8));
        assertThat(s.method()).isEqualTo(SamplerSettings.Method.PATH_INTEGRAL);
        assertThat(s.withSimulatedAnnealing().method()).isEqualTo(SamplerSettings.Method.SIMULATED_ANNEALING);
        assertThat(s.withThreads(1).withSweepsPerMicrosecond(7).pathIntegral()).isEqualTo(s.pathIntegral());
        assertThatThrownBy(() -> PathIntegralSampler.of(s.withKernel(SamplerSettings.Kernel.MULTI_SPIN)))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("multi-spin");
        assertThatThrownBy(() -> PathIntegralSampler.of(SamplerSettings.defaults()))
                .isInstanceOf(IllegalArgumentException.class);
        assertThat(SamplerSettings.Method.fromLabel("sqa")).isEqualTo(SamplerSettings.Method.PATH_INTEGRAL);
        assertThat(SamplerSettings.Method.fromLabel("sa")).isEqualTo(SamplerSettings.Method.SIMULATED_ANNEALING);
        assertThat(SamplerSettings.Method.fromLabel("qa")).isNull();
    }

    @Test
    void slicesMovesAndLineMovesHaveTheTrotterWeights() {
        // The chain weight against its definition from the one-spin factor
        // ⟨s|e^{εΓσˣ}|s'⟩ = C·e^{K s s'}: e^{2K} = cosh(εΓ)/sinh(εΓ), χ = 2K (Γ = A/2, ε = β/P).
        double beta = 3.0;
        double a = 0.7;
        int slices = 10;
        double eg = beta * (a / 2) / slices;
        double k = 0.5 * Math.log(Math.cosh(eg) / Math.sinh(eg));
        assertThat(PathIntegralKernels.chainWeight(beta, a, slices)).isCloseTo(2 * k, within(1e-12));
        assertThat(PathIntegralKernels.chainWeight(beta, 0.0, slices)).isEqualTo(Double.POSITIVE_INFINITY);
        assertThat(PathIntegralKernels.chainWeight(beta, a, 1)).isZero();
        // w = 0 adds nothing even at an infinite chain weight; w = ±2 gives ±∞.
        assertThat(PathIntegralKernels.sliceDelta(0.5, Double.POSITIVE_INFINITY, 2.0, 0)).isEqualTo(-1.0);
        assertThat(PathIntegralKernels.sliceDelta(0.5, Double.POSITIVE_INFINITY, 2.0, 2))
                .isEqualTo(Double.POSITIVE_INFINITY);
        assertThat(PathIntegralKernels.sliceDelta(0.5, Double.POSITIVE_INFINITY, 2.0, -2))
                .isEqualTo(Double.NEGATIVE_INFINITY);
        long[] table = new long[PathIntegralKernels.thresholdLength(3)];
        PathIntegralKernels.sliceThresholds(0.5, Double.POSITIVE_INFINITY, 3, table);
        // v = −3 (uphill by 1.5), w = 0: ⌈e^{−1.5}·2⁵³⌉.
        assertThat(table[1]).isEqualTo((long) Math.ceil(StrictMath.exp(-1.5) * 0x1p53));
        assertThat(table[2]).isEqualTo(PathIntegralKernels.NEVER);
        assertThat(table[0]).isEqualTo(PathIntegralKernels.ALWAYS);
    }
}
