package org.obverse.device;

import java.util.Arrays;
import org.obverse.model.VariableIndex;

/**
 * The working graph of a device: which qubits exist and which couplers join them. Immutable;
 * couplers are kept as sorted (lo, hi) id pairs and a compressed-row adjacency by position.
 * Membership tests are binary searches.
 */
public final class QubitGraph {
    private final VariableIndex qubits;
    private final long[] couplerKeys;
    private final int[] adjStart;
    private final int[] adjQubit;

    private QubitGraph(VariableIndex qubits, long[] couplerKeys) {
        this.qubits = qubits;
        this.couplerKeys = couplerKeys;
        int n = qubits.size();
        adjStart = new int[n + 1];
        for (long k : couplerKeys) {
            adjStart[qubits.indexOf(lo(k)) + 1]++;
            adjStart[qubits.indexOf(hi(k)) + 1]++;
        }
        for (int i = 0; i < n; i++) {
            adjStart[i + 1] += adjStart[i];
        }
        adjQubit = new int[2 * couplerKeys.length];
        int[] fill = Arrays.copyOf(adjStart, n);
        for (long k : couplerKeys) {
            int a = qubits.indexOf(lo(k));
            int b = qubits.indexOf(hi(k));
            adjQubit[fill[a]++] = b;
            adjQubit[fill[b]++] = a;
        }
    }

    /**
     * A graph from qubit ids and coupler pairs ({@code couplers[c] = {a, b}}). A coupler must
     * join two distinct listed qubits; a coupler listed twice is an error.
     */
    public static QubitGraph of(int[] qubitIds, int[][] couplers) {
        VariableIndex q = VariableIndex.of(qubitIds);
        long[] keys = new long[couplers.length];
        for (int c = 0; c < couplers.length; c++) {
            int a = couplers[c][0];
            int b = couplers[c][1];
            if (a == b) {
                throw new IllegalArgumentException("coupler (" + a + ", " + b + ") joins a qubit to itself");
            }
            if (!q.contains(a) || !q.contains(b)) {
                throw new IllegalArgumentException("coupler (" + a + ", " + b + ") uses a qubit that is not listed");
            }
            keys[c] = key(a, b);
        }
        Arrays.sort(keys);
        for (int c = 1; c < keys.length; c++) {
            if (keys[c] == keys[c - 1]) {
                throw new IllegalArgumentException("coupler (" + lo(keys[c]) + ", " + hi(keys[c]) + ") is listed twice");
            }
        }
        return new QubitGraph(q, keys);
    }

    /** Packs an unordered id pair as one sortable key. */
    public static long key(int a, int b) {
        int lo = Math.min(a, b);
        int hi = Math.max(a, b);
        return ((long) lo << 32) | (hi & 0xffffffffL);
    }

    static int lo(long key) {
        return (int) (key >>> 32);
    }

    static int hi(long key) {
        return (int) key;
    }

    public VariableIndex qubits() {
        return qubits;
    }

    public boolean hasQubit(int id) {
        return qubits.contains(id);
    }

    public boolean hasCoupler(int a, int b) {
        return Arrays.binarySearch(couplerKeys, key(a, b)) >= 0;
    }

    public int couplerCount() {
        return couplerKeys.length;
    }

    /** The couplers as {lo, hi} id pairs, ascending. */
    public int[][] couplers() {
        int[][] out = new int[couplerKeys.length][];
        for (int c = 0; c < couplerKeys.length; c++) {
            out[c] = new int[] {lo(couplerKeys[c]), hi(couplerKeys[c])};
        }
        return out;
    }

    /** Neighbour ids of a qubit, ascending; empty where the qubit is absent. */
    public int[] neighbours(int id) {
        int k = qubits.indexOf(id);
        if (k < 0) {
            return new int[0];
        }
        int[] out = new int[adjStart[k + 1] - adjStart[k]];
        for (int p = 0; p < out.length; p++) {
            out[p] = qubits.id(adjQubit[adjStart[k] + p]);
        }
        Arrays.sort(out);
        return out;
    }

    /** The graph without the given qubits (and their couplers) and without the given couplers. */
    public QubitGraph without(int[] removedQubits, int[][] removedCouplers) {
        VariableIndex gone = VariableIndex.of(removedQubits);
        long[] goneCouplers = new long[removedCouplers.length];
        for (int c = 0; c < removedCouplers.length; c++) {
            goneCouplers[c] = key(removedCouplers[c][0], removedCouplers[c][1]);
        }
        Arrays.sort(goneCouplers);
        int[] keep = Arrays.stream(qubits.toArray()).filter(q -> !gone.contains(q)).toArray();
        int[][] keptCouplers = Arrays.stream(couplerKeys)
                .filter(k -> !gone.contains(lo(k)) && !gone.contains(hi(k)) && Arrays.binarySearch(goneCouplers, k) < 0)
                .mapToObj(k -> new int[] {lo(k), hi(k)}).toArray(int[][]::new);
        return of(keep, keptCouplers);
    }
}
