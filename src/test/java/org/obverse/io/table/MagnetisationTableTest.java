package org.obverse.io.table;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

/** The magnetisation and coupler tables as written read back to the same values, in the bytes spec/results.md shows. */
class MagnetisationTableTest extends QuietTest {
    @TempDir
    Path dir;

    @Test
    void qubitRowsWriteThePinnedBytes() throws IOException {
        // Expected text written by hand from the columns in spec/results.md (common practice, no source).
        Path f = dir.resolve("m.csv");
        new MagnetisationTable.QubitRows().add(4, 0, 100, -38, 1).add(9, 0, 100, 100, -1).add(4, 1, 64, 0, -1).write(f);
        assertThat(Files.readString(f)).isEqualTo("""
                qubit,gauge,reads,sum_spin,sign
                4,0,100,-38,1
                9,0,100,100,-1
                4,1,64,0,-1
                """);
    }

    @Test
    void couplerRowsWriteThePinnedBytes() throws IOException {
        // Expected text written by hand from the columns in spec/results.md (common practice, no source).
        Path f = dir.resolve("c.csv");
        new MagnetisationTable.CouplerRows().add(4, 9, 0, 100, -100, -1).add(4, 9, 1, 64, 62, 1).write(f);
        assertThat(Files.readString(f)).isEqualTo("""
                qubit_a,qubit_b,gauge,reads,sum_product,sign
                4,9,0,100,-100,-1
                4,9,1,64,62,1
                """);
    }

    @Test
    void qubitTablesReadBackTheValuesWritten() {
        Seeds.forEachCase(200, 0x3a61L, (rng, seed) -> {
            int qubits = 1 + rng.nextInt(6);
            int gauges = 1 + rng.nextInt(4);
            int[] ids = distinctIds(rng, qubits);
            long[][] reads = new long[gauges][qubits];
            long[][] sums = new long[gauges][qubits];
            int[][] signs = new int[gauges][qubits];
            MagnetisationTable.QubitRows rows = new MagnetisationTable.QubitRows();
            for (int g = 0; g < gauges; g++) {
                for (int i = 0; i < qubits; i++) {
                    reads[g][i] = 1 + rng.nextInt(5000);
                    sums[g][i] = -reads[g][i] + 2L * rng.nextLong(reads[g][i] + 1);
                    signs[g][i] = rng.nextBoolean() ? 1 : -1;
                    rows.add(ids[i], g, reads[g][i], sums[g][i], signs[g][i]);
                }
            }
            Path f = dir.resolve("q" + seed + ".csv");
            rows.write(f);
            MagnetisationTable.Loaded l = MagnetisationTable.read(f);
            assertThat(l.gauges()).hasSize(gauges);
            for (int i = 0; i < qubits; i++) {
                int col = l.qubits().indexOf(ids[i]);
                assertThat(col).as("seed %d", seed).isNotNegative();
                for (int g = 0; g < gauges; g++) {
                    int row = l.gauges().indexOf(g);
                    assertThat(l.reads()[row][col]).as("seed %d", seed).isEqualTo(reads[g][i]);
                    assertThat(l.sums()[row][col]).as("seed %d", seed).isEqualTo((double) sums[g][i]);
                    assertThat(l.signs()[row][col]).as("seed %d", seed).isEqualTo((byte) signs[g][i]);
                }
            }
        });
    }

    @Test
    void couplerTablesReadBackTheValuesWritten() {
        Seeds.forEachCase(200, 0x3a62L, (rng, seed) -> {
            int[] ids = distinctIds(rng, 2 + rng.nextInt(5));
            List<int[]> pairs = new ArrayList<>();
            for (int a = 0; a < ids.length; a++) {
                for (int b = a + 1; b < ids.length; b++) {
                    if (rng.nextBoolean() || pairs.isEmpty()) {
                        pairs.add(new int[] {ids[a], ids[b]});
                    }
                }
            }
            long[] reads = new long[pairs.size()];
            long[] sums = new long[pairs.size()];
            int[] signs = new int[pairs.size()];
            MagnetisationTable.CouplerRows rows = new MagnetisationTable.CouplerRows();
            for (int e = 0; e < pairs.size(); e++) {
                reads[e] = 1 + rng.nextInt(5000);
                sums[e] = -reads[e] + 2L * rng.nextLong(reads[e] + 1);
                signs[e] = rng.nextBoolean() ? 1 : -1;
                rows.add(pairs.get(e)[0], pairs.get(e)[1], 3, reads[e], sums[e], signs[e]);
            }
            Path f = dir.resolve("c" + seed + ".csv");
            rows.write(f);
            MagnetisationTable.Couplers l = MagnetisationTable.readCouplers(f);
            assertThat(l.gauges()).containsExactly(3);
            assertThat(l.couplers()).hasSize(pairs.size());
            for (int e = 0; e < pairs.size(); e++) {
                int lo = Math.min(pairs.get(e)[0], pairs.get(e)[1]);
                int hi = Math.max(pairs.get(e)[0], pairs.get(e)[1]);
                int col = -1;
                for (int k = 0; k < l.couplers().size(); k++) {
                    if (l.couplers().get(k)[0] == lo && l.couplers().get(k)[1] == hi) {
                        col = k;
                    }
                }
                assertThat(col).as("seed %d", seed).isNotNegative();
                assertThat(l.reads()[0][col]).as("seed %d", seed).isEqualTo(reads[e]);
                assertThat(l.sums()[0][col]).as("seed %d", seed).isEqualTo((double) sums[e]);
                assertThat(l.signs()[0][col]).as("seed %d", seed).isEqualTo((byte) signs[e]);
            }
        });
    }

    private static int[] distinctIds(org.apache.commons.rng.UniformRandomProvider rng, int n) {
        Set<Integer> s = new LinkedHashSet<>();
        while (s.size() < n) {
            s.add(rng.nextInt(2048));
        }
        return s.stream().mapToInt(Integer::intValue).toArray();
    }
}
