package org.obverse.spectrum;

/**
 * How the minimum gap and the pause window are searched: a uniform coarse grid of
 * {@code points} values of s on [0, 1], golden-section refinement of s* to
 * {@code sTolerance}, and the pause rule's two gap ratios located to {@code pauseTolerance}.
 */
public record ScanSettings(int points, double sTolerance, double pauseFromRatio, double pauseToRatio,
                           double pauseTolerance) {
    /** Default ratio: the pause starts where the gap has regained 10 % over Δmin. */
    public static final double DEFAULT_FROM_RATIO = 1.1;
    /** Default ratio: the pause ends where the gap has doubled. */
    public static final double DEFAULT_TO_RATIO = 2.0;

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
    }

    /** 101 points, s* to 1e-6, ratios 1.1 and 2, pause ends to 1e-4. */
    public static ScanSettings defaults() {
        return new ScanSettings(101, 1e-6, DEFAULT_FROM_RATIO, DEFAULT_TO_RATIO, 1e-4);
    }

    /** The same with another grid size. */
    public ScanSettings withPoints(int count) {
        return new ScanSettings(count, sTolerance, pauseFromRatio, pauseToRatio, pauseTolerance);
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
