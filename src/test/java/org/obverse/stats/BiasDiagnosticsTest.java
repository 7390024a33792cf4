package org.obverse.stats;

import java.util.Set;
import java.util.stream.Collectors;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Planted device biases (the persistent-bias picture of Perdomo-Ortiz et al., Sci. Rep. 6,
 * 18628, 2016): device-frame reads simulated here with a seeded generator, each qubit a
 * ±1 variable with mean g_i·μ_i + b_i in gauge g (μ_i the logical magnetisation, b_i the bias).
 */
class BiasDiagnosticsTest extends QuietTest {
    private record Sim(double[][] sums, long[][] reads, byte[][] signs) {
    }

    private static Sim simulate(UniformRandomProvider rng, int qubits, int gauges, int reads, double[] bias,
            boolean balanced) {
        double[] mu = new double[qubits];
        for (int i = 0; i < qubits; i++) {
            mu[i] = rng.nextDouble() - 0.5;
        }
        return simulate(rng, mu, gauges, reads, bias, balanced);
    }

    private static Sim simulate(UniformRandomProvider rng, double[] mu, int gauges, int reads, double[] bias,
            boolean balanced) {
        int qubits = mu.length;
        double[][] sums = new double[gauges][qubits];
        long[][] counts = new long[gauges][qubits];
        byte[][] signs = new byte[gauges][qubits];
        for (int g = 0; g < gauges; g++) {
            for (int i = 0; i < qubits; i++) {
                signs[g][i] = (byte) (balanced ? (((g + i) & 1) == 0 ? 1 : -1) : (rng.nextBoolean() ? 1 : -1));
            }
            byte[] s = new byte[qubits];
            for (int r = 0; r < reads; r++) {
                for (int i = 0; i < qubits; i++) {
                    double mean = Math.max(-1, Math.min(1, signs[g][i] * mu[i] + bias[i]));
                    s[i] = (byte) (rng.nextDouble() < (1 + mean) / 2 ? 1 : -1);
                }
                for (int i = 0; i < qubits; i++) {
                    sums[g][i] += s[i];
                    counts[g][i]++;
                }
            }
        }
        return new Sim(sums, counts, signs);
    }

    @Test
    void findsPlantedBiasesWithRandomGaugesAndSigns() {
        // Bias 0.08 with 24 gauges × 400 reads: standard error about 0.01, so z ≈ 8 against a
        // threshold of about 3.9 (α = 0.01, 64 qubits); a planted qubit is missed with
        // probability below 1e-6 per case, and a null qubit flagged with ≤ 0.01 per case in all.
        Seeds.forEachCase(3, 31, (rng, seed) -> {
            int n = 64;
            double[] bias = new double[n];
            Set<Integer> planted = Set.of(5, 17, 40);
            for (int q : planted) {
                bias[q] = rng.nextBoolean() ? 0.08 : -0.08;
            }
            Sim sim = simulate(rng, n, 24, 400, bias, false);
            BiasDiagnostics.Result res = BiasDiagnostics.diagnose(sim.sums(), sim.reads(), sim.signs(), 0.01);
            Set<Integer> flagged = res.flagged().stream().map(BiasDiagnostics.Item::item).collect(Collectors.toSet());
            assertThat(flagged).isEqualTo(planted);
            assertThat(res.items().subList(0, 3).stream().map(BiasDiagnostics.Item::item)).containsExactlyInAnyOrderElementsOf(planted);
        });
    }

    @Test
    void findsPlantedBiasesWithBalancedGaugesWithoutSigns() {
        Seeds.forEachCase(2, 61, (rng, seed) -> {
            int n = 32;
            double[] bias = new double[n];
            bias[3] = 0.1;
            bias[30] = -0.1;
            Sim sim = simulate(rng, n, 20, 400, bias, true);
            BiasDiagnostics.Result res = BiasDiagnostics.diagnose(sim.sums(), sim.reads(), null, 0.01, true);
            assertThat(res.flagged().stream().map(BiasDiagnostics.Item::item).toList()).containsExactlyInAnyOrder(3, 30);
        });
    }

    @Test
    void withoutSignsRandomGaugesStayConservative() {
        // No signs, random gauges. Null qubits with logical magnetisation up to 0.5 must not be
        // flagged (their leftover μ·mean(g) is covered by the gauge scatter); planted biases of
        // 0.1 on qubits without logical magnetisation are found (z ≈ 0.1 / 0.01 = 10 vs ≈ 3.7).
        // False-failure rate: ≤ 0.01 family-wise per case for a flag, ~1e-6 for a miss; 3 cases.
        Seeds.forEachCase(3, 141, (rng, seed) -> {
            int n = 48;
            double[] mu = new double[n];
            double[] bias = new double[n];
            for (int i = 0; i < n; i++) {
                mu[i] = rng.nextDouble() - 0.5;
            }
            for (int q : new int[] {2, 29}) {
                mu[q] = 0;
                bias[q] = q == 2 ? 0.1 : -0.1;
            }
            Sim sim = simulate(rng, mu, 20, 500, bias, false);
            BiasDiagnostics.Result res = BiasDiagnostics.diagnose(sim.sums(), sim.reads(), null, 0.01);
            assertThat(res.flagged().stream().map(BiasDiagnostics.Item::item).toList()).containsExactlyInAnyOrder(2, 29);
        });
    }

