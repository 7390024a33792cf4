package org.obverse.io.codec;

import org.obverse.io.BadInputException;
import org.obverse.io.codec.ControlErrorsCodec;
import org.obverse.io.codec.ScheduleCodec;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.anneal.AnnealSchedule;
import org.obverse.anneal.ControlErrors;
import org.obverse.testsupport.QuietTest;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class SamplingCodecTest extends QuietTest {
    @TempDir
    Path dir;

    @Test
    void examplesReadAsDocumented() {
        AnnealSchedule s = ScheduleCodec.read(Path.of("examples", "schedule-pause.json"));
        assertThat(s).isEqualTo(AnnealSchedule.withPause(1.0, 0.3, 1.0));
        assertThat(s.runTimeMicros()).isEqualTo(2.0);
        ControlErrors e = ControlErrorsCodec.read(Path.of("examples", "errors.json"));
        assertThat(e.deviceSeed()).isEqualTo(20261201L);
        assertThat(e.fieldSigma()).isEqualTo(0.05);
        assertThat(e.couplingSigma()).isEqualTo(0.02);
        assertThat(e.readFieldSigma()).isEqualTo(0.01);
        assertThat(e.readCouplingSigma()).isEqualTo(0.0);
    }

    @Test
    void writtenFilesReadBackEqual() throws Exception {
        AnnealSchedule s = AnnealSchedule.withPauseAndQuench(1.0, 0.35, 0.5, 0.2);
        ScheduleCodec.write(dir.resolve("s.json"), false, s);
        assertThat(ScheduleCodec.read(dir.resolve("s.json"))).isEqualTo(s);
        ControlErrors e = ControlErrors.of(-4, 0.1, 0.2, 0.3, 0.4);
        ControlErrorsCodec.write(dir.resolve("e.json"), false, e);
        ControlErrors back = ControlErrorsCodec.read(dir.resolve("e.json"));
        assertThat(back.toString()).isEqualTo(e.toString());
        assertThatThrownBy(() -> ControlErrorsCodec.write(dir.resolve("e.json"), false, e)).hasMessageContaining("already exists");
    }

    @Test
    void refusesBadFilesWithOneLineNamingThePlace() throws Exception {
        Path p = dir.resolve("bad.json");
        Files.writeString(p, "{\"format\": \"obverse.schedule/1\", \"points\": [[0, 0], [1]]}");
        assertThatThrownBy(() -> ScheduleCodec.read(p)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("bad.json: points[1]");
        Files.writeString(p, "{\"format\": \"obverse.schedule/1\", \"points\": [[0, 0], [1, 1]], \"pause\": 1}");
        assertThatThrownBy(() -> ScheduleCodec.read(p)).hasMessageContaining("\"pause\": is not a field");
        Files.writeString(p, "{\"format\": \"obverse.errors/1\", \"seed\": 1.5, \"field_sigma\": 0, \"coupling_sigma\": 0}");
        assertThatThrownBy(() -> ControlErrorsCodec.read(p)).hasMessageContaining("\"seed\": is 1.5, not an integer");
        Files.writeString(p, "{\"format\": \"obverse.errors/1\", \"seed\": 1, \"field_sigma\": 0}");
        assertThatThrownBy(() -> ControlErrorsCodec.read(p)).hasMessageContaining("\"coupling_sigma\": is missing");
        Files.writeString(p, "{\"format\": \"obverse.schedule/1\", \"seed\": 1}");
        assertThatThrownBy(() -> ControlErrorsCodec.read(p)).hasMessageContaining("not \"obverse.errors/1\"");
    }
}
