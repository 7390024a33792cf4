package org.obverse.anneal;

import org.apache.commons.rng.UniformRandomProvider;

/**
 * Single-spin Metropolis sweeps over a spin problem held as compressed-row arrays: the
 * neighbours of spin k are {@code neighbour[start[k] .. start[k+1])} with couplings
 * {@code coupling[...]} (each coupler listed from both ends). Spins are ±1 bytes. One sweep
 * visits k = 0 … n−1 in order; flipping k changes the energy by ΔE = −2 s_k f_k with local
 * field f_k = h_k + Σ_j J_kj s_j. A downhill or level move (ΔE ≤ 0) is always taken and draws
 * no random number; an uphill move draws one u = nextDouble() and is taken when
 * u &lt; exp(−β ΔE). (Drawing u on every attempt instead, which saves a branch, measured slower
 * here.) All kernels here consume the same random numbers in the same order, so on the same
 * input they give the same spins (exactly so where local fields are exact, as for integer
 * couplings).
 *
 * <p>Kernels trust their callers: arrays of matching sizes, no checks, no allocation.
 */
public final class MetropolisKernels {
    private MetropolisKernels() {
    }

    /**
     * The local fields f_k = h_k + Σ_j J_kj s_j. Output: {@code localField} (length n) is
     * overwritten.
     */
    public static void localFields(int n, int[] start, int[] neighbour, double[] coupling, double[] fields,
                                   byte[] spins, double[] localField) {
        for (int k = 0; k < n; k++) {
            double f = fields[k];
            for (int p = start[k]; p < start[k + 1]; p++) {
                f += coupling[p] * spins[neighbour[p]];
            }
            localField[k] = f;
        }
    }

    /**
     * One sweep with maintained local fields and the bracketing exponential table. Input and
     * output: spins and localField are updated in place (localField must match spins).
     */
    public static void sweep(int n, int[] start, int[] neighbour, double[] coupling, byte[] spins,
                             double[] localField, double beta, UniformRandomProvider rng) {
        for (int k = 0; k < n; k++) {
            double dE = -2.0 * spins[k] * localField[k];
            if (dE > 0.0 && !ExponentialBracket.accepts(beta * dE, rng.nextDouble())) {
                continue;
            }
            flip(k, start, neighbour, coupling, spins, localField);
        }
    }

    /**
     * One sweep with maintained local fields and StrictMath.exp on every uphill attempt: the
     * exact reference for {@link #sweep}. Same contract.
     */
    public static void sweepExactExponential(int n, int[] start, int[] neighbour, double[] coupling, byte[] spins,
                                             double[] localField, double beta, UniformRandomProvider rng) {
        for (int k = 0; k < n; k++) {
            double dE = -2.0 * spins[k] * localField[k];
            if (dE > 0.0 && !(rng.nextDouble() < StrictMath.exp(-(beta * dE)))) {
                continue;
            }
            flip(k, start, neighbour, coupling, spins, localField);
        }
    }

    private static void flip(int k, int[] start, int[] neighbour, double[] coupling, byte[] spins,
                             double[] localField) {
        byte s = (byte) -spins[k];
        spins[k] = s;
        double twice = 2.0 * s;
        for (int p = start[k]; p < start[k + 1]; p++) {
            localField[neighbour[p]] += twice * coupling[p];
        }
    }

    /**
     * The plain baseline: the local field recomputed from the neighbours and Math.exp(−βΔE)
     * evaluated on every attempt; no maintained state besides the spins. Input and output:
     * spins in place. Used by the benchmark as the yardstick.
     */
    public static void sweepBaseline(int n, int[] start, int[] neighbour, double[] coupling, double[] fields,
                                     byte[] spins, double beta, UniformRandomProvider rng) {
        for (int k = 0; k < n; k++) {
            double f = fields[k];
            for (int p = start[k]; p < start[k + 1]; p++) {
                f += coupling[p] * spins[neighbour[p]];
            }
            double dE = -2.0 * spins[k] * f;
            double p = Math.exp(-(beta * dE));
            if (dE <= 0.0 || rng.nextDouble() < p) {
                spins[k] = (byte) -spins[k];
            }
        }
    }

