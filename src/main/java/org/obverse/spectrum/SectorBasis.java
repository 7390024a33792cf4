package org.obverse.spectrum;

import java.util.stream.IntStream;
import org.obverse.connectivity.DisjointSets;
import org.obverse.model.IsingProblem;

/**
 * The basis of the sector of the anneal's Hilbert space in which the spectrum is computed,
 * with the problem energy H_P precomputed on it. Immutable after construction.
 *
 * <p><b>Basis convention.</b> A computational basis state is an index b; bit p of b set means
 * the spin stored at bit p is +1 (σᶻ = +1), clear means −1, as in the bit-sliced sample
 * blocks.
 *
 * <p><b>Reachable sector.</b> The anneal starts in the ground state of the driver, the uniform
 * superposition |+…+⟩. Flipping every spin of a connected component of the coupling graph
 * that carries no field (no h ≠ 0; a coupler with J = 0 joins nothing) commutes with H(s) for
 * every s and leaves |+…+⟩ unchanged, so the state stays in the subspace that is even under
 * each such flip. For a connected problem without fields that is the even sector of the
 * global flip b → ~b; with fields on every component there is no such symmetry and the sector
 * is the whole space. The even subspace is represented by one state per orbit: the component's
 * lowest-position spin (its anchor) is fixed at +1 and not stored, so the sector has dimension
 * 2^(n − c) for c field-free components. Flipping an anchor maps a representative to the
 * representative with the component's other spins flipped, with amplitude +1 (the orbits all
 * have the same size), so the driver stays a sum of bit flips: spin k acts as b → b ^ mask(k).
 * Permutation symmetries of a problem (graph automorphisms) are not used; where a problem has
 * them, some computed levels may lie in sectors the anneal cannot reach.
 *
 * <p>{@link Sector#FULL} keeps every spin (dimension 2^n), for comparison.
 *
 * <p>Cost: the problem energy of every representative, O(2^m · (n + couplers)) once, over
 * both cores; memory 8 · 2^m bytes.
 */
public final class SectorBasis {
    /** Largest number of stored spins (the sector has dimension 2^30 at most). */
    public static final int MAX_STORED_SPINS = 30;

    /** Which part of the Hilbert space to use. */
    public enum Sector {
        /** Even under the flip of each field-free component: what the anneal can reach. */
        REACHABLE,
        /** The whole space, 2^n states. */
        FULL
    }

    private final int spins;
    private final int storedSpins;
    private final int symmetryComponents;
    private final Sector sector;
    private final int[] flipMasks;
    private final double[] energies;
    private final double minimumEnergy;
    private final int groundDegeneracy;
    private final double energyScale;

    private SectorBasis(IsingProblem problem, Sector sector) {
        int n = problem.size();
        this.spins = n;
        this.sector = sector;
        int[] component = components(problem);
        boolean[] hasField = new boolean[n];
        for (int k = 0; k < n; k++) {
            if (problem.field(k) != 0.0) {
                hasField[component[k]] = true;
            }
        }
        // Anchor: the lowest position of each field-free component (component roots are lowest).
        boolean[] anchor = new boolean[n];
        int c = 0;
        if (sector == Sector.REACHABLE) {
            for (int k = 0; k < n; k++) {
                if (component[k] == k && !hasField[k]) {
                    anchor[k] = true;
                    c++;
                }
            }
        }
        this.symmetryComponents = c;
        int m = n - c;
        if (m > MAX_STORED_SPINS) {
            throw new IllegalArgumentException("the sector would store " + m + " spins; at most "
                    + MAX_STORED_SPINS + " can be held");
        }
        this.storedSpins = m;
        int[] bitOf = new int[n];
        int next = 0;
        for (int k = 0; k < n; k++) {
            bitOf[k] = anchor[k] ? -1 : next++;
        }
        flipMasks = new int[n];
        for (int k = 0; k < n; k++) {
            if (!anchor[k]) {
                flipMasks[k] = 1 << bitOf[k];
            }
        }
        for (int k = 0; k < n; k++) {
            if (!anchor[k] && anchor[component[k]]) {
                flipMasks[component[k]] |= 1 << bitOf[k];
            }
        }
        energies = problemEnergies(problem, bitOf, m);
        double min = Double.POSITIVE_INFINITY;
        for (double e : energies) {
            min = Math.min(min, e);
        }
        double scale = Math.abs(problem.offset());
        for (int k = 0; k < n; k++) {
            scale += Math.abs(problem.field(k));
        }
        for (int e = 0; e < problem.edgeCount(); e++) {
            scale += Math.abs(problem.coupling(e));
        }
        this.energyScale = Math.max(1.0, scale);
        this.minimumEnergy = min;
        double tol = DEGENERACY_TOLERANCE * energyScale;
        int g = 0;
        for (double e : energies) {
            if (e <= min + tol) {
                g++;
            }
        }
        this.groundDegeneracy = g;
    }

