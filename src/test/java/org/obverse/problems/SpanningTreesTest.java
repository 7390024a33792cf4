package org.obverse.problems;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

class SpanningTreesTest extends QuietTest {
    static int[][] complete(int n) {
        List<int[]> e = new ArrayList<>();
        for (int u = 0; u < n; u++) {
            for (int v = u + 1; v < n; v++) {
                e.add(new int[] {u, v});
            }
        }
        return e.toArray(new int[0][]);
    }

    /** A connected random graph: a random tree plus each other pair with probability p. */
    static int[][] randomConnected(int n, double p, org.apache.commons.rng.UniformRandomProvider rng) {
        List<int[]> e = new ArrayList<>();
        boolean[][] has = new boolean[n][n];
        for (int v = 1; v < n; v++) {
            int u = rng.nextInt(v);
            e.add(new int[] {u, v});
            has[u][v] = true;
        }
        for (int u = 0; u < n; u++) {
            for (int v = u + 1; v < n; v++) {
                if (!has[u][v] && rng.nextDouble() < p) {
                    e.add(new int[] {u, v});
                }
            }
        }
        return e.toArray(new int[0][]);
    }

    @Test
    void completeGraphsHaveCayleyManyTrees() {
        // Cayley's formula: K_n has n^(n-2) spanning trees (Bondy & Murty, Graph Theory, Springer 2008).
        for (int n = 1; n <= 7; n++) {
            long expected = Math.round(Math.pow(n, n - 2));
            assertThat(SpanningTrees.count(n, complete(n))).as("K_%d", n).isEqualTo(expected);
            assertThat(SpanningTrees.kirchhoffCount(n, complete(n))).as("Kirchhoff K_%d", n)
                    .isCloseTo(expected, org.assertj.core.data.Offset.offset(1e-6 * expected));
        }
    }

    @Test
    void cyclesAndCompleteBipartiteGraphsMatchClosedForms() {
        // A cycle C_n has n spanning trees; K_{a,b} has a^(b-1) b^(a-1) (Scoins 1962; any graph
        // theory text, e.g. Bondy & Murty 2008).
        for (int n = 3; n <= 9; n++) {
            int[][] c = new int[n][];
            for (int v = 0; v < n; v++) {
                c[v] = new int[] {v, (v + 1) % n};
            }
            assertThat(SpanningTrees.count(n, c)).isEqualTo(n);
        }
        for (int a = 1; a <= 3; a++) {
            for (int b = 1; b <= 4; b++) {
                List<int[]> e = new ArrayList<>();
                for (int i = 0; i < a; i++) {
                    for (int j = 0; j < b; j++) {
                        e.add(new int[] {i, a + j});
                    }
                }
                long expected = Math.round(Math.pow(a, b - 1) * Math.pow(b, a - 1));
                assertThat(SpanningTrees.count(a + b, e.toArray(new int[0][]))).as("K_{%d,%d}", a, b).isEqualTo(expected);
            }
        }
    }

    @Test
    void enumerationAgreesWithTheMatrixTreeTheoremOnRandomGraphs() {
        // Kirchhoff's matrix-tree theorem through EJML's determinant is the oracle.
        Seeds.forEachCase(60, 5100, (rng, seed) -> {
            int n = 2 + rng.nextInt(6);
            int[][] edges = randomConnected(n, rng.nextDouble(), rng);
            long count = SpanningTrees.count(n, edges);
            assertThat((double) count).isCloseTo(SpanningTrees.kirchhoffCount(n, edges),
                    org.assertj.core.data.Offset.offset(1e-6 * count));
        });
    }

    @Test
    void disconnectedGraphHasNoTree() {
        int[][] edges = {{0, 1}, {2, 3}};
        assertThat(SpanningTrees.count(4, edges)).isZero();
        assertThat(SpanningTrees.kirchhoffCount(4, edges)).isCloseTo(0.0, org.assertj.core.data.Offset.offset(1e-9));
    }
}
