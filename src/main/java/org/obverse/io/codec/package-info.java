/**
 * The documents a user hands to obverse and gets back: one codec per format.
 *
 * <p>Problems ({@link org.obverse.io.codec.ProblemCodec}; JSON, and NumPy {@code .npy}/{@code .npz}
 * through {@link org.obverse.io.codec.NpyProblemCodec}), devices, chains, control errors, gauge
 * manifests, anneal schedules, campaign plans, a prepared campaign's record and the spectrum
 * summary (written only). Each codec reads and writes its format and no other class does; every
 * refusal names the file and the key path.
 */
package org.obverse.io.codec;
