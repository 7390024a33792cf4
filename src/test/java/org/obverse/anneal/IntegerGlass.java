package org.obverse.anneal;

import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.model.IsingProblem;
import org.obverse.problems.SpinGlasses;

/**
 * A random integer problem on a small cell grid, in the compressed rows the Metropolis kernels
 * take: couplings uniform in [−couplingScale, couplingScale] per edge, a field uniform in
 * [−fieldScale, fieldScale] on about a third of the spins, each as ints and as the same doubles.
 * Invented test data (the grid from {@link SpinGlasses#cellGrid}).
 */
final class IntegerGlass {
    final IsingProblem grid;
    final int n;
    final int[] start;
    final int[] neighbour;
    final int[] intCoupling;
    final double[] coupling;
    final int[] intFields;
    final double[] fields;

    private IntegerGlass(IsingProblem grid, int[] intCoupling, double[] coupling, int[] intFields, double[] fields) {
        this.grid = grid;
        this.n = grid.size();
        this.start = grid.adjacencyStarts();
        this.neighbour = grid.adjacencyVariables();
        this.intCoupling = intCoupling;
        this.coupling = coupling;
        this.intFields = intFields;
        this.fields = fields;
    }

    /** On a grid of 1–3 by 1–3 cells, drawn first. */
    static IntegerGlass random(UniformRandomProvider rng, int couplingScale, int fieldScale) {
        return on(SpinGlasses.cellGrid(1 + rng.nextInt(3), 1 + rng.nextInt(3), SpinGlasses.Couplings.PLUS_MINUS_ONE, rng),
                rng, couplingScale, fieldScale);
    }

    /** On the given grid's edges (its own couplings replaced). */
    static IntegerGlass on(IsingProblem p, UniformRandomProvider rng, int couplingScale, int fieldScale) {
        int n = p.size();
        int[] edge = p.adjacencyEdges();
        int[] perEdge = new int[p.edgeCount()];
        for (int e = 0; e < perEdge.length; e++) {
            perEdge[e] = rng.nextInt(2 * couplingScale + 1) - couplingScale;
        }
        int[] intCoupling = new int[edge.length];
        double[] coupling = new double[edge.length];
        for (int q = 0; q < edge.length; q++) {
            intCoupling[q] = perEdge[edge[q]];
            coupling[q] = intCoupling[q];
        }
        int[] intFields = new int[n];
        double[] fields = new double[n];
        for (int k = 0; k < n; k++) {
            intFields[k] = rng.nextInt(3) == 0 ? rng.nextInt(2 * fieldScale + 1) - fieldScale : 0;
            fields[k] = intFields[k];
        }
        return new IntegerGlass(p, intCoupling, coupling, intFields, fields);
    }
}
