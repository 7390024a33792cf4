package org.obverse.spectrum;

/**
 * One dip of the relevant gap along s: a local minimum at {@code s} (refined by golden-section
 * search inside the bracket of its two grid neighbours, to within {@code sTolerance}) of value
 * {@code gap} (within {@code gapTolerance}), with its pause window.
 *
 * <p>{@code depth} is the dip's topographic prominence: from the minimum, walk left on the grid
 * until the gap falls below it again (or s = 0) and take the highest gap passed, likewise to the
 * right; the depth is the lower of those two crests minus the gap at the minimum. A dip that
 * runs into s = 1 without the gap rising again by more than the noise rule's amount is an
 * {@code atEnd} dip — levels that merge (or nearly) at the end of the anneal; its depth is
 * measured on the left alone. The pause window of a dip ends at the latest at the crest that
 * separates it from the next dip.
 */
public record GapDip(double s, double sTolerance, double gap, double gapTolerance, double depth, boolean atEnd,
                     PauseWindow pause) {
}
