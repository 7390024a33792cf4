package org.obverse.campaign;

import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.embed.ChainBreakRule;
import org.obverse.embed.ChainDecoder;
import org.obverse.embed.Chains;
import org.obverse.embed.DecodedSamples;
import org.obverse.io.BadInputException;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.table.ResultsTable;
import org.obverse.io.samples.SampleCoding;
import org.obverse.io.samples.SampleFiles;
import org.obverse.model.IsingProblem;
import org.obverse.samples.SampleBlock;
import org.obverse.testsupport.QuietTest;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** DecodeStep on four hand-made reads whose outcome is worked out by hand. */
class DecodeStepTest extends QuietTest {
    @TempDir
    Path dir;

    // Logical E = s_a s_b (ground -1). Chains a = {0, 1}, b = {2, 3}: physical columns 0..3.
    private static final IsingProblem LOGICAL = IsingProblem.builder().coupling(0, 1, 1.0).build();
    private static final IsingProblem PHYSICAL = IsingProblem.builder().coupling(0, 1, -2).coupling(1, 2, 1)
            .coupling(2, 3, -2).build();
    // (+ + - -) ground; (+ + + +) excited; (+ - - -) chain a broken; (+ - + -) both broken.
    private static final byte[] READS = {1, 1, -1, -1, 1, 1, 1, 1, 1, -1, -1, -1, 1, -1, 1, -1};

    @Test
    void discardRowsByHandAndTheFolderMatchesTheRowFunction() throws Exception {
        Path q = dir.resolve("q.json");
        Path p = dir.resolve("p.json");
        ProblemCodec.write(q, false, ProblemFile.of(LOGICAL, null));
        ProblemCodec.write(p, false, ProblemFile.of(PHYSICAL, null));
        Files.writeString(dir.resolve("c.json"), "{\"format\": \"obverse.chains/1\", "
                + "\"chains\": [[0, [0, 1]], [1, [2, 3]]]}");
        Path samples = dir.resolve("s.npy");
        SampleFiles.writeAll(samples, PHYSICAL.variables(), false, SampleBlock.fromSpins(READS, 4, 4));
        DecodeStep.Labels labels = new DecodeStep.Labels("tiny", "V=-2", 3, 2.5, List.of("chain_coupling"),
                List.of("-2"));
        DecodeStep.Result r = DecodeStep.run(new DecodeStep.Request(p, q, dir.resolve("c.json"), samples,
                ChainBreakRule.DISCARD, 0, SampleCoding.SPIN, dir.resolve("out"), labels, false));
        assertThat(r.decoded().reads()).isEqualTo(4);
        assertThat(r.decoded().keptReads()).isEqualTo(2);
        // Chain a breaks in two reads, chain b in one: a is the most broken.
        assertThat(r.mostBroken()).isEqualTo(0);
        List<String> rows = Files.readAllLines(dir.resolve("out/results.csv"));
        assertThat(rows.subList(1, rows.size())).containsExactly("tiny,V=-2,3,-1,1,0,2.5,logical,-2",
                "tiny,V=-2,3,1,1,0,2.5,logical,-2", "tiny,V=-2,3,,1,1,2.5,logical,-2", "tiny,V=-2,3,,1,2,2.5,logical,-2");
        assertThat(Files.readString(dir.resolve("out/chains.csv")))
                .isEqualTo("logical_id,length,broken_reads,broken_fraction\n0,2,2,0.5\n1,2,1,0.25\n");

        // In memory, as a campaign collects: the same rows without a folder.
        Chains c = Chains.of(new int[] {0, 1}, new int[][] {{0, 1}, {2, 3}});
        ChainDecoder decoder = DecodeStep.decoder(LOGICAL, c, PHYSICAL.variables(), ChainBreakRule.DISCARD, 0, null, null);
        DecodedSamples d = DecodeStep.decode(decoder, SampleBlock.fromSpins(READS, 4, 4), samples);
        StringWriter table = new StringWriter();
        DecodeStep.writeRows(ResultsTable.RowWriter.start(table, labels.extraNames()), labels, d);
        assertThat(table.toString()).isEqualTo(Files.readString(dir.resolve("out/results.csv")));
    }

    @Test
    void chainsThatDoNotFitAreBadInputAndNothingIsWritten() throws Exception {
        Chains wrong = Chains.of(new int[] {0, 1}, new int[][] {{0, 1}, {2, 9}});
        assertThatThrownBy(() -> DecodeStep.decoder(LOGICAL, wrong, PHYSICAL.variables(), ChainBreakRule.MAJORITY, 0,
                dir.resolve("c.json"), dir.resolve("p.json"))).isInstanceOf(BadInputException.class)
                .hasMessageContaining("c.json").hasMessageContaining("p.json");
        assertThatThrownBy(() -> new DecodeStep.Labels("x", "s", -1, 0.0)).isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("run time");
    }
}
