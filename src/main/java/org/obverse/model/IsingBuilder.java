package org.obverse.model;

/**
 * Collects the terms of a spin problem by id, in any order. Refuses (with
 * {@link InvalidProblemException}) a negative id, a non-finite value, a coupler from a
 * variable to itself, and a field or coupler given twice ((i, j) and (j, i) are the same).
 */
public final class IsingBuilder {
    private final TermTable terms = new TermTable("field", "coupling");

    IsingBuilder() {
    }

    /** Declares a variable that may have no term. */
    public IsingBuilder variable(int id) {
        terms.variable(id);
        return this;
    }

    /** Sets h of a variable. */
    public IsingBuilder field(int id, double h) {
        terms.linear(id, h);
        return this;
    }

    /** Sets J of a coupler. */
    public IsingBuilder coupling(int i, int j, double value) {
        terms.pair(i, j, value);
        return this;
    }

    /** Sets the constant term. */
    public IsingBuilder offset(double value) {
        terms.offset(value);
        return this;
    }

    /** The problem. */
    public IsingProblem build() {
        TermTable.Arrays4 a = terms.arrays();
        return IsingProblem.of(a.index(), a.linear(), a.u(), a.v(), a.pair(), a.offset());
    }
}
