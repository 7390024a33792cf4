package org.obverse.spectrum;

import org.obverse.anneal.EnergyScales;
import java.util.ArrayList;
import java.util.List;
import org.obverse.model.IsingProblem;

/**
 * s*, Δmin and the pause window of an embedded problem as the chain coupling is swept: at each
 * value the logical problem is embedded afresh (by the caller's {@link EmbeddedFamily}) and
 * analysed. A stronger (more negative, ferromagnetic) chain coupling raises the problem's
 * energy scale, so B(s)·H_P overtakes the driver earlier and s* moves earlier. Stateless.
 */
public final class ChainCouplingScan {
    private ChainCouplingScan() {
    }

    /** The physical problem for a chain coupling (the value every intra-chain coupler gets). */
    @FunctionalInterface
    public interface EmbeddedFamily {
        /** The embedded problem at this chain coupling. */
        IsingProblem at(double chainCoupling);
    }

    /** One row of the sweep. */
    public record Row(double chainCoupling, int spins, MinimumGap minimum, PauseWindow pause) {
    }

    /** Analyses the family at each chain coupling, in the order given. */
    public static List<Row> run(EmbeddedFamily family, double[] chainCouplings, EnergyScales schedule,
                                SpectrumSettings spectrum, ScanSettings scan) {
        if (chainCouplings.length == 0) {
            throw new IllegalArgumentException("no chain couplings to sweep");
        }
        List<Row> rows = new ArrayList<>(chainCouplings.length);
        for (double c : chainCouplings) {
            if (!Double.isFinite(c)) {
                throw new IllegalArgumentException("chain coupling " + c + " is not a finite number");
            }
            IsingProblem physical = family.at(c);
            SpectrumAnalysis analysis = AnnealSpectrum.of(physical, schedule, spectrum).analyse(scan);
            rows.add(new Row(c, physical.size(), analysis.minimum(), analysis.pause()));
        }
        return rows;
    }
}
