package org.obverse.campaign;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.function.IntConsumer;
import org.apache.commons.math3.stat.interval.ConfidenceInterval;
import org.apache.commons.math3.stat.interval.WilsonScoreInterval;
import org.junit.jupiter.api.Test;
import org.obverse.io.BadInputException;
import org.obverse.stats.Campaign;
import org.obverse.stats.CellScore;
import org.obverse.stats.Resampling;
import org.obverse.testsupport.QuietTest;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

/** ScoreStep on the shipped example table, checked against counts worked out by hand from the CSV. */
class ScoreStepTest extends QuietTest {
    private static final Path RESULTS = Path.of("examples/results.csv");
    private static final Path GROUND = Path.of("examples/ground.csv");
    /** Rounding only: the values below are a few floating-point operations deep. */
    private static final double TOL = 1e-12;

    private static ScoreStep.Request request(List<ScoreStep.Comparison> compare, String sweep,
            StepProgress progress) {
        return new ScoreStep.Request(List.of(RESULTS), GROUND, 0.99, 0.95, 0.5, new double[] {0.35, 0.65},
                new double[] {0.05, 0.95}, 200, 1, 2, compare, null, sweep == null ? List.of() : List.of(sweep), 1e-9,
                1e-9, Resampling.READS_ONLY, progress);
    }

    private static CellScore cell(ScoreStep.Result r, String instance, String setting) {
        Campaign c = r.summary().campaign();
        int i = c.instances().indexOf(instance);
        int s = c.settings().indexOf(setting);
        return r.summary().cells().stream().filter(x -> x.instance() == i && x.setting() == s).findFirst()
                .orElseThrow();
    }

    @Test
    void pooledSuccessOfTheExampleMatchesTheCountsInTheTable() throws Exception {
        ScoreStep.Result r = ScoreStep.run(request(List.of(), null, null));
        // examples/results.csv, small-a under anneal=1: gauge 0 has 41 of 100 reads at the ground
        // energy -3.0 (examples/ground.csv), gauge 1 has 23 of 100: pooled p = (41+23)/200 = 0.32.
        CellScore a1 = cell(r, "small-a", "anneal=1");
        assertThat(a1.reads()).isEqualTo(200);
        assertThat(a1.successes()).isEqualTo(64);
        assertThat(a1.pSuccess()).isCloseTo(0.32, within(TOL));
        assertThat(a1.gauges()).isEqualTo(2);
        // TTS = t_run ln(1 - 0.99) / ln(1 - p) with t_run = 1 us: Rønnow et al., "Defining and
        // detecting quantum speedup", Science 345, 420 (2014).
        assertThat(a1.tts()).isCloseTo(Math.log(0.01) / Math.log(1 - 0.32), within(TOL));
        // Wilson, J. Am. Stat. Assoc. 22, 209 (1927); commons-math3 as the oracle.
        ConfidenceInterval w = new WilsonScoreInterval().createInterval(200, 64, 0.95);
        assertThat(a1.wilson().lower()).isCloseTo(w.getLowerBound(), within(1e-9));
        assertThat(a1.wilson().upper()).isCloseTo(w.getUpperBound(), within(1e-9));
        // small-b under anneal=1: 12 of 100 reads at -1.25.
        assertThat(cell(r, "small-b", "anneal=1").pSuccess()).isCloseTo(0.12, within(TOL));
        assertThat(r.loaded().rows()).isEqualTo(10);
        assertThat(r.rule().absolute()).isEqualTo(1e-9);
        assertThat(r.sweepName()).isNull();
        assertThat(r.sweepValueBySetting()).isNull();
    }

    @Test
    void sweepValuesComeFromTheLabelsAndProgressIsReportedThroughTheCallback() throws Exception {
        List<String> phases = new ArrayList<>();
        int[] last = {-1};
        long[] work = {-1};
        StepProgress progress = (phase, total, w) -> {
            phases.add(phase + " " + total);
            work[0] = w;
            IntConsumer c = done -> {
                synchronized (last) {
                    last[0] = Math.max(last[0], done);
                }
            };
            return c;
        };
        ScoreStep.Result r = ScoreStep.run(request(
                List.of(new ScoreStep.Comparison("anneal=5", "anneal=1")), "anneal", progress));
        Campaign c = r.summary().campaign();
        assertThat(r.sweepName()).isEqualTo("anneal");
        assertThat(r.sweepValueBySetting()[c.settings().indexOf("anneal=1")]).isEqualTo(1.0);
        assertThat(r.sweepValueBySetting()[c.settings().indexOf("anneal=5")]).isEqualTo(5.0);
        assertThat(r.summary().comparisons()).hasSize(1);
        assertThat(phases).containsExactly(ScoreStep.BOOTSTRAP + " 200");
        // Five gauge slots in the table: small-a/anneal=1 has two gauges, the other three cells one.
        assertThat(work[0]).isEqualTo(200L * 5);
        assertThat(last[0]).isEqualTo(200);
    }

    @Test
    void anUnknownComparedSettingIsBadInputNamingTheChoices() {
        assertThatThrownBy(() -> ScoreStep.run(request(
                List.of(new ScoreStep.Comparison("anneal=1", "anneal=9")), null, StepProgress.NONE)))
                .isInstanceOf(BadInputException.class)
                .hasMessageContaining("has no setting 'anneal=9'")
                .hasMessageContaining("anneal=1, anneal=5");
    }
}
