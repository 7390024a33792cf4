package org.obverse.samples;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.obverse.bits.BitSlicedCounter;
import org.obverse.model.IsingProblem;

/**
 * The fast energy kernels (see {@link EnergyKernel}): carry-save bit counters, cluster tables
 * and byte tables, chosen per term by a planner.
 *
 * <p>Rewritten with bits, E(r) = C + Σ_k 2h_k·[w_k bit r] − Σ_e 2J_e·[x_e bit r] with
 * C = offset − Σ h + Σ J and x_e = w_u ⊕ w_v. Each nonzero term is a word (w_k or x_e) and a
 * weight (2h or −2J); terms whose value is zero are dropped. Each remaining term goes to one of:
 * <ul>
 *   <li>a counted group: a weight that many terms share; per read, the set bits of the
 *       group's words are counted with {@link BitSlicedCounter} and the group adds weight · count;</li>
 *   <li>a cluster: eight consecutive positions 8c … 8c+7 whose own fields and couplers are
 *       many; a 256-entry table, computed once, holds their energy for every configuration,
 *       and per read the cluster adds the entry its eight spins select (the spins are
 *       gathered by an 8 × 8 byte and bit transposition of the cluster's eight words);</li>
 *   <li>the byte tables: the weight is added into eight 256-entry tables indexed by the bytes
 *       of the term's word, expanded once per block into 64 per-read sums.</li>
 * </ul>
 * Per read the parts are added in a fixed order: byte tables, clusters, groups, then C (the
 * offset plus the bit-form constants of the counted and byte-tabled terms).
 */
final class FastEnergy implements EnergyKernel {
    /** The planner's threshold: a weight shared by at least this many terms is counted. */
    static final int MIN_GROUP = 64;
    /** At most this many counted groups (the largest); the remaining weights are tabled. */
    static final int MAX_GROUPS = 64;
    /**
     * The planner's threshold: a cluster of eight positions gets its own table where at least
     * this many of its terms would otherwise go to the byte tables (a cluster costs about as
     * much per block as a dozen byte-table terms).
     */
    static final int MIN_CLUSTER_TERMS = 12;
    private static final double UNIT_ROUNDOFF = 0x1p-53;

    private final Plan plan;
    private final IsingProblem problem;
    private final Method method;
    private final int n;
    private final double constant;
    private final double tolerance;
    // Byte-tabled terms: fields (word k) and couplers (word u ^ word v), with their weights.
    private final int[] tableField;
    private final double[] tableFieldWeight;
    private final int[] tableU;
    private final int[] tableV;
    private final double[] tableCouplerWeight;
    // Clusters: first position of each, and 256 energies per cluster.
    private final int[] clusterFirst;
    private final double[] clusterEnergy;
    // Counted groups: terms of group g are termA/termB[groupStart[g] .. groupStart[g+1]);
    // field groups use termA alone.
    private final int[] groupStart;
    private final int[] termA;
    private final int[] termB;
    private final boolean[] groupIsField;
    private final double[] groupWeight;

    // Workspace, per instance.
    private final double[] table = new double[8 * 256];
    private final double[] acc = new double[64];
    private final long[] gathered;
    private final long[] planes = new long[32];
    private final int[] counts = new int[64];
    // Per cluster, eight words: byte b of word j = the cluster's spins in read 8j + b.
    private final long[] clusterSpins;

    private FastEnergy(Plan p) {
        this.problem = p.problem;
        this.method = p.method;
        this.n = p.problem.size();
        this.constant = p.constant;
        this.tolerance = p.tolerance;
        this.tableField = p.tableField;
        this.tableFieldWeight = p.tableFieldWeight;
        this.tableU = p.tableU;
        this.tableV = p.tableV;
        this.tableCouplerWeight = p.tableCouplerWeight;
        this.clusterFirst = p.clusterFirst;
        this.clusterEnergy = p.clusterEnergy;
        this.groupStart = p.groupStart;
        this.termA = p.termA;
        this.termB = p.termB;
        this.groupIsField = p.groupIsField;
        this.groupWeight = p.groupWeight;
        this.plan = p;
        int max = 0;
        for (int g = 0; g + 1 < groupStart.length; g++) {
            max = Math.max(max, groupStart[g + 1] - groupStart[g]);
        }
        this.gathered = new long[max];
        this.clusterSpins = new long[8 * clusterFirst.length];
    }

