package org.obverse.io.codec;

import org.obverse.io.BadInputException;
import org.obverse.io.codec.ChainList;
import org.obverse.io.codec.ChainsCodec;
import org.obverse.io.codec.DeviceCodec;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.output.AtomicOutput;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.device.CellLattice;
import org.obverse.device.DeviceLimits;
import org.obverse.device.QubitGraph;
import org.obverse.device.ValueRange;
import org.obverse.model.IsingProblem;
import org.obverse.testsupport.Generated;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class CodecTest extends QuietTest {
    @TempDir
    Path dir;

    private Path file(String name, String text) throws Exception {
        Path p = dir.resolve(name);
        Files.writeString(p, text, StandardCharsets.UTF_8);
        return p;
    }

    @Test
    void problemsRoundTripExactlyAndHashStably() throws Exception {
        Seeds.forEachCase(100, 7000, (rng, seed) -> {
            IsingProblem p = Generated.isingProblem(rng, 15, 0.3);
            Path f = dir.resolve("p" + seed + ".json");
            ProblemCodec.write(f, false, ProblemFile.of(p, null));
            ProblemFile back = ProblemCodec.read(f);
            assertThat(back.ising()).isEqualTo(p);
            assertThat(ProblemCodec.contentHash(back)).isEqualTo(ProblemCodec.contentHash(ProblemFile.of(p, null)));
            ProblemFile bin = ProblemFile.of(p.toBinary(), null);
            Path fb = dir.resolve("b" + seed + ".json");
            ProblemCodec.write(fb, false, bin);
            assertThat(ProblemCodec.read(fb).binary()).isEqualTo(bin.binary());
        });
    }

    @Test
    void hashIgnoresLayoutButSeesEveryValue() throws Exception {
        Path a = file("a.json", "{\"format\":\"obverse.problem/1\",\"domain\":\"spin\",\"h\":[[0,0.5]],"
                + "\"J\":[[0,1,-1.5],[1,2,1]],\"offset\":0}");
        Path b = file("b.json", "{\n \"J\": [[2, 1, 1.0], [1, 0, -1.5]], \"domain\": \"spin\",\n"
                + " \"format\": \"obverse.problem/1\", \"h\": [[0, 0.5]]}");
        Path c = file("c.json", "{\"format\":\"obverse.problem/1\",\"domain\":\"spin\",\"h\":[[0,0.5]],"
                + "\"J\":[[0,1,-1.5],[1,2,1.0000000001]]}");
        String ha = ProblemCodec.contentHash(ProblemCodec.read(a));
        assertThat(ProblemCodec.contentHash(ProblemCodec.read(b))).isEqualTo(ha);
        assertThat(ProblemCodec.contentHash(ProblemCodec.read(c))).isNotEqualTo(ha);
    }

    @Test
    void badProblemFilesGetOneLineNamingFileAndPlace() throws Exception {
        String head = "{\"format\":\"obverse.problem/1\",\"domain\":\"spin\",";
        assertThatThrownBy(() -> ProblemCodec.read(file("m.json", "{\"format\": \"obverse.problem/1\", ")))
                .isInstanceOf(BadInputException.class).hasMessageContaining("m.json").hasMessageContaining("line 1")
                .hasMessageContaining("not valid JSON");
        assertThatThrownBy(() -> ProblemCodec.read(file("k.json", "{\"format\":\"obverse.device/1\"}")))
                .hasMessageContaining("k.json").hasMessageContaining("not \"obverse.problem/1\"");
        assertThatThrownBy(() -> ProblemCodec.read(file("v.json", "{\"format\":\"obverse.problem/2\",\"domain\":\"spin\"}")))
                .hasMessageContaining("obverse.problem/2");
        assertThatThrownBy(() -> ProblemCodec.read(file("d.json", head + "\"J\":[[0,1,1],[1,0,2]]}")))
                .hasMessageContaining("J[1]").hasMessageContaining("twice");
        assertThatThrownBy(() -> ProblemCodec.read(file("s.json", head + "\"J\":[[4,4,1]]}")))
                .hasMessageContaining("J[0]").hasMessageContaining("itself");
        assertThatThrownBy(() -> ProblemCodec.read(file("i.json", head + "\"h\":[[0,1e999]]}")))
                .hasMessageContaining("h[0][1]").hasMessageContaining("not a finite number");
        assertThatThrownBy(() -> ProblemCodec.read(file("n.json", head + "\"h\":[[-2,1]]}")))
                .hasMessageContaining("h[0][0]").hasMessageContaining("negative");
        assertThatThrownBy(() -> ProblemCodec.read(file("t.json", head + "\"h\":[[0,\"1\"]]}")))
                .hasMessageContaining("not a number");
        assertThatThrownBy(() -> ProblemCodec.read(file("x.json", head + "\"Q\":[[0,0,1]]}")))
                .hasMessageContaining("binary term in a spin problem");
        assertThatThrownBy(() -> ProblemCodec.read(dir.resolve("absent.json"))).hasMessageContaining("no such file");
    }

    @Test
    void devicesAndChainsRoundTrip() throws Exception {
        QubitGraph g = QubitGraph.of(new int[] {0, 1, 2, 5}, new int[][] {{0, 1}, {1, 2}, {5, 0}});
        DeviceLimits d = DeviceLimits.builder(ValueRange.of(-2, 2), ValueRange.of(-2, 1))
                .couplingSum(ValueRange.of(-9, 4)).couplerRange(2, 1, ValueRange.of(-1, 1)).graph(g).build();
        Path f = dir.resolve("dev.json");
        DeviceCodec.write(f, false, d);
        DeviceLimits back = DeviceCodec.read(f);
        assertThat(DeviceCodec.contentHash(back)).isEqualTo(DeviceCodec.contentHash(d));
        assertThat(back.couplingRange(1, 2)).isEqualTo(ValueRange.of(-1, 1));
        assertThat(back.couplingRange(0, 1)).isEqualTo(ValueRange.of(-2, 1));
        assertThat(back.graph().orElseThrow().hasCoupler(0, 5)).isTrue();
        assertThatThrownBy(() -> DeviceCodec.read(file("bd.json",
                "{\"format\":\"obverse.device/1\",\"field\":[1,-1],\"coupling\":[-2,1]}")))
                .hasMessageContaining("\"field\"").hasMessageContaining("lo > hi");

        ChainList c = ChainsCodec.read(file("c.json",
                "{\"format\":\"obverse.chains/1\",\"chains\":[[3,[9,4]],[1,[2]]]}"));
        assertThat(c.logicalIds()).containsExactly(1, 3);
        assertThat(c.qubitGroups()[1]).containsExactly(4, 9);
        assertThatThrownBy(() -> ChainsCodec.read(file("c2.json",
                "{\"format\":\"obverse.chains/1\",\"chains\":[[3,[9,4]],[1,[4]]]}")))
                .hasMessageContaining("chains[1]").hasMessageContaining("qubit 4");
    }

    @Test
    void atomicOutputRefusesToOverwriteWithoutForce() throws Exception {
        Path f = file("out.json", "old");
        assertThatThrownBy(() -> AtomicOutput.writeText(f, false, List.of(), "new")).hasMessageContaining("already exists")
                .hasMessageContaining("--force");
        assertThat(Files.readString(f)).isEqualTo("old");
        AtomicOutput.writeText(f, true, List.of(), "new");
        assertThat(Files.readString(f)).isEqualTo("new");
        try (var s = Files.list(dir)) {
            assertThat(s.map(p -> p.getFileName().toString())).noneMatch(n -> n.endsWith(".part"));
        }
        // Temporary names are private; the published outputs get the usual modes.
        assertThat(java.nio.file.attribute.PosixFilePermissions.toString(Files.getPosixFilePermissions(f)))
                .isEqualTo("rw-r--r--");
        Path d = dir.resolve("folder");
        AtomicOutput.writeDirectory(d, false, List.of(), tmp -> Files.writeString(tmp.resolve("x"), "x"));
        assertThat(java.nio.file.attribute.PosixFilePermissions.toString(Files.getPosixFilePermissions(d)))
                .isEqualTo("rwxr-xr-x");
    }

    @Test
    void aLatticeDeviceRecordsItsShapeUnderMetaAndReadsItBack() throws Exception {
        // One K_{1,1} cell: qubits 0 (side 0) and 1 (side 1), one coupler; qubit 1 removed.
        CellLattice l = CellLattice.of(1, 1, 1);
        DeviceLimits d = DeviceLimits.builder(ValueRange.of(-2, 2), ValueRange.of(-1, 1))
                .graph(l.graphWithout(new int[] {1}, new int[0][])).build();
        Path f = dir.resolve("dev.json");
        DeviceCodec.write(f, false, d, new DeviceCodec.LatticeMeta(l, 9L));
        // Expected bytes written by hand from spec/chains.md (the device file and meta.lattice)
        // (common practice, no source).
        assertThat(Files.readString(f)).isEqualTo("""
                {
                  "format" : "obverse.device/1",
                  "field" : [ -2.0, 2.0 ],
                  "coupling" : [ -1.0, 1.0 ],
                  "qubits" : [ 0 ],
                  "couplers" : [ ],
                  "meta" : {
                    "lattice" : {
                      "rows" : 1,
                      "cols" : 1,
                      "shore" : 1,
                      "numbering" : "qubit = ((row*cols + col)*2 + side)*shore + k; side 0 vertical, side 1 horizontal"
                    },
                    "removed_qubits" : [ 1 ],
                    "seed" : 9
                  }
                }
                """);
        assertThat(DeviceCodec.read(f).graph().orElseThrow().qubits().toArray()).containsExactly(0);
        CellLattice back = DeviceCodec.lattice(f);
        assertThat(List.of(back.rows(), back.cols(), back.shore())).containsExactly(1, 1, 1);
        Seeds.forEachCase(30, 0x1a77L, (rng, seed) -> {
            CellLattice m = CellLattice.of(1 + rng.nextInt(4), 1 + rng.nextInt(4), 1 + rng.nextInt(4));
            Path g = dir.resolve("d" + seed + ".json");
            DeviceCodec.write(g, false, DeviceLimits.builder(ValueRange.of(-1, 1), ValueRange.of(-1, 1))
                    .graph(m.graph()).build(), new DeviceCodec.LatticeMeta(m, null));
            assertThat(Files.readString(g)).contains("\"removed_qubits\" : [ ]").doesNotContain("seed");
            CellLattice r = DeviceCodec.lattice(g);
            assertThat(List.of(r.rows(), r.cols(), r.shore())).containsExactly(m.rows(), m.cols(), m.shore());
        });
        // Without a record there is no lattice; a record that makes no lattice is refused in one line.
        assertThat(DeviceCodec.lattice(file("plain.json", "{\"format\": \"obverse.device/1\", \"field\": [-1, 1], "
                + "\"coupling\": [-1, 1]}"))).isNull();
        Path bad = file("bad.json", "{\"format\": \"obverse.device/1\", \"field\": [-1, 1], \"coupling\": [-1, 1], "
                + "\"meta\": {\"lattice\": {\"rows\": 0, \"cols\": 2, \"shore\": 4}}}");
        assertThatThrownBy(() -> DeviceCodec.lattice(bad)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("bad.json: \"meta\".\"lattice\": lattice 0 x 2");
    }
}
