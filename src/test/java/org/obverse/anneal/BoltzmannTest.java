package org.obverse.anneal;

import org.apache.commons.math3.stat.inference.ChiSquareTest;
import org.junit.jupiter.api.Test;
import org.obverse.model.IsingProblem;
import org.obverse.testsupport.QuietTest;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * At a fixed β, Metropolis sweeps sample the Boltzmann distribution (Metropolis et al., J. Chem.
 * Phys. 21, 1087, 1953). Each read is an independent chain (its own generator and random
 * start), run long enough to forget its start on 5 spins, so the reads are independent draws
 * and a chi-square goodness-of-fit test (commons-math3 as the oracle) applies. Threshold
 * p &lt; 1e-4: an exact sampler fails with probability 1e-4 per check (two checks), and the
 * seeds are fixed, so a pass is reproducible.
 */
class BoltzmannTest extends QuietTest {
    private static final double BETA = 0.4;

    /** A frustrated ring of five ±1 couplings with one field: one magnitude, so both kernels run it. */
    private static IsingProblem ring() {
        return IsingProblem.builder().coupling(0, 1, 1).coupling(1, 2, 1).coupling(2, 3, -1).coupling(3, 4, 1)
                .coupling(0, 4, 1).field(2, 1).build();
    }

    private static void assertBoltzmann(SamplerSettings.Kernel kernel) {
        IsingProblem p = ring();
        int reads = 16_000;
        SamplerSettings settings = SamplerSettings.defaults().withKernel(kernel).withBetaRange(BETA, BETA)
                .withSweepsPerMicrosecond(60);
        SampledReads s = ReferenceSampler.of(settings).sample(p, reads, 77);
        long[] observed = new long[32];
        for (int r = 0; r < reads; r++) {
            int state = 0;
            for (int k = 0; k < 5; k++) {
                state |= (s.samples().spin(r, k) > 0 ? 1 : 0) << k;
            }
            observed[state]++;
        }
        double[] expected = new double[32];
        double z = 0;
        byte[] spins = new byte[5];
        for (int state = 0; state < 32; state++) {
            for (int k = 0; k < 5; k++) {
                spins[k] = (byte) (((state >>> k) & 1) == 1 ? 1 : -1);
            }
            expected[state] = Math.exp(-BETA * p.energy(spins));
            z += expected[state];
        }
        for (int state = 0; state < 32; state++) {
            expected[state] *= reads / z;
        }
        double pValue = new ChiSquareTest().chiSquareTest(expected, observed);
        assertThat(pValue).as("%s kernel: chi-square p-value", kernel).isGreaterThan(1e-4);
    }

    @Test
    void exactKernelSamplesTheBoltzmannDistribution() {
        assertBoltzmann(SamplerSettings.Kernel.EXACT);
    }

    @Test
    void multiSpinKernelSamplesTheBoltzmannDistribution() {
        assertBoltzmann(SamplerSettings.Kernel.MULTI_SPIN);
    }

    /** A star: the centre meets the leaves (±1) and has a field: leaves + 1 terms at the centre. */
    private static IsingProblem star(int leaves) {
        org.obverse.model.IsingBuilder b = IsingProblem.builder().field(0, -1);
        for (int leaf = 1; leaf <= leaves; leaf++) {
            b.coupling(0, leaf, leaf % 3 == 0 ? 1 : -1);
            if (leaf % 4 == 0) {
                b.field(leaf, 1);
            }
        }
        return b.build();
    }

    /** Chi-square over energy levels (levels with an expected count below 5 pooled). */
    private static void assertEnergyLevelsBoltzmann(SamplerSettings.Kernel kernel, double beta, int leaves) {
        IsingProblem p = star(leaves);
        int n = p.size();
        int reads = 12_000;
        SamplerSettings settings = SamplerSettings.defaults().withKernel(kernel).withBetaRange(beta, beta)
                .withSweepsPerMicrosecond(40);
        SampledReads s = ReferenceSampler.of(settings).sample(p, reads, 78);
        java.util.TreeMap<Double, Double> weight = new java.util.TreeMap<>();
        byte[] spins = new byte[n];
        double z = 0;
        for (int state = 0; state < (1 << n); state++) {
            for (int k = 0; k < n; k++) {
                spins[k] = (byte) (((state >>> k) & 1) == 1 ? 1 : -1);
            }
            double w = Math.exp(-beta * p.energy(spins));
            weight.merge(p.energy(spins), w, Double::sum);
            z += w;
        }
        java.util.TreeMap<Double, Long> seen = new java.util.TreeMap<>();
        for (double e : s.energies()) {
            seen.merge(e, 1L, Long::sum);
        }
        assertThat(weight.keySet()).containsAll(seen.keySet());
        java.util.List<Double> expected = new java.util.ArrayList<>();
        java.util.List<Long> observed = new java.util.ArrayList<>();
        double poolE = 0;
        long poolO = 0;
        for (java.util.Map.Entry<Double, Double> level : weight.entrySet()) {
            double exp = level.getValue() / z * reads;
            long obs = seen.getOrDefault(level.getKey(), 0L);
            if (exp < 5) {
                poolE += exp;
                poolO += obs;
            } else {
                expected.add(exp);
                observed.add(obs);
            }
        }
        expected.add(poolE);
        observed.add(poolO);
        double pValue = new ChiSquareTest().chiSquareTest(expected.stream().mapToDouble(Double::doubleValue).toArray(),
                observed.stream().mapToLong(Long::longValue).toArray());
        assertThat(pValue).as("%s kernel at beta %s, %d leaves: chi-square p-value", kernel, beta, leaves)
                .isGreaterThan(1e-4);
    }

    @Test
    void highDegreeSpinsAreSampledExactlyByBothKernels() {
        // Centres with 8 and 11 terms: the multi-spin kernel's four-level and general paths.
        // Four chi-square checks at 1e-4 each: a false-failure rate below 4e-4.
        for (SamplerSettings.Kernel kernel : SamplerSettings.Kernel.values()) {
            assertEnergyLevelsBoltzmann(kernel, 0.3, 7);
            assertEnergyLevelsBoltzmann(kernel, 0.3, 10);
        }
    }
}