    /** The precomputed, immutable part, shared by copies. */
    private static final class Plan {
        IsingProblem problem;
        Method method;
        double constant;
        double tolerance;
        int[] tableField;
        double[] tableFieldWeight;
        int[] tableU;
        int[] tableV;
        double[] tableCouplerWeight;
        int[] clusterFirst;
        double[] clusterEnergy;
        int[] groupStart;
        int[] termA;
        int[] termB;
        boolean[] groupIsField;
        double[] groupWeight;
    }

    /**
     * Builds the kernel. Weights with at least minGroup terms (up to MAX_GROUPS of them) are
     * counted; clusters with at least minClusterTerms otherwise tabled terms get a table.
     */
    static FastEnergy plan(IsingProblem p, int minGroup, int minClusterTerms) {
        int n = p.size();
        int m = p.edgeCount();
        double sumAbs = 0.0;
        Map<Double, Integer> fieldUse = new HashMap<>();
        Map<Double, Integer> couplerUse = new HashMap<>();
        for (int k = 0; k < n; k++) {
            double h = p.field(k);
            sumAbs += Math.abs(h);
            if (h != 0.0) {
                fieldUse.merge(2.0 * h, 1, Integer::sum);
            }
        }
        for (int e = 0; e < m; e++) {
            double j = p.coupling(e);
            sumAbs += Math.abs(j);
            if (j != 0.0) {
                couplerUse.merge(-2.0 * j, 1, Integer::sum);
            }
        }

        // 1. Counted groups: the most used weights first, each with at least minGroup terms.
        List<double[]> candidates = new ArrayList<>(); // {weight, uses, isField}
        fieldUse.forEach((w, c) -> candidates.add(new double[] {w, c, 1}));
        couplerUse.forEach((w, c) -> candidates.add(new double[] {w, c, 0}));
        candidates.sort((a, b) -> a[1] != b[1] ? Double.compare(b[1], a[1])
                : a[2] != b[2] ? Double.compare(b[2], a[2]) : Double.compare(a[0], b[0]));
        int limit = minGroup == 1 ? Integer.MAX_VALUE : MAX_GROUPS;
        Map<Double, Integer> fieldGroup = new HashMap<>();
        Map<Double, Integer> couplerGroup = new HashMap<>();
        List<double[]> groups = new ArrayList<>();
        for (double[] c : candidates) {
            if (c[1] >= minGroup && groups.size() < limit) {
                (c[2] == 1 ? fieldGroup : couplerGroup).put(c[0], groups.size());
                groups.add(c);
            }
        }
        int g = groups.size();
        // Where each term goes: a group index >= 0, CLUSTERED, TABLED, or ZERO.
        final int tabled = -1;
        final int clustered = -2;
        final int zero = -3;
        int[] fieldPlace = new int[n];
        int[] couplerPlace = new int[m];
        for (int k = 0; k < n; k++) {
            double h = p.field(k);
            fieldPlace[k] = h == 0.0 ? zero : fieldGroup.getOrDefault(2.0 * h, tabled);
        }
        for (int e = 0; e < m; e++) {
            double j = p.coupling(e);
            couplerPlace[e] = j == 0.0 ? zero : couplerGroup.getOrDefault(-2.0 * j, tabled);
        }

        // 2. Clusters of eight consecutive positions with enough otherwise tabled terms of their own.
        int[] inside = new int[n / 8];
        for (int k = 0; k < 8 * inside.length; k++) {
            if (fieldPlace[k] == tabled) {
                inside[k >>> 3]++;
            }
        }
        for (int e = 0; e < m; e++) {
            int c = p.edgeU(e) >>> 3;
            if (couplerPlace[e] == tabled && c == p.edgeV(e) >>> 3 && c < inside.length) {
                inside[c]++;
            }
        }
        int[] clusterOf = new int[inside.length];
        int clusters = 0;
        for (int c = 0; c < inside.length; c++) {
            clusterOf[c] = inside[c] >= minClusterTerms ? clusters++ : -1;
        }
        int[] clusterFirst = new int[clusters];
        for (int c = 0; c < inside.length; c++) {
            if (clusterOf[c] >= 0) {
                clusterFirst[clusterOf[c]] = 8 * c;
            }
        }
        double[] clusterEnergy = new double[256 * clusters];
        // Fields first (by position), then couplers (by coupler order), into every configuration.
        for (int k = 0; k < 8 * inside.length; k++) {
            int c = clusterOf[k >>> 3];
            if (fieldPlace[k] == tabled && c >= 0) {
                fieldPlace[k] = clustered;
                double h = p.field(k);
                int bit = k & 7;
                for (int mask = 0; mask < 256; mask++) {
                    clusterEnergy[256 * c + mask] += ((mask >>> bit) & 1) != 0 ? h : -h;
                }
            }
        }
        for (int e = 0; e < m; e++) {
            int u = p.edgeU(e);
            int v = p.edgeV(e);
            int c = u >>> 3 < inside.length && u >>> 3 == v >>> 3 ? clusterOf[u >>> 3] : -1;
            if (couplerPlace[e] == tabled && c >= 0) {
                couplerPlace[e] = clustered;
                double j = p.coupling(e);
                for (int mask = 0; mask < 256; mask++) {
                    boolean same = ((mask >>> (u & 7)) & 1) == ((mask >>> (v & 7)) & 1);
                    clusterEnergy[256 * c + mask] += same ? j : -j;
                }
            }
        }

        // 3. Group members, byte-tabled terms, and the constant of all but the clustered terms.
        int[] groupSize = new int[g];
        int tabledFields = 0;
        int tabledCouplers = 0;
        double constant = p.offset();
        for (int k = 0; k < n; k++) {
            if (fieldPlace[k] >= 0) {
                groupSize[fieldPlace[k]]++;
            } else if (fieldPlace[k] == tabled) {
                tabledFields++;
            }
            if (fieldPlace[k] != clustered) {
                constant -= p.field(k);
            }
        }
        for (int e = 0; e < m; e++) {
            if (couplerPlace[e] >= 0) {
                groupSize[couplerPlace[e]]++;
            } else if (couplerPlace[e] == tabled) {
                tabledCouplers++;
            }
            if (couplerPlace[e] != clustered) {
                constant += p.coupling(e);
            }
        }
        int[] groupStart = new int[g + 1];
        for (int i = 0; i < g; i++) {
            groupStart[i + 1] = groupStart[i] + groupSize[i];
        }
        int[] fill = Arrays.copyOf(groupStart, g);
        Plan plan = new Plan();
        plan.termA = new int[groupStart[g]];
        plan.termB = new int[groupStart[g]];
        plan.tableField = new int[tabledFields];
        plan.tableFieldWeight = new double[tabledFields];
        plan.tableU = new int[tabledCouplers];
        plan.tableV = new int[tabledCouplers];
        plan.tableCouplerWeight = new double[tabledCouplers];
        tabledFields = 0;
        tabledCouplers = 0;
        for (int k = 0; k < n; k++) {
            int place = fieldPlace[k];
            if (place >= 0) {
                plan.termA[fill[place]] = k;
                plan.termB[fill[place]++] = -1;
            } else if (place == tabled) {
                plan.tableField[tabledFields] = k;
                plan.tableFieldWeight[tabledFields++] = 2.0 * p.field(k);
            }
        }
        for (int e = 0; e < m; e++) {
            int place = couplerPlace[e];
            if (place >= 0) {
                plan.termA[fill[place]] = p.edgeU(e);
                plan.termB[fill[place]++] = p.edgeV(e);
            } else if (place == tabled) {
                plan.tableU[tabledCouplers] = p.edgeU(e);
                plan.tableV[tabledCouplers] = p.edgeV(e);
                plan.tableCouplerWeight[tabledCouplers++] = -2.0 * p.coupling(e);
            }
        }
        plan.groupIsField = new boolean[g];
        plan.groupWeight = new double[g];
        for (int i = 0; i < g; i++) {
            plan.groupWeight[i] = groups.get(i)[0];
            plan.groupIsField[i] = groups.get(i)[2] == 1;
        }
        plan.problem = p;
        plan.constant = constant;
        plan.groupStart = groupStart;
        plan.clusterFirst = clusterFirst;
        plan.clusterEnergy = clusterEnergy;
        boolean anyTables = tabledFields + tabledCouplers + clusters > 0;
        plan.method = g == 0 ? Method.TABLES : anyTables ? Method.COUNTERS_AND_TABLES : Method.COUNTERS;
        long terms = 2L * (n + m) + 2L * g + 2088;
        double gamma = terms * UNIT_ROUNDOFF / (1 - terms * UNIT_ROUNDOFF);
        plan.tolerance = gamma * (3 * Math.abs(p.offset()) + 7 * sumAbs);
        return new FastEnergy(plan);
    }

