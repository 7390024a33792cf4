package org.obverse.campaign;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.function.IntConsumer;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.BadInputException;
import org.obverse.io.json.JsonFiles;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.model.IsingProblem;
import org.obverse.spectrum.GapDip;
import org.obverse.spectrum.ScanSettings;
import org.obverse.spectrum.SpectrumAnalysis;
import org.obverse.spectrum.SpectrumSettings;
import org.obverse.testsupport.QuietTest;

/** The spectrum step as a library call: a request in, the analysis and the written folder out. */
class SpectrumStepTest extends QuietTest {
    @TempDir
    Path tmp;

    /*
     * One spin with field h = 0.7 under A = 1 − s, B = s: the gap √((1 − s)² + h² s²) has one
     * interior minimum at s = 1/(1 + h²), where it is h/√(1 + h²) (closed form, as in
     * ClosedFormSpectrumTest). The step reports it as one dip, lists it in summary.json, and
     * counts the grid points through the progress it was given.
     */
    @Test
    void analysesOneProblemAndWritesTheDipsItReturns() throws Exception {
        double h = 0.7;
        Path p = tmp.resolve("one.json");
        ProblemCodec.write(p, false, ProblemFile.of(IsingProblem.builder().field(0, h).build(), null));
        List<int[]> seen = new ArrayList<>();
        StepProgress progress = (phase, total, work) -> {
            assertThat(phase).isEqualTo(SpectrumStep.SCAN_PHASE);
            int[] last = {total, 0};
            seen.add(last);
            return (IntConsumer) done -> last[1] = done;
        };
        Path out = tmp.resolve("out");
        SpectrumStep.Result r = SpectrumStep.run(new SpectrumStep.Request(p, null, null, "units",
                SpectrumSettings.defaults(), ScanSettings.defaults().withPoints(51), out, false, progress));
        assertThat(r.rows()).isNull();
        SpectrumAnalysis a = r.single().analysis();
        assertThat(a.dips()).hasSize(1);
        GapDip dip = a.dips().get(0);
        assertThat(dip.s()).isCloseTo(1 / (1 + h * h), within(1e-5));
        assertThat(dip.gap()).isCloseTo(h / Math.sqrt(1 + h * h), within(1e-10));
        assertThat(dip.atEnd()).isFalse();
        assertThat(seen).hasSize(1);
        assertThat(seen.get(0)).containsExactly(51, 51);
        ObjectNode summary = JsonFiles.read(out.resolve("summary.json"), "spectrum");
        JsonNode written = summary.get("dips").get(0);
        assertThat(written.get("s").asDouble()).isEqualTo(dip.s());
        assertThat(written.get("gap").asDouble()).isEqualTo(dip.gap());
        assertThat(written.get("pause_from").asDouble()).isEqualTo(a.pause().from());
        assertThat(summary.get("suggested_dip").asInt()).isZero();
        assertThat(Files.readAllLines(out.resolve("gap.csv"))).hasSize(52);

        // The folder exists now: a second run is refused before any work, and nothing changes.
        assertThatThrownBy(() -> SpectrumStep.run(new SpectrumStep.Request(p, null, null, "units",
                SpectrumSettings.defaults(), ScanSettings.defaults(), out, false, null)))
                .isInstanceOf(BadInputException.class).hasMessageContaining("already exists");
        assertThat(Files.readAllLines(out.resolve("gap.csv"))).hasSize(52);
    }

    @Test
    void refusesABadEnergyScalesTableNamingItsLine() throws Exception {
        Path p = tmp.resolve("one.json");
        ProblemCodec.write(p, false, ProblemFile.of(IsingProblem.builder().field(0, 0.5).build(), null));
        Path table = tmp.resolve("scales.csv");
        Files.writeString(table, "s,A,B\n0,1,0\n0.5,x,1\n1,0,1\n");
        Path out = tmp.resolve("never");
        assertThatThrownBy(() -> SpectrumStep.run(new SpectrumStep.Request(p, null, table, "GHz",
                SpectrumSettings.defaults(), ScanSettings.defaults(), out, false, null)))
                .isInstanceOf(BadInputException.class).hasMessageContaining("scales.csv").hasMessageContaining("line 3");
        assertThat(out).doesNotExist();
    }
}
