package org.obverse.problems;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashSet;
import java.util.List;
import java.util.Optional;
import java.util.Set;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.model.BinaryProblem;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

class DegreeBoundedSpanningTreeTest extends QuietTest {
    /** Rounding of the QUBO's fixed-order sum against the plain length sum. */
    private static final double ENERGY_TOLERANCE = 1e-9;

    static DegreeBoundedSpanningTree randomInstance(int n, UniformRandomProvider rng, int maxVariables) {
        while (true) {
            int[][] edges = SpanningTreesTest.randomConnected(n, rng.nextDouble(), rng);
            double[] lengths = new double[edges.length];
            for (int e = 0; e < edges.length; e++) {
                lengths[e] = 0.1 + 2.0 * rng.nextDouble();
            }
            int[] bounds = new int[n];
            for (int v = 0; v < n; v++) {
                bounds[v] = rng.nextInt(4) == 0 ? DegreeBoundedSpanningTree.UNBOUNDED : 1 + rng.nextInt(3);
            }
            int depth = 1 + rng.nextInt(n - 1);
            DegreeBoundedSpanningTree t = DegreeBoundedSpanningTree.of(n, rng.nextInt(n), edges, lengths, bounds, depth);
            if (t.variableCount() <= maxVariables) {
                return t;
            }
        }
    }

    @Test
    void logEncodingReachesTheBoundAndNoMore() {
        // Lucas 2014, §2.4: the coefficients 1, 2, ..., 2^(M-1), D + 1 - 2^M encode 0..D exactly.
        for (int bound = 1; bound <= 12; bound++) {
            int[] c = DegreeBoundedSpanningTree.slackCoefficients(bound);
            Set<Integer> reachable = new HashSet<>();
            for (int mask = 0; mask < (1 << c.length); mask++) {
                int sum = 0;
                for (int k = 0; k < c.length; k++) {
                    sum += ((mask >>> k) & 1) * c[k];
                }
                reachable.add(sum);
            }
            for (int d = 0; d <= bound + 6; d++) {
                assertThat(reachable.contains(d)).as("bound %d, degree %d", bound, d).isEqualTo(d <= bound);
            }
        }
        // The degree term as printed, sum_j j z_j over j = 1..D without a one-hot rule, reaches
        // degrees above D for every D >= 2 (D + 1 = 1 + D): such degrees would cost nothing.
        // This is why the log encoding is used.
        for (int bound = 2; bound <= 8; bound++) {
            Set<Integer> printed = new HashSet<>();
            for (int mask = 0; mask < (1 << bound); mask++) {
                int sum = 0;
                for (int j = 1; j <= bound; j++) {
                    sum += ((mask >>> (j - 1)) & 1) * j;
                }
                printed.add(sum);
            }
            assertThat(printed).as("printed encoding, bound %d", bound).contains(bound + 1, bound * (bound + 1) / 2);
        }
    }

    @Test
    void everyFeasibleTreeCostsItsLengthAndBeatsEveryInfeasibleAssignment() {
        // Brute force over every assignment of small instances (<= 16 variables).
        Seeds.forEachCase(25, 8100, (rng, seed) -> {
            DegreeBoundedSpanningTree t = randomInstance(3 + rng.nextInt(2), rng, 16);
            BinaryProblem q = t.qubo();
            int n = q.size();
            byte[] x = new byte[n];
            double maxFeasible = Double.NEGATIVE_INFINITY;
            double minInfeasible = Double.POSITIVE_INFINITY;
            Set<String> decodedTrees = new HashSet<>();
            for (int state = 0; state < (1 << n); state++) {
                for (int k = 0; k < n; k++) {
                    x[k] = (byte) ((state >>> k) & 1);
                }
                double e = q.energy(x);
                Optional<int[]> tree = t.decode(x);
                if (tree.isPresent()) {
                    assertThat(t.isFeasibleTree(tree.get())).isTrue();
                    assertThat(e).isCloseTo(t.length(tree.get()) + t.energyConstant(), within(ENERGY_TOLERANCE));
                    maxFeasible = Math.max(maxFeasible, e);
                    decodedTrees.add(Arrays.toString(tree.get()));
                } else {
                    minInfeasible = Math.min(minInfeasible, e);
                }
            }
            if (maxFeasible > Double.NEGATIVE_INFINITY) {
                assertThat(maxFeasible).isLessThan(minInfeasible);
            }
            // The feasible assignments encode exactly the feasible spanning trees.
            Set<String> enumerated = new HashSet<>();
            SpanningTrees.forEach(t.nodes(), edgesOf(t), tr -> {
                if (t.isFeasibleTree(tr)) {
                    enumerated.add(Arrays.toString(tr));
                }
            });
            assertThat(decodedTrees).isEqualTo(enumerated);
        });
    }

    @Test
    void exactBestTreeIsTheQuboGroundState() {
        Seeds.forEachCase(20, 8200, (rng, seed) -> {
            DegreeBoundedSpanningTree t = randomInstance(3 + rng.nextInt(3), rng, 24);
            Optional<DegreeBoundedSpanningTree.Tree> best = t.exactBest();
            GrayCodeSearch.Result ground = GrayCodeSearch.solve(t.qubo());
            if (best.isPresent()) {
                assertThat(best.get().quboEnergy()).isCloseTo(best.get().length(), within(ENERGY_TOLERANCE));
                assertThat(ground.energy()).isCloseTo(best.get().quboEnergy(), within(ENERGY_TOLERANCE));
                assertThat(t.decode(best.get().assignment())).hasValueSatisfying(e -> assertThat(e).isEqualTo(best.get().edges()));
            } else {
                // No feasible tree: every assignment pays at least the penalty weight.
                assertThat(ground.energy()).isGreaterThanOrEqualTo(t.penaltyWeight() - ENERGY_TOLERANCE);
            }
        });
    }

