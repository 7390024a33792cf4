package org.obverse.spectrum;

/**
 * Where the relevant gap is smallest: s* with its tolerance (half the width of the last
 * bracket) and Δmin with its tolerance (the spread of the gap over that bracket plus the
 * solver's accuracy). {@code atEdge} says the minimum lies at s = 0 or s = 1, where no
 * interior dip was found.
 */
public record MinimumGap(double sStar, double sTolerance, double gapMin, double gapTolerance, boolean atEdge) {
}
