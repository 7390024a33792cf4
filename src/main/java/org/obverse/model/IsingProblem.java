package org.obverse.model;

import java.util.Arrays;

/**
 * An immutable sparse spin problem E(s) = offset + Σ h_i s_i + Σ_{i<j} J_ij s_i s_j over
 * s_i ∈ {-1, +1}, on sparse integer ids.
 *
 * <p>Variables are addressed by position k in {@link #variables()} (ascending ids). Couplers
 * are numbered 0..edgeCount-1 in ascending (u, v) order of positions with u &lt; v, and a
 * compressed-row adjacency lists each variable's neighbours. Built once, never changed.
 * Accessors that return arrays return copies.
 */
public final class IsingProblem {
    private final VariableIndex variables;
    private final double[] fields;
    private final int[] edgeU;
    private final int[] edgeV;
    private final double[] couplings;
    private final double offset;
    // Compressed-row adjacency: neighbours of k are adjVar[adjStart[k] .. adjStart[k+1]).
    private final int[] adjStart;
    private final int[] adjVar;
    private final int[] adjEdge;

    private IsingProblem(VariableIndex variables, double[] fields, int[] edgeU, int[] edgeV,
                         double[] couplings, double offset) {
        this.variables = variables;
        this.fields = fields;
        this.edgeU = edgeU;
        this.edgeV = edgeV;
        this.couplings = couplings;
        this.offset = offset;
        int n = variables.size();
        adjStart = new int[n + 1];
        for (int e = 0; e < edgeU.length; e++) {
            adjStart[edgeU[e] + 1]++;
            adjStart[edgeV[e] + 1]++;
        }
        for (int k = 0; k < n; k++) {
            adjStart[k + 1] += adjStart[k];
        }
        adjVar = new int[2 * edgeU.length];
        adjEdge = new int[2 * edgeU.length];
        int[] fill = Arrays.copyOf(adjStart, n);
        for (int e = 0; e < edgeU.length; e++) {
            int u = edgeU[e];
            int v = edgeV[e];
            adjVar[fill[u]] = v;
            adjEdge[fill[u]++] = e;
            adjVar[fill[v]] = u;
            adjEdge[fill[v]++] = e;
        }
    }

    /** A builder that takes terms by id, in any order. */
    public static IsingBuilder builder() {
        return new IsingBuilder();
    }

    /**
     * A problem from arrays by position. Input: couplers in strictly ascending (u, v) order with
     * u &lt; v; every number finite. The arrays are copied, not modified.
     *
     * @throws InvalidProblemException naming the first term that breaks a rule
     */
    public static IsingProblem of(VariableIndex variables, double[] fields, int[] edgeU, int[] edgeV,
                                  double[] couplings, double offset) {
        int n = variables.size();
        if (fields.length != n) {
            throw new InvalidProblemException("fields has " + fields.length + " entries for " + n + " variables");
        }
        if (edgeU.length != edgeV.length || edgeU.length != couplings.length) {
            throw new InvalidProblemException("coupler arrays differ in length");
        }
        if (!Double.isFinite(offset)) {
            throw new InvalidProblemException("offset " + offset + " is not a finite number");
        }
        for (int k = 0; k < n; k++) {
            if (!Double.isFinite(fields[k])) {
                throw new InvalidProblemException("field of variable " + variables.id(k) + " is " + fields[k]
                        + ", not a finite number");
            }
        }
        for (int e = 0; e < edgeU.length; e++) {
            int u = edgeU[e];
            int v = edgeV[e];
            if (u < 0 || v >= n || u >= v) {
                throw new InvalidProblemException("coupler " + e + " joins positions " + u + " and " + v
                        + "; need 0 <= u < v < " + n);
            }
            if (e > 0 && (edgeU[e - 1] > u || (edgeU[e - 1] == u && edgeV[e - 1] >= v))) {
                throw new InvalidProblemException("coupler (" + variables.id(u) + ", " + variables.id(v)
                        + ") is out of order or given twice");
            }
            if (!Double.isFinite(couplings[e])) {
                throw new InvalidProblemException("coupling (" + variables.id(u) + ", " + variables.id(v) + ") is "
                        + couplings[e] + ", not a finite number");
            }
        }
        return new IsingProblem(variables, fields.clone(), edgeU.clone(), edgeV.clone(), couplings.clone(), offset);
    }

    /** The variable ids, ascending. */
    public VariableIndex variables() {
        return variables;
    }

    /** Number of variables. */
    public int size() {
        return variables.size();
    }

    /** Number of couplers. */
    public int edgeCount() {
        return edgeU.length;
    }

