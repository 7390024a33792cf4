package org.obverse.spectrum;

/**
 * A problem too large for the chosen solver; the message names the limit and the memory it would
 * need. A caller that lets its user choose the solver adds how to choose another one.
 */
public final class SpectrumLimitException extends IllegalArgumentException {
    private final String solver;

    private SpectrumLimitException(String solver, String message) {
        super(message);
        this.solver = solver;
    }

    static SpectrumLimitException of(String solver, int spins, int stored, int limit, long bytes) {
        return new SpectrumLimitException(solver, "problem has " + spins + " spins, so the sector has dimension 2^"
                + stored + " = " + (1L << stored) + "; the " + solver + " solver handles at most 2^" + limit
                + " (this one would need about " + humanBytes(bytes) + " of memory); use a smaller problem");
    }

    /** The name of the solver that refused the problem ({@code dense} or {@code lanczos}). */
    public String solver() {
        return solver;
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
