package org.obverse.embed;

import java.util.Arrays;
import java.util.BitSet;
import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.device.QubitGraph;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.random.LegacyStreams;

/**
 * Finds chains for any logical graph in any working graph, defects and all, by the path-based
 * rip-up-and-reroute heuristic of Cai, Macready &amp; Roy ("A practical heuristic for finding
 * graph minors", arXiv:1406.2741, 2014).
 *
 * <p>Chains may share qubits while the search runs. A qubit used by k other chains weighs
 * D^k, with D the working graph's diameter (as in that paper), times (1 + its history), which
 * grows each round the qubit stays shared, times a fresh random factor in [1, 2) per reroute
 * that breaks ties among equally short paths. To (re)place the chain of v: for each neighbour
 * u of v that has a chain, a shortest-path search (Dijkstra, qubit weights, both ends counted)
 * from the qubits next to u's chain gives every qubit's cost to reach u; the root is the qubit
 * with the least sum of these costs; from the root the chain grows as a tree, joining the
 * neighbours nearest the root first, each by a least-weight path from the chain as it stands;
 * leaves that no neighbour needs are pruned.
 *
 * <p>Stages: the first placement goes in breadth-first order over the logical graph; each
 * round then rips up and reroutes every chain in a fresh random order, until no qubit is
 * shared; after 40 rounds without a new least overlap the search starts again. Once valid,
 * up to 20 tightening rounds reroute each chain through free qubits only and keep it where it
 * is shorter. The result is confirmed by {@link EmbeddingCheck}. The history, the random
 * factor, breadth-first placement, tree growth, restarts and tightening are our additions to
 * the paper's method (tuned on cliques and random graphs in small lattices, no source).
 *
 * <p>Deterministic for a given generator state and round limit. Cost per reroute:
 * deg(v) searches of O(E log E) over the working graph.
 */
public final class RerouteEmbeddingFinder {
    /**
     * Added to a qubit's history each round it is still shared, as in negotiated-congestion
     * routing: without it the plain method often settles in a fixed point with a few shared
     * qubits (tuned on cliques in small lattices, no source).
     */
    /** Most rounds of the tightening stage. */
    private static final int TIGHTEN_ROUNDS = 20;
    private static final double HISTORY_STEP = 0.5;
    /**
     * Each reroute multiplies every weight by a fresh uniform factor in [1, 1 + JITTER): integer
     * weights make many paths equally short, and a fixed choice among them stalls the search
     * (tuned as above, no source).
     */
    private static final double JITTER = 1.0;
    /** Rounds without a new least overlap after which the search starts again (tuned as above). */
    private static final int RESTART_AFTER = 40;

    private final int qubitCount;
    private final int[] qubitStart;
    private final int[] qubitAdj;
    private final int logicalCount;
    private final int[] logicalStart;
    private final int[] logicalAdj;
    private final double[] weightOfUsage;

    private final UniformRandomProvider rng;

    // Search state.
    private final int[][] chain;
    private final int[] chainSize;
    private final BitSet[] member;
    private final int[] usage;
    /** In the tightening stage: qubits of other chains are forbidden, free ones weigh about 1. */
    private boolean strict;
    private final double[] history;
    private final double[] jitter;
    // Workspace.
    private final double[] cost;
    private final double[] dist;
    private final int[][] parent;
    private final int[] pathParent;
    private final double[] heapKey;
    private final int[] heapNode;

    private RerouteEmbeddingFinder(QubitGraph graph, IsingProblem logical, UniformRandomProvider rng) {
        VariableIndex q = graph.qubits();
        qubitCount = q.size();
        qubitStart = new int[qubitCount + 1];
        int[][] nbs = new int[qubitCount][];
        for (int a = 0; a < qubitCount; a++) {
            int[] ids = graph.neighbours(q.id(a));
            nbs[a] = new int[ids.length];
            for (int i = 0; i < ids.length; i++) {
                nbs[a][i] = q.indexOf(ids[i]);
            }
            qubitStart[a + 1] = qubitStart[a] + ids.length;
        }
        qubitAdj = new int[qubitStart[qubitCount]];
        for (int a = 0; a < qubitCount; a++) {
            System.arraycopy(nbs[a], 0, qubitAdj, qubitStart[a], nbs[a].length);
        }
        logicalCount = logical.size();
        logicalStart = logical.adjacencyStarts();
        logicalAdj = logical.adjacencyVariables();
        this.rng = rng;
        double base = Math.max(2, diameterEstimate());
        weightOfUsage = new double[logicalCount + 2];
        for (int k = 0; k < weightOfUsage.length; k++) {
            weightOfUsage[k] = Math.min(1e300, Math.pow(base, k));
        }
        chain = new int[logicalCount][];
        chainSize = new int[logicalCount];
        member = new BitSet[logicalCount];
        for (int v = 0; v < logicalCount; v++) {
            chain[v] = new int[8];
            member[v] = new BitSet(qubitCount);
        }
        usage = new int[qubitCount];
        history = new double[qubitCount];
        jitter = new double[qubitCount];
        cost = new double[qubitCount];
        dist = new double[qubitCount];
        int maxDegree = 0;
        for (int v = 0; v < logicalCount; v++) {
            maxDegree = Math.max(maxDegree, logicalStart[v + 1] - logicalStart[v]);
        }
        parent = new int[maxDegree][qubitCount];
        pathParent = new int[qubitCount];
        heapKey = new double[qubitAdj.length + qubitCount + 1];
        heapNode = new int[heapKey.length];
    }

