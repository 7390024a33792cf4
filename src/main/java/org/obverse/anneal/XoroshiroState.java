package org.obverse.anneal;

import org.obverse.random.RandomStreams;

/**
 * The xoroshiro128++ generator (Blackman &amp; Vigna, "Scrambled linear pseudorandom number
 * generators", ACM Trans. Math. Softw. 47(4), 2021) on a bare {@code long[2]} state, so that a
 * kernel can keep the state in local variables and advance it without a call or a branch. It
 * is the algorithm of Commons RNG's {@code XO_RO_SHI_RO_128_PP}: from the state {a, b} that
 * {@link RandomStreams#state} gives, it produces exactly the words of
 * {@link RandomStreams#generator} (property-tested), so the fast kernels draw the very numbers
 * of the reference ones.
 */
public final class XoroshiroState {
    private XoroshiroState() {
    }

    /** The next 64-bit word; advances {@code state} (length 2) in place. */
    public static long next(long[] state) {
        long s0 = state[0];
        long s1 = state[1];
        long result = Long.rotateLeft(s0 + s1, 17) + s0;
        s1 ^= s0;
        state[0] = Long.rotateLeft(s0, 49) ^ s1 ^ (s1 << 21);
        state[1] = Long.rotateLeft(s1, 28);
        return result;
    }
}
