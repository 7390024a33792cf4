package org.obverse.stats;

/**
 * When a read counts as a success: its energy is at most the ground energy plus a small
 * tolerance, energy ≤ ground + absolute + relative · |ground|. The tolerance absorbs the
 * rounding of energies summed in another order or printed in decimal; the defaults are
 * 1e-9 absolute and 1e-9 relative.
 *
 * @param absolute absolute tolerance (≥ 0)
 * @param relative relative tolerance (≥ 0)
 */
public record SuccessRule(double absolute, double relative) {
    /** 1e-9 absolute plus 1e-9 relative. */
    public static final SuccessRule DEFAULT = new SuccessRule(1e-9, 1e-9);

    /** Validates once. */
    public SuccessRule {
        if (!(absolute >= 0) || !(relative >= 0) || Double.isInfinite(absolute) || Double.isInfinite(relative)) {
            throw new IllegalArgumentException("tolerances must be finite and >= 0, got " + absolute + ", " + relative);
        }
    }

    /** Whether a read of this energy solves an instance of this ground energy. */
    public boolean isSuccess(double energy, double ground) {
        return energy <= ground + absolute + relative * Math.abs(ground);
    }
}
