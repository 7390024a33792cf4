package org.obverse.anneal;

/**
 * A table that decides Metropolis acceptance u &lt; exp(−x) (x = β·ΔE &gt; 0, u uniform in
 * [0, 1)) mostly without calling the exponential, and always with the same answer as the
 * exact comparison. Entry k holds e_k = exp(−k·δ) with δ = 2⁻⁵; for x in [kδ, (k+1)δ) the
 * exact value lies in [e_{k+1}, e_k] because the exponential is monotone (StrictMath.exp is
 * the correctly specified fdlibm function, hence semi-monotonic). So u &lt; e_{k+1} accepts,
 * u ≥ e_k rejects, and only u inside the bracket (probability ≈ δ·exp(−x)) computes
 * StrictMath.exp(−x) itself. The index is exact: δ is a power of two. Past x = 32 the table's
 * last entry bounds the value (and 0 below it). Immutable, shared by all threads.
 */
public final class ExponentialBracket {
    /** Table step δ = 2⁻⁵. */
    public static final double STEP = 0x1p-5;
    private static final double INVERSE_STEP = 0x1p5;
    /** Largest tabulated x. */
    public static final double LIMIT = 32.0;
    private static final int SIZE = (int) (LIMIT * INVERSE_STEP) + 1;
    // TABLE[k] = exp(-k δ) for k <= SIZE; one more entry, 0, closes the overflow bracket.
    private static final double[] TABLE = new double[SIZE + 2];
    // BITS[k] = ⌈TABLE[k]·2⁵³⌉: for a 53-bit integer m, m·2⁻⁵³ < TABLE[k] exactly when
    // m < BITS[k] (the scaling by a power of two is exact).
    private static final long[] BITS = new long[SIZE + 2];

    static {
        for (int k = 0; k <= SIZE; k++) {
            TABLE[k] = StrictMath.exp(-k * STEP);
        }
        TABLE[SIZE + 1] = 0.0;
        for (int k = 0; k < BITS.length; k++) {
            BITS[k] = (long) Math.ceil(TABLE[k] * 0x1p53);
        }
    }

    private ExponentialBracket() {
    }

    /**
     * Whether u &lt; StrictMath.exp(−x), for x &gt; 0 and u in [0, 1); equal to the exact
     * comparison for every input.
     */
    public static boolean accepts(double x, double u) {
        if (x < LIMIT) {
            int k = (int) (x * INVERSE_STEP);
            if (u < TABLE[k + 1]) {
                return true;
            }
            if (u >= TABLE[k]) {
                return false;
            }
        } else if (u >= TABLE[SIZE - 1]) {
            return false;
        }
        return u < StrictMath.exp(-x);
    }

    /**
     * {@link #accepts} for u = bits·2⁻⁵³ given as its 53-bit integer bits (0 ≤ bits &lt; 2⁵³,
     * the top 53 bits of a random word, as nextDouble() makes u): the same answer for every
     * input, with integer compares in place of the conversion to a double.
     */
    public static boolean acceptsBits(double x, long bits) {
        return acceptsBits(x, x * INVERSE_STEP, bits);
    }

    /**
     * {@link #acceptsBits(double, long)} given also {@code scaled} = x·2⁵ (x / {@link #STEP});
     * a caller with x = c·g can compute it as (c·2⁵)·g beside x rather than after it, which
     * shortens the chain from g to the decision. Scaling by a power of two is exact, except
     * for overflow (only past the table, where either form is beyond it) and subnormal
     * products (where either form gives index 0), so the answer is the same.
     */
    public static boolean acceptsBits(double x, double scaled, long bits) {
        if (scaled < LIMIT * INVERSE_STEP) {
            int k = (int) scaled;
            if (bits < BITS[k + 1]) {
                return true;
            }
            if (bits >= BITS[k]) {
                return false;
            }
        } else if (bits >= BITS[SIZE - 1]) {
            return false;
        }
        return bits * 0x1p-53 < StrictMath.exp(-x);
    }
}
