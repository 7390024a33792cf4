package org.obverse.io.codec;

import java.util.Arrays;

/**
 * The content of an {@code obverse.chains/1} file: for each logical id (ascending), its
 * qubits (ascending). Validated on reading: ids ≥ 0, no logical id twice, no empty chain, no
 * qubit in two chains. Whether the chains fit a problem or a graph is checked by their user.
 *
 * @param logicalIds   logical ids, ascending
 * @param qubitGroups  qubitGroups[k] are the qubits of logicalIds[k], ascending
 */
public record ChainList(int[] logicalIds, int[][] qubitGroups) {
    public ChainList {
        logicalIds = logicalIds.clone();
        int[][] copy = new int[qubitGroups.length][];
        for (int k = 0; k < copy.length; k++) {
            copy[k] = qubitGroups[k].clone();
        }
        qubitGroups = copy;
    }

    @Override
    public int[] logicalIds() {
        return logicalIds.clone();
    }

    @Override
    public int[][] qubitGroups() {
        int[][] copy = new int[qubitGroups.length][];
        for (int k = 0; k < copy.length; k++) {
            copy[k] = qubitGroups[k].clone();
        }
        return copy;
    }

    /** Number of chains. */
    public int size() {
        return logicalIds.length;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof ChainList c && Arrays.equals(logicalIds, c.logicalIds)
                && Arrays.deepEquals(qubitGroups, c.qubitGroups);
    }

    @Override
    public int hashCode() {
        return Arrays.hashCode(logicalIds) * 31 + Arrays.deepHashCode(qubitGroups);
    }

    @Override
    public String toString() {
        return "ChainList[" + logicalIds.length + " chains]";
    }
}
