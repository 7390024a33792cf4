package org.obverse.gauge;

import org.apache.commons.rng.UniformRandomProvider;

/** Each free cluster's sign independent and fair in every gauge. */
public final class RandomGaugeDesign implements GaugeDesign {
    @Override
    public String label() {
        return "random";
    }

    @Override
    public long[][] draw(int freeClusters, int count, UniformRandomProvider rng) {
        long[][] masks = new long[count][(freeClusters + 63) >>> 6];
        for (long[] m : masks) {
            redrawOne(m, freeClusters, rng);
        }
        return masks;
    }

    @Override
    public boolean redrawOne(long[] mask, int freeClusters, UniformRandomProvider rng) {
        for (int w = 0; w < mask.length; w++) {
            mask[w] = rng.nextLong();
        }
        if ((freeClusters & 63) != 0) {
            mask[mask.length - 1] &= (1L << freeClusters) - 1;
        }
        return true;
    }
}
