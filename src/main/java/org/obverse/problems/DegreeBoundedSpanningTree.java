package org.obverse.problems;

import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Optional;
import org.obverse.model.BinaryProblem;

/**
 * The degree-bounded minimum spanning tree as a QUBO, in the level-based formulation of
 * Lucas, "Ising formulations of many NP problems", Frontiers in Physics 2, 5 (2014), §8.1,
 * with the degree bound written in the log encoding of its §2.4 so that the bound binds.
 *
 * <p>Graph: nodes 0 … n−1, a root (the substation of the demo), edges with lengths ≥ 0, a
 * degree bound per node and a depth bound (levels 1 … maxDepth). Binary variables, numbered
 * from 0 in this order:
 * <ul>
 * <li>level L(v, i): non-root node v sits at level i (distance i from the root in the tree);</li>
 * <li>orientation O(p→c, i): edge (p, c) is in the tree with p the parent and child c at
 *     level i (i = 1 only when p is the root, i ≥ 2 otherwise);</li>
 * <li>slack z(v, k): only where the bound Δ_v is below v's degree in the graph, with
 *     coefficients 1, 2, …, 2^{M−1}, Δ_v + 1 − 2^M (M = ⌊log₂ Δ_v⌋), which encode exactly
 *     the integers 0 … Δ_v.</li>
 * </ul>
 * Energy: H = A·[Σ_v (1 − Σ_i L(v,i))² + Σ_{v,i} (L(v,i) − Σ_p O(p→v,i))²
 * + Σ_{O(p→c,i), p ≠ root} O·(1 − L(p, i−1)) + Σ_{bounded v} (deg(v) − Σ_k c_k z(v,k))²]
 * + B·Σ_e w_e·(Σ orientations of e), with deg(v) the sum of the orientation variables of
 * v's edges. Each penalty term is an integer, so an assignment that breaks any rule pays at
 * least A. With B = 1 and A = (sum of the n−1 longest edges) + (shortest edge, or 1 where
 * that is 0), every feasible tree's energy is its length (constant 0) and is below A, hence
 * below every infeasible assignment's energy. Immutable.
 *
 * <p>Lucas prints the degree term with Σ_j j·z_{v,j}; without a one-hot rule on z that sum
 * reaches Δ(Δ+1)/2, so degrees above Δ would cost nothing. The log encoding reaches Δ and no
 * more.
 */
public final class DegreeBoundedSpanningTree {
    /** A degree bound that never binds. */
    public static final int UNBOUNDED = Integer.MAX_VALUE;

    /** What a QUBO variable stands for. */
    public enum Role {
        /** Node at a level. */
        LEVEL,
        /** Edge in the tree with a parent, child and the child's level. */
        ORIENTATION,
        /** One bit of a node's degree slack. */
        SLACK
    }

    /**
     * The meaning of one variable.
     *
     * @param id          variable id in the QUBO
     * @param role        what kind of variable
     * @param node        LEVEL: the node; ORIENTATION: the child; SLACK: the bounded node
     * @param parent      ORIENTATION: the parent node; otherwise −1
     * @param edge        ORIENTATION: the edge number; otherwise −1
     * @param level       LEVEL and ORIENTATION: the (child's) level; otherwise −1
     * @param coefficient SLACK: its coefficient; otherwise 0
     */
    public record Variable(int id, Role role, int node, int parent, int edge, int level, int coefficient) {
        /** A line for a person, e.g. "x7: edge 2 in the tree, 0 -> 3, node 3 at level 1". */
        public String describe() {
            switch (role) {
                case LEVEL:
                    return "x" + id + ": node " + node + " at level " + level;
                case ORIENTATION:
                    return "x" + id + ": edge " + edge + " in the tree, " + parent + " -> " + node + ", node " + node
                            + " at level " + level;
                default:
                    return "x" + id + ": degree slack of node " + node + ", weight " + coefficient;
            }
        }
    }

    /**
     * A spanning tree and its QUBO form.
     *
     * @param edges      edge numbers, ascending
     * @param length     total length (sum of edge lengths, ascending edge order)
     * @param assignment a zero-penalty assignment of the QUBO encoding the tree (by variable id)
     * @param quboEnergy the QUBO's energy of that assignment (equal to length up to rounding)
     */
    public record Tree(int[] edges, double length, byte[] assignment, double quboEnergy) {
    }

