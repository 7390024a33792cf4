package org.obverse.io.table;

import java.util.Locale;

/**
 * Whose energies a results table or a ground-energy file holds: the logical problem's, or the
 * physical (embedded, device-unit) problem's. Physical energies of an embedded problem are
 * scale · logical + chain energy, so scoring one against the other is meaningless.
 */
public enum EnergyFrame {
    /** Energies of the logical problem (also of a problem sampled directly, its own logical problem). */
    LOGICAL,
    /** Energies of the physical problem an embedding wrote. */
    PHYSICAL;

    /** The label written in files: {@code logical} or {@code physical}. */
    public String label() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** The frame of a label, or null where it is neither. */
    public static EnergyFrame ofLabel(String label) {
        for (EnergyFrame f : values()) {
            if (f.label().equals(label)) {
                return f;
            }
        }
        return null;
    }
}