    /**
     * Largest |local field| an integer problem can reach, max_k(|h_k| + Σ_j |J_kj|), or −1
     * where some field or coupling is not an integer or the bound passes {@code limit}. Where
     * it is not −1, the integer kernels below give the same spins as the double ones: every
     * local field is then an exact small integer in either form.
     */
    public static int integerFieldBound(int n, int[] start, double[] coupling, double[] fields, int limit) {
        int bound = 0;
        for (int k = 0; k < n; k++) {
            double total = Math.abs(fields[k]);
            if (fields[k] != Math.rint(fields[k])) {
                return -1;
            }
            for (int p = start[k]; p < start[k + 1]; p++) {
                if (coupling[p] != Math.rint(coupling[p])) {
                    return -1;
                }
                total += Math.abs(coupling[p]);
            }
            if (!(total <= limit)) {
                return -1;
            }
            bound = Math.max(bound, (int) total);
        }
        return bound;
    }

    /** Integer local fields f_k = h_k + Σ_j J_kj s_j. Output: {@code localField} is overwritten. */
    public static void localFields(int n, int[] start, int[] neighbour, int[] coupling, int[] fields, byte[] spins,
                                   int[] localField) {
        for (int k = 0; k < n; k++) {
            int f = fields[k];
            for (int p = start[k]; p < start[k + 1]; p++) {
                f += coupling[p] * spins[neighbour[p]];
            }
            localField[k] = f;
        }
    }

    /**
     * The acceptance thresholds of the integer kernel at inverse temperature beta. Output:
     * {@code out[v]} (v ≥ 1, out.length − 1 at least the field bound) is the number of 53-bit
     * integers m with m·2⁻⁵³ &lt; StrictMath.exp(−β·2v), i.e. ⌈exp(−β·2v)·2⁵³⌉ (the scaling
     * is exact): nextDouble() is (nextLong() &gt;&gt;&gt; 11)·2⁻⁵³, so comparing the raw
     * top 53 bits with out[v] is the very test u &lt; exp(−βΔE) of {@link #sweepExactExponential}
     * for ΔE = 2v.
     */
    public static void integerThresholds(double beta, long[] out) {
        out[0] = 1L << 53;
        for (int v = 1; v < out.length; v++) {
            double p = StrictMath.exp(-(beta * (2.0 * v)));
            out[v] = (long) Math.ceil(p * 0x1p53);
        }
    }

    /**
     * One sweep of the integer kernel: integer couplings and fields, maintained integer local
     * fields, and the uphill test as one integer compare of raw random bits against the
     * thresholds of {@link #integerThresholds} (no floating point, no exponential on the
     * path). It draws the same random numbers as {@link #sweepExactExponential} and takes the
     * same decisions. Input and output: spins and localField in place.
     */
    public static void sweepInteger(int n, int[] start, int[] neighbour, int[] coupling, byte[] spins,
                                    int[] localField, long[] thresholds, UniformRandomProvider rng) {
        for (int k = 0; k < n; k++) {
            int s = spins[k];
            // ΔE = −2 s f = 2·(−s f); uphill where s f < 0.
            int v = s * localField[k];
            if (v < 0 && (rng.nextLong() >>> 11) >= thresholds[-v]) {
                continue;
            }
            spins[k] = (byte) -s;
            int twice = -2 * s;
            for (int p = start[k]; p < start[k + 1]; p++) {
                localField[neighbour[p]] += twice * coupling[p];
            }
        }
    }

    /** The largest row length of compressed-row arrays: the stride of the padded layout. */
    public static int maxDegree(int n, int[] start) {
        int d = 0;
        for (int k = 0; k < n; k++) {
            d = Math.max(d, start[k + 1] - start[k]);
        }
        return d;
    }

    /**
     * Compressed rows re-laid with a fixed stride: row k at {@code [k·degree, (k+1)·degree)},
     * short rows padded with {@code neighbourFill = true}: spin k itself, else: coupling 0. A
     * padded term adds 0 to a local field, so the kernels' results do not change; the fixed
     * trip count lets the processor predict the neighbour loop.
     */
    public static int[] padded(int n, int[] start, int[] values, int degree, boolean neighbourFill) {
        int[] out = new int[n * degree];
        for (int k = 0; k < n; k++) {
            for (int j = 0; j < degree; j++) {
                int q = start[k] + j;
                out[k * degree + j] = q < start[k + 1] ? values[q] : neighbourFill ? k : 0;
            }
        }
        return out;
    }