    private final int nodes;
    private final int root;
    private final int[][] edges;
    private final double[] lengths;
    private final int[] bounds;
    private final int maxDepth;
    private final Variable[] variables;
    // levelVar[v][i] = id of L(v, i) or -1.
    private final int[][] levelVar;
    private final double penaltyWeight;
    private final BinaryProblem qubo;

    private DegreeBoundedSpanningTree(int nodes, int root, int[][] edges, double[] lengths, int[] bounds,
                                      int maxDepth) {
        this.nodes = nodes;
        this.root = root;
        this.edges = edges;
        this.lengths = lengths;
        this.bounds = bounds;
        this.maxDepth = maxDepth;
        List<Variable> vars = new ArrayList<>();
        levelVar = new int[nodes][maxDepth + 1];
        for (int[] row : levelVar) {
            Arrays.fill(row, -1);
        }
        for (int v = 0; v < nodes; v++) {
            if (v == root) {
                continue;
            }
            for (int i = 1; i <= maxDepth; i++) {
                levelVar[v][i] = vars.size();
                vars.add(new Variable(vars.size(), Role.LEVEL, v, -1, -1, i, 0));
            }
        }
        for (int e = 0; e < edges.length; e++) {
            for (int dir = 0; dir < 2; dir++) {
                int p = edges[e][dir];
                int c = edges[e][1 - dir];
                if (c == root) {
                    continue;
                }
                int from = p == root ? 1 : 2;
                int to = p == root ? 1 : maxDepth;
                for (int i = from; i <= to; i++) {
                    vars.add(new Variable(vars.size(), Role.ORIENTATION, c, p, e, i, 0));
                }
            }
        }
        int[] graphDegree = graphDegrees(nodes, edges);
        for (int v = 0; v < nodes; v++) {
            if (bounds[v] < graphDegree[v]) {
                for (int c : slackCoefficients(bounds[v])) {
                    vars.add(new Variable(vars.size(), Role.SLACK, v, -1, -1, -1, c));
                }
            }
        }
        variables = vars.toArray(new Variable[0]);
        penaltyWeight = penaltyWeight(nodes, lengths);
        qubo = buildQubo();
    }

    /**
     * A problem instance.
     *
     * @param nodes        number of nodes (≥ 2)
     * @param root         the root node
     * @param edges        edges[e] = {u, v}, distinct nodes, no edge twice
     * @param lengths      length of each edge, finite and ≥ 0
     * @param degreeBounds bound of each node (≥ 1), or {@link #UNBOUNDED}
     * @param maxDepth     deepest level allowed, 1 … nodes − 1
     * @throws IllegalArgumentException naming the rule and the bad value
     */
    public static DegreeBoundedSpanningTree of(int nodes, int root, int[][] edges, double[] lengths, int[] degreeBounds,
                                               int maxDepth) {
        if (nodes < 2) {
            throw new IllegalArgumentException("a spanning-tree instance needs at least 2 nodes, has " + nodes);
        }
        if (root < 0 || root >= nodes) {
            throw new IllegalArgumentException("root " + root + " is not a node of 0.." + (nodes - 1));
        }
        if (lengths.length != edges.length) {
            throw new IllegalArgumentException(edges.length + " edges but " + lengths.length + " lengths");
        }
        if (degreeBounds.length != nodes) {
            throw new IllegalArgumentException(nodes + " nodes but " + degreeBounds.length + " degree bounds");
        }
        if (maxDepth < 1 || maxDepth > nodes - 1) {
            throw new IllegalArgumentException("depth bound " + maxDepth + " must lie in 1.." + (nodes - 1));
        }
        java.util.Set<Long> seen = new java.util.HashSet<>();
        int[][] copy = new int[edges.length][];
        for (int e = 0; e < edges.length; e++) {
            SpanningTrees.checkEdge(nodes, edges, e);
            int u = edges[e][0];
            int v = edges[e][1];
            if (!seen.add(((long) Math.min(u, v) << 32) | Math.max(u, v))) {
                throw new IllegalArgumentException("edge " + e + " (" + u + ", " + v + ") is listed twice");
            }
            if (!(lengths[e] >= 0) || !Double.isFinite(lengths[e])) {
                throw new IllegalArgumentException("edge " + e + " has length " + lengths[e] + "; need a finite number >= 0");
            }
            copy[e] = new int[] {u, v};
        }
        for (int v = 0; v < nodes; v++) {
            if (degreeBounds[v] < 1) {
                throw new IllegalArgumentException("node " + v + " has degree bound " + degreeBounds[v] + "; need >= 1");
            }
        }
        return new DegreeBoundedSpanningTree(nodes, root, copy, lengths.clone(), degreeBounds.clone(), maxDepth);
    }

