package org.obverse.connectivity;

import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Union–find against a naive connectivity oracle: breadth-first search over the pairs joined so
 * far (common practice, no source), on random graphs from empty to dense.
 */
class DisjointSetsTest extends QuietTest {
    @Test
    void agreesWithBreadthFirstSearchAfterEveryUnion() {
        Seeds.forEachCase(300, 7_100, (rng, seed) -> {
            int n = 1 + rng.nextInt(40);
            int pairs = rng.nextInt(2 * n + 1);
            DisjointSets sets = DisjointSets.of(n);
            List<List<Integer>> adjacent = new ArrayList<>();
            for (int i = 0; i < n; i++) {
                adjacent.add(new ArrayList<>());
            }
            for (int p = 0; p < pairs; p++) {
                int a = rng.nextInt(n);
                int b = rng.nextInt(n);
                boolean wasJoined = reachable(adjacent, a)[b];
                assertThat(sets.union(a, b)).as("union(%d, %d)", a, b).isEqualTo(!wasJoined);
                adjacent.get(a).add(b);
                adjacent.get(b).add(a);
                if (rng.nextInt(8) == 0) {
                    assertMatchesOracle(sets, adjacent, rng);
                }
            }
            assertMatchesOracle(sets, adjacent, rng);
        });
    }

    @Test
    void resetGivesSingletonsAgain() {
        Seeds.forEachCase(50, 7_500, (rng, seed) -> {
            int n = 2 + rng.nextInt(20);
            DisjointSets sets = DisjointSets.of(n);
            for (int p = 0; p < n; p++) {
                sets.union(rng.nextInt(n), rng.nextInt(n));
            }
            sets.reset();
            int[] labels = sets.labels();
            for (int i = 0; i < n; i++) {
                assertThat(labels[i]).isEqualTo(i);
                assertThat(sets.find(i)).isEqualTo(i);
            }
        });
    }

    private static void assertMatchesOracle(DisjointSets sets, List<List<Integer>> adjacent,
                                            UniformRandomProvider rng) {
        int n = adjacent.size();
        int[] labels = sets.labels();
        int[] smallest = sets.smallestMembers();
        int next = 0;
        for (int i = 0; i < n; i++) {
            boolean[] seen = reachable(adjacent, i);
            int first = 0;
            while (!seen[first]) {
                first++;
            }
            assertThat(smallest[i]).as("smallest member of %d's set", i).isEqualTo(first);
            // Labels are dense and numbered by smallest member.
            if (first == i) {
                assertThat(labels[i]).as("label of %d", i).isEqualTo(next++);
            } else {
                assertThat(labels[i]).as("label of %d", i).isEqualTo(labels[first]);
            }
            int j = rng.nextInt(n);
            assertThat(sets.connected(i, j)).as("connected(%d, %d)", i, j).isEqualTo(seen[j]);
        }
    }

    private static boolean[] reachable(List<List<Integer>> adjacent, int from) {
        boolean[] seen = new boolean[adjacent.size()];
        ArrayDeque<Integer> queue = new ArrayDeque<>();
        seen[from] = true;
        queue.add(from);
        while (!queue.isEmpty()) {
            for (int v : adjacent.get(queue.poll())) {
                if (!seen[v]) {
                    seen[v] = true;
                    queue.add(v);
                }
            }
        }
        return seen;
    }
}
