package org.obverse.samples;

import org.junit.jupiter.api.Test;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** Popcount sums of bit-sliced reads against plain sums over ±1 rows (common practice, no source). */
class SpinMomentsTest extends QuietTest {
    @Test
    void bitSlicedSumsEqualRowSums() {
        Seeds.forEachCase(200, 81, (rng, seed) -> {
            int n = 2 + rng.nextInt(9);
            IsingBuilder b = IsingProblem.builder();
            for (int k = 0; k < n; k++) {
                b.variable(3 * k + 1);
            }
            // A ring on sparse ids: a path, closed where there are three or more variables.
            for (int k = 0; k + 1 < n; k++) {
                b.coupling(3 * k + 1, 3 * k + 4, 1.0);
            }
            if (n > 2) {
                b.coupling(1, 3 * (n - 1) + 1, -0.5);
            }
            IsingProblem p = b.build();
            SpinMoments moments = SpinMoments.of(p);
            long[] spin = new long[n];
            long[] product = new long[p.edgeCount()];
            long reads = 0;
            // Several blocks of any length, so that partial 64-read words are masked.
            for (int part = rng.nextInt(4); part >= 0; part--) {
                int count = rng.nextInt(200);
                byte[] rows = new byte[count * n];
                for (int i = 0; i < rows.length; i++) {
                    rows[i] = (byte) (rng.nextBoolean() ? 1 : -1);
                }
                moments.add(SampleBlock.fromSpins(rows, count, n));
                for (int r = 0; r < count; r++) {
                    for (int k = 0; k < n; k++) {
                        spin[k] += rows[r * n + k];
                    }
                    for (int e = 0; e < p.edgeCount(); e++) {
                        product[e] += rows[r * n + p.edgeU(e)] * rows[r * n + p.edgeV(e)];
                    }
                }
                reads += count;
            }
            assertThat(moments.reads()).isEqualTo(reads);
            assertThat(moments.couplers()).isEqualTo(p.edgeCount());
            for (int k = 0; k < n; k++) {
                assertThat(moments.spinSum(k)).as("variable %d", k).isEqualTo(spin[k]);
            }
            for (int e = 0; e < p.edgeCount(); e++) {
                assertThat(moments.productSum(e)).as("coupler %d", e).isEqualTo(product[e]);
            }
        });
    }

    @Test
    void refusesCouplersOutsideTheColumnsAndBlocksOfAnotherWidth() {
        assertThatThrownBy(() -> SpinMoments.of(3, new int[][] {{0, 3}})).hasMessageContaining("coupler 0");
        assertThatThrownBy(() -> SpinMoments.of(3, new int[][] {{1, 1}})).hasMessageContaining("distinct");
        SpinMoments m = SpinMoments.of(3, new int[0][]);
        assertThatThrownBy(() -> m.add(SampleBlock.allDown(5, 4))).hasMessageContaining("4 columns");
    }
}