    /** As {@link #of(int, int, int[][], double[], int[], int)} with the deepest level n − 1. */
    public static DegreeBoundedSpanningTree of(int nodes, int root, int[][] edges, double[] lengths, int[] degreeBounds) {
        return of(nodes, root, edges, lengths, degreeBounds, nodes - 1);
    }

    /**
     * The log encoding of an integer in 0 … bound (Lucas 2014, §2.4): 1, 2, …, 2^{M−1} and
     * bound + 1 − 2^M with M = ⌊log₂ bound⌋; the coefficients sum to bound.
     */
    public static int[] slackCoefficients(int bound) {
        if (bound < 1) {
            throw new IllegalArgumentException("bound " + bound + " must be >= 1");
        }
        int m = 31 - Integer.numberOfLeadingZeros(bound);
        int[] c = new int[m + 1];
        for (int k = 0; k < m; k++) {
            c[k] = 1 << k;
        }
        c[m] = bound + 1 - (1 << m);
        return c;
    }

    private static int[] graphDegrees(int nodes, int[][] edges) {
        int[] d = new int[nodes];
        for (int[] e : edges) {
            d[e[0]]++;
            d[e[1]]++;
        }
        return d;
    }

    private static double penaltyWeight(int nodes, double[] lengths) {
        double[] sorted = lengths.clone();
        Arrays.sort(sorted);
        double top = 0;
        for (int k = 0; k < Math.min(nodes - 1, sorted.length); k++) {
            top += sorted[sorted.length - 1 - k];
        }
        double margin = sorted.length > 0 && sorted[0] > 0 ? sorted[0] : 1.0;
        return top + margin;
    }

    private BinaryProblem buildQubo() {
        double a = penaltyWeight;
        QuboAccumulator q = new QuboAccumulator(variables.length);
        // (1 - sum_i L(v,i))^2 for every non-root node.
        for (int v = 0; v < nodes; v++) {
            if (v == root) {
                continue;
            }
            int[] ids = new int[maxDepth];
            double[] co = new double[maxDepth];
            for (int i = 1; i <= maxDepth; i++) {
                ids[i - 1] = levelVar[v][i];
                co[i - 1] = -1.0;
            }
            q.square(a, 1.0, ids, co);
        }
        // (L(v,i) - sum_p O(p->v,i))^2 for every non-root node and level.
        for (int v = 0; v < nodes; v++) {
            if (v == root) {
                continue;
            }
            for (int i = 1; i <= maxDepth; i++) {
                List<Integer> ids = new ArrayList<>();
                List<Double> co = new ArrayList<>();
                ids.add(levelVar[v][i]);
                co.add(1.0);
                for (Variable x : variables) {
                    if (x.role() == Role.ORIENTATION && x.node() == v && x.level() == i) {
                        ids.add(x.id());
                        co.add(-1.0);
                    }
                }
                q.square(a, 0.0, ids.stream().mapToInt(Integer::intValue).toArray(),
                        co.stream().mapToDouble(Double::doubleValue).toArray());
            }
        }
        // O(p->c,i) (1 - L(p,i-1)) for a non-root parent; and the cable length.
        for (Variable x : variables) {
            if (x.role() != Role.ORIENTATION) {
                continue;
            }
            if (x.parent() != root) {
                q.linear(x.id(), a);
                q.pair(x.id(), levelVar[x.parent()][x.level() - 1], -a);
            }
            q.linear(x.id(), lengths[x.edge()]);
        }
        // (deg(v) - sum_k c_k z(v,k))^2 for every node whose bound can bind.
        for (int v = 0; v < nodes; v++) {
            List<Integer> ids = new ArrayList<>();
            List<Double> co = new ArrayList<>();
            for (Variable x : variables) {
                if (x.role() == Role.ORIENTATION && (x.node() == v || x.parent() == v)) {
                    ids.add(x.id());
                    co.add(1.0);
                }
            }
            boolean bounded = false;
            for (Variable x : variables) {
                if (x.role() == Role.SLACK && x.node() == v) {
                    ids.add(x.id());
                    co.add((double) -x.coefficient());
                    bounded = true;
                }
            }
            if (bounded) {
                q.square(a, 0.0, ids.stream().mapToInt(Integer::intValue).toArray(),
                        co.stream().mapToDouble(Double::doubleValue).toArray());
            }
        }
        return q.build();
    }

