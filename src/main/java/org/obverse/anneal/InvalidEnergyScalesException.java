package org.obverse.anneal;

/**
 * A schedule table that breaks a rule: s not strictly increasing, a negative or non-finite
 * value, too few rows, or a span other than [0, 1]. Carries the offending row (counting data
 * rows from 0; -1 where the fault is the table as a whole) so a reader can name the line.
 */
public final class InvalidEnergyScalesException extends IllegalArgumentException {
    private final int row;

    /** A fault at a data row (or -1 for the whole table). */
    public InvalidEnergyScalesException(int row, String problem) {
        super(row >= 0 ? "row " + row + ": " + problem : "schedule table " + problem);
        this.row = row;
    }

    /** The offending data row counting from 0, or -1 for the table as a whole. */
    public int row() {
        return row;
    }
}
