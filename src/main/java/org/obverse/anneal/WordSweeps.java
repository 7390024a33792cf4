package org.obverse.anneal;

/**
 * What the two multi-spin kernels ({@link MultiSpinCoding}, {@link SteadyMultiSpin}) offer
 * alike: 64 reads a word, bit k of word k of a block being spin k of each read; a one-block
 * sweep on a bare generator state and a lane sweep of many blocks at once that ends every
 * block exactly as the one-block sweep would.
 */
public interface WordSweeps {
    /** The number of spins. */
    int size();

    /** The acceptance thresholds at inverse temperature beta, into {@code out}. */
    void thresholds(double beta, long[] out);

    /** One sweep of one block ({@code bits}, n words) with the generator state {@code state}, in place. */
    void sweep(long[] bits, long[] thresholds, long[] state);

    /** One sweep of {@code lanes.count()} blocks interleaved in {@code bits}, in place. */
    void sweepLanes(long[] bits, long[] thresholds, MultiSpinCoding.Lanes lanes);
}