    /**
     * {@link #sweepInteger} on the padded layout of {@link #padded} (stride degree): the same
     * decisions, the same random numbers.
     */
    public static void sweepIntegerPadded(int n, int degree, int[] neighbour, int[] coupling, byte[] spins,
                                    int[] localField, long[] thresholds, UniformRandomProvider rng) {
        for (int k = 0; k < n; k++) {
            int s = spins[k];
            int v = s * localField[k];
            if (v < 0 && (rng.nextLong() >>> 11) >= thresholds[-v]) {
                continue;
            }
            spins[k] = (byte) -s;
            int twice = -2 * s;
            int base = k * degree;
            for (int j = 0; j < degree; j++) {
                localField[neighbour[base + j]] += twice * coupling[base + j];
            }
        }
    }

    /**
     * {@link #sweepInteger} without a branch on the decision, on compressed rows
     * ({@code degree = 0}) or on the padded layout of {@link #padded} (stride degree), with the
     * generator's state in {@code state} ({@link XoroshiroState}; advanced in place). Every
     * attempt computes the next random word and keeps it, i.e. advances the state, only where
     * the move is uphill; the acceptance is an integer compare against {@code thresholds}
     * (entry 0, 2⁵³, accepts every draw, which is what a downhill or level move needs); the
     * neighbours' fields change by zero where the move is refused. So it takes the decisions
     * of {@link #sweepInteger} on the same random numbers, and a mispredicted branch (about
     * one attempt in three on an anneal) costs nothing.
     */
    public static void sweepIntegerBranchFree(int n, int degree, int[] start, int[] neighbour, int[] coupling,
                                              byte[] spins, int[] localField, long[] thresholds, long[] state) {
        long s0 = state[0];
        long s1 = state[1];
        for (int k = 0; k < n; k++) {
            int s = spins[k];
            int v = s * localField[k];
            int uphill = v >> 31;
            long keep = uphill;
            long r = Long.rotateLeft(s0 + s1, 17) + s0;
            long t = s1 ^ s0;
            s0 = ((Long.rotateLeft(s0, 49) ^ t ^ (t << 21)) & keep) | (s0 & ~keep);
            s1 = (Long.rotateLeft(t, 28) & keep) | (s1 & ~keep);
            // -1 where taken: the draw's top 53 bits below the threshold of -v (of 0 when v >= 0).
            int taken = (int) (((r >>> 11) - thresholds[-v & uphill]) >> 63);
            int step = -2 * s & taken;
            spins[k] = (byte) (s + step);
            if (degree > 0) {
                int base = k * degree;
                for (int j = 0; j < degree; j++) {
                    localField[neighbour[base + j]] += step * coupling[base + j];
                }
            } else {
                for (int q = start[k]; q < start[k + 1]; q++) {
                    localField[neighbour[q]] += step * coupling[q];
                }
            }
        }
        state[0] = s0;
        state[1] = s1;
    }

    /** Reads swept together by {@link #sweepIntegerFour}. */
    public static final int FOUR = 4;

    /**
     * Largest |local field| {@link #sweepIntegerFour} takes: each read's field is one signed
     * 16-bit lane of a long.
     */
    public static final int FOUR_FIELD_LIMIT = (1 << 15) - 1;

    // Lanes 0–2 are stored plus 2¹⁵, so that every lane holds a number in [0, 2¹⁶) and no
    // borrow crosses into the next; lane 3, the top one, is stored as it is.
    private static final long LANE_BIAS = 0x0000_8000_8000_8000L;

    /**
     * The four local fields f_0 … f_3 (each |f_i| ≤ {@link #FOUR_FIELD_LIMIT}) as one long of
     * {@link #sweepIntegerFour}: Σ_i f_i·2¹⁶ⁱ plus a bias on the lower three lanes. The form is
     * linear: adding Σ_i d_i·2¹⁶ⁱ adds d_i to every lane (while each stays within the limit).
     */
    public static long packFields(int f0, int f1, int f2, int f3) {
        return (long) f0 + ((long) f1 << 16) + ((long) f2 << 32) + ((long) f3 << 48) + LANE_BIAS;
    }

    /** Lane i (0 … 3) of a long of {@link #packFields}. */
    public static int fieldLane(long packed, int i) {
        return i == 3 ? (int) (packed >> 48) : (int) ((packed >>> (16 * i)) & 0xffff) - 0x8000;
    }

