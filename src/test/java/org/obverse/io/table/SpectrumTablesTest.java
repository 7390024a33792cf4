package org.obverse.io.table;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.obverse.anneal.EnergyScales;
import org.obverse.model.IsingProblem;
import org.obverse.spectrum.AnnealSpectrum;
import org.obverse.spectrum.ChainCouplingScan;
import org.obverse.spectrum.GapScan;
import org.obverse.spectrum.MinimumGap;
import org.obverse.spectrum.PauseWindow;
import org.obverse.spectrum.ScanSettings;
import org.obverse.spectrum.SpectrumSettings;
import org.obverse.testsupport.QuietTest;

/** The spectrum folder's CSV tables: the columns spec/spectrum.md names, every number read back bit for bit. */
class SpectrumTablesTest extends QuietTest {
    private static GapScan scan() {
        IsingProblem p = IsingProblem.builder().field(0, 0.3).coupling(0, 1, -0.8).coupling(1, 2, 0.4).build();
        return AnnealSpectrum.of(p, EnergyScales.illustrative(), SpectrumSettings.defaults())
                .analyse(ScanSettings.defaults().withPoints(9)).scan();
    }

    @Test
    void levelsHoldOneRowPerGridPointReadBackBitForBit() {
        GapScan g = scan();
        List<String> lines = SpectrumTables.levels(g).lines().toList();
        StringBuilder header = new StringBuilder("s");
        for (int i = 0; i < g.levelCount(); i++) {
            header.append(",E").append(i);
        }
        assertThat(lines.get(0)).isEqualTo(header.toString());
        assertThat(lines).hasSize(1 + g.points());
        for (int r = 0; r < g.points(); r++) {
            String[] f = lines.get(1 + r).split(",");
            assertThat(f).hasSize(1 + g.levelCount());
            assertThat(Double.parseDouble(f[0])).isEqualTo(g.s(r));
            for (int i = 0; i < g.levelCount(); i++) {
                assertThat(Double.doubleToRawLongBits(Double.parseDouble(f[1 + i])))
                        .isEqualTo(Double.doubleToRawLongBits(g.levels(r)[i]));
            }
        }
    }

    @Test
    void gapHoldsSAndTheRelevantGap() {
        GapScan g = scan();
        List<String> lines = SpectrumTables.gap(g).lines().toList();
        assertThat(lines.get(0)).isEqualTo("s,gap");
        assertThat(lines).hasSize(1 + g.points());
        assertThat(lines.get(1)).isEqualTo("0.0," + g.gap(0));
        for (int r = 0; r < g.points(); r++) {
            String[] f = lines.get(1 + r).split(",");
            assertThat(Double.parseDouble(f[1])).isEqualTo(g.gap(r)).isPositive();
        }
    }

    @Test
    void chainScanWritesThePinnedBytes() {
        // Expected text written by hand from spec/spectrum.md's chain_scan.csv columns (common practice, no source).
        PauseWindow w = new PauseWindow(0.45, 0.6, 1.1, 2.0, 1e-4, false, true);
        List<ChainCouplingScan.Row> rows = List.of(
                new ChainCouplingScan.Row(-1.0, 6, new MinimumGap(0.41, 1e-6, 0.125, 2.5e-13, false), w, List.of(), -1),
                new ChainCouplingScan.Row(-2.5, 6, new MinimumGap(0.5, 1e-6, 0.0625, 1e-12, true), w, List.of(), -1));
        assertThat(SpectrumTables.chainScan(rows)).isEqualTo("""
                chain_coupling,spins,s_star,s_star_tolerance,gap_min,gap_min_tolerance,pause_from,pause_to
                -1.0,6,0.41,1.0E-6,0.125,2.5E-13,0.45,0.6
                -2.5,6,0.5,1.0E-6,0.0625,1.0E-12,0.45,0.6
                """);
    }
}