    @Test
    void everyDegreeAboveTheBoundIsPenalised() {
        // A star on 5 nodes needs the centre's degree 4: with bound 1, 2 or 3 at the centre no
        // assignment is feasible, so the QUBO's ground energy is at least A.
        int[][] star = {{0, 1}, {0, 2}, {0, 3}, {0, 4}};
        double[] len = {1, 1, 1, 1};
        for (int bound = 1; bound <= 4; bound++) {
            int[] bounds = {bound, 9, 9, 9, 9};
            DegreeBoundedSpanningTree t = DegreeBoundedSpanningTree.of(5, 1, star, len, bounds, 2);
            double ground = GrayCodeSearch.solve(t.qubo()).energy();
            if (bound < 4) {
                assertThat(t.exactBest()).isEmpty();
                assertThat(ground).as("bound %d", bound).isGreaterThanOrEqualTo(t.penaltyWeight());
            } else {
                assertThat(ground).isCloseTo(4.0, within(ENERGY_TOLERANCE));
            }
        }
    }

    @Test
    void fiveNodeInstancesHavePlausibleVariableCounts() {
        // Fact of the trade stated by practitioners, no further source: degree-bounded
        // spanning-tree instances on 5-node graphs map to between 30 and 75 logical variables
        // depending on the number of edges. A plausibility check of the builder, with turbine-like
        // bounds of 1 to 3 bays and the default depth bound.
        Seeds.forEachCase(40, 8300, (rng, seed) -> {
            int[][] edges = SpanningTreesTest.randomConnected(5, rng.nextDouble(), rng);
            int[] bounds = new int[5];
            for (int v = 0; v < 5; v++) {
                bounds[v] = 1 + rng.nextInt(3);
            }
            double[] len = new double[edges.length];
            Arrays.fill(len, 1.0);
            DegreeBoundedSpanningTree t = DegreeBoundedSpanningTree.of(5, 0, edges, len, bounds);
            assertThat(t.variableCount()).as("%d edges", edges.length).isBetween(30, 75);
        });
        assertThat(WindArray.fiveSites().problem().variableCount()).isBetween(30, 75);
    }

    @Test
    void windArrayDemoNeedsTheDegreeBound() {
        WindArray w = WindArray.demo();
        DegreeBoundedSpanningTree t = w.problem();
        assertThat(t.variableCount()).isEqualTo(18);
        DegreeBoundedSpanningTree.Tree best = t.exactBest().orElseThrow();
        List<String> names = new ArrayList<>();
        for (int e : best.edges()) {
            names.add(w.cableName(e));
        }
        assertThat(names).containsExactlyInAnyOrder("S-T1", "S-T2", "T1-T3");
        // Lengths by Pythagoras from the invented coordinates: 1.0440 + 1.2042 + 1.0198.
        assertThat(w.describe(best.edges())).isEqualTo("S-T1, S-T2, T1-T3 (3.268 km)");
        byte[] spins = new byte[best.assignment().length];
        for (int k = 0; k < spins.length; k++) {
            spins[k] = (byte) (2 * best.assignment()[k] - 1);
        }
        assertThat(t.decodeSpins(spins)).hasValueSatisfying(e -> assertThat(e).isEqualTo(best.edges()));
        // Without bays the shortest tree puts three cables into T1 (Kruskal by hand on the five
        // candidate lengths): the bound changes the answer.
        int[] free = {9, 9, 9, 9};
        DegreeBoundedSpanningTree unbounded = DegreeBoundedSpanningTree.of(4, 0, w.cables(), w.cableLengths(), free, 3);
        int[] mst = unbounded.exactBest().orElseThrow().edges();
        assertThat(mst).containsExactly(0, 2, 3);
        assertThat(t.isFeasibleTree(mst)).isFalse();
        assertThat(GrayCodeSearch.solve(t.qubo()).energy()).isCloseTo(best.quboEnergy(), within(ENERGY_TOLERANCE));
    }

    @Test
    void variablesSayWhatTheyMean() {
        DegreeBoundedSpanningTree t = WindArray.demo().problem();
        long levels = t.variables().stream().filter(v -> v.role() == DegreeBoundedSpanningTree.Role.LEVEL).count();
        long slack = t.variables().stream().filter(v -> v.role() == DegreeBoundedSpanningTree.Role.SLACK).count();
        assertThat(levels).isEqualTo(3 * 2);
        assertThat(slack).isEqualTo(4);
        assertThat(t.variable(0).describe()).isEqualTo("x0: node 1 at level 1");
    }

    @Test
    void refusesBadInstances() {
        int[][] e = {{0, 1}};
        assertThatThrownBy(() -> DegreeBoundedSpanningTree.of(2, 0, e, new double[] {-1}, new int[] {1, 1}))
                .hasMessageContaining("length -1.0");
        assertThatThrownBy(() -> DegreeBoundedSpanningTree.of(2, 0, new int[][] {{0, 1}, {1, 0}}, new double[] {1, 1},
                new int[] {1, 1})).hasMessageContaining("listed twice");
        assertThatThrownBy(() -> DegreeBoundedSpanningTree.of(3, 0, e, new double[] {1}, new int[] {1, 1, 1}, 3))
                .hasMessageContaining("depth bound 3");
    }

    static int[][] edgesOf(DegreeBoundedSpanningTree t) {
        int[][] out = new int[t.edgeCount()][];
        for (int k = 0; k < out.length; k++) {
            out[k] = t.edge(k);
        }
        return out;
    }
}
