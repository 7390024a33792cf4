package org.obverse.model;

/** A problem term breaks a rule of the model: the message names the term and the rule. */
public final class InvalidProblemException extends IllegalArgumentException {
    public InvalidProblemException(String message) {
        super(message);
    }
}