    /**
     * Two problem energies closer than this times the energy scale (|offset| + Σ|h| + Σ|J|, at
     * least 1) count as one level: the rule that decides which levels end in the ground
     * manifold at s = 1.
     */
    public static final double DEGENERACY_TOLERANCE = 1e-9;

    /**
     * The sector of a problem. Refuses a sector of more than {@link #MAX_STORED_SPINS} stored
     * spins; the solvers have lower limits of their own.
     */
    public static SectorBasis of(IsingProblem problem, Sector sector) {
        return new SectorBasis(problem, sector);
    }

    /** Number of stored spins m that a sector of this problem would have (without building it). */
    public static int storedSpins(IsingProblem problem, Sector sector) {
        if (sector == Sector.FULL) {
            return problem.size();
        }
        int[] component = components(problem);
        boolean[] hasField = new boolean[problem.size()];
        for (int k = 0; k < problem.size(); k++) {
            if (problem.field(k) != 0.0) {
                hasField[component[k]] = true;
            }
        }
        int c = 0;
        for (int k = 0; k < problem.size(); k++) {
            if (component[k] == k && !hasField[k]) {
                c++;
            }
        }
        return problem.size() - c;
    }

    // Components over couplers with J ≠ 0; each position maps to its component's lowest position.
    private static int[] components(IsingProblem problem) {
        DisjointSets sets = DisjointSets.of(problem.size());
        for (int e = 0; e < problem.edgeCount(); e++) {
            if (problem.coupling(e) != 0.0) {
                sets.union(problem.edgeU(e), problem.edgeV(e));
            }
        }
        return sets.smallestMembers();
    }

    // E_P of every representative, summed in IsingProblem.energy's order (fields, couplers, offset).
    private static double[] problemEnergies(IsingProblem problem, int[] bitOf, int m) {
        int n = problem.size();
        double[] h = problem.fields();
        int[] u = problem.edgeUs();
        int[] v = problem.edgeVs();
        double[] j = problem.couplings();
        double offset = problem.offset();
        int dim = 1 << m;
        double[] out = new double[dim];
        int chunk = 1 << 12;
        int chunks = (dim + chunk - 1) / chunk;
        IntStream.range(0, chunks).parallel().forEach(q -> {
            int[] spin = new int[n];
            int end = Math.min(dim, (q + 1) * chunk);
            for (int b = q * chunk; b < end; b++) {
                for (int k = 0; k < n; k++) {
                    spin[k] = bitOf[k] < 0 ? 1 : (((b >>> bitOf[k]) & 1) == 1 ? 1 : -1);
                }
                double sum = 0.0;
                for (int k = 0; k < n; k++) {
                    sum += h[k] * spin[k];
                }
                for (int e = 0; e < j.length; e++) {
                    sum += j[e] * (spin[u[e]] * spin[v[e]]);
                }
                out[b] = sum + offset;
            }
        });
        return out;
    }

    /** Number of spins of the problem. */
    public int spins() {
        return spins;
    }

    /** Number of stored spins m: the sector has dimension 2^m. */
    public int storedSpins() {
        return storedSpins;
    }

    /** Dimension of the sector, 2^m. */
    public int dimension() {
        return 1 << storedSpins;
    }

    /** Number of field-free components whose flip symmetry reduced the space (0 for FULL). */
    public int symmetryComponents() {
        return symmetryComponents;
    }

    /** The sector kind. */
    public Sector sector() {
        return sector;
    }

    /** Bit mask that σˣ of spin k (position k) flips in a representative; 0 leaves it unchanged. */
    public int flipMask(int k) {
        return flipMasks[k];
    }

    /** The flip masks by position (a copy). */
    public int[] flipMasks() {
        return flipMasks.clone();
    }

    /** H_P of representative b. */
    public double problemEnergy(int b) {
        return energies[b];
    }

    /** H_P of every representative (the internal array, not a copy: read only). */
    double[] problemEnergiesView() {
        return energies;
    }

    /** The lowest problem energy in the sector. */
    public double minimumEnergy() {
        return minimumEnergy;
    }

    /**
     * Number of sector states whose problem energy equals the minimum within
     * {@link #DEGENERACY_TOLERANCE}: the number of levels that end in the ground manifold at
     * s = 1 (1 for a unique ground state up to the sector's symmetry).
     */
    public int groundDegeneracy() {
        return groundDegeneracy;
    }

    /** |offset| + Σ|h| + Σ|J|, at least 1: the scale that tolerances are relative to. */
    public double energyScale() {
        return energyScale;
    }
}
