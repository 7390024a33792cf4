package org.obverse.embed;

import java.util.Arrays;
import org.obverse.model.VariableIndex;

/**
 * An embedding's chains: for each logical variable id, the sorted set of physical qubit ids
 * that represent it. Chains are listed by ascending logical id. Immutable; accessors that
 * return arrays return copies.
 *
 * <p>{@link #of} checks only what one chain can break on its own (a negative id, an empty
 * chain, a qubit listed twice in a chain, a logical id given twice). Whether chains are
 * disjoint, connected and joined where the logical problem needs it depends on the device and
 * the problem: {@link EmbeddingCheck} decides that.
 */
public final class Chains {
    private final VariableIndex logical;
    private final int[][] qubits;

    private Chains(VariableIndex logical, int[][] qubits) {
        this.logical = logical;
        this.qubits = qubits;
    }

    /**
     * Chains from parallel arrays: {@code qubits[c]} is the chain of {@code logicalIds[c]}, in any
     * order. The arrays are copied.
     *
     * @throws IllegalArgumentException naming the first chain that breaks a rule
     */
    public static Chains of(int[] logicalIds, int[][] qubits) {
        if (logicalIds.length != qubits.length) {
            throw new IllegalArgumentException(logicalIds.length + " logical ids for " + qubits.length + " chains");
        }
        VariableIndex index = VariableIndex.of(logicalIds);
        if (index.size() != logicalIds.length) {
            int[] s = logicalIds.clone();
            Arrays.sort(s);
            for (int i = 1; i < s.length; i++) {
                if (s[i] == s[i - 1]) {
                    throw new IllegalArgumentException("logical id " + s[i] + " has more than one chain");
                }
            }
        }
        int[][] sorted = new int[logicalIds.length][];
        for (int c = 0; c < logicalIds.length; c++) {
            int id = logicalIds[c];
            int[] q = qubits[c].clone();
            if (q.length == 0) {
                throw new IllegalArgumentException("chain of logical id " + id + " is empty; each chain needs a qubit");
            }
            Arrays.sort(q);
            if (q[0] < 0) {
                throw new IllegalArgumentException("chain of logical id " + id + " holds qubit " + q[0]
                        + "; qubit ids must be >= 0");
            }
            for (int i = 1; i < q.length; i++) {
                if (q[i] == q[i - 1]) {
                    throw new IllegalArgumentException("chain of logical id " + id + " lists qubit " + q[i] + " twice");
                }
            }
            sorted[index.indexOf(id)] = q;
        }
        return new Chains(index, sorted);
    }

    /** The logical ids that have a chain, ascending. */
    public VariableIndex logicalIds() {
        return logical;
    }

    /** Number of chains. */
    public int size() {
        return qubits.length;
    }

    /** The logical id of chain c (chains are in ascending logical id order). */
    public int logicalId(int c) {
        return logical.id(c);
    }

    /** The position of the chain of a logical id, or -1 where it has none. */
    public int chainIndexOf(int logicalId) {
        return logical.indexOf(logicalId);
    }

    /** The qubits of chain c, ascending (a copy). */
    public int[] chain(int c) {
        return qubits[c].clone();
    }

    /** Length of chain c. */
    public int length(int c) {
        return qubits[c].length;
    }

    /** The qubits of the chain of a logical id (a copy). */
    public int[] chainOf(int logicalId) {
        int c = logical.indexOf(logicalId);
        if (c < 0) {
            throw new IllegalArgumentException("logical id " + logicalId + " has no chain");
        }
        return qubits[c].clone();
    }

    /**
     * The chains as plain qubit groups, one array per chain in ascending logical id order (a
     * deep copy): the form that lower packages, such as the gauge's chain lock, take.
     */
    public int[][] qubitGroups() {
        int[][] out = new int[qubits.length][];
        for (int c = 0; c < qubits.length; c++) {
            out[c] = qubits[c].clone();
        }
        return out;
    }

    /** Total number of qubits over all chains. */
    public int qubitCount() {
        int n = 0;
        for (int[] q : qubits) {
            n += q.length;
        }
        return n;
    }

    /** Length of the longest chain (0 when there are none). */
    public int maxLength() {
        int m = 0;
        for (int[] q : qubits) {
            m = Math.max(m, q.length);
        }
        return m;
    }

    /** Every qubit used by some chain, ascending, each once. */
    public VariableIndex allQubits() {
        int[] all = new int[qubitCount()];
        int p = 0;
        for (int[] q : qubits) {
            System.arraycopy(q, 0, all, p, q.length);
            p += q.length;
        }
        return VariableIndex.of(all);
    }

    /**
     * Only the chains of the given logical ids.
     *
     * @throws IllegalArgumentException where an id has no chain
     */
    public Chains restrictedTo(VariableIndex ids) {
        int[] keep = ids.toArray();
        int[][] q = new int[keep.length][];
        for (int i = 0; i < keep.length; i++) {
            int c = logical.indexOf(keep[i]);
            if (c < 0) {
                throw new IllegalArgumentException("logical variable " + keep[i] + " has no chain; every variable of the"
                        + " logical problem needs one");
            }
            q[i] = qubits[c];
        }
        return new Chains(ids, q);
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Chains && logical.equals(((Chains) o).logical) && Arrays.deepEquals(qubits, ((Chains) o).qubits);
    }

    @Override
    public int hashCode() {
        return 31 * logical.hashCode() + Arrays.deepHashCode(qubits);
    }

    @Override
    public String toString() {
        return "Chains[" + size() + " chains, " + qubitCount() + " qubits, longest " + maxLength() + "]";
    }
}
