package org.obverse.anneal;

import static org.assertj.core.api.Assertions.assertThat;

import org.apache.commons.rng.UniformRandomProvider;

/**
 * The check both multi-spin kernels' lane forms pass: m blocks swept as lanes end bit for bit
 * as each block swept alone by the one-block form, generator state included, over a few
 * sweeps at β from 0 (every uphill move taken) to 20 (nearly none).
 */
final class LaneCheck {
    private LaneCheck() {
    }

    /** Random words and states for 1–70 lanes of an n-spin problem; asserts lanes == blocks alone. */
    static void lanesEqualBlocksAlone(WordSweeps kernel, UniformRandomProvider rng) {
        int n = kernel.size();
        int m = rng.nextInt(4) == 0 ? 1 + rng.nextInt(70) : 1 + rng.nextInt(20);
        long[][] ref = new long[m][n];
        long[] bits = new long[n * m];
        long[][] refState = new long[m][];
        MultiSpinCoding.Lanes lanes = new MultiSpinCoding.Lanes(m);
        for (int i = 0; i < m; i++) {
            for (int k = 0; k < n; k++) {
                ref[i][k] = rng.nextLong();
                bits[k * m + i] = ref[i][k];
            }
            long a = rng.nextLong();
            long b = rng.nextLong();
            refState[i] = new long[] {a, b};
            lanes.setState(i, a, b);
        }
        long[] thresholds = new long[MultiSpinCoding.thresholdLength()];
        int sweeps = 1 + rng.nextInt(5);
        for (int t = 0; t < sweeps; t++) {
            // Large beta too: then almost every uphill read is refused in the first rounds,
            // and lanes without an uphill read occur.
            double beta = rng.nextInt(5) == 0 ? 0.0 : rng.nextInt(4) == 0 ? 20 * rng.nextDouble() : rng.nextDouble() * 3;
            kernel.thresholds(beta, thresholds);
            for (int i = 0; i < m; i++) {
                kernel.sweep(ref[i], thresholds, refState[i]);
            }
            kernel.sweepLanes(bits, thresholds, lanes);
            for (int i = 0; i < m; i++) {
                for (int k = 0; k < n; k++) {
                    assertThat(bits[k * m + i]).as("lane %d of %d, spin %d, sweep %d", i, m, k, t).isEqualTo(ref[i][k]);
                }
            }
        }
        for (int i = 0; i < m; i++) {
            assertThat(lanes.state(i)).as("lane %d state", i).containsExactly(refState[i]);
        }
    }
}
