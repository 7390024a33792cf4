package org.obverse.spectrum;

import org.obverse.anneal.EnergyScales;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import org.junit.jupiter.api.Test;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.testsupport.QuietTest;

/** Problems too large for a solver are refused before any memory is taken, with the limit and the memory named. */
class SpectrumLimitTest extends QuietTest {
    private static IsingProblem chain(int n, boolean fields) {
        IsingBuilder b = IsingProblem.builder();
        for (int k = 0; k + 1 < n; k++) {
            b.coupling(k, k + 1, -1.0);
        }
        if (fields) {
            for (int k = 0; k < n; k++) {
                b.field(k, 0.1);
            }
        }
        return b.build();
    }

    @Test
    void denseRefusesMoreThanTwelveStoredSpins() {
        SpectrumSettings dense = SpectrumSettings.defaults().withSolver(SolverChoice.DENSE);
        assertThatThrownBy(() -> AnnealSpectrum.of(chain(13, true), EnergyScales.illustrative(), dense))
                .isInstanceOf(SpectrumLimitException.class)
                .hasMessageContaining("13 spins").hasMessageContaining("2^13").hasMessageContaining("at most 2^12")
                .hasMessageContaining("1.0 GiB").hasMessageEndingWith("use a smaller problem")
                // The core names the problem, not a command-line flag: the spectrum command adds --solver.
                .hasMessageNotContaining("--")
                .satisfies(e -> assertThat(((SpectrumLimitException) e).solver()).isEqualTo("dense"));
        // Without fields the global flip halves the space: 13 spins fit as 2^12.
        assertThat(AnnealSpectrum.of(chain(13, false), EnergyScales.illustrative(), dense).basis().dimension())
                .isEqualTo(1 << 12);
    }

    @Test
    void lanczosRefusesMoreThanTwentyStoredSpins() {
        SpectrumSettings lanczos = SpectrumSettings.defaults().withSolver(SolverChoice.LANCZOS);
        assertThatThrownBy(() -> AnnealSpectrum.of(chain(21, true), EnergyScales.illustrative(), lanczos))
                .isInstanceOf(SpectrumLimitException.class)
                .hasMessageContaining("21 spins").hasMessageContaining("2^21 = 2097152")
                .hasMessageContaining("at most 2^20").hasMessageContaining("MiB");
    }
}
