package org.obverse.embed;

import org.obverse.samples.SampleBlock;

/**
 * Logical reads decoded from physical ones. {@link #logical()} holds the kept reads only,
 * columns by ascending logical id; {@link #kept()} and {@link #brokenChains()} have one entry
 * per input read; {@link #energies()} one per kept read. With the discard rule a read with a
 * broken chain is not kept; with majority and descend every read is. Arrays are returned as
 * copies, the block as is (callers own it).
 */
public final class DecodedSamples {
    private final SampleBlock logical;
    private final boolean[] kept;
    private final int[] brokenChains;
    private final double[] energies;
    private final long[] breaksPerChain;

    DecodedSamples(SampleBlock logical, boolean[] kept, int[] brokenChains, double[] energies, long[] breaksPerChain) {
        this.logical = logical;
        this.kept = kept;
        this.brokenChains = brokenChains;
        this.energies = energies;
        this.breaksPerChain = breaksPerChain;
    }

    /** The kept logical reads. */
    public SampleBlock logical() {
        return logical;
    }

    /** Number of input reads. */
    public int reads() {
        return kept.length;
    }

    /** Number of kept reads. */
    public int keptReads() {
        return logical.reads();
    }

    /** Whether each input read was kept. */
    public boolean[] kept() {
        return kept.clone();
    }

    /** Broken chains in each input read. */
    public int[] brokenChains() {
        return brokenChains.clone();
    }

    /** Logical energies of the kept reads. */
    public double[] energies() {
        return energies.clone();
    }

    /** For each chain (ascending logical id), the number of input reads in which it is broken. */
    public long[] breaksPerChain() {
        return breaksPerChain.clone();
    }

    /** Broken chains over all (read, chain) pairs; 0 where there are no reads or no chains. */
    public double brokenFraction() {
        long total = 0;
        for (long b : breaksPerChain) {
            total += b;
        }
        long pairs = (long) kept.length * breaksPerChain.length;
        return pairs == 0 ? 0.0 : (double) total / pairs;
    }

    /** Fraction of input reads with at least one broken chain. */
    public double brokenReadFraction() {
        int n = 0;
        for (int b : brokenChains) {
            if (b > 0) {
                n++;
            }
        }
        return kept.length == 0 ? 0.0 : (double) n / kept.length;
    }
}
