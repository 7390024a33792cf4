package org.obverse.gauge;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.obverse.connectivity.DisjointSets;
import org.obverse.device.DeviceLimits;
import org.obverse.device.ValueRange;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;

/**
 * The clusters of qubits that a gauge must flip together, for one problem on one device.
 *
 * <p>A coupler with value J and range [lo, hi] is locked iff −J is outside the range; a field h
 * pins its qubit (g = +1) iff −h is outside the field range. Locked couplers (and, under the
 * {@code chains} policy, the chains) join qubits into clusters by union–find; a cluster that
 * holds a pinned qubit is pinned, every other cluster is free and gets one sign per gauge.
 * Free clusters are numbered 0 … freeCount−1 in order of their smallest position. Immutable.
 */
public final class LockedClusters {
    private final int size;
    private final int[] clusterOf;      // position -> cluster number (0..clusterCount-1)
    private final boolean[] pinned;     // cluster -> pinned
    private final int[] freeIndexOf;    // cluster -> free index, or -1 where pinned
    private final int[][] freeMembers;  // free index -> positions, ascending
    private final int[] lockedCouplers; // coupler numbers, ascending
    private final int pinnedQubits;
    private final LockPolicy policy;

    private LockedClusters(int size, int[] clusterOf, boolean[] pinned, int[] lockedCouplers, int pinnedQubits,
                           LockPolicy policy) {
        this.size = size;
        this.clusterOf = clusterOf;
        this.pinned = pinned;
        this.lockedCouplers = lockedCouplers;
        this.pinnedQubits = pinnedQubits;
        this.policy = policy;
        freeIndexOf = new int[pinned.length];
        int free = 0;
        for (int c = 0; c < pinned.length; c++) {
            freeIndexOf[c] = pinned[c] ? -1 : free++;
        }
        int[] counts = new int[free];
        for (int k = 0; k < size; k++) {
            int f = freeIndexOf[clusterOf[k]];
            if (f >= 0) {
                counts[f]++;
            }
        }
        freeMembers = new int[free][];
        for (int f = 0; f < free; f++) {
            freeMembers[f] = new int[counts[f]];
        }
        int[] fill = new int[free];
        for (int k = 0; k < size; k++) {
            int f = freeIndexOf[clusterOf[k]];
            if (f >= 0) {
                freeMembers[f][fill[f]++] = k;
            }
        }
    }

    /**
     * Finds the clusters. Input: the problem on qubit ids, the device's limits, the policy, and
     * for {@link LockPolicy#CHAINS} the chains as groups of qubit ids (checked against the problem under either policy, joined only under CHAINS; may be null for RANGE).
     *
     * @throws IllegalArgumentException where chains are given that do not fit the problem (a qubit the
     *     problem does not use, a qubit in two chains), under either policy, or the policy needs chains
     *     and none are given
     */
    public static LockedClusters of(IsingProblem p, DeviceLimits d, LockPolicy policy, int[][] chains) {
        int n = p.size();
        VariableIndex ids = p.variables();
        DisjointSets uf = DisjointSets.of(n);
        if (policy == LockPolicy.CHAINS && chains == null) {
            throw new IllegalArgumentException("lock policy chains needs the embedding's chains");
        }
        // Chains are checked against the problem whenever given; only the chains policy joins them.
        if (chains != null) {
            int[] owner = new int[n];
            Arrays.fill(owner, -1);
            for (int c = 0; c < chains.length; c++) {
                int first = -1;
                for (int q : chains[c]) {
                    int k = ids.indexOf(q);
                    if (k < 0) {
                        throw new IllegalArgumentException("chain " + c + " names qubit " + q
                                + ", which the problem does not use; the chains must belong to this problem");
                    }
                    if (owner[k] >= 0 && owner[k] != c) {
                        throw new IllegalArgumentException("qubit " + q + " is in chains " + owner[k] + " and " + c
                                + "; each qubit may belong to one chain only");
                    }
                    owner[k] = c;
                    if (first < 0) {
                        first = k;
                    } else if (policy == LockPolicy.CHAINS) {
                        uf.union(first, k);
                    }
                }
            }
        }
        List<Integer> locked = new ArrayList<>();
        for (int e = 0; e < p.edgeCount(); e++) {
            ValueRange r = d.couplingRange(ids.id(p.edgeU(e)), ids.id(p.edgeV(e)));
            if (!r.allowsSignChange(p.coupling(e))) {
                locked.add(e);
                uf.union(p.edgeU(e), p.edgeV(e));
            }
        }
        int[] clusterOf = uf.labels();
        int clusters = 0;
        for (int c : clusterOf) {
            clusters = Math.max(clusters, c + 1);
        }
        boolean[] pinned = new boolean[clusters];
        int pinnedQubits = 0;
        ValueRange fr = d.fieldRange();
        for (int k = 0; k < n; k++) {
            if (!fr.allowsSignChange(p.field(k))) {
                pinned[clusterOf[k]] = true;
                pinnedQubits++;
            }
        }
        return new LockedClusters(n, clusterOf, pinned, locked.stream().mapToInt(Integer::intValue).toArray(),
                pinnedQubits, policy);
    }

