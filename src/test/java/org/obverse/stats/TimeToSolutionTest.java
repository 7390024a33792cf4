package org.obverse.stats;

import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/** TTS conventions of Rønnow et al., "Defining and detecting quantum speedup", Science 345, 420 (2014). */
class TimeToSolutionTest extends QuietTest {
    @Test
    void workedValue() {
        // p = 0.5 at 1 µs: ln(0.01) / ln(0.5) = 6.6438... µs.
        assertThat(TimeToSolution.of(0.5, 1.0)).isCloseTo(6.643856189774724, within(1e-12));
        assertThat(TimeToSolution.of(0.5, 1.0)).isCloseTo(6.64, within(0.005));
    }

    @Test
    void edges() {
        assertThat(TimeToSolution.of(0, 20)).isInfinite();
        assertThat(TimeToSolution.of(0.99, 20)).isEqualTo(20);
        assertThat(TimeToSolution.of(1, 20)).isEqualTo(20);
        assertThat(TimeToSolution.of(0.999, 20)).isEqualTo(20);
    }

    @Test
    void formulaAndMonotone() {
        Seeds.forEachCase(200, 7, (rng, seed) -> {
            double p = rng.nextDouble() * 0.98 + 1e-6;
            double t = rng.nextDouble() * 100;
            double target = 0.5 + rng.nextDouble() * 0.49;
            double tts = TimeToSolution.of(p, t, target);
            if (p < target) {
                assertThat(tts).isCloseTo(t * Math.log(1 - target) / Math.log(1 - p), within(1e-9 * (1 + tts)));
            }
            assertThat(TimeToSolution.of(Math.min(1, p * 1.1), t, target)).isLessThanOrEqualTo(tts);
        });
    }
}
