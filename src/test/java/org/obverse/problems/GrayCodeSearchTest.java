package org.obverse.problems;

import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class GrayCodeSearchTest extends QuietTest {
    /** Every state by plain evaluation: {min energy, count within tol}. */
    static double[] bruteForce(IsingProblem p, double tol) {
        int n = p.size();
        byte[] s = new byte[n];
        double min = Double.POSITIVE_INFINITY;
        double[] energies = new double[1 << n];
        for (int state = 0; state < (1 << n); state++) {
            for (int k = 0; k < n; k++) {
                s[k] = (byte) (((state >>> k) & 1) == 1 ? 1 : -1);
            }
            energies[state] = p.energy(s);
            min = Math.min(min, energies[state]);
        }
        int count = 0;
        for (double e : energies) {
            if (e <= min + tol) {
                count++;
            }
        }
        return new double[] {min, count};
    }

    static IsingProblem randomProblem(int n, double density, boolean integer, UniformRandomProvider rng) {
        IsingBuilder b = IsingProblem.builder();
        for (int v = 0; v < n; v++) {
            b.variable(v);
            if (rng.nextBoolean()) {
                b.field(v, integer ? rng.nextInt(5) - 2 : rng.nextDouble() * 2 - 1);
            }
            for (int u = 0; u < v; u++) {
                if (rng.nextDouble() < density) {
                    b.coupling(u, v, integer ? rng.nextInt(5) - 2 : rng.nextDouble() * 2 - 1);
                }
            }
        }
        return b.offset(rng.nextDouble()).build();
    }

    @Test
    void agreesWithBruteForceOnRandomInstances() {
        Seeds.forEachCase(80, 7300, (rng, seed) -> {
            int n = 1 + rng.nextInt(14);
            IsingProblem p = randomProblem(n, rng.nextDouble(), rng.nextBoolean(), rng);
            GrayCodeSearch.Result r = GrayCodeSearch.solve(p);
            double[] brute = bruteForce(p, GrayCodeSearch.tolerance(p));
            assertThat(r.energy()).isEqualTo(brute[0]);
            assertThat(r.groundStates()).isEqualTo((long) brute[1]);
            assertThat(p.energy(r.spins(n))).isEqualTo(r.energy());
        });
    }

    @Test
    void resultDoesNotDependOnTheThreadCount() {
        // 22 spins: the search splits over 16 tasks.
        UniformRandomProvider rng = Seeds.rng(7400);
        IsingProblem p = randomProblem(22, 0.2, true, rng);
        GrayCodeSearch.Result one = GrayCodeSearch.solve(p, 1);
        GrayCodeSearch.Result two = GrayCodeSearch.solve(p, 2);
        assertThat(two).isEqualTo(one);
        assertThat(one.energy()).isEqualTo(bruteForce(p, GrayCodeSearch.tolerance(p))[0]);
    }

    @Test
    void petersenGraphMaxCutIsTwelve() {
        // Max-cut of the Petersen graph is 12 of its 15 edges: well known, from memory. Why: it
        // has 12 five-cycles and each edge lies on 4 of them, so a bipartite subgraph must drop
        // at least 12 / 4 = 3 edges, and 3 suffice.
        int[][] edges = new int[15][];
        for (int i = 0; i < 5; i++) {
            edges[i] = new int[] {i, (i + 1) % 5};
            edges[5 + i] = new int[] {i, 5 + i};
            edges[10 + i] = new int[] {5 + i, 5 + (i + 2) % 5};
        }
        GrayCodeSearch.Result r = GrayCodeSearch.solve(MaxCut.of(10, edges));
        assertThat(MaxCut.cutWeight(15, r.energy())).isEqualTo(12.0);
    }

    @Test
    void completeGraphsAndCyclesMatchClosedForms() {
        // Max-cut of K_n is floor(n^2/4) (split the nodes in halves); of the cycle C_n it is n for
        // even n and n - 1 for odd n. Both well known, no further source.
        for (int n = 2; n <= 12; n++) {
            GrayCodeSearch.Result r = GrayCodeSearch.solve(MaxCut.of(n, SpanningTreesTest.complete(n)));
            assertThat(MaxCut.cutWeight(n * (n - 1) / 2.0, r.energy())).as("K_%d", n).isEqualTo(Math.floor(n * n / 4.0));
        }
        for (int n = 3; n <= 16; n++) {
            int[][] c = new int[n][];
            for (int v = 0; v < n; v++) {
                c[v] = new int[] {v, (v + 1) % n};
            }
            GrayCodeSearch.Result r = GrayCodeSearch.solve(MaxCut.of(n, c));
            assertThat(MaxCut.cutWeight(n, r.energy())).as("C_%d", n).isEqualTo(n % 2 == 0 ? n : n - 1.0);
            // The odd antiferromagnetic ring has 2n ground states (one frustrated bond, two signs);
            // the even ring has 2 (standard result).
            assertThat(r.groundStates()).isEqualTo(n % 2 == 0 ? 2L : 2L * n);
        }
    }

    @Test
    void refusesTooManyVariables() {
        IsingBuilder b = IsingProblem.builder();
        for (int v = 0; v < 33; v++) {
            b.variable(v);
        }
        assertThatThrownBy(() -> GrayCodeSearch.solve(b.build())).isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("33 variables");
    }
}
