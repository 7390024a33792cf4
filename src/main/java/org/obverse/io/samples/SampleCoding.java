package org.obverse.io.samples;

/**
 * How a sample file writes a spin: {@link #SPIN} as −1/+1 (the default, as DESIGN.md pins),
 * {@link #BINARY} as 0/1 with x = (1 + s) / 2, on request. In memory a sample is always a spin.
 */
public enum SampleCoding {
    /** −1 and +1. */
    SPIN,
    /** 0 for s = −1 and 1 for s = +1. */
    BINARY;

    /** The stored value of a spin s (−1 or +1). */
    byte encode(int s) {
        return (byte) (this == SPIN ? s : (s + 1) >> 1);
    }

    /** What a stored value must be, for messages. */
    String rule() {
        return this == SPIN ? "spins must be -1 or +1" : "binary values must be 0 or 1";
    }
}
