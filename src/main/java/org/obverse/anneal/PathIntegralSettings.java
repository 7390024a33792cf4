package org.obverse.anneal;

/**
 * What the path-integral sampler needs beyond the shared settings: the energy scales A(s),
 * B(s) of the anneal Hamiltonian H(s) = −(A(s)/2) Σ σˣ_i + (B(s)/2) H_P, the temperature
 * k_B·T in the same energy units as A and B, and the number P of imaginary-time slices.
 * Validated once here; immutable.
 *
 * <p>P = 1 is allowed and is the classical limit: one slice carries no inter-slice bond, so
 * the sampler then draws from the classical Boltzmann distribution of (B(s)/2)·H_P at T, with
 * no trace of the driver. Useful as a control; a quantum model needs P ≥ 2 (and a Trotter
 * error of order (A/(2PT))² per spin).
 *
 * @param energyScales A(s) and B(s)
 * @param temperature  k_B·T in the energy units of A and B, finite and &gt; 0
 * @param slices       P, the number of Trotter slices, 1 … {@value #MAX_SLICES}
 */
public record PathIntegralSettings(EnergyScales energyScales, double temperature, int slices) {
    /** Default number of slices. */
    public static final int DEFAULT_SLICES = 32;
    /** Most slices a run may ask for (memory grows with slices × spins per thread). */
    public static final int MAX_SLICES = 4096;

    /** Validates once; each message names the rule and the bad value. */
    public PathIntegralSettings {
        if (energyScales == null) {
            throw new IllegalArgumentException("energy scales must be given (EnergyScales.illustrative() for the"
                    + " built-in pair)");
        }
        if (!(temperature > 0) || !Double.isFinite(temperature)) {
            throw new IllegalArgumentException("temperature " + temperature + " must be a finite number > 0 (k_B·T in"
                    + " the energy units of A and B)");
        }
        if (slices < 1 || slices > MAX_SLICES) {
            throw new IllegalArgumentException("slice count " + slices + " must lie in 1.." + MAX_SLICES);
        }
    }

    /** One line for people: the method, P, T with its units, the energy scales (the illustrative pair says so). */
    public String describe() {
        return "simulated quantum annealing (path integral), " + slices + (slices == 1 ? " slice (the classical limit)"
                : " slices") + ", k_B T = " + temperature + " " + energyScales.units() + ", energy scales: "
                + energyScales.name();
    }

    /** β = 1/T. */
    public double beta() {
        return 1.0 / temperature;
    }
}
