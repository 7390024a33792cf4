package org.obverse.spectrum;

import org.obverse.anneal.EnergyScales;
import java.util.ArrayList;
import java.util.List;
import java.util.function.IntConsumer;
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

    /** One row of the sweep: the global minimum, the suggested pause window and every dip. */
    public record Row(double chainCoupling, int spins, MinimumGap minimum, PauseWindow pause, List<GapDip> dips,
                      int suggestedDip) {
        /** Keeps an unmodifiable copy of the dips. */
        public Row {
            dips = List.copyOf(dips);
        }
    }

    /** Analyses the family at each chain coupling, in the order given. */
    public static List<Row> run(EmbeddedFamily family, double[] chainCouplings, EnergyScales schedule,
                                SpectrumSettings spectrum, ScanSettings scan) {
        return run(family, chainCouplings, schedule, spectrum, scan, null);
    }

    /**
     * The same, telling pointsDone (if not null) how many grid points are solved so far over
     * the whole sweep (chain couplings × points in all).
     */
    public static List<Row> run(EmbeddedFamily family, double[] chainCouplings, EnergyScales schedule,
                                SpectrumSettings spectrum, ScanSettings scan, IntConsumer pointsDone) {
        if (chainCouplings.length == 0) {
            throw new IllegalArgumentException("no chain couplings to sweep");
        }
        List<Row> rows = new ArrayList<>(chainCouplings.length);
        for (double c : chainCouplings) {
            if (!Double.isFinite(c)) {
                throw new IllegalArgumentException("chain coupling " + c + " is not a finite number");
            }
            IsingProblem physical = family.at(c);
            int before = rows.size() * scan.points();
            SpectrumAnalysis analysis = AnnealSpectrum.of(physical, schedule, spectrum).analyse(scan,
                    pointsDone == null ? null : done -> pointsDone.accept(before + done));
            rows.add(new Row(c, physical.size(), analysis.minimum(), analysis.pause(), analysis.dips(),
                    analysis.suggestedDip()));
        }
        return rows;
    }
}
