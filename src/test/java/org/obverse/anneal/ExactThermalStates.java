package org.obverse.anneal;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
import org.obverse.model.IsingProblem;

/**
 * The test oracle for the path-integral sampler, built here independently of the library (only
 * the problem's own energy is shared): the anneal Hamiltonian
 * H = −(A/2) Σ σˣ_i + (B/2) H_P(σᶻ) as a dense 2ⁿ × 2ⁿ matrix (basis state b: bit i set means
 * spin i is +1, as {@code spectrum}), and three distributions over the z basis:
 * <ul>
 * <li>{@link #thermal}: the diagonal of e^{−H/T}/Z by EJML's symmetric eigendecomposition,
 * Σ_j e^{−(λ_j − λ_0)/T}·v_j(b)² / Z;</li>
 * <li>{@link #trotter}: the diagonal of the symmetric Trotter product
 * (e^{−εV/2} e^{εΓX} e^{−εV/2})^P / Tr, ε = 1/(PT), Γ = A/2, V = (B/2)·H_P, with
 * ⟨b|e^{εΓX}|b'⟩ = cosh(εΓ)^{n−d} sinh(εΓ)^d for Hamming distance d (a product of one-spin
 * factors); a slice's marginal in the path integral is this diagonal exactly (V is diagonal,
 * so ⟨b|e^{−εV}Y|b⟩ = ⟨b|e^{−εV/2} Y e^{−εV/2}|b⟩);</li>
 * <li>{@link #classical}: the Boltzmann distribution e^{−(B/2)·H_P/T}/Z.</li>
 * </ul>
 * Standard quantum statistical mechanics and the Trotter product formula (Trotter, Proc. Am.
 * Math. Soc. 10, 545, 1959; Suzuki, Prog. Theor. Phys. 56, 1454, 1976).
 */
final class ExactThermalStates {
    private ExactThermalStates() {
    }

    /** H_P on every basis state, by the problem's own energy. */
    static double[] problemEnergies(IsingProblem p) {
        int n = p.size();
        double[] e = new double[1 << n];
        byte[] spins = new byte[n];
        for (int b = 0; b < e.length; b++) {
            for (int i = 0; i < n; i++) {
                spins[i] = (byte) (((b >>> i) & 1) == 1 ? 1 : -1);
            }
            e[b] = p.energy(spins);
        }
        return e;
    }

    /** H = −(A/2) Σ σˣ + (B/2) H_P as a dense matrix. */
    static DMatrixRMaj hamiltonian(IsingProblem p, double a, double b) {
        int n = p.size();
        int d = 1 << n;
        double[] e = problemEnergies(p);
        DMatrixRMaj h = new DMatrixRMaj(d, d);
        for (int x = 0; x < d; x++) {
            h.set(x, x, 0.5 * b * e[x]);
            for (int i = 0; i < n; i++) {
                h.set(x ^ (1 << i), x, -0.5 * a);
            }
        }
        return h;
    }

    /** Eigenvalues of H, ascending. */
    static double[] levels(IsingProblem p, double a, double b) {
        DMatrixRMaj h = hamiltonian(p, a, b);
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(h.numRows, false, true);
        if (!eig.decompose(h)) {
            throw new IllegalStateException("eigendecomposition failed");
        }
        double[] v = new double[h.numRows];
        for (int i = 0; i < v.length; i++) {
            v[i] = eig.getEigenvalue(i).getReal();
        }
        java.util.Arrays.sort(v);
        return v;
    }

    /** The z-basis diagonal of e^{−H/T}/Z. */
    static double[] thermal(IsingProblem p, double a, double b, double temperature) {
        DMatrixRMaj h = hamiltonian(p, a, b);
        int d = h.numRows;
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(d, true, true);
        if (!eig.decompose(h)) {
            throw new IllegalStateException("eigendecomposition failed");
        }
        double lowest = Double.POSITIVE_INFINITY;
        for (int j = 0; j < d; j++) {
            lowest = Math.min(lowest, eig.getEigenvalue(j).getReal());
        }
        double[] diag = new double[d];
        for (int j = 0; j < d; j++) {
            double w = Math.exp(-(eig.getEigenvalue(j).getReal() - lowest) / temperature);
            DMatrixRMaj v = eig.getEigenVector(j);
            double norm = 0;
            for (int x = 0; x < d; x++) {
                norm += v.get(x) * v.get(x);
            }
            for (int x = 0; x < d; x++) {
                diag[x] += w * v.get(x) * v.get(x) / norm;
            }
        }
        return normalised(diag);
    }

    /** The z-basis diagonal of the P-slice symmetric Trotter product, normalised. */
    static double[] trotter(IsingProblem p, double a, double b, double temperature, int slices) {
        int n = p.size();
        int d = 1 << n;
        double eps = 1.0 / (slices * temperature);
        double[] e = problemEnergies(p);
        double emin = Double.POSITIVE_INFINITY;
        for (double v : e) {
            emin = Math.min(emin, v);
        }
        double c = Math.cosh(eps * a / 2);
        double s = Math.sinh(eps * a / 2);
        DMatrixRMaj m = new DMatrixRMaj(d, d);
        for (int x = 0; x < d; x++) {
            for (int y = 0; y < d; y++) {
                int dist = Integer.bitCount(x ^ y);
                double half = Math.exp(-eps * 0.5 * b * (e[x] - emin) / 2) * Math.exp(-eps * 0.5 * b * (e[y] - emin) / 2);
                m.set(x, y, Math.pow(c, n - dist) * Math.pow(s, dist) * half);
            }
        }
        DMatrixRMaj product = CommonOps_DDRM.identity(d);
        DMatrixRMaj power = m.copy();
        DMatrixRMaj scratch = new DMatrixRMaj(d, d);
        for (int k = slices; k > 0; k >>= 1) {
            if ((k & 1) == 1) {
                CommonOps_DDRM.mult(product, power, scratch);
                product.setTo(scratch);
                CommonOps_DDRM.divide(product, CommonOps_DDRM.elementMaxAbs(product));
            }
            if (k > 1) {
                CommonOps_DDRM.mult(power, power, scratch);
                power.setTo(scratch);
                CommonOps_DDRM.divide(power, CommonOps_DDRM.elementMaxAbs(power));
            }
        }
        double[] diag = new double[d];
        for (int x = 0; x < d; x++) {
            diag[x] = product.get(x, x);
        }
        return normalised(diag);
    }

    /** The classical Boltzmann distribution of (B/2)·H_P at T. */
    static double[] classical(IsingProblem p, double b, double temperature) {
        double[] e = problemEnergies(p);
        double emin = Double.POSITIVE_INFINITY;
        for (double v : e) {
            emin = Math.min(emin, v);
        }
        double[] w = new double[e.length];
        for (int x = 0; x < e.length; x++) {
            w[x] = Math.exp(-0.5 * b * (e[x] - emin) / temperature);
        }
        return normalised(w);
    }

    /** Total variation distance ½ Σ |p − q|. */
    static double totalVariation(double[] p, double[] q) {
        double t = 0;
        for (int x = 0; x < p.length; x++) {
            t += Math.abs(p[x] - q[x]);
        }
        return 0.5 * t;
    }

    private static double[] normalised(double[] w) {
        double z = 0;
        for (double v : w) {
            z += v;
        }
        for (int x = 0; x < w.length; x++) {
            w[x] /= z;
        }
        return w;
    }
}
