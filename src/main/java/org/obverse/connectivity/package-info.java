/**
 * Connectivity of small graphs given as lists of joined pairs: {@link
 * org.obverse.connectivity.DisjointSets}, the one union–find of the project (locked clusters
 * of a gauge analysis, field-free components of the spectrum's sector, spanning-tree tests).
 * A bottom package: it imports nothing of the project, and every other package may use it.
 */
package org.obverse.connectivity;
