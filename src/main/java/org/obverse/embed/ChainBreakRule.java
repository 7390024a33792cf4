package org.obverse.embed;

import java.util.Locale;

/**
 * How a read whose chains disagree becomes a logical read (King &amp; McGeoch, arXiv:1410.2628,
 * 2014, compare such rules; majority vote as in Venturelli et al., Phys. Rev. X 5, 031040, 2015).
 */
public enum ChainBreakRule {
    /** A read with any broken chain is dropped (it still counts as a read when scoring). */
    DISCARD,
    /** Each chain takes the value most of its qubits hold; a tie is broken as {@link ChainDecoder} documents. */
    MAJORITY,
    /** Majority, then greedy single-variable descent on the logical problem until no flip lowers the energy. */
    DESCEND;

    /** The rule by its lower-case name (discard, majority, descend). */
    public static ChainBreakRule named(String name) {
        for (ChainBreakRule r : values()) {
            if (r.label().equals(name)) {
                return r;
            }
        }
        throw new IllegalArgumentException("chain-break rule '" + name + "' is not one of discard, majority, descend");
    }

    /** The lower-case name used on the command line and in files. */
    public String label() {
        return name().toLowerCase(Locale.ROOT);
    }
}