    /**
     * Finds chains for the logical problem's graph (its couplers; the values do not matter).
     *
     * @param logical Input: the logical problem
     * @param graph   Input: the working graph
     * @param limits  when to give up
     * @param rng     the generator (advanced)
     * @throws EmbeddingNotFoundException where no valid embedding was found within the limits
     */
    public static Chains find(IsingProblem logical, QubitGraph graph, FinderLimits limits, UniformRandomProvider rng) {
        VariableIndex ids = logical.variables();
        if (ids.size() == 0) {
            return Chains.of(new int[0], new int[0][]);
        }
        if (ids.size() > graph.qubits().size()) {
            throw new EmbeddingNotFoundException(ids.size() + " logical variables cannot fit " + graph.qubits().size()
                    + " qubits; use a larger device");
        }
        RerouteEmbeddingFinder f = new RerouteEmbeddingFinder(graph, logical, rng);
        int[][] found = f.search(limits);
        int[][] qubitIds = new int[found.length][];
        for (int v = 0; v < found.length; v++) {
            qubitIds[v] = new int[found[v].length];
            for (int i = 0; i < found[v].length; i++) {
                qubitIds[v][i] = graph.qubits().id(found[v][i]);
            }
        }
        Chains chains = Chains.of(ids.toArray(), qubitIds);
        // The search's own bookkeeping is not trusted: the independent check has the last word.
        EmbeddingCheck.requireValid(logical, chains, graph);
        return chains;
    }

    /**
     * Runs {@link #find} up to {@code tries} times, each from its own generator seeded from
     * {@code rng}, and keeps the best embedding: the shortest longest chain, then the fewest
     * qubits, then the earliest try. Tries that find nothing are skipped. The round limit
     * applies to each try, the time limit to all of them together: once it has passed, no
     * further try starts (so with a time limit the number of tries made may vary).
     *
     * @throws EmbeddingNotFoundException where no try finds one (the last try's message)
     */
    public static Chains findBest(IsingProblem logical, QubitGraph graph, FinderLimits limits, int tries,
                                  UniformRandomProvider rng) {
        if (tries < 1) {
            throw new IllegalArgumentException("tries " + tries + " must be >= 1");
        }
        Chains best = null;
        EmbeddingNotFoundException last = null;
        long deadline = System.nanoTime() + limits.timeLimitMillis() * 1_000_000L;
        for (int t = 0; t < tries; t++) {
            long left = (deadline - System.nanoTime()) / 1_000_000L;
            if (limits.timeLimitMillis() > 0 && t > 0 && left <= 0) {
                break;
            }
            FinderLimits own = limits.timeLimitMillis() == 0 ? limits : new FinderLimits(limits.rounds(), Math.max(1, left));
            UniformRandomProvider stream = LegacyStreams.ofSeed(rng.nextLong());
            try {
                Chains c = find(logical, graph, own, stream);
                if (best == null || c.maxLength() < best.maxLength()
                        || (c.maxLength() == best.maxLength() && c.qubitCount() < best.qubitCount())) {
                    best = c;
                }
            } catch (EmbeddingNotFoundException e) {
                last = e;
            }
        }
        if (best == null) {
            throw new EmbeddingNotFoundException(last.getMessage() + " (in every try)");
        }
        return best;
    }

