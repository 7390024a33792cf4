package org.obverse.gauge;

/** Which qubits a gauge must keep on the same sign. */
public enum LockPolicy {
    /** Only what the device's limits force: couplers whose negation leaves the range, fields likewise. */
    RANGE("range"),
    /** Each chain of an embedding is one cluster, plus what the limits force: equals gauging the logical problem. */
    CHAINS("chains");

    private final String label;

    LockPolicy(String label) {
        this.label = label;
    }

    /** The name used in files and on the command line. */
    public String label() {
        return label;
    }

    /** The policy of a label ("range" or "chains"). */
    public static LockPolicy ofLabel(String label) {
        for (LockPolicy p : values()) {
            if (p.label.equals(label)) {
                return p;
            }
        }
        throw new IllegalArgumentException("lock policy \"" + label + "\" is unknown; use range or chains");
    }
}