    static void checkBlock(IsingProblem problem, SampleBlock block, double[] out, int offset) {
        if (block.variables() != problem.size()) {
            throw new IllegalArgumentException("block has " + block.variables() + " spins per read; the problem has "
                    + problem.size() + " variables");
        }
        if (offset < 0 || out.length - offset < block.reads()) {
            throw new IllegalArgumentException("output of length " + out.length + " from " + offset
                    + " cannot hold " + block.reads() + " energies");
        }
    }

    @Override
    public IsingProblem problem() {
        return problem;
    }

    @Override
    public Method method() {
        return method;
    }

    @Override
    public double tolerance() {
        return tolerance;
    }

    /** Number of counted groups. */
    int groupCount() {
        return groupWeight.length;
    }

    /** Number of clusters with their own table. */
    int clusterCount() {
        return clusterFirst.length;
    }

    /** Number of terms in the byte tables. */
    int byteTabledCount() {
        return tableField.length + tableU.length;
    }

    @Override
    public void energies(SampleBlock block, double[] out, int offset) {
        checkBlock(problem, block, out, offset);
        long[] w = block.words();
        int blocks = block.blockCount();
        boolean tabled = tableField.length + tableU.length > 0;
        for (int b = 0; b < blocks; b++) {
            int base = b * n;
            if (tabled) {
                fillTables(w, base);
                expandTables();
            } else {
                Arrays.fill(acc, 0.0);
            }
            if (clusterFirst.length > 0) {
                addClusters(w, base);
            }
            for (int g = 0; g < groupWeight.length; g++) {
                countGroup(w, base, g);
                double weight = groupWeight[g];
                for (int r = 0; r < 64; r++) {
                    acc[r] += weight * counts[r];
                }
            }
            int live = Math.min(64, block.reads() - (b << 6));
            for (int r = 0; r < live; r++) {
                out[offset + (b << 6) + r] = acc[r] + constant;
            }
        }
    }

