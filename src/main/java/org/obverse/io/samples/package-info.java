/**
 * Sample files: one read per row, one spin per column, in NPY or CSV, coded ±1 or 0/1.
 *
 * <p>{@link org.obverse.io.samples.SampleFiles} opens a {@link org.obverse.io.samples.SampleReader}
 * or {@link org.obverse.io.samples.SampleWriter} by file name and {@link
 * org.obverse.io.samples.SampleFormat}; readers check every value in one branch-free pass and
 * pack 64 reads into the bit-sliced blocks of {@code org.obverse.samples}; writers unpack without
 * re-checking values the program made itself.
 */
package org.obverse.io.samples;
