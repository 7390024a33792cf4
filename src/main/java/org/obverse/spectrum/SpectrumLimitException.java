package org.obverse.spectrum;

/** A problem too large for the chosen solver; the message names the limit and the memory it would need. */
public final class SpectrumLimitException extends IllegalArgumentException {
    private SpectrumLimitException(String message) {
        super(message);
    }

    static SpectrumLimitException of(String solver, int spins, int stored, int limit, long bytes) {
        return new SpectrumLimitException("problem has " + spins + " spins, so the sector has dimension 2^" + stored
                + " = " + (1L << stored) + "; the " + solver + " solver handles at most 2^" + limit
                + " (this one would need about " + humanBytes(bytes) + " of memory); use a smaller problem"
                + (solver.equals("dense") ? " or --solver lanczos" : ""));
    }

    static String humanBytes(long bytes) {
        if (bytes >= 1L << 40) {
            return String.format(java.util.Locale.ROOT, "%.1f TiB", bytes / (double) (1L << 40));
        }
        if (bytes >= 1L << 30) {
            return String.format(java.util.Locale.ROOT, "%.1f GiB", bytes / (double) (1L << 30));
        }
        return String.format(java.util.Locale.ROOT, "%.1f MiB", bytes / (double) (1L << 20));
    }
}
