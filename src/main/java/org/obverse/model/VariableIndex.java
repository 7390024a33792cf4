package org.obverse.model;

import java.util.Arrays;

/**
 * An immutable, strictly ascending list of variable (or qubit) ids, which may be sparse.
 * Position k of every per-variable array in this library belongs to the k-th smallest id.
 * Lookup by id is a binary search: O(log n).
 */
public final class VariableIndex {
    private final int[] ids;

    private VariableIndex(int[] ids) {
        this.ids = ids;
    }

    /**
     * Input: ids in any order, each at least 0; duplicates are merged. The array is not modified.
     */
    public static VariableIndex of(int... ids) {
        int[] sorted = ids.clone();
        Arrays.sort(sorted);
        int n = 0;
        for (int k = 0; k < sorted.length; k++) {
            if (sorted[k] < 0) {
                throw new IllegalArgumentException("variable id " + sorted[k] + " is negative; ids must be >= 0");
            }
            if (n == 0 || sorted[n - 1] != sorted[k]) {
                sorted[n++] = sorted[k];
            }
        }
        return new VariableIndex(n == sorted.length ? sorted : Arrays.copyOf(sorted, n));
    }

    /** Number of ids. */
    public int size() {
        return ids.length;
    }

    /** The id at position k (0 ≤ k < size). */
    public int id(int k) {
        return ids[k];
    }

    /** Position of the id, or -1 where it is absent. */
    public int indexOf(int id) {
        int k = Arrays.binarySearch(ids, id);
        return k >= 0 ? k : -1;
    }

    /** Whether the id is present. */
    public boolean contains(int id) {
        return Arrays.binarySearch(ids, id) >= 0;
    }

    /** A copy of the ids, ascending. */
    public int[] toArray() {
        return ids.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof VariableIndex && Arrays.equals(ids, ((VariableIndex) o).ids);
    }

    @Override
    public int hashCode() {
        return Arrays.hashCode(ids);
    }

    @Override
    public String toString() {
        return ids.length <= 16 ? Arrays.toString(ids) : ids.length + " ids from " + ids[0] + " to " + ids[ids.length - 1];
    }
}
