package org.obverse.spectrum;

/** A whole analysis: the coarse scan, the refined minimum gap and the suggested pause window. */
public record SpectrumAnalysis(GapScan scan, MinimumGap minimum, PauseWindow pause) {
}
