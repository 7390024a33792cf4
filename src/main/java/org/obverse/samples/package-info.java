/**
 * Bit-sliced sample blocks (one long holds one spin over 64 reads) and the kernels over them:
 * un-gauging, energies. Knows no files.
 */
package org.obverse.samples;
