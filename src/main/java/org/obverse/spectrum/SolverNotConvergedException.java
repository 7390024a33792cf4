package org.obverse.spectrum;

/**
 * An iterative eigensolver that gave up before its residual tolerance: the problem is valid, but
 * these solver settings do not reach it. The message says how far it got; a caller that lets its
 * user choose the solver or the tolerance adds which to change.
 */
public final class SolverNotConvergedException extends IllegalStateException {
    SolverNotConvergedException(String message) {
        super(message);
    }
}
