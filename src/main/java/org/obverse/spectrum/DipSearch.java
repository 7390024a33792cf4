package org.obverse.spectrum;

import java.util.ArrayList;
import java.util.List;

/**
 * The dips of a gap sampled on a grid: every local minimum whose topographic prominence is at
 * least a given depth (the rule of {@link GapDip}). A minimum that the walk to the left takes
 * to s = 0 without a rise of that depth is where the anneal starts, not a dip, and is dropped;
 * one that the walk to the right takes to s = 1 without such a rise is an end dip. A run of
 * equal values counts once, at its first row. Stateless; O(points²) at worst, a few
 * microseconds for a usual grid.
 */
final class DipSearch {
    private DipSearch() {
    }

    /** A dip on the grid: its row, the crests on either side, whether it runs into s = 1. */
    record Candidate(int row, double leftCrest, double rightCrest, boolean atEnd) {
        /** The depth of a minimum of value gap under these crests. */
        double depthBelow(double gap) {
            return (atEnd ? leftCrest : Math.min(leftCrest, rightCrest)) - gap;
        }
    }

    /** The dips of gap[], at least minDepth deep, in the order of s. */
    static List<Candidate> candidates(double[] gap, double minDepth) {
        int n = gap.length;
        List<Candidate> out = new ArrayList<>();
        for (int r = 0; r < n; r++) {
            if (r > 0 && gap[r - 1] <= gap[r]) {
                continue; // not the first row of a descent's bottom
            }
            int end = r;
            while (end + 1 < n && gap[end + 1] == gap[r]) {
                end++;
            }
            if (end + 1 < n && gap[end + 1] < gap[r]) {
                continue; // still descending
            }
            double left = gap[r];
            int i = r - 1;
            while (i >= 0 && gap[i] >= gap[r]) {
                left = Math.max(left, gap[i]);
                i--;
            }
            boolean reachedStart = i < 0;
            double right = gap[r];
            int j = r + 1;
            while (j < n && gap[j] >= gap[r]) {
                right = Math.max(right, gap[j]);
                j++;
            }
            boolean reachedEnd = j == n;
            double leftRise = left - gap[r];
            double rightRise = right - gap[r];
            if (reachedEnd && !significant(rightRise, minDepth)) {
                if (significant(leftRise, minDepth)) {
                    out.add(new Candidate(r, left, right, true));
                }
            } else if (reachedStart && !significant(leftRise, minDepth)) {
                continue; // the start of the anneal
            } else if (significant(Math.min(leftRise, rightRise), minDepth)) {
                out.add(new Candidate(r, left, right, false));
            }
        }
        return out;
    }

    // A rise counts where it reaches the depth and is a rise at all (depth 0 keeps every one).
    private static boolean significant(double rise, double minDepth) {
        return rise >= minDepth && rise > 0;
    }
}
