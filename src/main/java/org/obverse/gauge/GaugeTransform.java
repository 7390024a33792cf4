package org.obverse.gauge;

import org.obverse.model.IsingProblem;

/**
 * The spin-reversal transformation: h'_i = g_i h_i, J'_ij = g_i g_j J_ij, offset unchanged.
 * Every term changes by an exact sign flip, so energies under a fixed summation order are
 * equal bit for bit: E(g ∘ s') = E'(s').
 */
public final class GaugeTransform {
    private GaugeTransform() {
    }

    /** The gauged problem. Negation is written as 0.0 − x so that a zero term stays +0.0. */
    public static IsingProblem apply(IsingProblem p, Gauge g) {
        if (g.size() != p.size()) {
            throw new IllegalArgumentException("gauge has " + g.size() + " positions for a problem of " + p.size());
        }
        double[] h = p.fields();
        for (int k = 0; k < h.length; k++) {
            if (g.isFlipped(k)) {
                h[k] = 0.0 - h[k];
            }
        }
        double[] j = p.couplings();
        for (int e = 0; e < j.length; e++) {
            if (g.isFlipped(p.edgeU(e)) != g.isFlipped(p.edgeV(e))) {
                j[e] = 0.0 - j[e];
            }
        }
        return IsingProblem.of(p.variables(), h, p.edgeUs(), p.edgeVs(), j, p.offset());
    }

    /** s = g ∘ s' for one sample by position (in place). */
    public static void mapSpins(Gauge g, byte[] spins) {
        for (int k : g.flippedPositions()) {
            spins[k] = (byte) -spins[k];
        }
    }
}
