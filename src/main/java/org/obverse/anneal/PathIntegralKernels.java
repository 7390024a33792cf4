package org.obverse.anneal;

import org.apache.commons.rng.UniformRandomProvider;

/**
 * Metropolis sweeps of the path-integral (Suzuki–Trotter) form of the anneal Hamiltonian: P
 * slices of the problem, each a copy of its n spins, slice k's spin i joined to the same spin
 * of slices k ± 1 (periodic in k). Spins are ±1 bytes in slice-major order: spin i of slice k
 * at {@code k·n + i}. The problem is held as compressed rows ({@code start}, {@code neighbour},
 * {@code coupling}, each coupler listed from both ends), the same for every slice, and each
 * slice keeps its own local fields f_{k,i} = h_i + Σ_j J_ij s_{k,j}.
 *
 * <p>Weights (see spec/sampling.md for the derivation): a configuration has weight
 * exp(−Σ_k φ·H_P(s_k)/2 + (χ/2)·Σ_{k,i} s_{k,i} s_{k+1,i}) with the field weight
 * φ = β·B/P and the chain weight χ = −ln tanh(β·A/(2P)) (χ = 0 for P = 1, whose one self-bond
 * is constant). Two moves:
 * <ul>
 * <li>slice move: flip s_{k,i}; the log-weight falls by Δ = −φ·v + χ·w with v = s_{k,i}·f_{k,i}
 * and w = s_{k,i}·(s_{k−1,i} + s_{k+1,i}) in {−2, 0, 2};</li>
 * <li>line move: flip spin i in every slice; the chain term is unchanged and
 * Δ = −φ·Σ_k s_{k,i}·f_{k,i}. It moves a spin where the slices are locked together (χ large
 * as A → 0), which slice moves alone cannot.</li>
 * </ul>
 * Acceptance: Δ ≤ 0 is taken without a random number; Δ = +∞ (only at A = 0, a slice move
 * that would break an aligned chain) is refused without one; otherwise one u = nextDouble()
 * and the move is taken when u &lt; exp(−Δ). One sweep: slice moves over k = 0 … P−1 and
 * i = 0 … n−1 in that order, then line moves over i = 0 … n−1.
 *
 * <p>The double kernel ({@link #sweep}) and the integer kernel ({@link #sweepInteger}) compute
 * Δ by the same expression from the same values, so on a problem with integer fields and
 * couplings they take the same decisions from the same random numbers: the same spins.
 * Kernels trust their callers: arrays of matching sizes, no checks, no allocation.
 */
public final class PathIntegralKernels {
    /** Threshold entry: the move is taken without a random number (Δ ≤ 0). */
    public static final long ALWAYS = Long.MAX_VALUE;
    /** Threshold entry: the move is refused without a random number (Δ = +∞). */
    public static final long NEVER = -1L;

    private PathIntegralKernels() {
    }

    /** The field weight φ = β·B/P. */
    public static double fieldWeight(double beta, double b, int slices) {
        return beta * b / slices;
    }

    /**
     * The chain weight χ = −ln tanh(β·A/(2P)) (twice the inter-slice coupling in units of the
     * temperature): +∞ at A = 0, 0 where tanh rounds to 1, and 0 for one slice.
     */
    public static double chainWeight(double beta, double a, int slices) {
        if (slices == 1) {
            return 0.0;
        }
        return -StrictMath.log(StrictMath.tanh(beta * a / (2.0 * slices)));
    }

    /** Δ of a slice move: −φ·v + χ·w (w in {−2, 0, 2}; w = 0 adds nothing even where χ = +∞). */
    public static double sliceDelta(double fieldWeight, double chainWeight, double v, int w) {
        double chain = w == 0 ? 0.0 : chainWeight * w;
        return chain - fieldWeight * v;
    }

    /**
     * Local fields of every slice. Output: {@code localField} (length P·n) is overwritten.
     */
    public static void localFields(int n, int slices, int[] start, int[] neighbour, double[] coupling, double[] fields,
                                   byte[] spins, double[] localField) {
        for (int k = 0; k < slices; k++) {
            int base = k * n;
            for (int i = 0; i < n; i++) {
                double f = fields[i];
                for (int p = start[i]; p < start[i + 1]; p++) {
                    f += coupling[p] * spins[base + neighbour[p]];
                }
                localField[base + i] = f;
            }
        }
    }

