package org.obverse.samples;

import org.obverse.model.IsingProblem;

/**
 * The exact energy path over bit-sliced blocks. Per read it adds, in this order, h_k·s_k for
 * every position k, then J_e·(s_u·s_v) for every coupler e, then the offset: the order of
 * {@link IsingProblem#energy(byte[])}, so the results are equal bit for bit. A term is h or J
 * with its sign bit flipped where the product is −1, exactly as the multiplication by ±1
 * gives. 64 reads go together, each with its own accumulator.
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
    }

    private ExactEnergy(ExactEnergy o) {
        this.problem = o.problem;
        this.n = o.n;
        this.fieldBits = o.fieldBits;
        this.edgeU = o.edgeU;
        this.edgeV = o.edgeV;
        this.couplingBits = o.couplingBits;
        this.offset = o.offset;
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
