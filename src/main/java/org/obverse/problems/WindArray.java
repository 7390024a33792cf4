package org.obverse.problems;

import java.util.List;

/**
 * The demo scenario: a small offshore wind array whose turbines must be joined to the
 * substation by a tree of export cables of least total length, where each turbine's
 * switchgear has only a few cable bays (a degree bound) and a feeder may string only so many
 * turbines (a depth bound). Coordinates, bays and candidate cables are invented for the demo;
 * cable length is the straight-line distance in km. A real cable layout follows the electrical
 * codes and a licensed engineer. Immutable.
 *
 * @param sites      site names, the substation first (node 0, the root)
 * @param x          east coordinate of each site, km
 * @param y          north coordinate of each site, km
 * @param cables     candidate cables as {site, site}
 * @param bays       cable bays of each site (its degree bound)
 * @param maxString  most turbines on one feeder counted from the substation (the depth bound)
 */
public record WindArray(List<String> sites, double[] x, double[] y, int[][] cables, int[] bays, int maxString) {
    /**
     * The demo instance: substation S and turbines T1, T2, T3; five candidate cables; two bays
     * everywhere; feeders of at most two turbines. The shortest tree overall would take three
     * cables into T1 (T1–S, T1–T2, T1–T3), which has two bays, so the bound binds: the best
     * layout is S–T1–T3 with S–T2. Its QUBO has 18 variables.
     */
    public static WindArray demo() {
        return new WindArray(List.of("S", "T1", "T2", "T3"),
                new double[] {0.0, 1.0, 0.9, 2.0},
                new double[] {0.0, 0.3, -0.8, 0.1},
                new int[][] {{0, 1}, {0, 2}, {1, 2}, {1, 3}, {2, 3}},
                new int[] {2, 2, 2, 2}, 2);
    }

    /**
     * A larger instance: the demo plus turbine T4 and two more cables, feeders of any length
     * (depth bound 4). Its QUBO has more variables (see {@link #problem()}).
     */
    public static WindArray fiveSites() {
        return new WindArray(List.of("S", "T1", "T2", "T3", "T4"),
                new double[] {0.0, 1.0, 0.9, 2.0, 1.9},
                new double[] {0.0, 0.3, -0.8, 0.1, -0.9},
                new int[][] {{0, 1}, {0, 2}, {1, 2}, {1, 3}, {2, 3}, {2, 4}, {3, 4}},
                new int[] {2, 2, 2, 2, 2}, 4);
    }

    /** Cable lengths: the straight-line distance between the sites, km. */
    public double[] cableLengths() {
        double[] out = new double[cables.length];
        for (int e = 0; e < cables.length; e++) {
            int a = cables[e][0];
            int b = cables[e][1];
            out[e] = Math.hypot(x[a] - x[b], y[a] - y[b]);
        }
        return out;
    }

    /** The degree-bounded spanning-tree instance (root = the substation, node 0). */
    public DegreeBoundedSpanningTree problem() {
        return DegreeBoundedSpanningTree.of(sites.size(), 0, cables, cableLengths(), bays, maxString);
    }

    /** A layout for a person: "S-T1, S-T2, T1-T3 (3.268 km)". */
    public String describe(int[] cableNumbers) {
        StringBuilder b = new StringBuilder();
        double km = 0;
        double[] len = cableLengths();
        for (int e : cableNumbers) {
            b.append(b.length() == 0 ? "" : ", ").append(cableName(e));
            km += len[e];
        }
        return b.append(String.format(java.util.Locale.ROOT, " (%.3f km)", km)).toString();
    }

    /** A cable by name, e.g. "S-T1". */
    public String cableName(int e) {
        return sites.get(cables[e][0]) + "-" + sites.get(cables[e][1]);
    }
}