    /** Integer local fields of every slice. Output: {@code localField} (length P·n) is overwritten. */
    public static void localFields(int n, int slices, int[] start, int[] neighbour, int[] coupling, int[] fields,
                                   byte[] spins, int[] localField) {
        for (int k = 0; k < slices; k++) {
            int base = k * n;
            for (int i = 0; i < n; i++) {
                int f = fields[i];
                for (int p = start[i]; p < start[i + 1]; p++) {
                    f += coupling[p] * spins[base + neighbour[p]];
                }
                localField[base + i] = f;
            }
        }
    }

    /** Length of the integer kernel's threshold table for local fields up to bound: 3·(2·bound + 1). */
    public static int thresholdLength(int bound) {
        return 3 * (2 * bound + 1);
    }

    /**
     * The slice-move thresholds of the integer kernel. Output: {@code out[(v + bound)·3 + (w + 2)/2]}
     * for v in [−bound, bound] and w in {−2, 0, 2} is {@link #ALWAYS} where Δ ≤ 0,
     * {@link #NEVER} where Δ = +∞, else ⌈exp(−Δ)·2⁵³⌉: nextDouble() is (nextLong() ⋙ 11)·2⁻⁵³,
     * so (nextLong() ⋙ 11) &lt; out[...] is exactly u &lt; exp(−Δ).
     */
    public static void sliceThresholds(double fieldWeight, double chainWeight, int bound, long[] out) {
        int q = 0;
        for (int v = -bound; v <= bound; v++) {
            for (int w = -2; w <= 2; w += 2) {
                double d = sliceDelta(fieldWeight, chainWeight, v, w);
                if (d <= 0) {
                    out[q++] = ALWAYS;
                } else if (d == Double.POSITIVE_INFINITY) {
                    out[q++] = NEVER;
                } else {
                    out[q++] = (long) Math.ceil(StrictMath.exp(-d) * 0x1p53);
                }
            }
        }
    }

    /**
     * One sweep with double local fields; decisions through {@link ExponentialBracket} (the
     * same as comparing with StrictMath.exp). Input and output: spins and localField in place.
     */
    public static void sweep(int n, int slices, int[] start, int[] neighbour, double[] coupling, byte[] spins,
                             double[] localField, double fieldWeight, double chainWeight, UniformRandomProvider rng) {
        for (int k = 0; k < slices; k++) {
            int base = k * n;
            int prev = (k == 0 ? slices - 1 : k - 1) * n;
            int next = (k + 1 == slices ? 0 : k + 1) * n;
            for (int i = 0; i < n; i++) {
                int q = base + i;
                int s = spins[q];
                double v = s * localField[q];
                int w = s * (spins[prev + i] + spins[next + i]);
                double d = sliceDelta(fieldWeight, chainWeight, v, w);
                if (d > 0 && (d == Double.POSITIVE_INFINITY || !ExponentialBracket.accepts(d, rng.nextDouble()))) {
                    continue;
                }
                spins[q] = (byte) -s;
                double twice = -2.0 * s;
                for (int p = start[i]; p < start[i + 1]; p++) {
                    localField[base + neighbour[p]] += twice * coupling[p];
                }
            }
        }
        for (int i = 0; i < n; i++) {
            double total = 0;
            for (int q = i; q < slices * n; q += n) {
                total += spins[q] * localField[q];
            }
            double d = -fieldWeight * total;
            if (d > 0 && !ExponentialBracket.accepts(d, rng.nextDouble())) {
                continue;
            }
            for (int k = 0; k < slices; k++) {
                int base = k * n;
                int s = spins[base + i];
                spins[base + i] = (byte) -s;
                double twice = -2.0 * s;
                for (int p = start[i]; p < start[i + 1]; p++) {
                    localField[base + neighbour[p]] += twice * coupling[p];
                }
            }
        }
    }