    /**
     * {@link #sweepIntegerBranchFree} on four reads at once, each with its own spins, local
     * fields and generator state, on the same problem and thresholds (field bound at most
     * {@link #FOUR_FIELD_LIMIT}), the terms as {@link #interleavedTerms} of the compressed rows
     * ({@code degree = 0}) or of the padded layout (stride degree). Spin k of read i is
     * {@code spins[4k + i]}; the four local fields of spin k are one long {@code field[k]} of
     * {@link #packFields}; read i's generator state is {@code states[2i], states[2i + 1]}. Spin k of read 0, 1, 2, 3 is visited in turn,
     * each read drawing only from its own state and deciding on its own field, so each ends
     * exactly as if swept alone. Two things make it faster than four single sweeps: the four
     * reads' chains of dependent work (field, decision, generator step) overlap in the
     * processor, and a neighbour's four fields change with one multiply-add of the coupling and
     * the four packed steps (the packed form is linear), so the rows are walked once for all
     * four. Input and output: spins, field and states in place.
     */
    public static void sweepIntegerFour(int n, int degree, int[] start, int[] terms, byte[] spins, long[] field,
                                        long[] states, long[] thresholds) {
        // One loop per layout, deliberately twins: one loop holding both measured slower on
        // the two-read form, and the padded layout walked as rows of stride starts 0.155
        // against 0.229 attempts per cpu-ns here (the fixed trip count is what pays). The
        // thresholds last: on that form this order of arguments measured 8 % faster
        // under C2 (register assignment).
        if (degree > 0) {
            fourPadded(n, degree, terms, spins, field, states, thresholds);
        } else {
            fourRows(n, start, terms, spins, field, states, thresholds);
        }
    }

    /**
     * Neighbours and couplings interleaved, term q as {@code out[2q], out[2q + 1]}: the layout
     * of {@link #sweepIntegerFour} (one array walked, one base register fewer: 13 % faster
     * than two arrays there), from rows or from the padded layout alike.
     */
    public static int[] interleavedTerms(int[] neighbour, int[] coupling) {
        int[] out = new int[2 * neighbour.length];
        for (int q = 0; q < neighbour.length; q++) {
            out[2 * q] = neighbour[q];
            out[2 * q + 1] = coupling[q];
        }
        return out;
    }

    /**
     * The packed local fields of four reads for {@link #sweepIntegerFour}: spins as there
     * ({@code spins[4k + i]}); output {@code field} (length n) overwritten.
     */
    public static void packedLocalFields(int n, int[] start, int[] neighbour, int[] coupling, int[] fields,
                                         byte[] spins, long[] field) {
        int[] f = new int[FOUR];
        for (int k = 0; k < n; k++) {
            for (int i = 0; i < FOUR; i++) {
                f[i] = fields[k];
                for (int p = start[k]; p < start[k + 1]; p++) {
                    f[i] += coupling[p] * spins[FOUR * neighbour[p] + i];
                }
            }
            field[k] = packFields(f[0], f[1], f[2], f[3]);
        }
    }