    /** Adds every byte-tabled term's weight into the entry its word's byte j selects, in table j. */
    private void fillTables(long[] w, int base) {
        double[] t = table;
        for (int i = 0; i < tableField.length; i++) {
            addToTables(t, w[base + tableField[i]], tableFieldWeight[i]);
        }
        int[] u = tableU;
        int[] v = tableV;
        double[] c = tableCouplerWeight;
        for (int i = 0; i < u.length; i++) {
            addToTables(t, w[base + u[i]] ^ w[base + v[i]], c[i]);
        }
    }

    private static void addToTables(double[] t, long x, double c) {
        t[(int) x & 255] += c;
        t[256 + ((int) (x >>> 8) & 255)] += c;
        t[512 + ((int) (x >>> 16) & 255)] += c;
        t[768 + ((int) (x >>> 24) & 255)] += c;
        t[1024 + ((int) (x >>> 32) & 255)] += c;
        t[1280 + ((int) (x >>> 40) & 255)] += c;
        t[1536 + ((int) (x >>> 48) & 255)] += c;
        t[1792 + (int) (x >>> 56)] += c;
    }

    /**
     * Read 8j + i gets the sum of table j's entries whose index has bit i set. Taking bit 7
     * first: sum the upper half, then fold it onto the lower half; 510 additions a table
     * instead of 1024. Leaves the tables cleared for the next block.
     */
    private void expandTables() {
        double[] t = table;
        for (int j = 0; j < 8; j++) {
            int from = j << 8;
            for (int bit = 7; bit >= 0; bit--) {
                int half = 1 << bit;
                double s = 0.0;
                for (int v = half; v < 2 * half; v++) {
                    s += t[from + v];
                }
                acc[(j << 3) + bit] = s;
                for (int v = 0; v < half; v++) {
                    t[from + v] += t[from + v + half];
                }
            }
        }
        Arrays.fill(t, 0.0);
    }