    /** The QUBO (variable ids 0 … variableCount − 1, every one declared). */
    public BinaryProblem qubo() {
        return qubo;
    }

    /** Number of QUBO variables. */
    public int variableCount() {
        return variables.length;
    }

    /** The meaning of variable id. */
    public Variable variable(int id) {
        return variables[id];
    }

    /** Every variable's meaning, by id. */
    public List<Variable> variables() {
        return List.of(variables);
    }

    /** The penalty weight A. */
    public double penaltyWeight() {
        return penaltyWeight;
    }

    /** The objective weight B (1: energies are in length units). */
    public double objectiveWeight() {
        return 1.0;
    }

    /** The constant between a feasible tree's energy and its length: 0. */
    public double energyConstant() {
        return 0.0;
    }

    public int nodes() {
        return nodes;
    }

    public int root() {
        return root;
    }

    public int maxDepth() {
        return maxDepth;
    }

    /** Edge e as {u, v} (a copy). */
    public int[] edge(int e) {
        return edges[e].clone();
    }

    public int edgeCount() {
        return edges.length;
    }

    public double length(int e) {
        return lengths[e];
    }

    public int degreeBound(int v) {
        return bounds[v];
    }

    /** Total length of a set of edges, summed in the given order. */
    public double length(int[] treeEdges) {
        double sum = 0;
        for (int e : treeEdges) {
            sum += lengths[e];
        }
        return sum;
    }

    /**
     * The tree an assignment encodes (ascending edge numbers), or empty where the assignment
     * breaks any rule (its penalty is not zero). Checked rule by rule, not through the energy.
     */
    public Optional<int[]> decode(byte[] x) {
        if (x.length != variables.length) {
            throw new IllegalArgumentException("assignment has " + x.length + " values for " + variables.length + " variables");
        }
        int[] level = new int[nodes];
        for (int v = 0; v < nodes; v++) {
            if (v == root) {
                continue;
            }
            int count = 0;
            for (int i = 1; i <= maxDepth; i++) {
                if (x[levelVar[v][i]] == 1) {
                    count++;
                    level[v] = i;
                }
            }
            if (count != 1) {
                return Optional.empty();
            }
        }
        int[][] incoming = new int[nodes][maxDepth + 1];
        int[] degree = new int[nodes];
        int[] slack = new int[nodes];
        List<Integer> treeEdges = new ArrayList<>();
        for (Variable v : variables) {
            if (x[v.id()] != 1) {
                continue;
            }
            if (v.role() == Role.ORIENTATION) {
                incoming[v.node()][v.level()]++;
                degree[v.node()]++;
                degree[v.parent()]++;
                int parentLevel = v.parent() == root ? 0 : level[v.parent()];
                if (parentLevel != v.level() - 1) {
                    return Optional.empty();
                }
                treeEdges.add(v.edge());
            } else if (v.role() == Role.SLACK) {
                slack[v.node()] += v.coefficient();
            }
        }
        int[] graphDegree = graphDegrees(nodes, edges);
        for (int v = 0; v < nodes; v++) {
            if (v != root) {
                for (int i = 1; i <= maxDepth; i++) {
                    if (incoming[v][i] != (i == level[v] ? 1 : 0)) {
                        return Optional.empty();
                    }
                }
            }
            if (bounds[v] < graphDegree[v] && degree[v] != slack[v]) {
                return Optional.empty();
            }
        }
        int[] out = treeEdges.stream().mapToInt(Integer::intValue).sorted().toArray();
        return Optional.of(out);
    }

    /**
     * As {@link #decode(byte[])} for a read given as spins (−1 for x = 0, +1 for x = 1), the
     * way samples of the QUBO's spin form come back.
     */
    public Optional<int[]> decodeSpins(byte[] spins) {
        byte[] x = new byte[spins.length];
        for (int k = 0; k < x.length; k++) {
            x[k] = (byte) (spins[k] > 0 ? 1 : 0);
        }
        return decode(x);
    }