    private int[][] search(FinderLimits limits) {
        long deadline = limits.timeLimitMillis() == 0 ? Long.MAX_VALUE
                : System.nanoTime() + limits.timeLimitMillis() * 1_000_000L;
        int[] order = new int[logicalCount];
        for (int v = 0; v < logicalCount; v++) {
            order[v] = v;
        }
        for (int v : breadthFirstOrder()) {
            place(v);
        }
        int bestOverlap = overlap();
        int overallBest = bestOverlap;
        int stalled = 0;
        int rounds = 0;
        while (overlap() > 0 && rounds < limits.rounds() && System.nanoTime() < deadline) {
            rounds++;
            if (stalled >= RESTART_AFTER) {
                // A long stall: start again from a fresh random placement.
                for (int v = 0; v < logicalCount; v++) {
                    ripUp(v);
                }
                Arrays.fill(history, 0.0);
                for (int v : breadthFirstOrder()) {
                    place(v);
                }
                bestOverlap = overlap();
                stalled = 0;
                continue;
            }
            shuffle(order);
            for (int v : order) {
                ripUp(v);
                place(v);
            }
            for (int q = 0; q < qubitCount; q++) {
                if (usage[q] > 1) {
                    history[q] += HISTORY_STEP;
                }
            }
            int now = overlap();
            if (now < bestOverlap) {
                bestOverlap = now;
                stalled = 0;
            } else {
                stalled++;
            }
            overallBest = Math.min(overallBest, now);
        }
        bestOverlap = overallBest;
        if (overlap() > 0) {
            String why = rounds >= limits.rounds() ? "after " + rounds + " rounds" : "within the time limit (" + rounds
                    + " rounds)";
            throw new EmbeddingNotFoundException("no embedding of " + logicalCount + " logical variables found in "
                    + qubitCount + " working qubits " + why + "; the best try still shared " + bestOverlap
                    + " qubits between chains; allow more rounds or time, try another seed, or use a larger device");
        }
        tighten(order, deadline);
        int[][] out = new int[logicalCount][];
        for (int v = 0; v < logicalCount; v++) {
            out[v] = Arrays.copyOf(chain[v], chainSize[v]);
        }
        return out;
    }

    /**
     * Once no qubit is shared: reroutes each chain through free qubits only and keeps the new
     * chain where it is valid and not longer, until a round shortens nothing (or a limit).
     */
    private void tighten(int[] order, long deadline) {
        strict = true;
        for (int round = 0; round < TIGHTEN_ROUNDS && System.nanoTime() < deadline; round++) {
            int saved = 0;
            shuffle(order);
            for (int v : order) {
                int[] old = Arrays.copyOf(chain[v], chainSize[v]);
                ripUp(v);
                place(v);
                if (chainSize[v] == 0 || chainSize[v] > old.length || !touchesAll(v) || overlap() > 0) {
                    ripUp(v);
                    for (int q : old) {
                        add(v, q);
                        usage[q]++;
                    }
                } else {
                    saved += old.length - chainSize[v];
                }
            }
            if (saved == 0) {
                break;
            }
        }
        strict = false;
    }

    private boolean touchesAll(int v) {
        for (int p = logicalStart[v]; p < logicalStart[v + 1]; p++) {
            int u = logicalAdj[p];
            boolean touch = false;
            for (int i = 0; i < chainSize[v] && !touch; i++) {
                touch = nextTo(chain[v][i], u);
            }
            if (!touch) {
                return false;
            }
        }
        return true;
    }

    /**
     * The logical vertices in breadth-first order from a random start (components one after
     * another, neighbours in random order), so that each vertex but a component's first is
     * placed next to a placed neighbour and the first chains do not scatter over the device.
     */
    private int[] breadthFirstOrder() {
        int[] start = new int[logicalCount];
        for (int v = 0; v < logicalCount; v++) {
            start[v] = v;
        }
        shuffle(start);
        boolean[] seen = new boolean[logicalCount];
        int[] out = new int[logicalCount];
        int tail = 0;
        int head = 0;
        for (int s : start) {
            if (seen[s]) {
                continue;
            }
            seen[s] = true;
            out[tail++] = s;
            while (head < tail) {
                int v = out[head++];
                int from = tail;
                for (int p = logicalStart[v]; p < logicalStart[v + 1]; p++) {
                    int u = logicalAdj[p];
                    if (!seen[u]) {
                        seen[u] = true;
                        out[tail++] = u;
                    }
                }
                shuffle(out, from, tail);
            }
        }
        return out;
    }

    private void shuffle(int[] a, int from, int to) {
        for (int i = to - 1; i > from; i--) {
            int j = from + rng.nextInt(i - from + 1);
            int t = a[i];
            a[i] = a[j];
            a[j] = t;
        }
    }

    /** Number of (qubit, extra chain) pairs: Σ max(0, usage − 1). */
    private int overlap() {
        int o = 0;
        for (int u : usage) {
            if (u > 1) {
                o += u - 1;
            }
        }
        return o;
    }

