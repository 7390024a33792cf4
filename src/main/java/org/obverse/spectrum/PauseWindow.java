package org.obverse.spectrum;

/**
 * A suggested pause window [from, to] after the minimum gap: from is the first s ≥ s* where
 * the relevant gap reaches fromRatio · Δmin, to the first where it reaches toRatio · Δmin,
 * each located to within {@code tolerance} in s. {@code toCapped} says the gap never reached
 * toRatio · Δmin before s = 1, so the window was cut at 1 (likewise {@code fromCapped}).
 * A heuristic, documented in spec/spectrum.md.
 */
public record PauseWindow(double from, double to, double fromRatio, double toRatio, double tolerance,
                          boolean fromCapped, boolean toCapped) {
}
