package org.obverse.embed;

import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.obverse.device.QubitGraph;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;

/**
 * Decides whether chains are a valid minor embedding of a logical problem's graph in a working
 * graph, and lists every way they are not: a logical variable without a chain, a qubit that is
 * not in the working graph, a qubit in two chains, a chain that is not connected by working
 * couplers, a logical coupling with no working coupler between its two chains.
 *
 * <p>Written apart from the finders on purpose (a breadth-first search per chain and a scan of
 * every coupler), so that it can check them.
 */
public final class EmbeddingCheck {
    private EmbeddingCheck() {
    }

    /** Every problem, in a fixed order (missing chains, qubits, overlaps, connectivity, couplings); empty where valid. */
    public static List<String> problems(IsingProblem logical, Chains chains, QubitGraph graph) {
        List<String> out = new ArrayList<>();
        VariableIndex ids = logical.variables();
        for (int k = 0; k < ids.size(); k++) {
            if (chains.chainIndexOf(ids.id(k)) < 0) {
                out.add("logical variable " + ids.id(k) + " has no chain");
            }
        }
        Map<Integer, Integer> owner = new HashMap<>();
        for (int c = 0; c < chains.size(); c++) {
            for (int q : chains.chain(c)) {
                if (!graph.hasQubit(q)) {
                    out.add("chain of logical id " + chains.logicalId(c) + " uses qubit " + q
                            + ", which is not in the device's working graph");
                }
                Integer other = owner.putIfAbsent(q, c);
                if (other != null) {
                    out.add("qubit " + q + " is in the chains of logical ids " + chains.logicalId(other) + " and "
                            + chains.logicalId(c) + "; chains must be disjoint");
                }
            }
        }
        for (int c = 0; c < chains.size(); c++) {
            if (!connected(chains.chain(c), graph)) {
                out.add("chain of logical id " + chains.logicalId(c) + " is not connected by the device's working couplers");
            }
        }
        for (int e = 0; e < logical.edgeCount(); e++) {
            int u = ids.id(logical.edgeU(e));
            int v = ids.id(logical.edgeV(e));
            int cu = chains.chainIndexOf(u);
            int cv = chains.chainIndexOf(v);
            if (cu >= 0 && cv >= 0 && !touch(chains.chain(cu), chains.chain(cv), graph)) {
                out.add("logical coupling (" + u + ", " + v + ") has no working coupler between the two chains");
            }
        }
        return out;
    }

    /** Whether the chains are a valid embedding. */
    public static boolean isValid(IsingProblem logical, Chains chains, QubitGraph graph) {
        return problems(logical, chains, graph).isEmpty();
    }

    /**
     * Throws where the chains are not valid.
     *
     * @throws IllegalArgumentException with the first problem and the number of others
     */
    public static void requireValid(IsingProblem logical, Chains chains, QubitGraph graph) {
        List<String> p = problems(logical, chains, graph);
        if (!p.isEmpty()) {
            throw new IllegalArgumentException(p.get(0) + (p.size() > 1 ? " (and " + (p.size() - 1) + " more problems)" : ""));
        }
    }

    private static boolean connected(int[] chain, QubitGraph graph) {
        VariableIndex members = VariableIndex.of(chain);
        boolean[] seen = new boolean[chain.length];
        ArrayDeque<Integer> queue = new ArrayDeque<>();
        seen[0] = true;
        queue.add(chain[0]);
        int reached = 1;
        while (!queue.isEmpty()) {
            int q = queue.poll();
            for (int nb : graph.neighbours(q)) {
                int k = members.indexOf(nb);
                if (k >= 0 && !seen[k]) {
                    seen[k] = true;
                    reached++;
                    queue.add(nb);
                }
            }
        }
        return reached == chain.length;
    }

    private static boolean touch(int[] a, int[] b, QubitGraph graph) {
        VariableIndex other = VariableIndex.of(b);
        for (int q : a) {
            for (int nb : graph.neighbours(q)) {
                if (other.contains(nb)) {
                    return true;
                }
            }
        }
        return false;
    }
}
