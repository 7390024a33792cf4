package org.obverse.connectivity;

import java.util.Arrays;

/**
 * A partition of the elements 0 … n − 1 into disjoint sets, merged pair by pair: union–find
 * with path halving and union by size (Tarjan, J. ACM 22(2), 1975; Tarjan and van Leeuwen,
 * J. ACM 31(2), 1984), so a sequence of m operations costs O(m α(n)). Mutable, not
 * thread-safe; {@link #reset} reuses the arrays.
 */
public final class DisjointSets {
    private final int[] parent;
    private final int[] size;

    private DisjointSets(int n) {
        parent = new int[n];
        size = new int[n];
        reset();
    }

    /** n singletons. */
    public static DisjointSets of(int n) {
        if (n < 0) {
            throw new IllegalArgumentException("a partition needs n >= 0 elements, got " + n);
        }
        return new DisjointSets(n);
    }

    /** Back to n singletons. */
    public void reset() {
        for (int i = 0; i < parent.length; i++) {
            parent[i] = i;
            size[i] = 1;
        }
    }

    /** Number of elements. */
    public int size() {
        return parent.length;
    }

    /** The representative of x's set (changes only when sets merge). */
    public int find(int x) {
        while (parent[x] != x) {
            parent[x] = parent[parent[x]];
            x = parent[x];
        }
        return x;
    }

    /** Merges the sets of a and b; false where they were one set already. */
    public boolean union(int a, int b) {
        int ra = find(a);
        int rb = find(b);
        if (ra == rb) {
            return false;
        }
        if (size[ra] < size[rb]) {
            int t = ra;
            ra = rb;
            rb = t;
        }
        parent[rb] = ra;
        size[ra] += size[rb];
        return true;
    }

    /** Whether a and b are in one set. */
    public boolean connected(int a, int b) {
        return find(a) == find(b);
    }

    /** Dense set labels 0, 1, …, numbered in order of each set's smallest element. */
    public int[] labels() {
        int[] label = smallestMembers();
        int next = 0;
        for (int i = 0; i < label.length; i++) {
            // The smallest member comes first, so its label is already set.
            label[i] = label[i] == i ? next++ : label[label[i]];
        }
        return label;
    }

    /** For every element, the smallest element of its set. */
    public int[] smallestMembers() {
        int n = parent.length;
        int[] smallest = new int[n];
        int[] ofRoot = new int[n];
        Arrays.fill(ofRoot, -1);
        for (int i = 0; i < n; i++) {
            int r = find(i);
            if (ofRoot[r] < 0) {
                ofRoot[r] = i;
            }
            smallest[i] = ofRoot[r];
        }
        return smallest;
    }
}
