package org.obverse.gauge;

import java.util.ArrayList;
import java.util.Collections;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.device.DeviceLimits;
import org.obverse.device.LimitCheck;
import org.obverse.device.LimitViolation;
import org.obverse.device.ValueRange;
import org.obverse.model.IsingProblem;
import org.obverse.random.LegacyStreams;

/**
 * A set of gauges for one problem on one device, drawn by a design from a seed. Each gauge
 * respects the locked clusters, so every gauged coupler and field stays in range; where the
 * device has a per-qubit coupling-sum range, a gauge that breaks it is redrawn (the whole set,
 * for a design that cannot redraw one gauge alone) and the redraws are counted. Immutable.
 */
public final class GaugeSet {
    /** Draws allowed before giving up on a coupling-sum range. */
    public static final int MAX_REDRAWS = 1000;

    private final List<Gauge> gauges;
    private final LockedClusters clusters;
    private final String design;
    private final long seed;
    private final int redraws;
    private final int distinct;

    private GaugeSet(List<Gauge> gauges, LockedClusters clusters, String design, long seed, int redraws, int distinct) {
        this.gauges = Collections.unmodifiableList(gauges);
        this.clusters = clusters;
        this.design = design;
        this.seed = seed;
        this.redraws = redraws;
        this.distinct = distinct;
    }

    /**
     * Draws count gauges.
     *
     * @throws IllegalArgumentException where the source already breaks the limits, or no gauge
     *     within the coupling-sum range was found in {@value #MAX_REDRAWS} draws
     */
    public static GaugeSet draw(IsingProblem p, DeviceLimits d, LockedClusters clusters, GaugeDesign design,
                                int count, long seed) {
        if (count < 1) {
            throw new IllegalArgumentException("gauge count " + count + " must be at least 1");
        }
        List<LimitViolation> v = LimitCheck.violations(p, d);
        if (!v.isEmpty()) {
            throw new IllegalArgumentException("the source problem breaks the device's limits before any gauge ("
                    + v.size() + " violations, first: " + v.get(0).describe() + "); fix the source or the device file");
        }
        UniformRandomProvider rng = LegacyStreams.gauges(seed, 0);
        int free = clusters.freeCount();
        int redraws = 0;
        long[][] masks = design.draw(free, count, rng);
        List<Gauge> out = new ArrayList<>(count);
        for (int g = 0; g < count; g++) {
            Gauge gauge = clusters.gauge(masks[g]);
            while (!withinCouplingSums(p, d, gauge)) {
                if (++redraws > MAX_REDRAWS) {
                    throw new IllegalArgumentException("no gauge within the per-qubit coupling-sum range "
                            + d.couplingSumRange().orElseThrow() + " after " + MAX_REDRAWS
                            + " draws; widen the range or lock more qubits together");
                }
                if (design.redrawOne(masks[g], free, rng)) {
                    gauge = clusters.gauge(masks[g]);
                } else {
                    masks = design.draw(free, count, rng);
                    out.clear();
                    g = 0;
                    gauge = clusters.gauge(masks[0]);
                }
            }
            out.add(gauge);
        }
        return new GaugeSet(out, clusters, design.label(), seed, redraws, countDistinct(p, out));
    }

    /** Whether the gauged problem keeps every qubit's coupling sum in range (true where there is none). */
    public static boolean withinCouplingSums(IsingProblem p, DeviceLimits d, Gauge g) {
        if (d.couplingSumRange().isEmpty()) {
            return true;
        }
        ValueRange r = d.couplingSumRange().get();
        for (double s : LimitCheck.couplingSums(GaugeTransform.apply(p, g))) {
            if (!r.contains(s)) {
                return false;
            }
        }
        return true;
    }

    /**
     * How many of the gauges give different gauged problems. g and −g restricted to a connected
     * component (of the non-zero couplers) without non-zero fields give the same problem, so each
     * gauge is first brought to a canonical form with that component's smallest position unflipped.
     */
    public static int countDistinct(IsingProblem p, List<Gauge> gauges) {
        int n = p.size();
        int[] comp = components(p);
        boolean[] hasField = new boolean[n];
        int[] lowest = new int[n];
        java.util.Arrays.fill(lowest, -1);
        for (int k = 0; k < n; k++) {
            if (p.field(k) != 0.0) {
                hasField[comp[k]] = true;
            }
            if (lowest[comp[k]] < 0) {
                lowest[comp[k]] = k;
            }
        }
        Set<Gauge> seen = new HashSet<>();
        int[] signs = new int[n];
        for (Gauge g : gauges) {
            for (int k = 0; k < n; k++) {
                int c = comp[k];
                int s = g.sign(k);
                signs[k] = !hasField[c] && g.isFlipped(lowest[c]) ? -s : s;
            }
            seen.add(Gauge.ofSigns(signs));
        }
        return seen.size();
    }

    private static int[] components(IsingProblem p) {
        int n = p.size();
        int[] comp = new int[n];
        java.util.Arrays.fill(comp, -1);
        int[] start = p.adjacencyStarts();
        int[] adj = p.adjacencyVariables();
        int[] adjEdge = p.adjacencyEdges();
        int[] stack = new int[n];
        int next = 0;
        for (int s = 0; s < n; s++) {
            if (comp[s] >= 0) {
                continue;
            }
            int top = 0;
            stack[top++] = s;
            comp[s] = next;
            while (top > 0) {
                int k = stack[--top];
                for (int q = start[k]; q < start[k + 1]; q++) {
                    if (p.coupling(adjEdge[q]) != 0.0 && comp[adj[q]] < 0) {
                        comp[adj[q]] = next;
                        stack[top++] = adj[q];
                    }
                }
            }
            next++;
        }
        return comp;
    }

    public List<Gauge> gauges() {
        return gauges;
    }

    public int size() {
        return gauges.size();
    }

    public Gauge gauge(int index) {
        return gauges.get(index);
    }

    public LockedClusters clusters() {
        return clusters;
    }

    public String design() {
        return design;
    }

    public long seed() {
        return seed;
    }

    /** Gauges redrawn because they broke a coupling-sum range. */
    public int redraws() {
        return redraws;
    }

    /** Gauges that give different gauged problems. */
    public int distinctCount() {
        return distinct;
    }
}
