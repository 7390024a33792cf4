package org.obverse.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import org.obverse.anneal.AnnealSchedule;
import org.obverse.anneal.SamplerSettings;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;

/** Issue 13, class 6: counts in long with stated limits, refused in one line. */
class OverflowTest extends CommandTestSupport {
    @TempDir
    Path dir;

    @Test
    void theSweepCountIsComputedInLong() {
        // 4,294,968.296 us at 1000 sweeps/us is 2^32 + 1000 sweeps; the old int cast gave 1000.
        SamplerSettings s = SamplerSettings.defaults().withSchedule(AnnealSchedule.linear(4_294_968.296));
        assertThat(s.sweepCount()).isEqualTo(4_294_968_296L);
        assertThatThrownBy(s::sweeps).hasMessageContaining("4294968296").hasMessageContaining("limit");
        SamplerSettings huge = SamplerSettings.defaults().withSchedule(AnnealSchedule.linear(2e10))
                .withSweepsPerMicrosecond(1e300);
        assertThat(huge.sweepCount()).isEqualTo(Long.MAX_VALUE);
        assertThat(SamplerSettings.defaults().withSchedule(AnnealSchedule.linear(1)).sweeps()).isEqualTo(1000);
    }

    @Test
    void aScheduleTooLongToSampleIsBadInput() throws Exception {
        Path sched = Files.writeString(dir.resolve("long.json"),
                "{\"format\": \"obverse.schedule/1\", \"points\": [[0, 0], [2e10, 1]]}");
        Run r = obverse("sample", "--problem", "examples/problem.json", "--reads", "4", "--seed", "1", "--schedule", sched.toString(),
                "--out", dir.resolve("s.npy").toString());
        assertThat(r.code()).isEqualTo(Main.BAD_INPUT);
        assertThat(r.err()).contains("long.json").contains("limit");
        assertThat(r.err().strip().lines().count()).isEqualTo(1);
        assertThat(dir.resolve("s.npy")).doesNotExist();
    }

    /** A 128-byte NPY of shape (2147483648, 0) made energy spin for 50 s and run out of memory. */
    @Test
    void anNpyWithMoreReadsThanTheLimitIsRefusedAtOnce() throws Exception {
        for (String shape : new String[] {"(2147483648, 0)", "(2147483647, 0)", "(9223372036854775807, 0)"}) {
            String dict = "{'descr': '|i1', 'fortran_order': False, 'shape': " + shape + ", }";
            StringBuilder h = new StringBuilder(dict);
            while ((10 + h.length() + 1) % 64 != 0) {
                h.append(' ');
            }
            h.append('\n');
            byte[] head = h.toString().getBytes(java.nio.charset.StandardCharsets.ISO_8859_1);
            byte[] all = new byte[10 + head.length];
            byte[] magic = {(byte) 0x93, 'N', 'U', 'M', 'P', 'Y', 1, 0, (byte) head.length, 0};
            System.arraycopy(magic, 0, all, 0, 10);
            System.arraycopy(head, 0, all, 10, head.length);
            Path npy = Files.write(dir.resolve("wide.npy"), all);
            Path empty = Files.writeString(dir.resolve("empty.json"),
                    "{\"format\": \"obverse.problem/1\", \"domain\": \"spin\", \"h\": [], \"J\": [], \"offset\": 0}");
            Run r = assertTimeoutPreemptively(Duration.ofSeconds(5),
                    () -> obverse("energy", "--problem", empty.toString(), "--samples", npy.toString()));
            assertThat(r.code()).as(shape + ": " + r.err()).isEqualTo(Main.BAD_INPUT);
            assertThat(r.err()).contains("wide.npy").contains("limit");
        }
    }
}
