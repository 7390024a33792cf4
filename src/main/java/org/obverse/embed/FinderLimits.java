package org.obverse.embed;

/**
 * When an embedding finder gives up.
 *
 * @param rounds          the most improvement rounds (each reroutes every chain once), at least 1
 * @param timeLimitMillis wall-clock limit in milliseconds, or 0 for none. With a time limit the
 *                        result may depend on the machine's speed; with rounds alone it depends
 *                        only on the seed.
 */
public record FinderLimits(int rounds, long timeLimitMillis) {
    public FinderLimits {
        if (rounds < 1) {
            throw new IllegalArgumentException("rounds " + rounds + " must be >= 1");
        }
        if (timeLimitMillis < 0) {
            throw new IllegalArgumentException("time limit " + timeLimitMillis + " ms must be >= 0 (0 for none)");
        }
    }

    /** Rounds alone: reproducible from the seed. */
    public static FinderLimits rounds(int rounds) {
        return new FinderLimits(rounds, 0);
    }
}
