/**
 * Strict JSON reading and the canonical content hash.
 *
 * <p>{@link org.obverse.io.json.JsonFiles} reads a document (duplicate keys refused), {@link org.obverse.io.json.JsonFields} names the place of every refusal, and {@link
 * org.obverse.io.json.ContentHash} hashes a document's canonical form so layout and key order
 * never change a manifest's binding while any value does.
 */
package org.obverse.io.json;
