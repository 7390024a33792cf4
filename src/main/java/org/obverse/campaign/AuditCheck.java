package org.obverse.campaign;

/**
 * One check of an audit and its verdict.
 *
 * @param subject what was checked, e.g. "gauge 3" or "source problem"
 * @param claim   what must hold, in words
 * @param passed  whether it holds
 * @param detail  the evidence: a count where it holds, the first counter-example where not
 * @param skipped the check could not be made (e.g. a problem too large); it then counts as holding
 */
public record AuditCheck(String subject, String claim, boolean passed, String detail, boolean skipped) {
    static AuditCheck pass(String subject, String claim, String detail) {
        return new AuditCheck(subject, claim, true, detail, false);
    }

    static AuditCheck fail(String subject, String claim, String detail) {
        return new AuditCheck(subject, claim, false, detail, false);
    }

    static AuditCheck skip(String subject, String claim, String why) {
        return new AuditCheck(subject, claim, true, why, true);
    }

    static AuditCheck of(String subject, String claim, String failure, String detail) {
        return failure == null ? pass(subject, claim, detail) : fail(subject, claim, failure);
    }

    /** One line: verdict, subject, claim, evidence. */
    public String line() {
        return (skipped ? "skip  " : passed ? "ok    " : "FAIL  ") + subject + ": " + claim + (detail == null || detail.isEmpty() ? "" : " (" + detail + ")");
    }
}
