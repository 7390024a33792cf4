package org.obverse.anneal;

import org.obverse.model.IsingProblem;

/**
 * The inverse-temperature schedule of the emulation. Sweep k of S runs at schedule time
 * t_k = (k + ½)·T/S and at β_k = β_hot·(β_cold/β_hot)^{s(t_k)}: the anneal fraction s moves
 * β geometrically from hot to cold, so a pause (flat s) is a run of extra sweeps at the pause
 * point's β and a quench a few sweeps over a wide β step. This is an emulation of a schedule's
 * shape, not a model of quantum dynamics.
 *
 * <p>Automatic range (common practice for simulated annealing, no source): at β_hot the
 * largest possible single-flip rise, 2·max_k(|h_k| + Σ_j |J_kj|), is taken with probability
 * ½; at β_cold the smallest coefficient's flip cost, 2·min(|h|, |J|), with probability
 * 1/100. Coefficients below 10⁻⁹ of the largest count as zero: they are rounding residues of a
 * QUBO-to-spin conversion, not terms.
 */
public final class BetaRange {
    private BetaRange() {
    }

    /** {hot, cold} for the problem, as the class comment says; {1, 1} for a problem without terms. */
    public static double[] automatic(IsingProblem p) {
        int n = p.size();
        double[] sumAbs = new double[n];
        double biggest = 0;
        for (int k = 0; k < n; k++) {
            double h = Math.abs(p.field(k));
            sumAbs[k] += h;
            biggest = Math.max(biggest, h);
        }
        for (int e = 0; e < p.edgeCount(); e++) {
            double j = Math.abs(p.coupling(e));
            sumAbs[p.edgeU(e)] += j;
            sumAbs[p.edgeV(e)] += j;
            biggest = Math.max(biggest, j);
        }
        double largest = 0;
        for (double s : sumAbs) {
            largest = Math.max(largest, s);
        }
        if (largest == 0) {
            return new double[] {1.0, 1.0};
        }
        double floor = 1e-9 * biggest;
        double smallest = Double.POSITIVE_INFINITY;
        for (int k = 0; k < n; k++) {
            double h = Math.abs(p.field(k));
            if (h > floor) {
                smallest = Math.min(smallest, h);
            }
        }
        for (int e = 0; e < p.edgeCount(); e++) {
            double j = Math.abs(p.coupling(e));
            if (j > floor) {
                smallest = Math.min(smallest, j);
            }
        }
        double hot = Math.log(2.0) / (2.0 * largest);
        double cold = Math.log(100.0) / (2.0 * smallest);
        return new double[] {hot, Math.max(hot, cold)};
    }

    /** β of every sweep. Output: a new array of length settings.sweeps(). */
    public static double[] perSweep(SamplerSettings settings, double hot, double cold) {
        AnnealSchedule schedule = settings.schedule();
        int sweeps = settings.sweeps();
        double[] beta = new double[sweeps];
        double t = schedule.runTimeMicros();
        double ratio = cold / hot;
        for (int k = 0; k < sweeps; k++) {
            double s = schedule.fractionAt((k + 0.5) * t / sweeps);
            beta[k] = hot * StrictMath.pow(ratio, s);
        }
        return beta;
    }
}
