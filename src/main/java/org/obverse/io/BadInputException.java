package org.obverse.io;

import java.nio.file.Path;

/**
 * Input that cannot be used: a file that is malformed, of the wrong kind, or inconsistent with
 * another. The message is one line for a person: which file, where, what is wrong, what to do;
 * it is made safe by {@link Messages#oneLine} (control characters escaped, at most
 * {@link Messages#MAX_MESSAGE} characters). The command line turns it into exit code 2.
 */
public class BadInputException extends RuntimeException {
    public BadInputException(String message) {
        super(Messages.oneLine(message, Messages.MAX_MESSAGE));
    }

    public BadInputException(String message, Throwable cause) {
        super(Messages.oneLine(message, Messages.MAX_MESSAGE), cause);
    }

    /** "file: place: problem; remedy" (place and remedy may be empty). */
    public static BadInputException at(Path file, String place, String problem, String remedy) {
        StringBuilder s = new StringBuilder();
        if (file != null) {
            s.append(file).append(": ");
        }
        if (place != null && !place.isEmpty()) {
            s.append(place).append(": ");
        }
        s.append(problem);
        if (remedy != null && !remedy.isEmpty()) {
            s.append("; ").append(remedy);
        }
        return new BadInputException(s.toString());
    }
}
