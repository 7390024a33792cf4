package org.obverse.embed;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.obverse.device.DeviceLimits;
import org.obverse.device.LimitCheck;
import org.obverse.device.LimitViolation;
import org.obverse.device.QubitGraph;
import org.obverse.device.ValueRange;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;

/**
 * Places a logical spin problem on a device through chains (Choi, "Minor-embedding in
 * adiabatic quantum computation: I. The parameter setting problem", Quantum Inf. Process. 7,
 * 193, 2008): a logical field h_v is spread evenly over the L_v qubits of chain v, a logical
 * coupling J_uv evenly over the c_uv working couplers between chains u and v, and every
 * working coupler inside a chain gets the chain coupling. The logical terms are multiplied by
 * one scale so that every spread term fits the symmetric part [-m, m] of its range (the
 * field range, or the coupler's own coupling range); the chain coupling is physical and not
 * scaled, and must lie in each chain coupler's range. The physical offset is scale · the
 * logical offset.
 */
public final class ChainEmbedder {
    private ChainEmbedder() {
    }

    /** Embeds with the largest scale that fits (see {@link #embed(IsingProblem, Chains, DeviceLimits, ChainStrength, double)}). */
    public static EmbeddedProblem embed(IsingProblem logical, Chains chains, DeviceLimits device, ChainStrength strength) {
        return embed(logical, chains, device, strength, Double.NaN);
    }

    /**
     * Embeds a logical problem.
     *
     * @param logical  Input: the logical problem; every variable needs a chain (chains of other ids are ignored)
     * @param chains   Input: the chains; must be a valid embedding in the device's working graph
     * @param device   Input: the limits, with a working graph
     * @param strength Input: the chain coupling
     * @param scale    the scale to use, or NaN for the largest that fits the symmetric ranges
     * @throws IllegalArgumentException where the device has no graph, the chains are not valid,
     *                                  a chain coupling is outside a coupler's range, a given scale does not fit, or
     *                                  the result breaks another limit (such as a coupling-sum range); the message
     *                                  names the first such problem
     */
    public static EmbeddedProblem embed(IsingProblem logical, Chains chains, DeviceLimits device, ChainStrength strength,
                                        double scale) {
        QubitGraph graph = device.graph().orElseThrow(() -> new IllegalArgumentException(
                "the device lists no working graph (qubits and couplers); embedding needs one"));
        Chains used = chains.restrictedTo(logical.variables());
        EmbeddingCheck.requireValid(logical, used, graph);

        VariableIndex qubits = used.allQubits();
        int n = qubits.size();
        int[] owner = new int[n];
        for (int c = 0; c < used.size(); c++) {
            for (int q : used.chain(c)) {
                owner[qubits.indexOf(q)] = c;
            }
        }
        // Walk every working coupler among the chain qubits once: inside a chain, or between two.
        int[] chainCouplers = new int[used.size()];
        List<long[]> inside = new ArrayList<>();
        int[] between = new int[logical.edgeCount()];
        List<long[]> across = new ArrayList<>();
        for (int a = 0; a < n; a++) {
            int qa = qubits.id(a);
            for (int qb : graph.neighbours(qa)) {
                int b = qubits.indexOf(qb);
                if (qb <= qa || b < 0) {
                    continue;
                }
                if (owner[a] == owner[b]) {
                    chainCouplers[owner[a]]++;
                    inside.add(new long[] {a, b, owner[a]});
                } else {
                    int e = logical.edgeBetween(owner[a], owner[b]);
                    if (e >= 0) {
                        between[e]++;
                        across.add(new long[] {a, b, e});
                    }
                }
            }
        }

        int[] lengths = new int[used.size()];
        int[] degrees = new int[used.size()];
        for (int c = 0; c < used.size(); c++) {
            lengths[c] = used.length(c);
            degrees[c] = logical.degree(c);
        }
        double[] strengths = strength.perChain(lengths, degrees);
        for (long[] t : inside) {
            int qa = qubits.id((int) t[0]);
            int qb = qubits.id((int) t[1]);
            double v = strengths[(int) t[2]];
            ValueRange r = device.couplingRange(qa, qb);
            if (!r.contains(v)) {
                throw new IllegalArgumentException("chain coupling " + v + " is outside the coupling range " + r
                        + " of chain coupler (" + qa + ", " + qb + "); choose a chain coupling inside the device's range");
            }
        }

        double[] spreadField = new double[n];
        for (int a = 0; a < n; a++) {
            int c = owner[a];
            spreadField[a] = logical.field(c) / lengths[c];
        }
        double[] spreadCoupling = new double[across.size()];
        for (int i = 0; i < spreadCoupling.length; i++) {
            int e = (int) across.get(i)[2];
            spreadCoupling[i] = logical.coupling(e) / between[e];
        }

        double s = Double.isNaN(scale) ? largestScale(qubits, spreadField, across, spreadCoupling, device) : scale;
        if (!(s > 0) || !Double.isFinite(s)) {
            throw new IllegalArgumentException("scale " + s + " must be a finite number above 0");
        }
        double[] fields = new double[n];
        for (int a = 0; a < n; a++) {
            fields[a] = s * spreadField[a];
        }
        long[] keys = new long[inside.size() + across.size()];
        double[] values = new double[keys.length];
        int m = 0;
        for (long[] t : inside) {
            keys[m] = (t[0] << 32) | t[1];
            values[m++] = strengths[(int) t[2]];
        }
        for (int i = 0; i < across.size(); i++) {
            long[] t = across.get(i);
            keys[m] = (t[0] << 32) | t[1];
            values[m++] = s * spreadCoupling[i];
        }
        Integer[] order = new Integer[keys.length];
        for (int i = 0; i < order.length; i++) {
            order[i] = i;
        }
        Arrays.sort(order, (x, y) -> Long.compare(keys[x], keys[y]));
        int[] eu = new int[keys.length];
        int[] ev = new int[keys.length];
        double[] j = new double[keys.length];
        for (int i = 0; i < order.length; i++) {
            long k = keys[order[i]];
            eu[i] = (int) (k >>> 32);
            ev[i] = (int) k;
            j[i] = values[order[i]];
        }
        IsingProblem physical = IsingProblem.of(qubits, fields, eu, ev, j, s * logical.offset());
        checkScaledTerms(qubits, across, s, spreadField, spreadCoupling, device);
        List<LimitViolation> v = LimitCheck.violations(physical, device);
        if (!v.isEmpty()) {
            throw new IllegalArgumentException("the embedded problem breaks the device's limits: " + v.get(0).describe()
                    + (v.size() > 1 ? " (and " + (v.size() - 1) + " more)" : "")
                    + "; choose a weaker chain coupling or a smaller scale");
        }
        return new EmbeddedProblem(physical, used, s, strength, strengths, chainCouplers);
    }