    /**
     * Whether a set of edges is a spanning tree that keeps every degree bound and the depth
     * bound (measured from the root).
     */
    public boolean isFeasibleTree(int[] treeEdges) {
        return levels(treeEdges) != null;
    }

    /** Levels by node of a feasible tree, or null where it is not one. */
    private int[][] levels(int[] treeEdges) {
        if (treeEdges.length != nodes - 1) {
            return null;
        }
        int[] degree = new int[nodes];
        List<List<int[]>> adj = new ArrayList<>();
        for (int v = 0; v < nodes; v++) {
            adj.add(new ArrayList<>());
        }
        for (int e : treeEdges) {
            int u = edges[e][0];
            int v = edges[e][1];
            degree[u]++;
            degree[v]++;
            adj.get(u).add(new int[] {v, e});
            adj.get(v).add(new int[] {u, e});
        }
        for (int v = 0; v < nodes; v++) {
            if (degree[v] > bounds[v]) {
                return null;
            }
        }
        int[] level = new int[nodes];
        int[] parentEdge = new int[nodes];
        Arrays.fill(level, -1);
        level[root] = 0;
        ArrayDeque<Integer> queue = new ArrayDeque<>();
        queue.add(root);
        int seen = 1;
        while (!queue.isEmpty()) {
            int u = queue.poll();
            for (int[] nb : adj.get(u)) {
                if (level[nb[0]] < 0) {
                    level[nb[0]] = level[u] + 1;
                    parentEdge[nb[0]] = nb[1];
                    seen++;
                    queue.add(nb[0]);
                }
            }
        }
        if (seen != nodes) {
            return null;
        }
        for (int v = 0; v < nodes; v++) {
            if (level[v] > maxDepth) {
                return null;
            }
        }
        return new int[][] {level, parentEdge, degree};
    }

    /**
     * The zero-penalty assignment of a feasible tree: its levels and orientations, and each
     * bounded node's degree in the slack (the last coefficient first, then the powers of two
     * from the largest).
     *
     * @throws IllegalArgumentException where the edges are not a feasible tree
     */
    public byte[] encode(int[] treeEdges) {
        int[][] info = levels(treeEdges);
        if (info == null) {
            throw new IllegalArgumentException("edges " + Arrays.toString(treeEdges)
                    + " are not a spanning tree within the degree and depth bounds");
        }
        int[] level = info[0];
        int[] parentEdge = info[1];
        int[] degree = info[2];
        byte[] x = new byte[variables.length];
        int[] remaining = degree.clone();
        for (int id = variables.length - 1; id >= 0; id--) {
            Variable v = variables[id];
            switch (v.role()) {
                case LEVEL:
                    x[id] = (byte) (level[v.node()] == v.level() ? 1 : 0);
                    break;
                case ORIENTATION:
                    x[id] = (byte) (parentEdge[v.node()] == v.edge() && level[v.node()] == v.level()
                            && level[v.parent()] == v.level() - 1 ? 1 : 0);
                    break;
                default:
                    // Slack bits of a node are listed with the last coefficient last: walking
                    // ids downward takes it first, then the powers of two from the largest.
                    if (remaining[v.node()] >= v.coefficient()) {
                        x[id] = 1;
                        remaining[v.node()] -= v.coefficient();
                    }
                    break;
            }
        }
        return x;
    }

    /** The tree with its assignment and QUBO energy. */
    public Tree tree(int[] treeEdges) {
        byte[] x = encode(treeEdges);
        int[] sorted = treeEdges.clone();
        Arrays.sort(sorted);
        return new Tree(sorted, length(sorted), x, qubo.energy(x));
    }

    /**
     * The exact best feasible tree, by enumerating every spanning tree of the graph (ties go
     * to the lexicographically smallest edge list); empty where no tree is feasible.
     */
    public Optional<Tree> exactBest() {
        int[][] best = {null};
        double[] bestLength = {Double.POSITIVE_INFINITY};
        SpanningTrees.forEach(nodes, edges, t -> {
            if (isFeasibleTree(t)) {
                double len = length(t);
                if (len < bestLength[0]) {
                    bestLength[0] = len;
                    best[0] = t.clone();
                }
            }
        });
        return best[0] == null ? Optional.empty() : Optional.of(tree(best[0]));
    }
}