    /** {@link #sweepIntegerFour} on the padded layout (stride degree). */
    private static void fourPadded(int n, int degree, int[] terms, byte[] spins, long[] field, long[] states,
                                   long[] thresholds) {
        long a0 = states[0];
        long a1 = states[1];
        long b0 = states[2];
        long b1 = states[3];
        long c0 = states[4];
        long c1 = states[5];
        long d0 = states[6];
        long d1 = states[7];
        for (int k = 0; k < n; k++) {
            long q = field[k];
            int at = 4 * k;

            int s0 = spins[at + 0];
            int v0 = s0 * ((int) (q & 0xffff) - 0x8000);
            int up0 = v0 >> 31;
            long keep0 = up0;
            long r0 = Long.rotateLeft(a0 + a1, 17) + a0;
            long t0 = a1 ^ a0;
            a0 = ((Long.rotateLeft(a0, 49) ^ t0 ^ (t0 << 21)) & keep0) | (a0 & ~keep0);
            a1 = (Long.rotateLeft(t0, 28) & keep0) | (a1 & ~keep0);
            int step0 = -2 * s0 & (int) (((r0 >>> 11) - thresholds[-v0 & up0]) >> 63);
            spins[at + 0] = (byte) (s0 + step0);

            int s1 = spins[at + 1];
            int v1 = s1 * ((int) ((q >>> 16) & 0xffff) - 0x8000);
            int up1 = v1 >> 31;
            long keep1 = up1;
            long r1 = Long.rotateLeft(b0 + b1, 17) + b0;
            long t1 = b1 ^ b0;
            b0 = ((Long.rotateLeft(b0, 49) ^ t1 ^ (t1 << 21)) & keep1) | (b0 & ~keep1);
            b1 = (Long.rotateLeft(t1, 28) & keep1) | (b1 & ~keep1);
            int step1 = -2 * s1 & (int) (((r1 >>> 11) - thresholds[-v1 & up1]) >> 63);
            spins[at + 1] = (byte) (s1 + step1);

            int s2 = spins[at + 2];
            int v2 = s2 * ((int) ((q >>> 32) & 0xffff) - 0x8000);
            int up2 = v2 >> 31;
            long keep2 = up2;
            long r2 = Long.rotateLeft(c0 + c1, 17) + c0;
            long t2 = c1 ^ c0;
            c0 = ((Long.rotateLeft(c0, 49) ^ t2 ^ (t2 << 21)) & keep2) | (c0 & ~keep2);
            c1 = (Long.rotateLeft(t2, 28) & keep2) | (c1 & ~keep2);
            int step2 = -2 * s2 & (int) (((r2 >>> 11) - thresholds[-v2 & up2]) >> 63);
            spins[at + 2] = (byte) (s2 + step2);

            int s3 = spins[at + 3];
            int v3 = s3 * ((int) (q >> 48));
            int up3 = v3 >> 31;
            long keep3 = up3;
            long r3 = Long.rotateLeft(d0 + d1, 17) + d0;
            long t3 = d1 ^ d0;
            d0 = ((Long.rotateLeft(d0, 49) ^ t3 ^ (t3 << 21)) & keep3) | (d0 & ~keep3);
            d1 = (Long.rotateLeft(t3, 28) & keep3) | (d1 & ~keep3);
            int step3 = -2 * s3 & (int) (((r3 >>> 11) - thresholds[-v3 & up3]) >> 63);
            spins[at + 3] = (byte) (s3 + step3);
            long step = (long) step0 + ((long) step1 << 16) + ((long) step2 << 32) + ((long) step3 << 48);
            int base = 2 * k * degree;
            for (int i = 0; i < 2 * degree; i += 2) {
                field[terms[base + i]] += terms[base + i + 1] * step;
            }
        }
        states[0] = a0;
        states[1] = a1;
        states[2] = b0;
        states[3] = b1;
        states[4] = c0;
        states[5] = c1;
        states[6] = d0;
        states[7] = d1;
    }

    /** {@link #sweepIntegerFour} on compressed rows. */
    private static void fourRows(int n, int[] start, int[] terms, byte[] spins, long[] field, long[] states,
                                 long[] thresholds) {
        long a0 = states[0];
        long a1 = states[1];
        long b0 = states[2];
        long b1 = states[3];
        long c0 = states[4];
        long c1 = states[5];
        long d0 = states[6];
        long d1 = states[7];
        for (int k = 0; k < n; k++) {
            long q = field[k];
            int at = 4 * k;

            int s0 = spins[at + 0];
            int v0 = s0 * ((int) (q & 0xffff) - 0x8000);
            int up0 = v0 >> 31;
            long keep0 = up0;
            long r0 = Long.rotateLeft(a0 + a1, 17) + a0;
            long t0 = a1 ^ a0;
            a0 = ((Long.rotateLeft(a0, 49) ^ t0 ^ (t0 << 21)) & keep0) | (a0 & ~keep0);
            a1 = (Long.rotateLeft(t0, 28) & keep0) | (a1 & ~keep0);
            int step0 = -2 * s0 & (int) (((r0 >>> 11) - thresholds[-v0 & up0]) >> 63);
            spins[at + 0] = (byte) (s0 + step0);

            int s1 = spins[at + 1];
            int v1 = s1 * ((int) ((q >>> 16) & 0xffff) - 0x8000);
            int up1 = v1 >> 31;
            long keep1 = up1;
            long r1 = Long.rotateLeft(b0 + b1, 17) + b0;
            long t1 = b1 ^ b0;
            b0 = ((Long.rotateLeft(b0, 49) ^ t1 ^ (t1 << 21)) & keep1) | (b0 & ~keep1);
            b1 = (Long.rotateLeft(t1, 28) & keep1) | (b1 & ~keep1);
            int step1 = -2 * s1 & (int) (((r1 >>> 11) - thresholds[-v1 & up1]) >> 63);
            spins[at + 1] = (byte) (s1 + step1);

            int s2 = spins[at + 2];
            int v2 = s2 * ((int) ((q >>> 32) & 0xffff) - 0x8000);
            int up2 = v2 >> 31;
            long keep2 = up2;
            long r2 = Long.rotateLeft(c0 + c1, 17) + c0;
            long t2 = c1 ^ c0;
            c0 = ((Long.rotateLeft(c0, 49) ^ t2 ^ (t2 << 21)) & keep2) | (c0 & ~keep2);
            c1 = (Long.rotateLeft(t2, 28) & keep2) | (c1 & ~keep2);
            int step2 = -2 * s2 & (int) (((r2 >>> 11) - thresholds[-v2 & up2]) >> 63);
            spins[at + 2] = (byte) (s2 + step2);

            int s3 = spins[at + 3];
            int v3 = s3 * ((int) (q >> 48));
            int up3 = v3 >> 31;
            long keep3 = up3;
            long r3 = Long.rotateLeft(d0 + d1, 17) + d0;
            long t3 = d1 ^ d0;
            d0 = ((Long.rotateLeft(d0, 49) ^ t3 ^ (t3 << 21)) & keep3) | (d0 & ~keep3);
            d1 = (Long.rotateLeft(t3, 28) & keep3) | (d1 & ~keep3);
            int step3 = -2 * s3 & (int) (((r3 >>> 11) - thresholds[-v3 & up3]) >> 63);
            spins[at + 3] = (byte) (s3 + step3);
            long step = (long) step0 + ((long) step1 << 16) + ((long) step2 << 32) + ((long) step3 << 48);
            for (int p = 2 * start[k]; p < 2 * start[k + 1]; p += 2) {
                field[terms[p]] += terms[p + 1] * step;
            }
        }
        states[0] = a0;
        states[1] = a1;
        states[2] = b0;
        states[3] = b1;
        states[4] = c0;
        states[5] = c1;
        states[6] = d0;
        states[7] = d1;
    }