    private void shuffle(int[] a) {
        for (int i = a.length - 1; i > 0; i--) {
            int j = rng.nextInt(i + 1);
            int t = a[i];
            a[i] = a[j];
            a[j] = t;
        }
    }

    private void ripUp(int v) {
        for (int i = 0; i < chainSize[v]; i++) {
            usage[chain[v][i]]--;
        }
        member[v].clear();
        chainSize[v] = 0;
    }

    private double weight(int q) {
        if (strict) {
            return usage[q] > 0 ? Double.POSITIVE_INFINITY : jitter[q];
        }
        return (1.0 + history[q]) * weightOfUsage[usage[q]] * jitter[q];
    }

    private void place(int v) {
        for (int q = 0; q < qubitCount; q++) {
            jitter[q] = 1.0 + JITTER * rng.nextDouble();
        }
        int placed = 0;
        Arrays.fill(cost, 0.0);
        for (int p = logicalStart[v]; p < logicalStart[v + 1]; p++) {
            int u = logicalAdj[p];
            if (chainSize[u] == 0) {
                continue;
            }
            shortestPathsFrom(u, parent[placed]);
            for (int q = 0; q < qubitCount; q++) {
                cost[q] += dist[q];
            }
            placed++;
        }
        int offset = rng.nextInt(qubitCount);
        int root = -1;
        double bestCost = Double.POSITIVE_INFINITY;
        for (int i = 0; i < qubitCount; i++) {
            int q = (offset + i) % qubitCount;
            double c = placed == 0 ? weight(q) : cost[q];
            if (c < bestCost) {
                bestCost = c;
                root = q;
            }
        }
        if (root < 0 && strict) {
            return;
        }
        if (root < 0) {
            throw new EmbeddingNotFoundException("the chains of the neighbours of logical variable position " + v
                    + " cannot be reached from one qubit: the working graph is not connected enough for this problem");
        }
        add(v, root);
        // Grow the chain as a tree: join the neighbours nearest the root first, each by a
        // shortest path from the chain as it stands, so that paths share qubits.
        int[] nbs = new int[placed];
        long[] keyed = new long[placed];
        int m = 0;
        for (int p = logicalStart[v]; p < logicalStart[v + 1]; p++) {
            if (chainSize[logicalAdj[p]] > 0) {
                nbs[m] = logicalAdj[p];
                int hops = 0;
                for (int q = parent[m][root]; q >= 0; q = parent[m][q]) {
                    hops++;
                }
                keyed[m] = ((long) hops << 32) | m;
                m++;
            }
        }
        Arrays.sort(keyed);
        for (long k : keyed) {
            connect(v, nbs[(int) k]);
        }
        prune(v);
        for (int i = 0; i < chainSize[v]; i++) {
            usage[chain[v][i]]++;
        }
    }

    /** Adds to v's chain a least-weight path from it to a qubit next to u's chain (none where they already touch). */
    private void connect(int v, int u) {
        for (int i = 0; i < chainSize[v]; i++) {
            if (nextTo(chain[v][i], u)) {
                return;
            }
        }
        Arrays.fill(dist, Double.POSITIVE_INFINITY);
        int[] par = pathParent;
        int size = 0;
        for (int i = 0; i < chainSize[v]; i++) {
            int q = chain[v][i];
            dist[q] = 0.0;
            par[q] = -1;
            size = push(size, 0.0, q);
        }
        while (size > 0) {
            double d = heapKey[0];
            int q = heapNode[0];
            size = pop(size);
            if (d > dist[q]) {
                continue;
            }
            if (!member[v].get(q) && nextTo(q, u)) {
                for (int r = q; r >= 0 && !member[v].get(r); r = par[r]) {
                    add(v, r);
                }
                return;
            }
            size = relaxFrom(q, d, par, size);
        }
    }

    /** Dijkstra's relaxation of q's neighbours at distance d; returns the new heap size. */
    private int relaxFrom(int q, double d, int[] par, int size) {
        for (int p = qubitStart[q]; p < qubitStart[q + 1]; p++) {
            int nb = qubitAdj[p];
            double nd = d + weight(nb);
            if (nd < dist[nb]) {
                dist[nb] = nd;
                par[nb] = q;
                size = push(size, nd, nb);
            }
        }
        return size;
    }

    private void add(int v, int q) {
        if (chainSize[v] == chain[v].length) {
            chain[v] = Arrays.copyOf(chain[v], 2 * chain[v].length);
        }
        chain[v][chainSize[v]++] = q;
        member[v].set(q);
    }

