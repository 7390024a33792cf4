package org.obverse.spectrum;

/**
 * The reachable-sector levels and the relevant gap on a grid of s values: row r holds s[r],
 * the lowest levels E_0(s) ≤ E_1(s) ≤ … and gap[r] = E_g(s) − E_0(s), where g is the index of
 * the relevant level ({@link AnnealSpectrum#relevantLevel()}). Immutable; accessors copy.
 */
public final class GapScan {
    private final double[] s;
    private final double[][] levels;
    private final double[] gap;

    GapScan(double[] s, double[][] levels, double[] gap) {
        this.s = s;
        this.levels = levels;
        this.gap = gap;
    }

    /** Number of grid points. */
    public int points() {
        return s.length;
    }

    /** The grid (a copy). */
    public double[] s() {
        return s.clone();
    }

    /** s at row r. */
    public double s(int r) {
        return s[r];
    }

    /** The levels at row r, ascending (a copy). */
    public double[] levels(int r) {
        return levels[r].clone();
    }

    /** Number of levels per row. */
    public int levelCount() {
        return levels.length == 0 ? 0 : levels[0].length;
    }

    /** The relevant gap at row r. */
    public double gap(int r) {
        return gap[r];
    }

    /** The relevant gaps (a copy). */
    public double[] gaps() {
        return gap.clone();
    }

    /** Row of the smallest gap (the first, where several tie). */
    public int minimumRow() {
        int best = 0;
        for (int r = 1; r < gap.length; r++) {
            if (gap[r] < gap[best]) {
                best = r;
            }
        }
        return best;
    }
}
