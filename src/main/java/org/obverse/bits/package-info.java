/**
 * Bit-sliced counting: {@link org.obverse.bits.BitSlicedCounter} keeps 64 counts in a few
 * {@code long} words (word p holds bit p of every count) and adds, compares and reads them with
 * whole-word operations; the energy kernels count terms with it and the chain decoder counts
 * a chain's +1 qubits and a read's broken chains. A bottom package: it imports nothing of the
 * project, and every other package may use it.
 */
package org.obverse.bits;
