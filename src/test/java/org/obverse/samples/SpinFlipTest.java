package org.obverse.samples;

import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.gauge.Gauge;
import org.obverse.gauge.GaugeTransform;
import org.obverse.model.IsingProblem;
import org.obverse.samples.GeneratedProblems.Values;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;
import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * Un-gauging: s = g ∘ s' (DESIGN.md, "The mathematics"), and the invariance E(s) = E'(s') of a
 * gauged problem h'_i = g_i h_i, J'_ij = g_i g_j J_ij, offset unchanged.
 */
class SpinFlipTest extends QuietTest {
    private static byte[] gauge(UniformRandomProvider rng, int n) {
        byte[] g = new byte[n];
        // Sometimes few flips (the sparse path), sometimes many (the full pass).
        double p = rng.nextBoolean() ? 0.05 : 0.5;
        for (int k = 0; k < n; k++) {
            g[k] = (byte) (rng.nextDouble() < p ? -1 : 1);
        }
        return g;
    }

    @Test
    void flipMultipliesEachSpinByItsSign() {
        Seeds.forEachCase(200, 60_000, (rng, seed) -> {
            int n = 1 + rng.nextInt(150);
            int reads = rng.nextInt(300);
            byte[] g = gauge(rng, n);
            byte[] s = GeneratedProblems.spins(rng, reads * n);
            SampleBlock block = SampleBlock.fromSpins(s, reads, n);
            SampleBlock out = SampleBlock.allDown(reads, n);
            SpinFlip flip = SpinFlip.ofSigns(g);
            flip.apply(block, out);
            flip.applyInPlace(block);
            byte[] expected = new byte[s.length];
            for (int i = 0; i < s.length; i++) {
                expected[i] = (byte) (s[i] * g[i % n]);
            }
            assertThat(block.toSpins()).containsExactly(expected);
            assertThat(out.words()).containsExactly(block.words());
            // Bits past the last read stay clear.
            for (int b = 0; b < block.blockCount(); b++) {
                for (int k = 0; k < n; k++) {
                    assertThat(block.word(b, k) & ~block.validMask(b)).isZero();
                }
            }
        });
    }

    @Test
    void flippingTwiceIsTheIdentity() {
        Seeds.forEachCase(200, 70_000, (rng, seed) -> {
            int n = 1 + rng.nextInt(150);
            int reads = 1 + rng.nextInt(300);
            SampleBlock block = SampleBlock.fromSpins(GeneratedProblems.spins(rng, reads * n), reads, n);
            SampleBlock before = block.copy();
            SpinFlip flip = SpinFlip.ofSigns(gauge(rng, n));
            flip.applyInPlace(block);
            flip.applyInPlace(block);
            assertThat(block.words()).containsExactly(before.words());
            flip.apply(block, block);
            flip.apply(block, block);
            assertThat(block.words()).containsExactly(before.words());
        });
    }

    @Test
    void gaugedEnergyEqualsSourceEnergyBitForBit() {
        Seeds.forEachCase(200, 80_000, (rng, seed) -> {
            IsingProblem source = GeneratedProblems.problem(rng, Values.values()[rng.nextInt(3)], 90);
            int n = source.size();
            byte[] g = gauge(rng, n);
            double[] h = source.fields();
            double[] j = source.couplings();
            for (int k = 0; k < n; k++) {
                h[k] *= g[k];
            }
            for (int e = 0; e < j.length; e++) {
                j[e] *= g[source.edgeU(e)] * g[source.edgeV(e)];
            }
            IsingProblem gauged = IsingProblem.of(source.variables(), h, source.edgeUs(), source.edgeVs(), j,
                    source.offset());
            int reads = 1 + rng.nextInt(200);
            SampleBlock raw = SampleBlock.fromSpins(GeneratedProblems.spins(rng, reads * n), reads, n);
            double[] eGauged = EnergyKernel.exact(gauged).energies(raw);
            SampleBlock ungauged = raw.copy();
            SpinFlip.ofSigns(g).applyInPlace(ungauged);
            double[] eSource = EnergyKernel.exact(source).energies(ungauged);
            // The gauge package's transform (zero terms kept +0.0) must give the same energies.
            int[] signs = new int[n];
            for (int k = 0; k < n; k++) {
                signs[k] = g[k];
            }
            IsingProblem viaGaugePackage = GaugeTransform.apply(source, Gauge.ofSigns(signs));
            double[] eViaPackage = EnergyKernel.exact(viaGaugePackage).energies(raw);
            for (int r = 0; r < reads; r++) {
                assertThat(Double.doubleToRawLongBits(eGauged[r])).as("read %d", r)
                        .isEqualTo(Double.doubleToRawLongBits(eSource[r]));
                assertThat(Double.doubleToRawLongBits(eViaPackage[r])).as("read %d", r)
                        .isEqualTo(Double.doubleToRawLongBits(eSource[r]));
            }
        });
    }

    @Test
    void refusesBadPositionsAndWidths() {
        assertThatThrownBy(() -> SpinFlip.of(4, new int[] {1, 4})).isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("position 4 is outside [0, 4)");
        assertThatThrownBy(() -> SpinFlip.of(4, new int[] {2, 2})).isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("given twice");
        SpinFlip f = SpinFlip.of(4, new int[] {3, 0});
        assertThat(f.positions()).containsExactly(0, 3);
        assertThatThrownBy(() -> f.applyInPlace(SampleBlock.allDown(2, 5))).isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("flip is for 4");
    }
}
