/**
 * Bit-sliced sample blocks (one long holds one spin over 64 reads) and the kernels over them:
 * un-gauging, energies. Knows no files.
 *
 * <ul>
 *   <li>{@link org.obverse.samples.SampleBlock}: the layout every kernel works on.</li>
 *   <li>{@link org.obverse.samples.SpinFlip}: un-gauging (and gauging): an XOR of the flipped
 *       spins' words with the live-read mask.</li>
 *   <li>{@link org.obverse.samples.EnergyKernel}: energies per read; {@code exact} equals
 *       {@link org.obverse.model.IsingProblem#energy(byte[])} bit for bit, {@code of} plans
 *       bit counters, cluster tables and byte tables within a stated tolerance.</li>
 * </ul>
 */
package org.obverse.samples;
