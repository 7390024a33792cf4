package org.obverse.spectrum;

import java.util.Arrays;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.EigenDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.obverse.model.IsingProblem;

/**
 * An independent oracle for the tests: H(s) built on the full 2^n space from the definition,
 * with the opposite bit convention to the main code (bit k set means spin k = −1), and
 * diagonalised by commons-math3. The even sector of the global flip is built explicitly from
 * the states (|b⟩ + |~b⟩)/√2. Shares no code with org.obverse.spectrum.
 */
final class ReferenceHamiltonian {
    private ReferenceHamiltonian() {
    }

    static double spin(int b, int k) {
        return ((b >>> k) & 1) == 1 ? -1.0 : 1.0;
    }

    static double problemEnergy(IsingProblem p, int b) {
        double e = p.offset();
        for (int k = 0; k < p.size(); k++) {
            e += p.field(k) * spin(b, k);
        }
        for (int c = 0; c < p.edgeCount(); c++) {
            e += p.coupling(c) * spin(b, p.edgeU(c)) * spin(b, p.edgeV(c));
        }
        return e;
    }

    /** H = -(a/2) Σ σˣ + (b/2) H_P on the full space. */
    static RealMatrix full(IsingProblem p, double a, double bWeight) {
        int n = p.size();
        int d = 1 << n;
        RealMatrix h = new Array2DRowRealMatrix(d, d);
        for (int b = 0; b < d; b++) {
            h.addToEntry(b, b, 0.5 * bWeight * problemEnergy(p, b));
            for (int k = 0; k < n; k++) {
                h.addToEntry(b, b ^ (1 << k), -0.5 * a);
            }
        }
        return h;
    }

    /** H restricted to the even sector of the global flip: Vᵀ H V. */
    static RealMatrix even(IsingProblem p, double a, double bWeight) {
        RealMatrix h = full(p, a, bWeight);
        int d = h.getRowDimension();
        int half = d / 2;
        RealMatrix v = new Array2DRowRealMatrix(d, half);
        int all = d - 1;
        for (int c = 0; c < half; c++) {
            v.setEntry(c, c, Math.sqrt(0.5));
            v.setEntry(all ^ c, c, Math.sqrt(0.5));
        }
        return v.transpose().multiply(h).multiply(v);
    }

    static double[] eigenvalues(RealMatrix h) {
        double[] e = new EigenDecomposition(h).getRealEigenvalues();
        Arrays.sort(e);
        return e;
    }
}
