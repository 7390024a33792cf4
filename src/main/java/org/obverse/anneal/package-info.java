/**
 * Anneal schedules with a pause and a quench, the control-error model of a simulated analog
 * device, and the reference sampler (simulated annealing with exact single-spin Metropolis
 * and a multi-spin-coded variant). Uses model and samples; knows no files and no console.
 */
package org.obverse.anneal;
