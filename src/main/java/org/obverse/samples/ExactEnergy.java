package org.obverse.samples;

import org.obverse.model.IsingProblem;

/**
 * The exact energy path over bit-sliced blocks. Per read it adds, in this order, h_k·s_k for
 * every position k, then J_e·(s_u·s_v) for every coupler e, then the offset: the order of
 * {@link IsingProblem#energy(byte[])}, so the results are equal bit for bit. A term is h or J
 * with its sign bit flipped where the product is −1, exactly as the multiplication by ±1
 * gives. 64 reads go together, each with its own accumulator.
 *
 * <p>Where the order cannot matter it is not followed: if every term (offset, h, J) is an
 * integer multiple of one power of two 2^q and B = 4·|offset| + 8·(Σ|h| + Σ|J|) is below
 * 2^(53+q), every sum of terms, doubled terms and their integer multiples that either path
 * forms is a multiple of 2^q below 2^(53+q) in size, so it is a double without rounding
 * (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., SIAM 2002, §2.1: a
 * floating-point sum or product is exact when the exact result is representable). Both this
 * path and the fast kernels then return the exact real energy, the same double; a zero is
 * +0.0 on this path (the sum starts at +0.0), so the fast result has +0.0 added. Integer and
 * few-bit problems, the common case on hardware, take the fast kernels this way with the same
 * bits; others take the per-read order above.
 */
final class ExactEnergy implements EnergyKernel {
    private final IsingProblem problem;
    private final int n;
    private final long[] fieldBits;
    private final int[] edgeU;
    private final int[] edgeV;
    private final long[] couplingBits;
    private final double offset;
    private final double[] acc = new double[64];
    // A fast kernel that gives the same bits (see the type's comment), or null.
    private final EnergyKernel sameBits;

    ExactEnergy(IsingProblem problem) {
        this.problem = problem;
        this.n = problem.size();
        this.fieldBits = new long[n];
        for (int k = 0; k < n; k++) {
            fieldBits[k] = Double.doubleToRawLongBits(problem.field(k));
        }
        this.edgeU = problem.edgeUs();
        this.edgeV = problem.edgeVs();
        this.couplingBits = new long[edgeU.length];
        for (int e = 0; e < edgeU.length; e++) {
            couplingBits[e] = Double.doubleToRawLongBits(problem.coupling(e));
        }
        this.offset = problem.offset();
        this.sameBits = exactOnGrid(problem) ? EnergyKernel.of(problem) : null;
    }

    /** Whether every term is a multiple of one 2^q and all sums stay below 2^(53+q): no sum rounds. */
    static boolean exactOnGrid(IsingProblem p) {
        int q = Integer.MAX_VALUE;
        double sum = 0.0;
        for (int k = 0; k < p.size(); k++) {
            q = Math.min(q, lowestBit(p.field(k)));
            sum += Math.abs(p.field(k));
        }
        for (int e = 0; e < p.edgeCount(); e++) {
            q = Math.min(q, lowestBit(p.coupling(e)));
            sum += Math.abs(p.coupling(e));
        }
        q = Math.min(q, lowestBit(p.offset()));
        if (q == Integer.MIN_VALUE) {
            return false;
        }
        if (q == Integer.MAX_VALUE) {
            return true; // every term is zero
        }
        // The bound, computed with rounding, is enlarged by a margin far above its rounding error.
        double bound = (4 * Math.abs(p.offset()) + 8 * sum) * 1.0001;
        return q <= 900 && bound < Math.scalb(1.0, Math.max(-1074, 53 + q));
    }

    /** Exponent of the lowest set bit of x (x = odd · 2^result); MAX_VALUE for zero, MIN_VALUE where not finite or subnormal. */
    private static int lowestBit(double x) {
        if (x == 0.0) {
            return Integer.MAX_VALUE;
        }
        if (!Double.isFinite(x) || Math.abs(x) < Double.MIN_NORMAL) {
            return Integer.MIN_VALUE;
        }
        long mantissa = (Double.doubleToRawLongBits(x) & 0x000FFFFFFFFFFFFFL) | 0x0010000000000000L;
        return Math.getExponent(x) - 52 + Long.numberOfTrailingZeros(mantissa);
    }

    /** Whether this kernel takes the fast kernels for its problem (same bits, see the type's comment). */
    boolean regroups() {
        return sameBits != null;
    }

    private ExactEnergy(ExactEnergy o) {
        this.problem = o.problem;
        this.n = o.n;
        this.fieldBits = o.fieldBits;
        this.edgeU = o.edgeU;
        this.edgeV = o.edgeV;
        this.couplingBits = o.couplingBits;
        this.offset = o.offset;
        this.sameBits = o.sameBits == null ? null : o.sameBits.copy();
    }

    @Override
    public IsingProblem problem() {
        return problem;
    }

    @Override
    public Method method() {
        return Method.EXACT;
    }

    @Override
    public double tolerance() {
        return 0.0;
    }

    @Override
    public void energies(SampleBlock block, double[] out, int offsetOut) {
        FastEnergy.checkBlock(problem, block, out, offsetOut);
        if (sameBits != null) {
            sameBits.energies(block, out, offsetOut);
            for (int r = offsetOut; r < offsetOut + block.reads(); r++) {
                out[r] += 0.0; // -0.0 to +0.0, as the per-read sum gives; nothing else changes
            }
            return;
        }
        long[] w = block.words();
        int blocks = block.blockCount();
        for (int b = 0; b < blocks; b++) {
            int base = b * n;
            java.util.Arrays.fill(acc, 0.0);
            for (int k = 0; k < n; k++) {
                // Clear bit: s = -1, the term is -h.
                long down = ~w[base + k];
                long hb = fieldBits[k];
                for (int r = 0; r < 64; r++) {
                    acc[r] += Double.longBitsToDouble(hb ^ ((down >>> r) << 63));
                }
            }
            for (int e = 0; e < edgeU.length; e++) {
                // Set bit of x: s_u != s_v, the term is -J.
                long x = w[base + edgeU[e]] ^ w[base + edgeV[e]];
                long jb = couplingBits[e];
                for (int r = 0; r < 64; r++) {
                    acc[r] += Double.longBitsToDouble(jb ^ ((x >>> r) << 63));
                }
            }
            int live = Math.min(64, block.reads() - (b << 6));
            for (int r = 0; r < live; r++) {
                out[offsetOut + (b << 6) + r] = acc[r] + offset;
            }
        }
    }

    @Override
    public EnergyKernel copy() {
        return new ExactEnergy(this);
    }

    @Override
    public String toString() {
        return "ExactEnergy[" + problem + "]";
    }
}
