package org.obverse.cli;

import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.anneal.ControlErrors;
import org.obverse.anneal.ReferenceSampler;
import org.obverse.anneal.SampledReads;
import org.obverse.anneal.SamplerSettings;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.stats.BiasDiagnostics;
import org.obverse.samples.SpinMoments;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The bias diagnosis on reads from the project's reference sampler with its static
 * control-error model (a field offset δh_q per qubit in the device frame; the persistent
 * biases of Perdomo-Ortiz et al., Sci. Rep. 6, 18628, 2016). Independent qubits with logical
 * fields h ∈ {0, ±0.4}, random gauges, sampled at β = 1 at the end of the anneal: in gauge g a
 * qubit's device-frame mean is −tanh(β (g h + δh)) (Boltzmann, E = h s), so the fitted bias is
 * b = −(tanh(β (h + δh)) + tanh(β (δh − h))) / 2, zero exactly when δh = 0.
 */
class ReferenceSamplerBiasTest extends QuietTest {
    private static final int QUBITS = 40;
    private static final int GAUGES = 16;
    private static final int READS = 512;
    private static final double BETA = 1.0;

    private record Run(BiasDiagnostics.Result result, double[] logical) {
    }

    private static Run run(ControlErrors errors, long seed) {
        UniformRandomProvider rng = Seeds.rng(seed);
        double[] h = new double[QUBITS];
        for (int q = 0; q < QUBITS; q++) {
            h[q] = new double[] {0, 0.4, -0.4}[rng.nextInt(3)];
        }
        ReferenceSampler sampler = ReferenceSampler.of(SamplerSettings.defaults().withBetaRange(0.1, BETA)
                .withSweepsPerMicrosecond(60).withErrors(errors).withThreads(1));
        double[][] sums = new double[GAUGES][QUBITS];
        long[][] reads = new long[GAUGES][QUBITS];
        byte[][] signs = new byte[GAUGES][QUBITS];
        for (int g = 0; g < GAUGES; g++) {
            IsingBuilder b = IsingProblem.builder();
            for (int q = 0; q < QUBITS; q++) {
                signs[g][q] = (byte) (rng.nextBoolean() ? 1 : -1);
                b.variable(q).field(q, signs[g][q] * h[q]);
            }
            SampledReads s = sampler.sample(b.build(), READS, seed * 1000 + g);
            SpinMoments moments = SpinMoments.of(QUBITS, new int[0][]);
            moments.add(s.samples());
            for (int q = 0; q < QUBITS; q++) {
                sums[g][q] = moments.spinSum(q);
                reads[g][q] = moments.reads();
            }
        }
        return new Run(BiasDiagnostics.diagnose(sums, reads, signs, 0.01), h);
    }

    @Test
    void flagsTheQubitsWithLargeOffsetsAndNoneWithout() {
        // Expected z of a qubit = b / se with se ≈ sqrt((1 - m²) / (G · reads)), m ≈ ±tanh(0.4).
        // A qubit expected at |z| > 7 is missed with probability < 1e-4; one expected at
        // |z| < 0.5 is flagged (|z| > ≈3.7) with probability < 1e-3; 40 qubits, two cases.
        ControlErrors errors = ControlErrors.of(99, 0.08, 0.0);
        Seeds.forEachCase(2, 501, (rng, seed) -> {
            Run r = run(errors, seed);
            int strong = 0;
            for (BiasDiagnostics.Item it : r.result().items()) {
                double dh = errors.fieldOffset(it.item());
                double h = r.logical()[it.item()];
                double b = -(Math.tanh(BETA * (h + dh)) + Math.tanh(BETA * (dh - h))) / 2;
                double m = Math.tanh(BETA * Math.abs(h));
                double se = Math.sqrt((1 - m * m) / (GAUGES * READS));
                double zExpected = b / se;
                if (Math.abs(zExpected) > 7) {
                    strong++;
                    assertThat(it.flagged()).as("qubit %d, offset %s, expected z %s, got z %s", it.item(), dh,
                            zExpected, it.z()).isTrue();
                    assertThat(Math.signum(it.bias())).isEqualTo(Math.signum(b));
                }
                if (Math.abs(zExpected) < 0.5) {
                    assertThat(it.flagged()).as("qubit %d, expected z %s, got z %s", it.item(), zExpected, it.z())
                            .isFalse();
                }
            }
            assertThat(strong).as("the device has qubits with large offsets").isGreaterThanOrEqualTo(5);
        });
    }

    @Test
    void noErrorsNoFlags() {
        // Family-wise false-positive rate 0.01 per case (Bonferroni, normal approximation); 2 cases.
        Seeds.forEachCase(2, 601, (rng, seed) -> {
            Run r = run(ControlErrors.NONE, seed);
            assertThat(r.result().flagged()).isEmpty();
        });
    }
}
