package org.obverse.embed;

import java.util.Locale;

/**
 * How strong the coupling inside each chain is, in physical units (it is not scaled with the
 * logical terms). {@link Mode#UNIFORM}: every chain coupler gets {@code value}.
 * {@link Mode#LENGTH} and {@link Mode#DEGREE}: chain c gets value · a_c / max_c a_c, where a_c
 * is the chain's length or its logical degree (at least 1), so that the longest or best
 * connected chain gets {@code value} and every other one a value between 0 and it, inside any
 * coupling range that holds 0 and {@code value}.
 *
 * @param value the chain coupling (negative is ferromagnetic), finite and not 0
 * @param mode  how it is shared out over the chains
 */
public record ChainStrength(double value, Mode mode) {
    /** How the chain coupling varies from chain to chain. */
    public enum Mode {
        /** The same coupling in every chain. */
        UNIFORM,
        /** Proportional to the chain's length (number of qubits). */
        LENGTH,
        /** Proportional to the logical variable's degree (number of logical couplings). */
        DEGREE;

        /** The mode by its lower-case name (uniform, length, degree). */
        public static Mode named(String name) {
            for (Mode m : values()) {
                if (m.name().toLowerCase(Locale.ROOT).equals(name)) {
                    return m;
                }
            }
            throw new IllegalArgumentException("chain coupling mode '" + name + "' is not one of uniform, length, degree");
        }

        /** The lower-case name used in files and on the command line. */
        public String label() {
            return name().toLowerCase(Locale.ROOT);
        }
    }

    public ChainStrength {
        if (!Double.isFinite(value) || value == 0.0) {
            throw new IllegalArgumentException("chain coupling " + value + " must be a finite number other than 0");
        }
        if (mode == null) {
            throw new IllegalArgumentException("chain coupling mode is missing");
        }
    }

    /** The same coupling in every chain. */
    public static ChainStrength uniform(double value) {
        return new ChainStrength(value, Mode.UNIFORM);
    }

    /** The coupling for each chain given its length and logical degree. */
    double[] perChain(int[] lengths, int[] degrees) {
        double[] out = new double[lengths.length];
        int[] a = mode == Mode.LENGTH ? lengths : degrees;
        int max = 1;
        for (int x : a) {
            max = Math.max(max, x);
        }
        for (int c = 0; c < out.length; c++) {
            out[c] = mode == Mode.UNIFORM ? value : value * Math.max(1, a[c]) / max;
        }
        return out;
    }
}
