/**
 * Problem builders for demos and tests (spin glasses on a grid of K4,4 cells, max-cut, the
 * degree-bounded minimum spanning tree as a QUBO and the wind-array scenario) and exact
 * solvers for small problems (Gray-code enumeration, spanning-tree enumeration with the
 * matrix-tree count). Uses model; knows no files and no console.
 */
package org.obverse.problems;
