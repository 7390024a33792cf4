package org.obverse.campaign;

/**
 * One check of an audit and its verdict.
 *
 * @param subject what was checked, e.g. "gauge 3" or "source problem"
 * @param claim   what must hold, in words
 * @param passed  whether it holds
 * @param detail  the evidence: a count where it holds, the first counter-example where not
 */
public record AuditCheck(String subject, String claim, boolean passed, String detail) {
    static AuditCheck pass(String subject, String claim, String detail) {
        return new AuditCheck(subject, claim, true, detail);
    }

    static AuditCheck fail(String subject, String claim, String detail) {
        return new AuditCheck(subject, claim, false, detail);
    }

    static AuditCheck of(String subject, String claim, String failure, String detail) {
        return failure == null ? pass(subject, claim, detail) : fail(subject, claim, failure);
    }

    /** One line: verdict, subject, claim, evidence. */
    public String line() {
        return (passed ? "ok    " : "FAIL  ") + subject + ": " + claim + (detail == null || detail.isEmpty() ? "" : " (" + detail + ")");
    }
}
