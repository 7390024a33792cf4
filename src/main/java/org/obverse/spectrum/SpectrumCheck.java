package org.obverse.spectrum;

import org.obverse.anneal.EnergyScales;
import org.obverse.model.IsingProblem;

/**
 * Checks that two problems have the same anneal spectrum at given values of s: the check a
 * gauged problem must pass against its source. A gauge g acts on the anneal Hamiltonian as
 * the unitary U = ∏_{g_i = −1} σˣ_i, with U σᶻ_i U = g_i σᶻ_i and U σˣ_i U = σˣ_i, so
 * U H(s) U = H'(s) for every s and the spectra agree exactly (standard quantum mechanics;
 * see REFERENCES.md, "Spin-reversal algebra"). U also fixes |+…+⟩ and commutes with each
 * component flip, so it maps the reachable sector to itself. Stateless.
 */
public final class SpectrumCheck {
    private SpectrumCheck() {
    }

    /**
     * The outcome: whether every compared level agreed within the tolerance, the largest
     * difference seen and where (s and level index), and a reason where the problems could not
     * be compared level by level.
     */
    public record Comparison(boolean same, double worstDifference, double worstS, int worstLevel, String reason) {
    }

    /** The s values of {@link #sameSpectrum(IsingProblem, IsingProblem)}. */
    public static final double[] DEFAULT_S = {0.0, 0.1, 0.3, 0.5, 0.7, 0.9, 1.0};
    /** The tolerance of {@link #sameSpectrum(IsingProblem, IsingProblem)}, relative to max(1, energy scale). */
    public static final double DEFAULT_TOLERANCE = 1e-9;

    /**
     * The check with defaults, for an audit: the illustrative schedule, the four lowest levels
     * of the reachable sector at {@link #DEFAULT_S}, the AUTO solver, {@link #DEFAULT_TOLERANCE}.
     * Use {@link #fits(IsingProblem, SpectrumSettings)} with {@link SpectrumSettings#defaults()}
     * first to skip problems too large.
     */
    public static Comparison sameSpectrum(IsingProblem a, IsingProblem b) {
        return sameSpectrum(a, b, EnergyScales.illustrative(), SpectrumSettings.defaults(), DEFAULT_S,
                DEFAULT_TOLERANCE);
    }

    /**
     * Compares the lowest levels of a and b at each s (in [0, 1]) in the given sector.
     *
     * @param tolerance absolute tolerance on each level, relative to max(1, energy scale)
     */
    public static Comparison sameSpectrum(IsingProblem a, IsingProblem b, EnergyScales schedule,
                                          SpectrumSettings settings, double[] sValues, double tolerance) {
        if (a.size() != b.size()) {
            return new Comparison(false, Double.POSITIVE_INFINITY, Double.NaN, -1,
                    "the problems have " + a.size() + " and " + b.size() + " spins");
        }
        AnnealSpectrum sa = AnnealSpectrum.of(a, schedule, settings);
        AnnealSpectrum sb = AnnealSpectrum.of(b, schedule, settings);
        if (sa.basis().dimension() != sb.basis().dimension()) {
            return new Comparison(false, Double.POSITIVE_INFINITY, Double.NaN, -1,
                    "the reachable sectors have dimensions " + sa.basis().dimension() + " and "
                            + sb.basis().dimension());
        }
        double scale = Math.max(sa.basis().energyScale(), sb.basis().energyScale());
        double worst = 0.0;
        double worstS = Double.NaN;
        int worstLevel = -1;
        for (double s : sValues) {
            double[] la = sa.levels(s);
            double[] lb = sb.levels(s);
            int n = Math.min(la.length, lb.length);
            for (int i = 0; i < n; i++) {
                double d = Math.abs(la[i] - lb[i]);
                if (d > worst || worstLevel < 0) {
                    worst = Math.max(worst, d);
                    worstS = s;
                    worstLevel = i;
                }
            }
        }
        boolean same = worst <= tolerance * scale;
        return new Comparison(same, worst, worstS, worstLevel, same ? "" : "level " + worstLevel + " at s = "
                + worstS + " differs by " + worst);
    }

    /** Whether a problem is small enough for {@link #sameSpectrum} with the given settings. */
    public static boolean fits(IsingProblem problem, SpectrumSettings settings) {
        int m = SectorBasis.storedSpins(problem, settings.sector());
        return m <= settings.solver().solverFor(m, settings.tolerance()).maxStoredSpins();
    }
}
