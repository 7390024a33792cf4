/**
 * Publishing outputs whole or not at all.
 *
 * <p>{@link org.obverse.io.output.AtomicOutput} writes every output under a temporary name beside
 * its target and renames it into place, refuses to overwrite without force, refuses an output
 * that is one of the command's inputs or lies inside an input folder, and removes what a failed
 * command left. {@link org.obverse.io.output.PendingFile} is one such file open for writing.
 */
package org.obverse.io.output;
