package org.obverse.io;

import org.obverse.io.codec.ControlErrorsCodec;
import org.obverse.io.codec.ManifestCodec;
import org.obverse.io.codec.ScheduleCodec;
import org.obverse.io.json.JsonFiles;
import org.obverse.io.npy.NpyReader;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.obverse.testsupport.QuietTest;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** Issue 13, classes 7 and 10: the codecs follow spec/formats.md and spec/samples.md, and gauge names never clash. */
class SpecDriftTest extends QuietTest {
    @TempDir
    Path dir;

    private static ObjectNode manifest() {
        return JsonFiles.read(Path.of("examples/gauges/manifest.json"), ManifestCodec.KIND);
    }

    @Test
    void theManifestRefusesUnknownTopLevelKeysAndKeepsMetaFree() {
        ObjectNode m = manifest();
        m.put("extra", 1);
        assertThatThrownBy(() -> ManifestCodec.fromJson(Path.of("m.json"), m)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("\"extra\"").hasMessageContaining("not a field");
        ObjectNode ok = manifest();
        ok.putObject("meta").put("note", "free");
        assertThat(ManifestCodec.fromJson(Path.of("m.json"), ok).gauges()).hasSize(4);
    }

    /** Issue 13, class 7: a gauge named magnetisation.json lost its samples to the moments table. */
    @Test
    void gaugeNamesThatClashAreRefused() {
        for (String bad : new String[] {"magnetisation.json", "Correlations.json", "manifest.json", "g0000.energies.json",
            "results.json", "G0001.json"}) {
            ObjectNode m = manifest();
            ((ObjectNode) ((ArrayNode) m.get("gauges")).get(2)).put("problem", bad);
            assertThatThrownBy(() -> ManifestCodec.fromJson(Path.of("m.json"), m)).as(bad)
                    .isInstanceOf(BadInputException.class).hasMessageContaining("gauges[2].problem");
        }
    }

    @Test
    void scheduleAndErrorFilesAcceptMeta() throws Exception {
        Path s = Files.writeString(dir.resolve("s.json"),
                "{\"format\": \"obverse.schedule/1\", \"points\": [[0, 0], [1, 1]], \"meta\": {\"by\": \"hand\"}}");
        assertThat(ScheduleCodec.read(s).runTimeMicros()).isEqualTo(1.0);
        Path e = Files.writeString(dir.resolve("e.json"), "{\"format\": \"obverse.errors/1\", \"seed\": 1, "
                + "\"field_sigma\": 0, \"coupling_sigma\": 0, \"meta\": {\"by\": \"hand\"}}");
        assertThat(ControlErrorsCodec.read(e).fieldSigma()).isZero();
        Path bad = Files.writeString(dir.resolve("b.json"),
                "{\"format\": \"obverse.schedule/1\", \"points\": [[0, 0], [1, 1]], \"meta\": 3}");
        assertThatThrownBy(() -> ScheduleCodec.read(bad)).hasMessageContaining("\"meta\"");
    }

    /** numpy.lib.format: the dict is padded with spaces (0x20) and ends with a newline. */
    @Test
    void npyPaddingIsSpacesAndANewlineOnly() throws Exception {
        for (char pad : new char[] {'\u001f', '\t', '\u000b', '\u000c', '\r'}) {
            Path f = npy("p.npy", pad, '\n');
            assertThatThrownBy(() -> NpyReader.open(f).close()).as("pad " + (int) pad)
                    .isInstanceOf(BadInputException.class).hasMessageContaining("padded with spaces");
        }
        Path noNewline = npy("n.npy", ' ', ' ');
        assertThatThrownBy(() -> NpyReader.open(noNewline).close()).isInstanceOf(BadInputException.class)
                .hasMessageContaining("newline");
        try (NpyReader r = NpyReader.open(npy("ok.npy", ' ', '\n'))) {
            assertThat(r.header().shape()).containsExactly(1, 1);
        }
    }

    private Path npy(String name, char pad, char last) throws Exception {
        String dict = "{'descr': '|i1', 'fortran_order': False, 'shape': (1, 1), }";
        StringBuilder h = new StringBuilder(dict);
        h.append(' ');
        h.append(pad);
        while ((10 + h.length() + 1) % 64 != 0) {
            h.append(' ');
        }
        h.append(last);
        byte[] head = h.toString().getBytes(StandardCharsets.ISO_8859_1);
        byte[] all = new byte[10 + head.length + 1];
        byte[] magic = {(byte) 0x93, 'N', 'U', 'M', 'P', 'Y', 1, 0, (byte) head.length, 0};
        System.arraycopy(magic, 0, all, 0, 10);
        System.arraycopy(head, 0, all, 10, head.length);
        all[all.length - 1] = 1;
        return Files.write(dir.resolve(name), all);
    }
}
