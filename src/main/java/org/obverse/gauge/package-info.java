/**
 * Range-aware spin-reversal gauges: sign vectors, lock policies, locked clusters (union–find),
 * gauge designs (random, balanced), gauge sets with coupling-sum redraws, and the transform.
 * Knows no files.
 */
package org.obverse.gauge;