    /**
     * Turns local fields into signed fields for {@link #sweepSigned}: {@code spin[k]} becomes
     * s_k (±1.0) and {@code field[k]} becomes s_k·f_k (exact: a change of sign at most).
     * Input: ±1 spins and the local fields of {@link #localFields}; output: spin and field.
     */
    public static void signedFields(int n, byte[] spins, double[] spin, double[] field) {
        for (int k = 0; k < n; k++) {
            spin[k] = spins[k];
            field[k] = spins[k] * field[k];
        }
    }

    /**
     * {@link #sweep} on signed fields g_k = s_k·f_k (from {@link #signedFields}) with the
     * generator's bare state ({@link XoroshiroState}, advanced in place) and the bracket
     * compared on the draw's raw bits ({@link ExponentialBracket#acceptsBits}). Uphill is
     * g_k &lt; 0 with ΔE = −2·g_k, the very double of {@code sweep} (both are ±2·f_k, exact); a
     * neighbour's signed field changes by s_j·(2 s_k J_kj), which is s_j times the change of its
     * field, and rounding commutes with a change of sign, so g_j stays exactly s_j·f_j. Hence
     * the same decisions on the same random numbers as {@code sweep}, with no conversion of a
     * spin to a double and no branch on the spin's sign on the path of an attempt. Input and
     * output: spin (±1.0) and field in place.
     */
    public static void sweepSigned(int n, int[] start, int[] neighbour, double[] coupling, double[] spin,
                                   double[] field, double beta, long[] state) {
        long s0 = state[0];
        long s1 = state[1];
        // x = β·(−2g) is the real number (−2β)·g, so the same double; its table index x·2⁵
        // comes from g in one multiply too (exact scaling), not from x: a shorter chain from
        // the field to the decision, which is what a mispredicted decision waits for.
        double minusTwoBeta = -2.0 * beta;
        double scaledBeta = minusTwoBeta / ExponentialBracket.STEP;
        for (int k = 0; k < n; k++) {
            double g = field[k];
            if (g < 0.0) {
                long r = Long.rotateLeft(s0 + s1, 17) + s0;
                long t = s1 ^ s0;
                s0 = Long.rotateLeft(s0, 49) ^ t ^ (t << 21);
                s1 = Long.rotateLeft(t, 28);
                if (!ExponentialBracket.acceptsBits(minusTwoBeta * g, scaledBeta * g, r >>> 11)) {
                    continue;
                }
            }
            double s = -spin[k];
            spin[k] = s;
            field[k] = -g;
            double twice = 2.0 * s;
            for (int p = start[k]; p < start[k + 1]; p++) {
                int j = neighbour[p];
                field[j] += spin[j] * (twice * coupling[p]);
            }
        }
        state[0] = s0;
        state[1] = s1;
    }
}