    /** The largest s with s·|t| inside the symmetric half width of each spread term's range. */
    private static double largestScale(VariableIndex qubits, double[] spreadField, List<long[]> across,
                                       double[] spreadCoupling, DeviceLimits device) {
        double s = Double.POSITIVE_INFINITY;
        double fieldWidth = device.fieldRange().symmetricHalfWidth();
        for (double h : spreadField) {
            if (h != 0.0) {
                s = Math.min(s, fieldWidth / Math.abs(h));
            }
        }
        for (int i = 0; i < spreadCoupling.length; i++) {
            if (spreadCoupling[i] != 0.0) {
                long[] t = across.get(i);
                double w = device.couplingRange(qubits.id((int) t[0]), qubits.id((int) t[1])).symmetricHalfWidth();
                s = Math.min(s, w / Math.abs(spreadCoupling[i]));
            }
        }
        if (s == 0.0) {
            throw new IllegalArgumentException("the device's field or coupling range has no symmetric part around 0,"
                    + " so signed logical terms cannot be placed");
        }
        if (s == Double.POSITIVE_INFINITY) {
            return 1.0;
        }
        // s·|t| may round one unit above the width: step down until every term fits.
        while (!fits(s, qubits, spreadField, across, spreadCoupling, device)) {
            s = Math.nextDown(s);
        }
        return s;
    }

    private static boolean fits(double s, VariableIndex qubits, double[] spreadField, List<long[]> across,
                                double[] spreadCoupling, DeviceLimits device) {
        double fieldWidth = device.fieldRange().symmetricHalfWidth();
        for (double h : spreadField) {
            if (Math.abs(s * h) > fieldWidth) {
                return false;
            }
        }
        for (int i = 0; i < spreadCoupling.length; i++) {
            long[] t = across.get(i);
            double w = device.couplingRange(qubits.id((int) t[0]), qubits.id((int) t[1])).symmetricHalfWidth();
            if (Math.abs(s * spreadCoupling[i]) > w) {
                return false;
            }
        }
        return true;
    }

    private static void checkScaledTerms(VariableIndex qubits, List<long[]> across, double s,
                                         double[] spreadField, double[] spreadCoupling, DeviceLimits device) {
        if (!fits(s, qubits, spreadField, across, spreadCoupling, device)) {
            throw new IllegalArgumentException("scale " + s + " puts logical terms outside the symmetric part of the"
                    + " device's ranges (field " + device.fieldRange() + ", coupling " + device.couplingRange()
                    + "); choose a smaller scale or let it be chosen");
        }
    }
}
