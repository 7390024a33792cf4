package org.obverse.io.codec;

import com.fasterxml.jackson.databind.node.ObjectNode;
import org.obverse.model.BinaryProblem;
import org.obverse.model.IsingProblem;

/**
 * The content of an {@code obverse.problem/1} file: a spin or a binary problem and its
 * {@code meta} object, kept verbatim (null where absent).
 *
 * @param ising  the spin problem, or null for a binary file
 * @param binary the binary problem, or null for a spin file
 * @param meta   the meta object, or null
 */
public record ProblemFile(IsingProblem ising, BinaryProblem binary, ObjectNode meta) {
    public ProblemFile {
        if ((ising == null) == (binary == null)) {
            throw new IllegalArgumentException("a problem file holds exactly one of a spin and a binary problem");
        }
    }

    public static ProblemFile of(IsingProblem p, ObjectNode meta) {
        return new ProblemFile(p, null, meta);
    }

    public static ProblemFile of(BinaryProblem p, ObjectNode meta) {
        return new ProblemFile(null, p, meta);
    }

    /** "spin" or "binary". */
    public String domain() {
        return ising != null ? "spin" : "binary";
    }

    /** The problem as a spin problem (a binary one converted exactly as DESIGN.md states). */
    public IsingProblem spin() {
        return ising != null ? ising : binary.toIsing();
    }

    /** Ascending variable ids. */
    public org.obverse.model.VariableIndex variables() {
        return ising != null ? ising.variables() : binary.variables();
    }
}
