package org.obverse.model;

/**
 * Collects the terms of a binary problem by id, in any order: Q_ii is the linear term of i,
 * Q_ij (i ≠ j) a pair term. Refuses a negative id, a non-finite value and a term given twice
 * ((i, j) and (j, i) are the same).
 */
public final class BinaryBuilder {
    private final TermTable terms = new TermTable("Q diagonal", "Q");

    BinaryBuilder() {
    }

    /** Declares a variable that may have no term. */
    public BinaryBuilder variable(int id) {
        terms.variable(id);
        return this;
    }

    /** Sets Q_ij; i = j is the linear term. */
    public BinaryBuilder term(int i, int j, double value) {
        if (i == j) {
            terms.linear(i, value);
        } else {
            terms.pair(i, j, value);
        }
        return this;
    }

    /** Sets the constant term. */
    public BinaryBuilder offset(double value) {
        terms.offset(value);
        return this;
    }

    /** The problem. */
    public BinaryProblem build() {
        TermTable.Arrays4 a = terms.arrays();
        return BinaryProblem.of(a.index(), a.linear(), a.u(), a.v(), a.pair(), a.offset());
    }
}
