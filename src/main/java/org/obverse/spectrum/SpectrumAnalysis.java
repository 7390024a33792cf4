package org.obverse.spectrum;

import java.util.List;

/**
 * A whole analysis: the coarse scan, the refined global minimum of the gap, every dip of the
 * gap ({@link GapDip}, in the order of s) and the suggested pause window. The suggested dip is
 * the interior dip (not {@link GapDip#atEnd()}) with the smallest gap — where the state is most
 * likely to leave the ground level — and {@code pause} is its window; where there is no interior
 * dip, {@code suggestedDip} is −1 and {@code pause} is the window after the global minimum.
 */
public record SpectrumAnalysis(GapScan scan, MinimumGap minimum, PauseWindow pause, List<GapDip> dips,
                               int suggestedDip) {
    /** Keeps an unmodifiable copy of the dips. */
    public SpectrumAnalysis {
        dips = List.copyOf(dips);
    }

    /** The index of the interior dip with the smallest gap (the first of equals), or −1. */
    public static int suggestedDip(List<GapDip> dips) {
        int best = -1;
        for (int k = 0; k < dips.size(); k++) {
            if (!dips.get(k).atEnd() && (best < 0 || dips.get(k).gap() < dips.get(best).gap())) {
                best = k;
            }
        }
        return best;
    }
}