    /** Field of the variable at position k. */
    public double field(int k) {
        return fields[k];
    }

    /** Lower endpoint (position) of coupler e. */
    public int edgeU(int e) {
        return edgeU[e];
    }

    /** Upper endpoint (position) of coupler e. */
    public int edgeV(int e) {
        return edgeV[e];
    }

    /** Value J of coupler e. */
    public double coupling(int e) {
        return couplings[e];
    }

    /** The constant term. */
    public double offset() {
        return offset;
    }

    /** Coupler number between positions a and b (either order), or -1 where there is none. */
    public int edgeBetween(int a, int b) {
        for (int p = adjStart[a]; p < adjStart[a + 1]; p++) {
            if (adjVar[p] == b) {
                return adjEdge[p];
            }
        }
        return -1;
    }

    /** Number of neighbours of the variable at position k. */
    public int degree(int k) {
        return adjStart[k + 1] - adjStart[k];
    }

    /** Fields by position (a copy). */
    public double[] fields() {
        return fields.clone();
    }

    /** Lower endpoints by coupler (a copy). */
    public int[] edgeUs() {
        return edgeU.clone();
    }

    /** Upper endpoints by coupler (a copy). */
    public int[] edgeVs() {
        return edgeV.clone();
    }

    /** Couplings by coupler (a copy). */
    public double[] couplings() {
        return couplings.clone();
    }

    /** Compressed-row starts, length size()+1 (a copy). */
    public int[] adjacencyStarts() {
        return adjStart.clone();
    }

    /** Compressed-row neighbour positions (a copy). */
    public int[] adjacencyVariables() {
        return adjVar.clone();
    }

    /** Compressed-row coupler numbers, parallel to {@link #adjacencyVariables()} (a copy). */
    public int[] adjacencyEdges() {
        return adjEdge.clone();
    }

    /**
     * Exact energy of one sample, by position, values -1 or +1. The summation order is fixed:
     * fields in position order, then couplers in coupler order, then the offset; every term is
     * h·s or J·(s_u·s_v), so a gauge, which flips the signs of terms only, leaves the result
     * equal bit for bit.
     */
    public double energy(byte[] spins) {
        double sum = 0.0;
        for (int k = 0; k < fields.length; k++) {
            sum += fields[k] * spins[k];
        }
        for (int e = 0; e < couplings.length; e++) {
            sum += couplings[e] * (spins[edgeU[e]] * spins[edgeV[e]]);
        }
        return sum + offset;
    }

    /** The same problem with a constant added to the offset. */
    public IsingProblem withOffset(double newOffset) {
        return of(variables, fields, edgeU, edgeV, couplings, newOffset);
    }

    /** Every term multiplied by factor (offset included). */
    public IsingProblem scaled(double factor) {
        double[] h = fields.clone();
        double[] j = couplings.clone();
        for (int k = 0; k < h.length; k++) {
            h[k] *= factor;
        }
        for (int e = 0; e < j.length; e++) {
            j[e] *= factor;
        }
        return of(variables, h, edgeU, edgeV, j, offset * factor);
    }

    /**
     * The equivalent binary problem under x = (1 + s) / 2: s = 2x − 1 gives
     * Q_ii = 2 h_i − 2 Σ_j J_ij, Q_ij = 4 J_ij, offset' = offset − Σ h_i + Σ J_ij.
     */
    public BinaryProblem toBinary() {
        double[] linear = new double[fields.length];
        double[] quad = new double[couplings.length];
        double c = offset;
        for (int k = 0; k < fields.length; k++) {
            linear[k] = 2.0 * fields[k];
            c -= fields[k];
        }
        for (int e = 0; e < couplings.length; e++) {
            double j = couplings[e];
            quad[e] = 4.0 * j;
            linear[edgeU[e]] -= 2.0 * j;
            linear[edgeV[e]] -= 2.0 * j;
            c += j;
        }
        return BinaryProblem.of(variables, linear, edgeU, edgeV, quad, c);
    }

    @Override
    public boolean equals(Object o) {
        if (!(o instanceof IsingProblem)) {
            return false;
        }
        IsingProblem p = (IsingProblem) o;
        return variables.equals(p.variables) && Arrays.equals(fields, p.fields) && Arrays.equals(edgeU, p.edgeU)
                && Arrays.equals(edgeV, p.edgeV) && Arrays.equals(couplings, p.couplings)
                && Double.compare(offset, p.offset) == 0;
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(couplings) + Arrays.hashCode(fields);
    }

    @Override
    public String toString() {
        return "IsingProblem[" + size() + " variables, " + edgeCount() + " couplers, offset " + offset + "]";
    }
}
