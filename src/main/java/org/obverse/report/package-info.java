/**
 * Plots (drawn with XChart, written as PNG and SVG) and the self-contained HTML report of a
 * scored campaign: TTS and success against a swept setting with bootstrap bands, the
 * per-gauge success distribution, instance-wise comparisons, and the bias map of the qubits.
 */
package org.obverse.report;