    /**
     * One sweep of the integer kernel: integer couplings, fields and local fields (|f| ≤ bound),
     * slice moves decided by one integer compare against the table of {@link #sliceThresholds};
     * line moves as in {@link #sweep} (their Δ takes too many values for a table). The same
     * decisions and random numbers as {@link #sweep}. Input and output: spins and localField
     * in place.
     */
    public static void sweepInteger(int n, int slices, int[] start, int[] neighbour, int[] coupling, byte[] spins,
                                    int[] localField, long[] thresholds, int bound, double fieldWeight,
                                    UniformRandomProvider rng) {
        int offset = 3 * bound + 1;
        for (int k = 0; k < slices; k++) {
            int base = k * n;
            int prev = (k == 0 ? slices - 1 : k - 1) * n;
            int next = (k + 1 == slices ? 0 : k + 1) * n;
            for (int i = 0; i < n; i++) {
                int q = base + i;
                int s = spins[q];
                int v = s * localField[q];
                int w = s * (spins[prev + i] + spins[next + i]);
                // (v + bound)·3 + (w + 2)/2 = 3v + w/2 + 3·bound + 1.
                long t = thresholds[3 * v + (w >> 1) + offset];
                if (t != ALWAYS && (t < 0 || (rng.nextLong() >>> 11) >= t)) {
                    continue;
                }
                spins[q] = (byte) -s;
                int twice = -2 * s;
                for (int p = start[i]; p < start[i + 1]; p++) {
                    localField[base + neighbour[p]] += twice * coupling[p];
                }
            }
        }
        for (int i = 0; i < n; i++) {
            int total = 0;
            for (int q = i; q < slices * n; q += n) {
                total += spins[q] * localField[q];
            }
            double d = -fieldWeight * total;
            if (d > 0 && !ExponentialBracket.accepts(d, rng.nextDouble())) {
                continue;
            }
            for (int k = 0; k < slices; k++) {
                int base = k * n;
                int s = spins[base + i];
                spins[base + i] = (byte) -s;
                int twice = -2 * s;
                for (int p = start[i]; p < start[i + 1]; p++) {
                    localField[base + neighbour[p]] += twice * coupling[p];
                }
            }
        }
    }

    /**
     * The plain baseline: the same moves with every local field recomputed from the neighbours,
     * the weights' logarithm and Math.exp(−Δ) evaluated on every attempt, no maintained state
     * besides the spins. Input and output: spins in place. The benchmark's yardstick.
     */
    public static void sweepBaseline(int n, int slices, int[] start, int[] neighbour, double[] coupling,
                                     double[] fields, byte[] spins, double beta, double a, double b,
                                     UniformRandomProvider rng) {
        for (int k = 0; k < slices; k++) {
            int base = k * n;
            int prev = ((k + slices - 1) % slices) * n;
            int next = ((k + 1) % slices) * n;
            for (int i = 0; i < n; i++) {
                double f = fields[i];
                for (int p = start[i]; p < start[i + 1]; p++) {
                    f += coupling[p] * spins[base + neighbour[p]];
                }
                int s = spins[base + i];
                double chain = slices == 1 ? 0.0 : -Math.log(Math.tanh(beta * a / (2.0 * slices)));
                double d = -(beta * b / slices) * s * f + chain * s * (spins[prev + i] + spins[next + i]);
                if (d <= 0 || rng.nextDouble() < Math.exp(-d)) {
                    spins[base + i] = (byte) -s;
                }
            }
        }
        for (int i = 0; i < n; i++) {
            double total = 0;
            for (int k = 0; k < slices; k++) {
                int base = k * n;
                double f = fields[i];
                for (int p = start[i]; p < start[i + 1]; p++) {
                    f += coupling[p] * spins[base + neighbour[p]];
                }
                total += spins[base + i] * f;
            }
            double d = -(beta * b / slices) * total;
            if (d <= 0 || rng.nextDouble() < Math.exp(-d)) {
                for (int k = 0; k < slices; k++) {
                    spins[k * n + i] = (byte) -spins[k * n + i];
                }
            }
        }
    }
}
