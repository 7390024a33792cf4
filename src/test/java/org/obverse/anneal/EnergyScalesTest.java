package org.obverse.anneal;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

/**
 * The schedule's shape-preserving interpolation (Fritsch and Carlson, SIAM J. Numer. Anal. 17,
 * 238, 1980: a monotone data run gives a monotone interpolant) and its input rules.
 */
class EnergyScalesTest extends QuietTest {
    @Test
    void illustrativePairIsLinearAndSaysSo() {
        EnergyScales s = EnergyScales.illustrative();
        assertThat(s.isIllustrative()).isTrue();
        assertThat(s.name()).contains("illustrative").contains("not any device");
        for (double x : new double[] {0, 0.25, 0.5, 0.9, 1}) {
            assertThat(s.a(x)).isCloseTo(1 - x, within(1e-15));
            assertThat(s.b(x)).isCloseTo(x, within(1e-15));
        }
    }

    /* A cubic Hermite interpolant with exact slopes reproduces a straight line; PCHIP's slopes are exact for one. */
    @Test
    void tableOnALineIsReproducedExactly() {
        double[] s = {0, 0.1, 0.35, 0.6, 1};
        double[] a = new double[s.length];
        double[] b = new double[s.length];
        for (int i = 0; i < s.length; i++) {
            a[i] = 3 - 2 * s[i];
            b[i] = 0.5 + 4 * s[i];
        }
        EnergyScales t = EnergyScales.fromTable("line", "GHz", s, a, b);
        for (double x = 0; x <= 1; x += 0.0137) {
            assertThat(t.a(x)).isCloseTo(3 - 2 * x, within(1e-12));
            assertThat(t.b(x)).isCloseTo(0.5 + 4 * x, within(1e-12));
        }
    }

    @Test
    void monotoneTablesStayMonotoneAndWithinTheirRows() {
        Seeds.forEachCase(50, 3100, (rng, seed) -> {
            int rows = 2 + rng.nextInt(12);
            double[] s = new double[rows];
            double[] a = new double[rows];
            double[] b = new double[rows];
            for (int i = 1; i < rows - 1; i++) {
                s[i] = rng.nextDouble();
            }
            s[rows - 1] = 1;
            java.util.Arrays.sort(s, 1, rows - 1);
            double av = 10;
            double bv = 0;
            for (int i = 0; i < rows; i++) {
                // Steps of wildly different sizes, some flat: where a naive spline overshoots.
                av = Math.max(0, av - (rng.nextInt(3) == 0 ? 0 : rng.nextDouble() * 3));
                bv += rng.nextInt(3) == 0 ? 0 : Math.pow(rng.nextDouble(), 3) * 5;
                a[i] = av;
                b[i] = bv;
            }
            for (int i = 1; i < rows; i++) {
                if (s[i] <= s[i - 1]) {
                    return; // a tie from the generator: not a valid table, skip the case
                }
            }
            EnergyScales t = EnergyScales.fromTable("t", "GHz", s, a, b);
            for (int i = 0; i < rows; i++) {
                assertThat(t.a(s[i])).isEqualTo(a[i]);
                assertThat(t.b(s[i])).isEqualTo(b[i]);
            }
            double prevA = Double.POSITIVE_INFINITY;
            double prevB = Double.NEGATIVE_INFINITY;
            for (int k = 0; k <= 2000; k++) {
                double x = k / 2000.0;
                double ax = t.a(x);
                double bx = t.b(x);
                assertThat(ax).isLessThanOrEqualTo(prevA + 1e-12).isGreaterThanOrEqualTo(-1e-12);
                assertThat(bx).isGreaterThanOrEqualTo(prevB - 1e-12);
                prevA = ax;
                prevB = bx;
            }
        });
    }

    @Test
    void badTablesAreRefusedNamingTheRow() {
        double[] a = {1, 0.5, 0};
        double[] b = {0, 0.5, 1};
        assertThatThrownBy(() -> EnergyScales.fromTable("t", "u", new double[] {0, 0.6, 0.6}, a, b))
                .isInstanceOf(InvalidEnergyScalesException.class).hasMessageContaining("row 2")
                .hasMessageContaining("increase strictly");
        assertThatThrownBy(() -> EnergyScales.fromTable("t", "u", new double[] {0, 0.7, 0.5}, a, b))
                .isInstanceOf(InvalidEnergyScalesException.class).hasMessageContaining("row 2");
        assertThatThrownBy(() -> EnergyScales.fromTable("t", "u", new double[] {0, 0.5, 1},
                new double[] {1, -0.1, 0}, b))
                .isInstanceOf(InvalidEnergyScalesException.class).hasMessageContaining("row 1")
                .hasMessageContaining("negative");
        assertThatThrownBy(() -> EnergyScales.fromTable("t", "u", new double[] {0, 0.5, 0.9}, a, b))
                .isInstanceOf(InvalidEnergyScalesException.class).hasMessageContaining("s = 0 to s = 1");
        assertThatThrownBy(() -> EnergyScales.fromTable("t", "u", new double[] {0}, new double[] {1},
                new double[] {0})).isInstanceOf(InvalidEnergyScalesException.class).hasMessageContaining("two");
        assertThatThrownBy(() -> EnergyScales.illustrative().a(1.5))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("outside");
    }
}