    /**
     * Adds each cluster's energy for each read's configuration. The cluster's eight words form
     * an 8 × 8 matrix of bytes (row i = spin 8c+i, byte j = reads 8j … 8j+7); transposing it
     * by bytes and then each byte block by bits leaves, in byte b of row j, the eight spins of
     * read 8j + b: the index into the cluster's table. Delta swaps as in Warren, Hacker's
     * Delight, 2nd ed., 2012, §7-3. The indices of all clusters are gathered first, then each
     * run of eight reads sums its entries over all clusters in registers. Per read the
     * clusters' energies are thus added together first and their sum then added to the byte
     * tables' part (a fixed order).
     */
    private void addClusters(long[] w, int base) {
        double[] e = clusterEnergy;
        long[] spins = clusterSpins;
        for (int c = 0; c < clusterFirst.length; c++) {
            int at = base + clusterFirst[c];
            long w0 = w[at];
            long w1 = w[at + 1];
            long w2 = w[at + 2];
            long w3 = w[at + 3];
            long w4 = w[at + 4];
            long w5 = w[at + 5];
            long w6 = w[at + 6];
            long w7 = w[at + 7];
            long t;
            // Byte transpose: swap 4-byte blocks of rows i, i+4; 2-byte of i, i+2; bytes of i, i+1.
            t = ((w0 >>> 32) ^ w4) & 0xFFFFFFFFL;
            w0 ^= t << 32;
            w4 ^= t;
            t = ((w1 >>> 32) ^ w5) & 0xFFFFFFFFL;
            w1 ^= t << 32;
            w5 ^= t;
            t = ((w2 >>> 32) ^ w6) & 0xFFFFFFFFL;
            w2 ^= t << 32;
            w6 ^= t;
            t = ((w3 >>> 32) ^ w7) & 0xFFFFFFFFL;
            w3 ^= t << 32;
            w7 ^= t;
            t = ((w0 >>> 16) ^ w2) & 0x0000FFFF0000FFFFL;
            w0 ^= t << 16;
            w2 ^= t;
            t = ((w1 >>> 16) ^ w3) & 0x0000FFFF0000FFFFL;
            w1 ^= t << 16;
            w3 ^= t;
            t = ((w4 >>> 16) ^ w6) & 0x0000FFFF0000FFFFL;
            w4 ^= t << 16;
            w6 ^= t;
            t = ((w5 >>> 16) ^ w7) & 0x0000FFFF0000FFFFL;
            w5 ^= t << 16;
            w7 ^= t;
            t = ((w0 >>> 8) ^ w1) & 0x00FF00FF00FF00FFL;
            w0 ^= t << 8;
            w1 ^= t;
            t = ((w2 >>> 8) ^ w3) & 0x00FF00FF00FF00FFL;
            w2 ^= t << 8;
            w3 ^= t;
            t = ((w4 >>> 8) ^ w5) & 0x00FF00FF00FF00FFL;
            w4 ^= t << 8;
            w5 ^= t;
            t = ((w6 >>> 8) ^ w7) & 0x00FF00FF00FF00FFL;
            w6 ^= t << 8;
            w7 ^= t;
            int z = c << 3;
            spins[z] = transposeBits(w0);
            spins[z + 1] = transposeBits(w1);
            spins[z + 2] = transposeBits(w2);
            spins[z + 3] = transposeBits(w3);
            spins[z + 4] = transposeBits(w4);
            spins[z + 5] = transposeBits(w5);
            spins[z + 6] = transposeBits(w6);
            spins[z + 7] = transposeBits(w7);
        }
        // Eight reads at a time, over every cluster, in registers: no stores in the hot loop.
        int clusters = clusterFirst.length;
        for (int j = 0; j < 8; j++) {
            double a0 = 0;
            double a1 = 0;
            double a2 = 0;
            double a3 = 0;
            double a4 = 0;
            double a5 = 0;
            double a6 = 0;
            double a7 = 0;
            for (int c = 0; c < clusters; c++) {
                long z = spins[(c << 3) + j];
                int from = c << 8;
                a0 += e[from + ((int) z & 255)];
                a1 += e[from + ((int) (z >>> 8) & 255)];
                a2 += e[from + ((int) (z >>> 16) & 255)];
                a3 += e[from + ((int) (z >>> 24) & 255)];
                a4 += e[from + ((int) (z >>> 32) & 255)];
                a5 += e[from + ((int) (z >>> 40) & 255)];
                a6 += e[from + ((int) (z >>> 48) & 255)];
                a7 += e[from + (int) (z >>> 56)];
            }
            int r = j << 3;
            acc[r] += a0;
            acc[r + 1] += a1;
            acc[r + 2] += a2;
            acc[r + 3] += a3;
            acc[r + 4] += a4;
            acc[r + 5] += a5;
            acc[r + 6] += a6;
            acc[r + 7] += a7;
        }
    }

