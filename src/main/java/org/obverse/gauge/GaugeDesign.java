package org.obverse.gauge;

import org.apache.commons.rng.UniformRandomProvider;

/**
 * How the signs of the free clusters are chosen across a set of gauges. A design returns, for
 * each of count gauges, a bit mask over the free clusters (bit f set: cluster f flipped).
 */
public interface GaugeDesign {
    /** The name used in files and on the command line. */
    String label();

    /** Flip masks: result[gauge][f >>> 6] bit f. */
    long[][] draw(int freeClusters, int count, UniformRandomProvider rng);

    /** Redraws one gauge of a set, or returns false where the design can only redraw the whole set. */
    boolean redrawOne(long[] mask, int freeClusters, UniformRandomProvider rng);

    /** The design of a label ("random" or "balanced"). */
    static GaugeDesign ofLabel(String label) {
        switch (label) {
            case "random":
                return new RandomGaugeDesign();
            case "balanced":
                return new BalancedGaugeDesign();
            default:
                throw new IllegalArgumentException("gauge design \"" + label + "\" is unknown; use random or balanced");
        }
    }
}
