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

    /**
     * {@link #sweepIntegerBranchFree} on two reads at once, A and B, each with its own spins,
     * local fields and generator state, on the same problem and thresholds. Spin k of A and then
     * spin k of B is visited, each read drawing only from its own state, so each ends exactly
     * as if swept alone; the two reads' independent chains of dependent work (field, decision,
     * generator step) overlap in the processor, and the neighbour rows are loaded once for both.
     */
    public static void sweepIntegerBranchFreePair(int n, int degree, int[] start, int[] neighbour, int[] coupling,
                                                  long[] thresholds, byte[] spinsA, int[] fieldA, long[] stateA,
                                                  byte[] spinsB, int[] fieldB, long[] stateB) {
        // One loop per layout (one loop holding both measured slower), with the thresholds
        // last: that order of arguments measured 8 % faster under C2 (register assignment).
        if (degree > 0) {
            pairPadded(n, degree, neighbour, coupling, spinsA, fieldA, stateA, spinsB, fieldB, stateB, thresholds);
        } else {
            pairRows(n, start, neighbour, coupling, spinsA, fieldA, stateA, spinsB, fieldB, stateB, thresholds);
        }
    }

    /** {@link #sweepIntegerBranchFreePair} on the padded layout (stride degree). */
    private static void pairPadded(int n, int degree, int[] neighbour, int[] coupling, byte[] spinsA,
                                   int[] fieldA, long[] stateA, byte[] spinsB, int[] fieldB, long[] stateB,
                                   long[] thresholds) {
        long a0 = stateA[0];
        long a1 = stateA[1];
        long b0 = stateB[0];
        long b1 = stateB[1];
        for (int k = 0; k < n; k++) {
            int s = spinsA[k];
            int v = s * fieldA[k];
            int up = v >> 31;
            long keep = up;
            long r = Long.rotateLeft(a0 + a1, 17) + a0;
            long t = a1 ^ a0;
            a0 = ((Long.rotateLeft(a0, 49) ^ t ^ (t << 21)) & keep) | (a0 & ~keep);
            a1 = (Long.rotateLeft(t, 28) & keep) | (a1 & ~keep);
            int taken = (int) (((r >>> 11) - thresholds[-v & up]) >> 63);
            int step = -2 * s & taken;
            spinsA[k] = (byte) (s + step);
            int sB = spinsB[k];
            int vB = sB * fieldB[k];
            int upB = vB >> 31;
            long keepB = upB;
            long rB = Long.rotateLeft(b0 + b1, 17) + b0;
            long tB = b1 ^ b0;
            b0 = ((Long.rotateLeft(b0, 49) ^ tB ^ (tB << 21)) & keepB) | (b0 & ~keepB);
            b1 = (Long.rotateLeft(tB, 28) & keepB) | (b1 & ~keepB);
            int takenB = (int) (((rB >>> 11) - thresholds[-vB & upB]) >> 63);
            int stepB = -2 * sB & takenB;
            spinsB[k] = (byte) (sB + stepB);
            int base = k * degree;
            for (int j = 0; j < degree; j++) {
                int q = neighbour[base + j];
                int c = coupling[base + j];
                fieldA[q] += step * c;
                fieldB[q] += stepB * c;
            }
        }
        stateA[0] = a0;
        stateA[1] = a1;
        stateB[0] = b0;
        stateB[1] = b1;
    }

    /** {@link #sweepIntegerBranchFreePair} on compressed rows. */
    private static void pairRows(int n, int[] start, int[] neighbour, int[] coupling, byte[] spinsA,
                                 int[] fieldA, long[] stateA, byte[] spinsB, int[] fieldB, long[] stateB,
                                 long[] thresholds) {
        long a0 = stateA[0];
        long a1 = stateA[1];
        long b0 = stateB[0];
        long b1 = stateB[1];
        for (int k = 0; k < n; k++) {
            int sa = spinsA[k];
            int va = sa * fieldA[k];
            int upA = va >> 31;
            long keepA = upA;
            long ra = Long.rotateLeft(a0 + a1, 17) + a0;
            long ta = a1 ^ a0;
            a0 = ((Long.rotateLeft(a0, 49) ^ ta ^ (ta << 21)) & keepA) | (a0 & ~keepA);
            a1 = (Long.rotateLeft(ta, 28) & keepA) | (a1 & ~keepA);
            int stepA = -2 * sa & (int) (((ra >>> 11) - thresholds[-va & upA]) >> 63);
            spinsA[k] = (byte) (sa + stepA);

            int sb = spinsB[k];
            int vb = sb * fieldB[k];
            int upB = vb >> 31;
            long keepB = upB;
            long rb = Long.rotateLeft(b0 + b1, 17) + b0;
            long tb = b1 ^ b0;
            b0 = ((Long.rotateLeft(b0, 49) ^ tb ^ (tb << 21)) & keepB) | (b0 & ~keepB);
            b1 = (Long.rotateLeft(tb, 28) & keepB) | (b1 & ~keepB);
            int stepB = -2 * sb & (int) (((rb >>> 11) - thresholds[-vb & upB]) >> 63);
            spinsB[k] = (byte) (sb + stepB);

            for (int q = start[k]; q < start[k + 1]; q++) {
                int j = neighbour[q];
                int c = coupling[q];
                fieldA[j] += stepA * c;
                fieldB[j] += stepB * c;
            }
        }
        stateA[0] = a0;
        stateA[1] = a1;
        stateB[0] = b0;
        stateB[1] = b1;
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
        for (int k = 0; k < n; k++) {
            double g = field[k];
            if (g < 0.0) {
                long r = Long.rotateLeft(s0 + s1, 17) + s0;
                long t = s1 ^ s0;
                s0 = Long.rotateLeft(s0, 49) ^ t ^ (t << 21);
                s1 = Long.rotateLeft(t, 28);
                if (!ExponentialBracket.acceptsBits(beta * (-2.0 * g), r >>> 11)) {
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