    public LockPolicy policy() {
        return policy;
    }

    /** Number of positions (qubits) of the problem. */
    public int size() {
        return size;
    }

    public int clusterCount() {
        return pinned.length;
    }

    public int freeCount() {
        return freeMembers.length;
    }

    public int pinnedClusterCount() {
        return pinned.length - freeMembers.length;
    }

    /** Qubits whose own field cannot change sign. */
    public int pinnedQubitCount() {
        return pinnedQubits;
    }

    /** Couplers whose value cannot change sign, ascending. */
    public int[] lockedCouplers() {
        return lockedCouplers.clone();
    }

    /** Cluster number of a position. */
    public int clusterOf(int k) {
        return clusterOf[k];
    }

    /** Whether a position may never flip. */
    public boolean isPinned(int k) {
        return pinned[clusterOf[k]];
    }

    /** Free cluster index of a position, or −1 where pinned. */
    public int freeIndexOf(int k) {
        return freeIndexOf[clusterOf[k]];
    }

    /** Positions of free cluster f, ascending (a copy). */
    public int[] freeMembers(int f) {
        return freeMembers[f].clone();
    }

    /** Size of free cluster f. */
    public int freeSize(int f) {
        return freeMembers[f].length;
    }

    /** The gauge that flips exactly the free clusters marked in flips (bit f of word f/64). */
    public Gauge gauge(long[] flips) {
        int count = 0;
        for (int f = 0; f < freeMembers.length; f++) {
            if ((flips[f >>> 6] >>> f & 1L) != 0) {
                count += freeMembers[f].length;
            }
        }
        int[] pos = new int[count];
        int m = 0;
        for (int f = 0; f < freeMembers.length; f++) {
            if ((flips[f >>> 6] >>> f & 1L) != 0) {
                for (int k : freeMembers[f]) {
                    pos[m++] = k;
                }
            }
        }
        return Gauge.flipping(size, pos);
    }

    /**
     * Whether a gauge respects the clusters: pinned positions unflipped, every cluster on one sign.
     * Returns null where it does, else a sentence naming the first offending position.
     */
    public String whyNotAllowed(Gauge g, VariableIndex ids) {
        int[] signOfCluster = new int[pinned.length];
        for (int k = 0; k < size; k++) {
            int c = clusterOf[k];
            int s = g.sign(k);
            if (pinned[c] && s < 0) {
                return "qubit " + ids.id(k) + " is flipped but its cluster is pinned by a field that cannot change sign";
            }
            if (signOfCluster[c] == 0) {
                signOfCluster[c] = s;
            } else if (signOfCluster[c] != s) {
                return "qubit " + ids.id(k) + " has another sign than the rest of its locked cluster";
            }
        }
        return null;
    }
}
