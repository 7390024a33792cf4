package org.obverse.embed;

/** A finder stopped without an embedding; the message says how close it came and what to try. */
public final class EmbeddingNotFoundException extends IllegalArgumentException {
    public EmbeddingNotFoundException(String message) {
        super(message);
    }
}
