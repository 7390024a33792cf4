package org.obverse.gauge;

import java.util.Arrays;

/**
 * A spin-reversal gauge g ∈ {-1, +1}^n over the positions of a problem, packed one bit a
 * position (set bit: g = −1, the spin is flipped). Immutable. g is its own inverse.
 */
public final class Gauge {
    private final int size;
    private final long[] bits;

    private Gauge(int size, long[] bits) {
        this.size = size;
        this.bits = bits;
    }

    /** The identity gauge (nothing flipped) on n positions. */
    public static Gauge identity(int n) {
        return new Gauge(n, new long[(n + 63) >>> 6]);
    }

    /** The gauge flipping exactly the given positions (each in [0, n), repeats allowed). */
    public static Gauge flipping(int n, int... positions) {
        long[] b = new long[(n + 63) >>> 6];
        for (int k : positions) {
            if (k < 0 || k >= n) {
                throw new IllegalArgumentException("flipped position " + k + " is outside [0, " + n + ")");
            }
            b[k >>> 6] |= 1L << k;
        }
        return new Gauge(n, b);
    }

    /** From a sign per position (each −1 or +1). */
    public static Gauge ofSigns(int[] signs) {
        long[] b = new long[(signs.length + 63) >>> 6];
        for (int k = 0; k < signs.length; k++) {
            if (signs[k] == -1) {
                b[k >>> 6] |= 1L << k;
            } else if (signs[k] != 1) {
                throw new IllegalArgumentException("sign " + signs[k] + " at position " + k + " is not -1 or +1");
            }
        }
        return new Gauge(signs.length, b);
    }

    public int size() {
        return size;
    }

    /** Whether position k is flipped (g_k = −1). */
    public boolean isFlipped(int k) {
        return (bits[k >>> 6] >>> k & 1L) != 0;
    }

    /** g_k: −1 or +1. */
    public int sign(int k) {
        return isFlipped(k) ? -1 : 1;
    }

    /** Number of flipped positions. */
    public int flippedCount() {
        int c = 0;
        for (long w : bits) {
            c += Long.bitCount(w);
        }
        return c;
    }

    /** The flipped positions, ascending. */
    public int[] flippedPositions() {
        int[] out = new int[flippedCount()];
        int m = 0;
        for (int w = 0; w < bits.length; w++) {
            long x = bits[w];
            while (x != 0) {
                out[m++] = (w << 6) + Long.numberOfTrailingZeros(x);
                x &= x - 1;
            }
        }
        return out;
    }

    /** The packed bits, word w bit b for position 64w + b (a copy). */
    public long[] bits() {
        return bits.clone();
    }

    /** −g: every position flipped the other way. */
    public Gauge negated() {
        long[] b = new long[bits.length];
        for (int w = 0; w < b.length; w++) {
            b[w] = ~bits[w];
        }
        if ((size & 63) != 0) {
            b[b.length - 1] &= (1L << size) - 1;
        }
        return new Gauge(size, b);
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Gauge g && g.size == size && Arrays.equals(g.bits, bits);
    }

    @Override
    public int hashCode() {
        return Arrays.hashCode(bits) * 31 + size;
    }

    @Override
    public String toString() {
        return "Gauge[" + size + " positions, " + flippedCount() + " flipped]";
    }
}
