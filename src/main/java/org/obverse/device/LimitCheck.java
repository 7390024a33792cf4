package org.obverse.device;

import java.util.ArrayList;
import java.util.List;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;

/** Checks a spin problem, on qubit ids, against a device's limits and lists every violation. */
public final class LimitCheck {
    private LimitCheck() {
    }

    /** Every violation, in a fixed order: graph, fields, couplings, coupling sums. Empty where it complies. */
    public static List<LimitViolation> violations(IsingProblem p, DeviceLimits d) {
        List<LimitViolation> out = new ArrayList<>();
        VariableIndex ids = p.variables();
        d.graph().ifPresent(g -> {
            for (int k = 0; k < p.size(); k++) {
                if (!g.hasQubit(ids.id(k))) {
                    out.add(new LimitViolation("qubit " + ids.id(k), Double.NaN, null, "is not in the device's working graph"));
                }
            }
            for (int e = 0; e < p.edgeCount(); e++) {
                int a = ids.id(p.edgeU(e));
                int b = ids.id(p.edgeV(e));
                if (!g.hasCoupler(a, b)) {
                    out.add(new LimitViolation("coupler (" + a + ", " + b + ")", p.coupling(e), null,
                            "is not in the device's working graph"));
                }
            }
        });
        ValueRange fr = d.fieldRange();
        for (int k = 0; k < p.size(); k++) {
            if (!fr.contains(p.field(k))) {
                out.add(new LimitViolation("field of " + ids.id(k), p.field(k), fr, "is outside the field range"));
            }
        }
        for (int e = 0; e < p.edgeCount(); e++) {
            int a = ids.id(p.edgeU(e));
            int b = ids.id(p.edgeV(e));
            ValueRange cr = d.couplingRange(a, b);
            if (!cr.contains(p.coupling(e))) {
                out.add(new LimitViolation("coupling (" + a + ", " + b + ")", p.coupling(e), cr,
                        "is outside the coupling range"));
            }
        }
        d.couplingSumRange().ifPresent(sr -> {
            double[] sums = couplingSums(p);
            for (int k = 0; k < sums.length; k++) {
                if (!sr.contains(sums[k])) {
                    out.add(new LimitViolation("coupling sum at " + ids.id(k), sums[k], sr,
                            "is outside the per-qubit coupling-sum range"));
                }
            }
        });
        return out;
    }

    /** Σ_j J_kj for each position k, summed in coupler order. */
    public static double[] couplingSums(IsingProblem p) {
        double[] sums = new double[p.size()];
        for (int e = 0; e < p.edgeCount(); e++) {
            sums[p.edgeU(e)] += p.coupling(e);
            sums[p.edgeV(e)] += p.coupling(e);
        }
        return sums;
    }
}