    /**
     * Dijkstra from the qubits next to u's chain: dist[q] is the least total weight of a path
     * q … s with s next to the chain (both ends counted), parent[q] the next qubit towards the
     * chain (−1 at s).
     */
    private void shortestPathsFrom(int u, int[] par) {
        Arrays.fill(dist, Double.POSITIVE_INFINITY);
        int size = 0;
        for (int i = 0; i < chainSize[u]; i++) {
            int c = chain[u][i];
            for (int p = qubitStart[c]; p < qubitStart[c + 1]; p++) {
                int s = qubitAdj[p];
                double w = weight(s);
                if (w < dist[s]) {
                    dist[s] = w;
                    par[s] = -1;
                    size = push(size, w, s);
                }
            }
        }
        while (size > 0) {
            double d = heapKey[0];
            int q = heapNode[0];
            size = pop(size);
            if (d > dist[q]) {
                continue;
            }
            size = relaxFrom(q, d, par, size);
        }
    }

    private int push(int size, double key, int node) {
        int i = size;
        while (i > 0) {
            int up = (i - 1) >>> 1;
            if (heapKey[up] <= key) {
                break;
            }
            heapKey[i] = heapKey[up];
            heapNode[i] = heapNode[up];
            i = up;
        }
        heapKey[i] = key;
        heapNode[i] = node;
        return size + 1;
    }

    private int pop(int size) {
        int last = size - 1;
        double key = heapKey[last];
        int node = heapNode[last];
        int i = 0;
        while (true) {
            int child = 2 * i + 1;
            if (child >= last) {
                break;
            }
            if (child + 1 < last && heapKey[child + 1] < heapKey[child]) {
                child++;
            }
            if (heapKey[child] >= key) {
                break;
            }
            heapKey[i] = heapKey[child];
            heapNode[i] = heapNode[child];
            i = child;
        }
        heapKey[i] = key;
        heapNode[i] = node;
        return last;
    }

    /** Removes leaves of v's chain that no neighbour chain needs for a coupler. */
    private void prune(int v) {
        boolean changed = true;
        while (changed && chainSize[v] > 1) {
            changed = false;
            for (int i = 0; i < chainSize[v] && chainSize[v] > 1; i++) {
                int q = chain[v][i];
                if (isLeaf(v, q) && !needed(v, q)) {
                    member[v].clear(q);
                    chain[v][i] = chain[v][--chainSize[v]];
                    i--;
                    changed = true;
                }
            }
        }
    }

    private boolean isLeaf(int v, int q) {
        int inside = 0;
        for (int p = qubitStart[q]; p < qubitStart[q + 1]; p++) {
            if (member[v].get(qubitAdj[p]) && ++inside > 1) {
                return false;
            }
        }
        return true;
    }

    /** Whether q is the only qubit of v's chain next to some placed neighbour's chain. */
    private boolean needed(int v, int q) {
        for (int p = logicalStart[v]; p < logicalStart[v + 1]; p++) {
            int u = logicalAdj[p];
            if (chainSize[u] == 0 || !nextTo(q, u)) {
                continue;
            }
            boolean other = false;
            for (int i = 0; i < chainSize[v] && !other; i++) {
                int r = chain[v][i];
                other = r != q && nextTo(r, u);
            }
            if (!other) {
                return true;
            }
        }
        return false;
    }

    private boolean nextTo(int q, int u) {
        for (int p = qubitStart[q]; p < qubitStart[q + 1]; p++) {
            if (member[u].get(qubitAdj[p])) {
                return true;
            }
        }
        return false;
    }

    /** Twice-swept breadth-first search from qubit 0's component: a lower bound on the diameter, exact on trees. */
    private int diameterEstimate() {
        if (qubitCount == 0) {
            return 2;
        }
        int[] far = bfs(0);
        int[] back = bfs(far[0]);
        return back[1];
    }

    private int[] bfs(int from) {
        int[] depth = new int[qubitCount];
        Arrays.fill(depth, -1);
        int[] queue = new int[qubitCount];
        int head = 0;
        int tail = 0;
        queue[tail++] = from;
        depth[from] = 0;
        int last = from;
        while (head < tail) {
            int q = queue[head++];
            last = q;
            for (int p = qubitStart[q]; p < qubitStart[q + 1]; p++) {
                int nb = qubitAdj[p];
                if (depth[nb] < 0) {
                    depth[nb] = depth[q] + 1;
                    queue[tail++] = nb;
                }
            }
        }
        return new int[] {last, depth[last]};
    }
}
