package org.obverse.spectrum;

import org.obverse.anneal.EnergyScales;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.obverse.model.IsingProblem;
import org.obverse.testsupport.QuietTest;

/**
 * A small embedded problem (three logical spins, chains of 2, 3 and 2 qubits; see
 * {@link TinyEmbedding}) swept over the chain coupling: a stronger ferromagnetic chain coupling
 * raises the energy scale of H_P, B(s)·H_P overtakes the driver earlier, and s* moves earlier.
 * The numbers were computed by this package and are checked independently below against the
 * commons-math3 oracle (full space; every component has fields, so the reachable sector is the
 * whole space and the ground state is unique).
 */
class ChainCouplingScanTest extends QuietTest {
    private static final double[] COUPLINGS = {-0.5, -1.0, -2.0, -4.0};
    // s* and Δmin under the illustrative schedule A = 1 − s, B = s (values from this code, each
    // confirmed below to be a local minimum of the oracle's gap with the same value).
    private static final double[] S_STAR = {0.547750, 0.483450, 0.406187, 0.323742};
    private static final double[] GAP_MIN = {0.1780232, 0.1655189, 0.1458755, 0.1206970};

    @Test
    void minimumGapMovesEarlierAsChainsGrowStronger() {
        TinyEmbedding family = TinyEmbedding.triangle();
        List<ChainCouplingScan.Row> rows = ChainCouplingScan.run(family, COUPLINGS, EnergyScales.illustrative(),
                SpectrumSettings.defaults(), ScanSettings.defaults());
        assertThat(rows).hasSize(4);
        for (int i = 0; i < rows.size(); i++) {
            ChainCouplingScan.Row row = rows.get(i);
            assertThat(row.spins()).isEqualTo(7);
            assertThat(row.minimum().sStar()).as("s* at %s", COUPLINGS[i]).isCloseTo(S_STAR[i], within(1e-5));
            assertThat(row.minimum().gapMin()).isCloseTo(GAP_MIN[i], within(1e-6));
            assertThat(row.pause().from()).isGreaterThan(row.minimum().sStar());
            assertThat(row.pause().to()).isGreaterThan(row.pause().from());
            if (i > 0) {
                assertThat(row.minimum().sStar()).isLessThan(rows.get(i - 1).minimum().sStar());
            }
            // Independent check: the oracle's gap at s* equals Δmin, and is larger on both sides.
            IsingProblem physical = family.at(COUPLINGS[i]);
            double s = row.minimum().sStar();
            double at = oracleGap(physical, s);
            assertThat(at).isCloseTo(row.minimum().gapMin(), within(1e-9));
            assertThat(oracleGap(physical, s - 1e-3)).isGreaterThan(at);
            assertThat(oracleGap(physical, s + 1e-3)).isGreaterThan(at);
            // Pause ends: the oracle's gap there is 1.1 and 2 times Δmin (to the bisection tolerance).
            assertThat(oracleGap(physical, row.pause().from()) / at).isCloseTo(1.1, within(0.01));
            assertThat(oracleGap(physical, row.pause().to()) / at).isCloseTo(2.0, within(0.01));
        }
    }

    private static double oracleGap(IsingProblem p, double s) {
        double[] e = ReferenceHamiltonian.eigenvalues(ReferenceHamiltonian.full(p, 1 - s, s));
        return e[1] - e[0];
    }
}
