package org.obverse.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.Locale;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

/** Decimals.fixed against the JDK's own java.util.Formatter (the reference), ROOT locale. */
class DecimalsTest extends QuietTest {
    @Test
    void matchesTheFormatterOnEdgeValues() {
        double[] edge = {0.0, -0.0, 1.0, -1.0, 0.5, 0.0000005, 0.0000015, 0.0000025, 0.1234565, 0.9999995, 0.99999949,
            -0.0000001, -0.0000004, 1e-300, -1e-300, 4.9e-324, 1e20, 123456789.123456789, 2.675, 1.005, Double.MAX_VALUE,
            Double.MIN_NORMAL, 1.0 / 3, 2.0 / 3, Double.NaN, Double.POSITIVE_INFINITY, Double.NEGATIVE_INFINITY};
        for (double v : edge) {
            for (int places : new int[] {0, 1, 3, 6, 9}) {
                assertThat(Decimals.fixed(v, places)).as("%s to %d places", v, places)
                        .isEqualTo(String.format(Locale.ROOT, "%." + places + "f", v));
            }
        }
    }

    @Test
    void matchesTheFormatterOnGeneratedFractionsAndRatios() {
        Seeds.forEachCase(2000, 0xdec1_0001L, (rng, seed) -> {
            double v;
            switch (rng.nextInt(4)) {
                case 0:
                    v = rng.nextDouble();
                    break;
                case 1:
                    v = (double) rng.nextInt(1_000_000) / (1 + rng.nextInt(1_000_000));
                    break;
                case 2:
                    v = (rng.nextDouble() - 0.5) * Math.pow(10, rng.nextInt(30) - 15);
                    break;
                default:
                    v = Double.longBitsToDouble(rng.nextLong());
            }
            int places = rng.nextInt(10);
            assertThat(Decimals.fixed(v, places)).as("%s to %d places", v, places)
                    .isEqualTo(String.format(Locale.ROOT, "%." + places + "f", v));
        });
    }
}
