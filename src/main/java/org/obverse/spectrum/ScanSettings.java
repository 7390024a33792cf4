package org.obverse.spectrum;

/**
 * How the minimum gap, the dips of the gap and the pause windows are searched: a uniform coarse
 * grid of {@code points} values of s on [0, 1], golden-section refinement of each minimum to
 * {@code sTolerance}, the pause rule's two gap ratios located to {@code pauseTolerance}, and
 * the noise rule for dips: a local minimum counts as a dip only where it lies at least
 * {@code dipDepth} times the largest gap on the grid below the lower of its two neighbouring
 * crests ({@link GapDip}).
 */
public record ScanSettings(int points, double sTolerance, double pauseFromRatio, double pauseToRatio,
                           double pauseTolerance, double dipDepth) {
    /** Default ratio: the pause starts where the gap has regained 10 % over Δmin. */
    public static final double DEFAULT_FROM_RATIO = 1.1;
    /** Default ratio: the pause ends where the gap has doubled. */
    public static final double DEFAULT_TO_RATIO = 2.0;
    /** Default noise rule: a dip is at least a thousandth of the largest gap on the grid deep. */
    public static final double DEFAULT_DIP_DEPTH = 1e-3;

    /** Validates once. */
    public ScanSettings {
        if (points < 3 || points > 100_001) {
            throw new IllegalArgumentException("s grid of " + points + " points; need 3..100001");
        }
        if (!(sTolerance >= 1e-12 && sTolerance <= 0.1)) {
            throw new IllegalArgumentException("s tolerance " + sTolerance + " must lie in [1e-12, 0.1]");
        }
        if (!(pauseFromRatio >= 1.0) || !(pauseToRatio > pauseFromRatio) || !Double.isFinite(pauseToRatio)) {
            throw new IllegalArgumentException("pause ratios " + pauseFromRatio + ", " + pauseToRatio
                    + " must satisfy 1 <= from < to");
        }
        if (!(pauseTolerance >= 1e-12 && pauseTolerance <= 0.1)) {
            throw new IllegalArgumentException("pause tolerance " + pauseTolerance + " must lie in [1e-12, 0.1]");
        }
        if (!(dipDepth >= 0.0 && dipDepth < 1.0)) {
            throw new IllegalArgumentException("dip depth " + dipDepth + " must lie in [0, 1)");
        }
    }

    /** The default noise rule for dips ({@link #DEFAULT_DIP_DEPTH}). */
    public ScanSettings(int points, double sTolerance, double pauseFromRatio, double pauseToRatio,
                        double pauseTolerance) {
        this(points, sTolerance, pauseFromRatio, pauseToRatio, pauseTolerance, DEFAULT_DIP_DEPTH);
    }

    /** 101 points, s* to 1e-6, ratios 1.1 and 2, pause ends to 1e-4, dips at least 1e-3 of the gap scale deep. */
    public static ScanSettings defaults() {
        return new ScanSettings(101, 1e-6, DEFAULT_FROM_RATIO, DEFAULT_TO_RATIO, 1e-4, DEFAULT_DIP_DEPTH);
    }

    /** The same with another grid size. */
    public ScanSettings withPoints(int count) {
        return new ScanSettings(count, sTolerance, pauseFromRatio, pauseToRatio, pauseTolerance, dipDepth);
    }

    /** The same with another s tolerance. */
    public ScanSettings withSTolerance(double tolerance) {
        return new ScanSettings(points, tolerance, pauseFromRatio, pauseToRatio, pauseTolerance, dipDepth);
    }

    /** The uniform grid s_r = r / (points − 1). */
    public double[] grid() {
        double[] s = new double[points];
        for (int r = 0; r < points; r++) {
            s[r] = r == points - 1 ? 1.0 : r / (double) (points - 1);
        }
        return s;
    }
}
