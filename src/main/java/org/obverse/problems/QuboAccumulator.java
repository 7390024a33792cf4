package org.obverse.problems;

import java.util.Map;
import java.util.TreeMap;
import org.obverse.model.BinaryBuilder;
import org.obverse.model.BinaryProblem;

/** Sums QUBO terms (penalties written as squares of linear forms) before building the problem. */
final class QuboAccumulator {
    private final int variables;
    private final double[] linear;
    private final Map<Long, Double> pairs = new TreeMap<>();
    private double offset;

    QuboAccumulator(int variables) {
        this.variables = variables;
        this.linear = new double[variables];
    }

    void linear(int i, double v) {
        linear[i] += v;
    }

    void pair(int i, int j, double v) {
        if (i == j) {
            linear[i] += v;
            return;
        }
        long key = ((long) Math.min(i, j) << 32) | Math.max(i, j);
        pairs.merge(key, v, Double::sum);
    }

    void offset(double v) {
        offset += v;
    }

    /** Adds weight·(constant + Σ a_k x_k)² using x² = x; the variables must be distinct. */
    void square(double weight, double constant, int[] vars, double[] coefficients) {
        offset += weight * constant * constant;
        for (int p = 0; p < vars.length; p++) {
            double a = coefficients[p];
            linear(vars[p], weight * (2.0 * constant * a + a * a));
            for (int q = p + 1; q < vars.length; q++) {
                pair(vars[p], vars[q], weight * 2.0 * a * coefficients[q]);
            }
        }
    }

    BinaryProblem build() {
        BinaryBuilder b = BinaryProblem.builder();
        for (int i = 0; i < variables; i++) {
            b.variable(i);
            if (linear[i] != 0.0) {
                b.term(i, i, linear[i]);
            }
        }
        for (Map.Entry<Long, Double> t : pairs.entrySet()) {
            if (t.getValue() != 0.0) {
                b.term((int) (t.getKey() >>> 32), (int) (long) t.getKey(), t.getValue());
            }
        }
        return b.offset(offset).build();
    }
}