    /** Transposes the 8 × 8 bit matrix whose row i is byte i: bit 8i + b goes to 8b + i. */
    static long transposeBits(long x) {
        long t = (x ^ (x >>> 7)) & 0x00AA00AA00AA00AAL;
        x ^= t ^ (t << 7);
        t = (x ^ (x >>> 14)) & 0x0000CCCC0000CCCCL;
        x ^= t ^ (t << 14);
        t = (x ^ (x >>> 28)) & 0x00000000F0F0F0F0L;
        x ^= t ^ (t << 28);
        return x;
    }

    /** Counts, per read, the set bits of group g's words into {@link #counts}. */
    private void countGroup(long[] w, int base, int g) {
        int start = groupStart[g];
        int size = groupStart[g + 1] - start;
        long[] x = gathered;
        if (groupIsField[g]) {
            for (int i = 0; i < size; i++) {
                x[i] = w[base + termA[start + i]];
            }
        } else {
            for (int i = 0; i < size; i++) {
                x[i] = w[base + termA[start + i]] ^ w[base + termB[start + i]];
            }
        }
        BitSlicedCounter.countLanes(x, size, planes, counts);
    }

    @Override
    public EnergyKernel copy() {
        return new FastEnergy(plan);
    }

    @Override
    public String toString() {
        return "FastEnergy[" + method + ", " + groupWeight.length + " counted groups, " + clusterFirst.length
                + " clusters, " + byteTabledCount() + " byte-tabled terms, " + problem + "]";
    }
}
