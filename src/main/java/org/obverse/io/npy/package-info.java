/**
 * The NPY container (NumPy format versions 1.0 to 3.0, NEP 1).
 *
 * <p>{@link org.obverse.io.npy.NpyHeader} parses and writes the header, {@link
 * org.obverse.io.npy.NpyDtype} the element types we accept, {@link org.obverse.io.npy.NpyReader}
 * and {@link org.obverse.io.npy.NpyWriter} stream the payload in chunks so files larger than
 * memory pass through, and {@link org.obverse.io.npy.NpyVectors} reads and writes whole
 * one-dimensional arrays (reported energies, run times).
 */
package org.obverse.io.npy;
