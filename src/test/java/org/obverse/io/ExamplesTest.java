package org.obverse.io;

import org.obverse.io.codec.ChainList;
import org.obverse.io.codec.ChainsCodec;
import org.obverse.io.codec.ControlErrorsCodec;
import org.obverse.io.codec.DeviceCodec;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.codec.ScheduleCodec;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.obverse.device.LimitCheck;
import org.obverse.testsupport.QuietTest;

import static org.assertj.core.api.Assertions.assertThat;

/** Every file in examples/ reads, and the example problem fits the example device. */
class ExamplesTest extends QuietTest {
    @Test
    void everyExampleReadsAndTheyFitTogether() {
        ProblemFile physical = ProblemCodec.read(Path.of("examples/problem.json"));
        ProblemFile logical = ProblemCodec.read(Path.of("examples/logical.json"));
        var device = DeviceCodec.read(Path.of("examples/device.json"));
        ChainList chains = ChainsCodec.read(Path.of("examples/chains.json"));
        assertThat(logical.domain()).isEqualTo("binary");
        assertThat(ProblemCodec.read(Path.of("examples/logical.npy")).binary()).isEqualTo(logical.binary());
        assertThat(LimitCheck.violations(physical.spin(), device)).isEmpty();
        assertThat(chains.size()).isEqualTo(logical.variables().size());
        assertThat(ScheduleCodec.read(Path.of("examples/schedule-pause.json")).runTimeMicros()).isPositive();
        assertThat(ControlErrorsCodec.read(Path.of("examples/errors.json")).isNone()).isFalse();
    }
}
