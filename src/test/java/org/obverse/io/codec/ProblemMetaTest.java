package org.obverse.io.codec;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.BadInputException;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.testsupport.QuietTest;

/** The embedding and gauge blocks of a problem's meta: written with pinned bytes, read back as written. */
class ProblemMetaTest extends QuietTest {
    @TempDir
    Path dir;

    private static final String HASH = "0123456789abcdef".repeat(4);
    private static final EmbeddingMeta EMBEDDING = new EmbeddingMeta(1.5, -2.0, "uniform", 1, -2.0, 0.25, 1, 2);
    private static final GaugeMeta GAUGE = new GaugeMeta(3, HASH, 1);

    private static IsingProblem problem(double h0) {
        IsingBuilder b = IsingProblem.builder();
        b.field(0, h0);
        b.coupling(0, 1, -1.0);
        b.offset(0.75);
        return b.build();
    }

    /** A gauged physical problem: the embedding block, then the gauge block added by gauging. */
    private static ProblemFile gaugedPhysical() {
        ProblemFile physical = ProblemCodec.embedded(problem(0.25), EMBEDDING);
        return ProblemCodec.gauged(physical, problem(-0.25), GAUGE);
    }

    @Test
    void aGaugedPhysicalProblemHasPinnedBytes() throws Exception {
        Path f = dir.resolve("g.json");
        ProblemCodec.write(f, false, gaugedPhysical());
        // Expected bytes written by hand (keys in the order spec/chains.md and spec/formats.md list them, two-space
        // indent, values with a fraction as doubles, counts as integers): common practice, no source.
        String expected = "{\n"
                + "  \"format\" : \"obverse.problem/1\",\n"
                + "  \"domain\" : \"spin\",\n"
                + "  \"h\" : [ [ 0, -0.25 ] ],\n"
                + "  \"J\" : [ [ 0, 1, -1.0 ] ],\n"
                + "  \"offset\" : 0.75,\n"
                + "  \"meta\" : {\n"
                + "    \"scale\" : 1.5,\n"
                + "    \"chain_coupling\" : -2.0,\n"
                + "    \"chain_coupling_mode\" : \"uniform\",\n"
                + "    \"chain_couplers\" : 1,\n"
                + "    \"chain_energy\" : -2.0,\n"
                + "    \"logical_offset\" : 0.25,\n"
                + "    \"logical_variables\" : 1,\n"
                + "    \"longest_chain\" : 2,\n"
                + "    \"gauge\" : {\n"
                + "      \"index\" : 3,\n"
                + "      \"source_sha256\" : \"" + HASH + "\",\n"
                + "      \"flipped_count\" : 1\n"
                + "    }\n"
                + "  }\n"
                + "}\n";
        assertThat(Files.readString(f)).isEqualTo(expected);
    }

    @Test
    void theMetaRecordsReadBackAsWritten() throws Exception {
        Path f = dir.resolve("g.json");
        ProblemCodec.write(f, false, gaugedPhysical());
        ProblemFile read = ProblemCodec.read(f);
        assertThat(ProblemCodec.recordsEmbedding(read)).isTrue();
        assertThat(ProblemCodec.embedding(f, read)).contains(EMBEDDING);
        assertThat(ProblemCodec.gauge(f, read)).contains(GAUGE);
        assertThat(read.spin().field(0)).isEqualTo(-0.25);

        // A logical problem gauged: no embedding block, the source's own meta kept beside the gauge block.
        Path plain = dir.resolve("plain.json");
        Files.writeString(plain, "{\"format\": \"obverse.problem/1\", \"domain\": \"spin\", \"h\": [[0, 1.0]],"
                + " \"meta\": {\"note\": \"kept\"}}");
        ProblemFile source = ProblemCodec.read(plain);
        assertThat(ProblemCodec.recordsEmbedding(source)).isFalse();
        assertThat(ProblemCodec.embedding(plain, source)).isEmpty();
        assertThat(ProblemCodec.gauge(plain, source)).isEmpty();
        Path g = dir.resolve("plain-g.json");
        ProblemCodec.write(g, false, ProblemCodec.gauged(source, source.spin(), GAUGE));
        ProblemFile back = ProblemCodec.read(g);
        assertThat(back.meta().get("note").asText()).isEqualTo("kept");
        assertThat(ProblemCodec.gauge(g, back)).contains(GAUGE);
        assertThat(ProblemCodec.recordsEmbedding(back)).isFalse();
    }

    @Test
    void aDamagedBlockIsBadInputNamingFileAndPlace() throws Exception {
        Path f = dir.resolve("bad.json");
        Files.writeString(f, "{\"format\": \"obverse.problem/1\", \"domain\": \"spin\", \"h\": [[0, 1.0]],"
                + " \"meta\": {\"gauge\": {\"index\": \"three\", \"source_sha256\": \"x\", \"flipped_count\": 0}}}");
        ProblemFile pf = ProblemCodec.read(f);
        assertThatThrownBy(() -> ProblemCodec.gauge(f, pf)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("bad.json").hasMessageContaining("\"gauge\".\"index\"");
        Path e = dir.resolve("half.json");
        Files.writeString(e, "{\"format\": \"obverse.problem/1\", \"domain\": \"spin\", \"h\": [[0, 1.0]],"
                + " \"meta\": {\"chain_energy\": -1.0}}");
        ProblemFile half = ProblemCodec.read(e);
        assertThat(ProblemCodec.recordsEmbedding(half)).isTrue();
        assertThatThrownBy(() -> ProblemCodec.embedding(e, half)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("half.json").hasMessageContaining("\"scale\"");
    }
}
