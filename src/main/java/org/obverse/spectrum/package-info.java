/**
 * Exact low levels of the anneal Hamiltonian H(s) = -(A(s)/2) Σ σˣ_i + (B(s)/2) H_P(σᶻ) for
 * small problems: anneal schedules, the reachable symmetry sector, a dense (EJML) and a
 * matrix-free Lanczos eigensolver, the relevant gap and its minimum over s, a pause-window
 * heuristic, a chain-coupling scan and a gauge-invariance check. Knows no files and no console;
 * uses only {@code model} and EJML.
 */
package org.obverse.spectrum;
