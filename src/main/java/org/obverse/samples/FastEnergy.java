package org.obverse.samples;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.obverse.model.IsingProblem;

/**
 * The fast energy kernels: byte tables and carry-save bit counters (see {@link EnergyKernel}).
 *
 * <p>Rewritten with bits, E(r) = C + Σ_k 2h_k·[w_k bit r] − Σ_e 2J_e·[x_e bit r] with
 * C = offset − Σ h + Σ J and x_e = w_u ⊕ w_v. Each nonzero term is a word (w_k or x_e) and a
 * weight (2h or −2J). Weights that many terms share form groups whose set bits are counted
 * per read; the other terms go into byte tables. Terms with a zero value are dropped.
 */
final class FastEnergy implements EnergyKernel {
    /** The planner's threshold: a value shared by at least this many terms is counted, not tabled. */
    static final int MIN_GROUP = 64;
    /** At most this many counted groups (the largest); the remaining values are tabled. */
    static final int MAX_GROUPS = 64;
    private static final double UNIT_ROUNDOFF = 0x1p-53;

    private final IsingProblem problem;
    private final Method method;
    private final int n;
    private final double constant;
    private final double tolerance;
    // Tabled terms: fields (word k) then couplers (word u ^ word v), with their weights.
    private final int[] tableField;
    private final double[] tableFieldWeight;
    private final int[] tableU;
    private final int[] tableV;
    private final double[] tableCouplerWeight;
    // Counted groups: terms of group g are termA/termB[groupStart[g] .. groupStart[g+1]);
    // termB < 0 marks a field group (the word alone).
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

    private FastEnergy(IsingProblem problem, Method method, double constant, double tolerance, int[] tableField,
                       double[] tableFieldWeight, int[] tableU, int[] tableV, double[] tableCouplerWeight,
                       int[] groupStart, int[] termA, int[] termB, boolean[] groupIsField, double[] groupWeight) {
        this.problem = problem;
        this.method = method;
        this.n = problem.size();
        this.constant = constant;
        this.tolerance = tolerance;
        this.tableField = tableField;
        this.tableFieldWeight = tableFieldWeight;
        this.tableU = tableU;
        this.tableV = tableV;
        this.tableCouplerWeight = tableCouplerWeight;
        this.groupStart = groupStart;
        this.termA = termA;
        this.termB = termB;
        this.groupIsField = groupIsField;
        this.groupWeight = groupWeight;
        int max = 0;
        for (int g = 0; g + 1 < groupStart.length; g++) {
            max = Math.max(max, groupStart[g + 1] - groupStart[g]);
        }
        this.gathered = new long[max];
    }

    private FastEnergy(FastEnergy o) {
        this(o.problem, o.method, o.constant, o.tolerance, o.tableField, o.tableFieldWeight, o.tableU, o.tableV,
                o.tableCouplerWeight, o.groupStart, o.termA, o.termB, o.groupIsField, o.groupWeight);
    }

    /** Builds the kernel; values with at least minGroup terms (up to MAX_GROUPS of them) are counted. */
    static FastEnergy plan(IsingProblem p, int minGroup) {
        int n = p.size();
        int m = p.edgeCount();
        // Weights per term; count how many terms share each (field and coupler weights apart).
        Map<Double, Integer> fieldUse = new HashMap<>();
        Map<Double, Integer> couplerUse = new HashMap<>();
        double sumAbs = 0.0;
        double constant = p.offset();
        for (int k = 0; k < n; k++) {
            double h = p.field(k);
            constant -= h;
            sumAbs += Math.abs(h);
            if (h != 0.0) {
                fieldUse.merge(2.0 * h, 1, Integer::sum);
            }
        }
        for (int e = 0; e < m; e++) {
            double j = p.coupling(e);
            constant += j;
            sumAbs += Math.abs(j);
            if (j != 0.0) {
                couplerUse.merge(-2.0 * j, 1, Integer::sum);
            }
        }
        // Pick groups: the most used values first, each with at least minGroup terms.
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
        int[] groupSize = new int[g];
        int tabledFields = 0;
        int tabledCouplers = 0;
        for (int k = 0; k < n; k++) {
            double h = p.field(k);
            if (h != 0.0) {
                Integer gi = fieldGroup.get(2.0 * h);
                if (gi != null) {
                    groupSize[gi]++;
                } else {
                    tabledFields++;
                }
            }
        }
        for (int e = 0; e < m; e++) {
            double j = p.coupling(e);
            if (j != 0.0) {
                Integer gi = couplerGroup.get(-2.0 * j);
                if (gi != null) {
                    groupSize[gi]++;
                } else {
                    tabledCouplers++;
                }
            }
        }
        int[] groupStart = new int[g + 1];
        for (int i = 0; i < g; i++) {
            groupStart[i + 1] = groupStart[i] + groupSize[i];
        }
        int[] fill = Arrays.copyOf(groupStart, g);
        int[] termA = new int[groupStart[g]];
        int[] termB = new int[groupStart[g]];
        int[] tableField = new int[tabledFields];
        double[] tableFieldWeight = new double[tabledFields];
        int[] tableU = new int[tabledCouplers];
        int[] tableV = new int[tabledCouplers];
        double[] tableCouplerWeight = new double[tabledCouplers];
        tabledFields = 0;
        tabledCouplers = 0;
        for (int k = 0; k < n; k++) {
            double h = p.field(k);
            if (h != 0.0) {
                Integer gi = fieldGroup.get(2.0 * h);
                if (gi != null) {
                    termA[fill[gi]] = k;
                    termB[fill[gi]++] = -1;
                } else {
                    tableField[tabledFields] = k;
                    tableFieldWeight[tabledFields++] = 2.0 * h;
                }
            }
        }
        for (int e = 0; e < m; e++) {
            double j = p.coupling(e);
            if (j != 0.0) {
                Integer gi = couplerGroup.get(-2.0 * j);
                if (gi != null) {
                    termA[fill[gi]] = p.edgeU(e);
                    termB[fill[gi]++] = p.edgeV(e);
                } else {
                    tableU[tabledCouplers] = p.edgeU(e);
                    tableV[tabledCouplers] = p.edgeV(e);
                    tableCouplerWeight[tabledCouplers++] = -2.0 * j;
                }
            }
        }
        boolean[] isField = new boolean[g];
        double[] weight = new double[g];
        for (int i = 0; i < g; i++) {
            weight[i] = groups.get(i)[0];
            isField[i] = groups.get(i)[2] == 1;
        }
        boolean tabled = tabledFields + tabledCouplers > 0;
        Method method = g == 0 ? Method.TABLES : tabled ? Method.COUNTERS_AND_TABLES : Method.COUNTERS;
        long terms = 2L * (n + m) + 2048 + 2L * g + 4;
        double gamma = terms * UNIT_ROUNDOFF / (1 - terms * UNIT_ROUNDOFF);
        double tolerance = gamma * (3 * Math.abs(p.offset()) + 7 * sumAbs);
        return new FastEnergy(p, method, constant, tolerance, tableField, tableFieldWeight, tableU, tableV,
                tableCouplerWeight, groupStart, termA, termB, isField, weight);
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

    /** Adds every tabled term's weight into the entry its word's byte j selects, in table j. */
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
        BitCounter.count(x, size, planes, counts);
    }

    @Override
    public EnergyKernel copy() {
        return new FastEnergy(this);
    }

    @Override
    public String toString() {
        return "FastEnergy[" + method + ", " + groupWeight.length + " counted groups, " + (tableField.length
                + tableU.length) + " tabled terms, " + problem + "]";
    }
}
