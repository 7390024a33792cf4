package org.obverse.model;

import java.util.Arrays;

/**
 * An immutable sparse binary problem (QUBO) E(x) = offset + Σ_i Q_ii x_i + Σ_{i<j} Q_ij x_i x_j
 * over x_i ∈ {0, 1}, on sparse integer ids. Layout as {@link IsingProblem}: positions by
 * ascending id, pair terms in ascending (u, v) order with u &lt; v.
 */
public final class BinaryProblem {
    private final VariableIndex variables;
    private final double[] linear;
    private final int[] edgeU;
    private final int[] edgeV;
    private final double[] quadratic;
    private final double offset;

    private BinaryProblem(VariableIndex variables, double[] linear, int[] edgeU, int[] edgeV,
                          double[] quadratic, double offset) {
        this.variables = variables;
        this.linear = linear;
        this.edgeU = edgeU;
        this.edgeV = edgeV;
        this.quadratic = quadratic;
        this.offset = offset;
    }

    /** A builder that takes Q terms by id, in any order. */
    public static BinaryBuilder builder() {
        return new BinaryBuilder();
    }

    /**
     * A problem from arrays by position, validated as {@link IsingProblem#of}; arrays are copied.
     */
    public static BinaryProblem of(VariableIndex variables, double[] linear, int[] edgeU, int[] edgeV,
                                   double[] quadratic, double offset) {
        // The spin form validates the same shape rules; reuse it rather than repeat them.
        IsingProblem.of(variables, linear, edgeU, edgeV, quadratic, offset);
        return new BinaryProblem(variables, linear.clone(), edgeU.clone(), edgeV.clone(), quadratic.clone(), offset);
    }

    public VariableIndex variables() {
        return variables;
    }

    public int size() {
        return variables.size();
    }

    public int edgeCount() {
        return edgeU.length;
    }

    /** Q_kk of the variable at position k. */
    public double linear(int k) {
        return linear[k];
    }

    public int edgeU(int e) {
        return edgeU[e];
    }

    public int edgeV(int e) {
        return edgeV[e];
    }

    /** Q_uv of pair term e. */
    public double quadratic(int e) {
        return quadratic[e];
    }

    public double offset() {
        return offset;
    }

    /** Energy of one assignment by position, values 0 or 1; fixed summation order. */
    public double energy(byte[] x) {
        double sum = 0.0;
        for (int k = 0; k < linear.length; k++) {
            sum += linear[k] * x[k];
        }
        for (int e = 0; e < quadratic.length; e++) {
            sum += quadratic[e] * (x[edgeU[e]] * x[edgeV[e]]);
        }
        return sum + offset;
    }

    /**
     * The equivalent spin problem under x = (1 + s) / 2: h_i = Q_ii / 2 + Σ_j Q_ij / 4,
     * J_ij = Q_ij / 4, offset' = offset + Σ Q_ii / 2 + Σ Q_ij / 4.
     */
    public IsingProblem toIsing() {
        double[] h = new double[linear.length];
        double[] j = new double[quadratic.length];
        double c = offset;
        for (int k = 0; k < linear.length; k++) {
            h[k] = 0.5 * linear[k];
            c += 0.5 * linear[k];
        }
        for (int e = 0; e < quadratic.length; e++) {
            double q = 0.25 * quadratic[e];
            j[e] = q;
            h[edgeU[e]] += q;
            h[edgeV[e]] += q;
            c += q;
        }
        return IsingProblem.of(variables, h, edgeU, edgeV, j, c);
    }

    @Override
    public boolean equals(Object o) {
        if (!(o instanceof BinaryProblem)) {
            return false;
        }
        BinaryProblem p = (BinaryProblem) o;
        return variables.equals(p.variables) && Arrays.equals(linear, p.linear) && Arrays.equals(edgeU, p.edgeU)
                && Arrays.equals(edgeV, p.edgeV) && Arrays.equals(quadratic, p.quadratic)
                && Double.compare(offset, p.offset) == 0;
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(quadratic) + Arrays.hashCode(linear);
    }

    @Override
    public String toString() {
        return "BinaryProblem[" + size() + " variables, " + edgeCount() + " pair terms, offset " + offset + "]";
    }
}
