package org.obverse.device;

/**
 * One way a problem breaks a device's limits.
 *
 * @param term    the term, e.g. {@code "coupling (3, 7)"} or {@code "field of 12"}
 * @param value   its value (NaN where the term has no value, e.g. a missing qubit)
 * @param allowed the allowed range, or null where the rule is not a range
 * @param rule    what is wrong, in words
 */
public record LimitViolation(String term, double value, ValueRange allowed, String rule) {
    /** One line for a person. */
    public String describe() {
        StringBuilder s = new StringBuilder(term);
        if (!Double.isNaN(value)) {
            s.append(" = ").append(value);
        }
        s.append(": ").append(rule);
        if (allowed != null) {
            s.append(' ').append(allowed);
        }
        return s.toString();
    }
}