    @Test
    void flagsNothingWithoutBias() {
        // Family-wise rate α = 0.001 per campaign (Bonferroni over 64 qubits, normal
        // approximation): over 4 campaigns a false failure has probability about 0.004.
        Seeds.forEachCase(4, 71, (rng, seed) -> {
            Sim sim = simulate(rng, 64, 16, 300, new double[64], false);
            BiasDiagnostics.Result res = BiasDiagnostics.diagnose(sim.sums(), sim.reads(), sim.signs(), 0.001);
            assertThat(res.flagged()).isEmpty();
            assertThat(res.items()).hasSize(64);
        });
    }

    @Test
    void findsAPlantedCouplerCorrelationBias() {
        // Chain of 16 qubits, 15 couplers; logical correlation c_k flips with g_a g_b; coupler 6
        // carries a device bias of +0.12 in its correlation. 24 gauges × 400 reads: standard
        // error about 0.01, z about 12 against a threshold near 3.4 (α = 0.01, 15 couplers).
        Seeds.forEachCase(2, 91, (rng, seed) -> {
            int n = 16;
            int[][] couplers = new int[n - 1][];
            double[] logical = new double[n - 1];
            for (int k = 0; k < n - 1; k++) {
                couplers[k] = new int[] {k, k + 1};
                logical[k] = rng.nextDouble() * 1.2 - 0.6;
            }
            int gauges = 24;
            double[][] sums = new double[gauges][n - 1];
            long[][] counts = new long[gauges][n - 1];
            byte[][] signs = new byte[gauges][n - 1];
            byte[] s = new byte[n];
            for (int g = 0; g < gauges; g++) {
                byte[] gs = new byte[n];
                for (int i = 0; i < n; i++) {
                    gs[i] = (byte) (rng.nextBoolean() ? 1 : -1);
                }
                for (int k = 0; k < n - 1; k++) {
                    signs[g][k] = (byte) (gs[k] * gs[k + 1]);
                }
                for (int r = 0; r < 400; r++) {
                    s[0] = (byte) (rng.nextBoolean() ? 1 : -1);
                    for (int k = 0; k < n - 1; k++) {
                        double c = Math.max(-1, Math.min(1, signs[g][k] * logical[k] + (k == 6 ? 0.12 : 0)));
                        s[k + 1] = (byte) (rng.nextDouble() < (1 + c) / 2 ? s[k] : -s[k]);
                    }
                    for (int k = 0; k < n - 1; k++) {
                        sums[g][k] += s[couplers[k][0]] * s[couplers[k][1]];
                        counts[g][k]++;
                    }
                }
            }
            BiasDiagnostics.Result res = BiasDiagnostics.diagnose(sums, counts, signs, 0.01);
            assertThat(res.flagged().stream().map(BiasDiagnostics.Item::item).toList()).containsExactly(6);
        });
    }

    @Test
    void aLockedCouplerIsNotTestedWhateverItsCorrelation() {
        // Two couplers over 8 gauges of 500 reads: coupler 0 is locked (sign +1 in every gauge,
        // as a chain coupler is) and fully correlated, which a test would flag at any level;
        // coupler 1 is flipped by the gauges and unbiased. Bonferroni over tested items only
        // (common practice, no source): one tested item, so the threshold is Φ⁻¹(1 − α/2).
        int gauges = 8;
        double[][] sums = new double[gauges][2];
        long[][] reads = new long[gauges][2];
        byte[][] signs = new byte[gauges][2];
        for (int g = 0; g < gauges; g++) {
            reads[g][0] = 500;
            reads[g][1] = 500;
            sums[g][0] = 500;
            signs[g][0] = 1;
            signs[g][1] = (byte) (g % 2 == 0 ? 1 : -1);
            sums[g][1] = signs[g][1] * 100;
        }
        BiasDiagnostics.Result res = BiasDiagnostics.diagnose(sums, reads, signs, 0.01);
        assertThat(res.flagged()).isEmpty();
        assertThat(res.items()).hasSize(2);
        assertThat(res.items().get(0).item()).isEqualTo(1);
        assertThat(res.items().get(1).flipped()).isFalse();
        assertThat(res.threshold()).isCloseTo(new org.apache.commons.math3.distribution.NormalDistribution()
                .inverseCumulativeProbability(1 - 0.005), org.assertj.core.api.Assertions.within(1e-9));
    }
}
