package org.obverse.embed;

import java.util.HashMap;
import java.util.HashSet;
import java.util.Map;
import java.util.Set;
import org.obverse.device.QubitGraph;
import org.obverse.model.IsingProblem;

/**
 * A second, deliberately different minor-embedding check for tests (union–find over the
 * couplers instead of a search per chain), so that a bug shared with {@link EmbeddingCheck}
 * is unlikely. Definition of a minor embedding: disjoint, connected vertex sets with an edge
 * between the sets of every logical edge (Choi, Quantum Inf. Process. 7, 193, 2008).
 */
final class IndependentMinorCheck {
    private IndependentMinorCheck() {
    }

    static boolean isMinorEmbedding(IsingProblem logical, Chains chains, QubitGraph graph) {
        Map<Integer, Integer> owner = new HashMap<>();
        for (int k = 0; k < logical.size(); k++) {
            int c = chains.chainIndexOf(logical.variables().id(k));
            if (c < 0) {
                return false;
            }
            for (int q : chains.chain(c)) {
                if (!graph.hasQubit(q) || owner.put(q, k) != null) {
                    return false;
                }
            }
        }
        Map<Integer, Integer> root = new HashMap<>();
        for (int q : owner.keySet()) {
            root.put(q, q);
        }
        Set<Long> joined = new HashSet<>();
        for (int[] e : graph.couplers()) {
            Integer a = owner.get(e[0]);
            Integer b = owner.get(e[1]);
            if (a == null || b == null) {
                continue;
            }
            if (a.equals(b)) {
                int ra = find(root, e[0]);
                int rb = find(root, e[1]);
                root.put(ra, rb);
            } else {
                joined.add(((long) Math.min(a, b) << 32) | Math.max(a, b));
            }
        }
        for (int k = 0; k < logical.size(); k++) {
            Set<Integer> roots = new HashSet<>();
            for (int q : chains.chain(chains.chainIndexOf(logical.variables().id(k)))) {
                roots.add(find(root, q));
            }
            if (roots.size() != 1) {
                return false;
            }
        }
        for (int e = 0; e < logical.edgeCount(); e++) {
            if (!joined.contains(((long) logical.edgeU(e) << 32) | logical.edgeV(e))) {
                return false;
            }
        }
        return true;
    }

    private static int find(Map<Integer, Integer> root, int q) {
        int r = q;
        while (root.get(r) != r) {
            r = root.get(r);
        }
        return r;
    }
}
