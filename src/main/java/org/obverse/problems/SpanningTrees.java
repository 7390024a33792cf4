package org.obverse.problems;

import java.util.function.Consumer;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.obverse.connectivity.DisjointSets;

/**
 * Spanning trees of a small undirected graph on nodes 0 … n−1 with edges
 * {@code edges[e] = {u, v}}: enumeration (every (n−1)-edge subset, kept when it has no cycle,
 * tested by union–find; C(m, n−1) subsets, so for small graphs only) and the count by
 * Kirchhoff's matrix-tree theorem (any cofactor of the Laplacian; Bondy &amp; Murty, Graph
 * Theory, Springer 2008), computed as a determinant with EJML.
 */
public final class SpanningTrees {
    /** Largest edge count enumerated. */
    public static final int MAX_EDGES = 40;

    private SpanningTrees() {
    }

    /**
     * Calls the visitor with every spanning tree as ascending edge numbers. The array passed is
     * reused between calls: copy it to keep it.
     */
    public static void forEach(int nodes, int[][] edges, Consumer<int[]> visitor) {
        check(nodes, edges);
        if (nodes == 1) {
            visitor.accept(new int[0]);
            return;
        }
        int need = nodes - 1;
        int m = edges.length;
        if (m < need) {
            return;
        }
        int[] pick = new int[need];
        DisjointSets sets = DisjointSets.of(nodes);
        for (int i = 0; i < need; i++) {
            pick[i] = i;
        }
        while (true) {
            if (isTree(edges, pick, sets)) {
                visitor.accept(pick);
            }
            int i = need - 1;
            while (i >= 0 && pick[i] == m - need + i) {
                i--;
            }
            if (i < 0) {
                return;
            }
            pick[i]++;
            for (int j = i + 1; j < need; j++) {
                pick[j] = pick[j - 1] + 1;
            }
        }
    }

    /** The number of spanning trees, by enumeration. */
    public static long count(int nodes, int[][] edges) {
        long[] c = {0};
        forEach(nodes, edges, t -> c[0]++);
        return c[0];
    }

    /**
     * The number of spanning trees by the matrix-tree theorem: the determinant of the
     * Laplacian with node 0's row and column removed (a double, exact for small counts).
     */
    public static double kirchhoffCount(int nodes, int[][] edges) {
        check(nodes, edges);
        if (nodes == 1) {
            return 1.0;
        }
        DMatrixRMaj minor = new DMatrixRMaj(nodes - 1, nodes - 1);
        for (int[] e : edges) {
            int u = e[0];
            int v = e[1];
            addLaplacian(minor, u, u, 1.0);
            addLaplacian(minor, v, v, 1.0);
            addLaplacian(minor, u, v, -1.0);
            addLaplacian(minor, v, u, -1.0);
        }
        return CommonOps_DDRM.det(minor);
    }

    private static void addLaplacian(DMatrixRMaj minor, int row, int col, double value) {
        if (row > 0 && col > 0) {
            minor.add(row - 1, col - 1, value);
        }
    }

    private static boolean isTree(int[][] edges, int[] pick, DisjointSets sets) {
        sets.reset();
        for (int e : pick) {
            if (!sets.union(edges[e][0], edges[e][1])) {
                return false;
            }
        }
        return true;
    }

    private static void check(int nodes, int[][] edges) {
        if (nodes < 1) {
            throw new IllegalArgumentException("a graph needs at least one node, has " + nodes);
        }
        if (edges.length > MAX_EDGES) {
            throw new IllegalArgumentException(edges.length + " edges are too many to enumerate; the limit is " + MAX_EDGES);
        }
        for (int e = 0; e < edges.length; e++) {
            checkEdge(nodes, edges, e);
        }
    }

    /** Edge e must join two distinct nodes of 0..nodes-1. */
    static void checkEdge(int nodes, int[][] edges, int e) {
        int u = edges[e][0];
        int v = edges[e][1];
        if (u < 0 || v < 0 || u >= nodes || v >= nodes || u == v) {
            throw new IllegalArgumentException("edge " + e + " (" + u + ", " + v + ") must join two distinct nodes of 0.."
                    + (nodes - 1));
        }
    }
}
