package org.obverse.anneal;

import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

class AnnealScheduleTest extends QuietTest {
    @Test
    void pauseAddsItsDurationToTheRunTime() {
        AnnealSchedule s = AnnealSchedule.withPause(1.0, 0.3, 1.0);
        assertThat(s.runTimeMicros()).isEqualTo(2.0);
        assertThat(s.fractionAt(0.15)).isCloseTo(0.15, within(1e-12));
        assertThat(s.fractionAt(0.3)).isEqualTo(0.3);
        assertThat(s.fractionAt(0.9)).isEqualTo(0.3);
        assertThat(s.fractionAt(1.3)).isEqualTo(0.3);
        assertThat(s.fractionAt(1.65)).isCloseTo(0.65, within(1e-12));
        assertThat(s.fractionAt(2.0)).isEqualTo(1.0);
        assertThat(s.fractionAt(-1.0)).isEqualTo(0.0);
        assertThat(s.fractionAt(9.0)).isEqualTo(1.0);
    }

    @Test
    void quenchEndsTheRunEarly() {
        AnnealSchedule s = AnnealSchedule.withPauseAndQuench(1.0, 0.3, 0.5, 0.1);
        assertThat(s.runTimeMicros()).isCloseTo(0.9, within(1e-12));
        assertThat(s.fractionAt(0.85)).isCloseTo(0.65, within(1e-9));
    }

    @Test
    void plausibleDefaultsMatchPractitionersFigures() {
        // Facts of the trade stated by practitioners, no further source: without a pause the
        // shortest anneal (1 µs) gave the best time-to-solution; useful pauses were short
        // (0.25 to 2 µs) and early (s_p about 0.3). Plausibility checks of our defaults only.
        assertThat(SamplerSettings.defaults().schedule()).isEqualTo(AnnealSchedule.linear(1.0));
        assertThat(SamplerSettings.defaults().schedule().runTimeMicros()).isEqualTo(1.0);
        AnnealSchedule example = AnnealSchedule.withPause(1.0, 0.3, 1.0);
        double pause = example.time(2) - example.time(1);
        assertThat(pause).isBetween(0.25, 2.0);
        assertThat(example.fraction(1)).isCloseTo(0.3, within(0.05));
    }

    @Test
    void refusesEachBrokenRuleByName() {
        assertThatThrownBy(() -> AnnealSchedule.of(new double[] {0, 1}, new double[] {0}))
                .hasMessageContaining("2 times but 1 values");
        assertThatThrownBy(() -> AnnealSchedule.of(new double[] {0}, new double[] {0}))
                .hasMessageContaining("at least 2 points");
        assertThatThrownBy(() -> AnnealSchedule.of(new double[] {0, 1, 1}, new double[] {0, 0.5, 1}))
                .hasMessageContaining("point 2: time 1.0 µs does not increase");
        assertThatThrownBy(() -> AnnealSchedule.of(new double[] {0, 1}, new double[] {0, 1.5}))
                .hasMessageContaining("s = 1.5 is outside [0, 1]");
        assertThatThrownBy(() -> AnnealSchedule.of(new double[] {0, 1, 2}, new double[] {0, 0.6, 0.4}))
                .hasMessageContaining("falls from 0.6 to 0.4");
        assertThatThrownBy(() -> AnnealSchedule.of(new double[] {0, 0.05}, new double[] {0, 1}))
                .hasMessageContaining("slope 20.0 per µs exceeds the limit 10.0");
        assertThatThrownBy(() -> AnnealSchedule.of(new double[] {0.5, 1}, new double[] {0, 1}))
                .hasMessageContaining("start at t = 0");
        assertThatThrownBy(() -> AnnealSchedule.of(new double[] {0, 1}, new double[] {0.1, 1}))
                .hasMessageContaining("starts at s = 0");
        assertThatThrownBy(() -> AnnealSchedule.of(new double[] {0, 1}, new double[] {0, 0.9}))
                .hasMessageContaining("ends at s = 1");
        assertThatThrownBy(() -> AnnealSchedule.withPause(1, 1.0, 1)).hasMessageContaining("s_p = 1.0");
        assertThatThrownBy(() -> AnnealSchedule.withPause(1, 0.3, 0)).hasMessageContaining("pause duration 0.0");
        assertThatThrownBy(() -> AnnealSchedule.of(new double[] {0, Double.NaN}, new double[] {0, 1}))
                .hasMessageContaining("not finite");
    }

    @Test
    void pauseIsHeldAsExtraSweepsAtThePausePoint() {
        SamplerSettings plain = SamplerSettings.defaults().withBetaRange(0.1, 10.0);
        SamplerSettings paused = plain.withSchedule(AnnealSchedule.withPause(1.0, 0.3, 0.5));
        assertThat(plain.sweeps()).isEqualTo(1000);
        assertThat(paused.sweeps()).isEqualTo(1500);
        double[] beta = BetaRange.perSweep(paused, 0.1, 10.0);
        double atPause = 0.1 * Math.pow(100.0, 0.3);
        // Sweeps 300..799 run at schedule times inside the pause [0.3, 0.8] µs.
        for (int k = 300; k < 800; k++) {
            assertThat(beta[k]).isCloseTo(atPause, within(1e-12));
        }
        for (int k = 1; k < beta.length; k++) {
            assertThat(beta[k]).isGreaterThanOrEqualTo(beta[k - 1]);
        }
        assertThat(beta[0]).isCloseTo(0.1, within(0.01));
        assertThat(beta[beta.length - 1]).isCloseTo(10.0, within(0.1));
    }
}
