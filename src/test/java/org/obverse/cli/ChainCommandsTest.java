package org.obverse.cli;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.device.CellLattice;
import org.obverse.device.DeviceLimits;
import org.obverse.embed.Chains;
import org.obverse.embed.EmbeddingCheck;
import org.obverse.io.codec.ChainList;
import org.obverse.io.codec.ChainsCodec;
import org.obverse.io.codec.DeviceCodec;
import org.obverse.io.json.JsonFiles;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.samples.SampleFiles;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.samples.SampleBlock;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class ChainCommandsTest extends CommandTestSupport {
    @TempDir
    Path tmp;

    private Path lattice(String name, String... extra) {
        Path d = tmp.resolve(name);
        String[] base = {"device", "lattice", "--rows", "3", "--cols", "3", "--shore", "4", "--out", d.toString()};
        String[] args = new String[base.length + extra.length];
        System.arraycopy(base, 0, args, 0, base.length);
        System.arraycopy(extra, 0, args, base.length, extra.length);
        Run r = obverse(args);
        assertThat(r.code()).as(r.err()).isZero();
        return d;
    }

    private Path logical() throws Exception {
        // A 5-cycle with a chord and fields; offset 1.5.
        IsingProblem q = IsingProblem.builder().field(0, 0.5).field(2, -0.25).field(4, 1.0)
                .coupling(0, 1, 1.0).coupling(1, 2, -0.5).coupling(2, 3, 0.75).coupling(3, 4, -1.0).coupling(4, 0, 0.5)
                .coupling(1, 3, 0.25).offset(1.5).build();
        Path p = tmp.resolve("logical.json");
        ProblemCodec.write(p, false, ProblemFile.of(q, null));
        return p;
    }

    @Test
    void latticeWritesTheWorkingGraphWithDefects() throws Exception {
        Path d = lattice("dev.json", "--remove-qubits", "5,70", "--remove-couplers", "0-4", "--random-qubits", "3",
                "--seed", "9", "--coupling=-2,1");
        DeviceLimits limits = DeviceCodec.read(d);
        // 3 x 3 cells of K4,4: 72 qubits; 70 is a real id, 5 too.
        assertThat(limits.graph().orElseThrow().qubits().size()).isEqualTo(72 - 2 - 3);
        assertThat(limits.graph().orElseThrow().hasCoupler(0, 4)).isFalse();
        assertThat(limits.couplingRange().lo()).isEqualTo(-2.0);
        ObjectNode json = JsonFiles.read(d, "device");
        assertThat(json.path("meta").path("lattice").path("rows").asInt()).isEqualTo(3);
        assertThat(json.path("meta").path("removed_qubits").size()).isEqualTo(5);

        Run bad = obverse("device", "lattice", "--rows", "2", "--cols", "2", "--remove-couplers", "0:4", "--out",
                tmp.resolve("x.json").toString());
        assertThat(bad.code()).isEqualTo(2);
        assertThat(bad.err()).contains("'0:4' is not a coupler");
        // A coupler or qubit the lattice lacks, or a zero size, is bad input (exit 2), not an internal error.
        for (String[] args : new String[][] {{"--remove-couplers", "0-1"}, {"--remove-qubits", "32"},
            {"--random-qubits", "33"}}) {
            Run absent = obverse(Stream.concat(Stream.of("device", "lattice", "--rows", "2", "--cols", "2", "--out",
                    tmp.resolve("y.json").toString()), Stream.of(args)).toArray(String[]::new));
            assertThat(absent.code()).as(args[0]).isEqualTo(2);
            assertThat(absent.err()).as(args[0]).contains(args[0]).doesNotContain("internal error");
        }
        Run zero = obverse("device", "lattice", "--rows", "0", "--cols", "2", "--out", tmp.resolve("z.json").toString());
        assertThat(zero.code()).isEqualTo(2);
        assertThat(zero.err()).contains("must be >= 1");
        Run again = obverse("device", "lattice", "--rows", "3", "--cols", "3", "--out", d.toString());
        assertThat(again.code()).isEqualTo(2);
        assertThat(again.err()).contains("already exists");
    }

    @Test
    void embedFindsChainsAndTheMetaGivesTheIdentity() throws Exception {
        Path d = lattice("dev.json", "--random-qubits", "4", "--seed", "3");
        Path q = logical();
        Path p = tmp.resolve("phys.json");
        Run r = obverse("embed", "--logical", q.toString(), "--device", d.toString(), "--chain-coupling", "-1.5",
                "--seed", "4", "--out", p.toString());
        assertThat(r.code()).as(r.err()).isZero();
        assertThat(r.out()).contains("scale").contains("chain couplers");
        Path chainsFile = tmp.resolve("phys.chains.json");
        ChainList list = ChainsCodec.read(chainsFile);
        Chains c = Chains.of(list.logicalIds(), list.qubitGroups());
        IsingProblem logical = ProblemCodec.read(q).spin();
        assertThat(EmbeddingCheck.problems(logical, c, DeviceCodec.read(d).graph().orElseThrow())).isEmpty();
        ProblemFile pf = ProblemCodec.read(p);
        double scale = pf.meta().get("scale").asDouble();
        int couplers = pf.meta().get("chain_couplers").asInt();
        assertThat(pf.meta().get("chain_coupling").asDouble()).isEqualTo(-1.5);
        // Every unbroken read: E_phys = scale · E_logical + couplers · V (DESIGN.md's embedding identity).
        IsingProblem phys = pf.spin();
        for (int mask = 0; mask < 32; mask++) {
            byte[] s = new byte[5];
            for (int k = 0; k < 5; k++) {
                s[k] = (byte) (((mask >> k) & 1) == 1 ? 1 : -1);
            }
            byte[] physical = new byte[phys.size()];
            for (int k = 0; k < 5; k++) {
                for (int qubit : c.chainOf(k)) {
                    physical[phys.variables().indexOf(qubit)] = s[k];
                }
            }
            assertThat(phys.energy(physical)).isCloseTo(scale * logical.energy(s) + couplers * -1.5, within(1e-12));
        }

        // Per-chain coupling proportional to length: the longest chain gets V, V_c / L_c is constant.
        Path p3 = tmp.resolve("bylength.json");
        Run byLength = obverse("embed", "--logical", q.toString(), "--chains", chainsFile.toString(), "--device",
                d.toString(), "--chain-coupling", "-2", "--chain-coupling-mode", "length", "--out", p3.toString());
        assertThat(byLength.code()).as(byLength.err()).isZero();
        ProblemFile lengthFile = ProblemCodec.read(p3);
        assertThat(lengthFile.meta().get("chain_coupling_mode").asText()).isEqualTo("length");
        IsingProblem lp = lengthFile.spin();
        int longest = c.maxLength();
        for (int k = 0; k < 5; k++) {
            int[] chain = c.chainOf(k);
            for (int a = 0; a < chain.length; a++) {
                for (int b = a + 1; b < chain.length; b++) {
                    int e = lp.edgeBetween(lp.variables().indexOf(chain[a]), lp.variables().indexOf(chain[b]));
                    if (e >= 0) {
                        assertThat(lp.coupling(e)).isCloseTo(-2.0 * chain.length / longest, within(1e-15));
                    }
                }
            }
        }

        Path p2 = tmp.resolve("clique.json");
        Run clique = obverse("embed", "--logical", q.toString(), "--device", lattice("full.json").toString(),
                "--chain-coupling", "-2", "--finder", "clique", "--out", p2.toString());
        assertThat(clique.code()).as(clique.err()).isZero();
        // 5 variables fit a 2 x 2 square of K4,4 cells: chains of length 3.
        assertThat(clique.out()).contains("native clique of 5 variables").contains("at most 12").contains("length 3");
    }

    @Test
    void badChainsAndCouplingsAreOneLineAndExitTwo() throws Exception {
        Path d = lattice("dev.json", "--remove-qubits", "71");
        Path q = logical();
        CellLattice l = CellLattice.of(3, 3, 4);
        int[][] good = cliqueLike(l);
        String[][] cases = {
            // chain of 0 not connected: two vertical qubits of different k in one cell
            {"0", l.qubit(2, 2, 0, 0) + "," + l.qubit(2, 2, 0, 1), "not connected"},
            // chain uses the removed qubit 71
            {"4", "71", "qubit 71, which is not in the device's working graph"},
            // chain of 3 far from 4's: the logical coupling (3, 4) has no coupler
            {"3", String.valueOf(l.qubit(2, 0, 0, 3)), "logical coupling"},
        };
        for (String[] cse : cases) {
            int id = Integer.parseInt(cse[0]);
            int[][] chains = good.clone();
            chains[id] = java.util.Arrays.stream(cse[1].split(",")).mapToInt(Integer::parseInt).toArray();
            Path cf = tmp.resolve("chains-" + id + ".json");
            ChainsCodec.write(cf, true, new ChainList(new int[] {0, 1, 2, 3, 4}, chains));
            Run r = obverse("embed", "--logical", q.toString(), "--chains", cf.toString(), "--device", d.toString(),
                    "--chain-coupling", "-1", "--out", tmp.resolve("p" + id + ".json").toString());
            assertThat(r.code()).as(r.err()).isEqualTo(2);
            assertThat(r.err()).contains(cse[2]).contains(cf.toString());
            assertThat(r.err().strip().lines().count()).isEqualTo(1);
        }
        Path cf = tmp.resolve("good.json");
        ChainsCodec.write(cf, false, new ChainList(new int[] {0, 1, 2, 3, 4}, good));
        Run strong = obverse("embed", "--logical", q.toString(), "--chains", cf.toString(), "--device", d.toString(),
                "--chain-coupling", "-3", "--out", tmp.resolve("p.json").toString());
        assertThat(strong.code()).isEqualTo(2);
        assertThat(strong.err()).contains("chain coupling -3.0 is outside the coupling range [-2.0, 1.0]");
        Files.writeString(tmp.resolve("overlap.json"),
                "{\"format\": \"obverse.chains/1\", \"chains\": [[0, [0, 4]], [1, [4]]]}");
        Run overlap = obverse("embed", "--logical", q.toString(), "--chains", tmp.resolve("overlap.json").toString(),
                "--device", d.toString(), "--chain-coupling", "-1", "--out", tmp.resolve("p.json").toString());
        assertThat(overlap.code()).isEqualTo(2);
        assertThat(overlap.err()).contains("qubit 4 is in the chains of logical 0 and 1");
    }

    /** The native clique's first five chains in the 3 x 3 lattice (valid for any 5-variable problem). */
    private static int[][] cliqueLike(CellLattice l) {
        Chains c = org.obverse.embed.CliqueEmbedding.of(l, 5);
        return c.qubitGroups();
    }

    @Test
    void decodeWritesThePinnedOutputsForEachRule() throws Exception {
        Path d = lattice("dev.json");
        Path q = logical();
        CellLattice l = CellLattice.of(3, 3, 4);
        Path cf = tmp.resolve("chains.json");
        ChainsCodec.write(cf, false, new ChainList(new int[] {0, 1, 2, 3, 4}, cliqueLike(l)));
        Path p = tmp.resolve("phys.json");
        assertThat(obverse("embed", "--logical", q.toString(), "--chains", cf.toString(), "--device", d.toString(),
                "--chain-coupling", "-2", "--out", p.toString()).code()).isZero();
        VariableIndex qubits = ProblemCodec.read(p).variables();
        // Three reads: all +1; all -1 except one qubit of chain 0 (broken, majority -1); all +1 but two of chain 1.
        int n = qubits.size();
        byte[] flat = new byte[3 * n];
        java.util.Arrays.fill(flat, 0, n, (byte) 1);
        java.util.Arrays.fill(flat, n, 2 * n, (byte) -1);
        java.util.Arrays.fill(flat, 2 * n, 3 * n, (byte) 1);
        int[] chain0 = l.qubit(0, 0, 0, 0) == 0 ? cliqueLike(l)[0] : null;
        flat[n + qubits.indexOf(chain0[0])] = 1;
        int[] chain1 = cliqueLike(l)[1];
        flat[2 * n + qubits.indexOf(chain1[0])] = -1;
        flat[2 * n + qubits.indexOf(chain1[1])] = -1;
        Path s = tmp.resolve("samples.npy");
        SampleFiles.writeAll(s, qubits, false, SampleBlock.fromSpins(flat, 3, n));
        IsingProblem logical = ProblemCodec.read(q).spin();

        Path out = tmp.resolve("maj");
        Run r = obverse("decode", "--problem", p.toString(), "--logical", q.toString(), "--chains", cf.toString(),
                "--samples", s.toString(), "--rule", "majority", "--out", out.toString());
        assertThat(r.code()).as(r.err()).isZero();
        assertThat(NpyVectors.readBool(out.resolve("kept.npy"), 3)).containsExactly(true, true, true);
        assertThat(NpyVectors.readInt32(out.resolve("broken.npy"), 3)).containsExactly(0, 1, 1);
        SampleBlock x = SampleFiles.readAll(out.resolve("logical.npy"), logical.variables());
        // Chain length 4 (3 x 3 native clique): 1 of 4 up is majority -1; 2 of 4 down is a tie,
        // settled by the energy given the others (all +1): f_1 = h_1 + J_01 + J_12 + J_13 = 0 + 1 - 0.5 + 0.25 > 0, so -1.
        assertThat(x.toSpins()).containsExactly(1, 1, 1, 1, 1, -1, -1, -1, -1, -1, 1, -1, 1, 1, 1);
        double[] e = NpyVectors.readFloat64(out.resolve("energies.npy"), 3);
        assertThat(e[0]).isEqualTo(logical.energy(new byte[] {1, 1, 1, 1, 1}));
        assertThat(Files.readString(out.resolve("chains.csv"))).startsWith("logical_id,length,broken_reads,broken_fraction\n0,4,1,");

        // The same reads as 0/1 in CSV give the same logical reads, written as 0/1 CSV.
        Path csv = tmp.resolve("samples.csv");
        try (org.obverse.io.samples.SampleWriter sw = SampleFiles.create(csv, qubits, false, org.obverse.io.samples.SampleCoding.BINARY)) {
            sw.writeBlock(SampleBlock.fromSpins(flat, 3, n));
            sw.commit();
        }
        Path bin = tmp.resolve("bin");
        assertThat(obverse("decode", "--problem", p.toString(), "--logical", q.toString(), "--chains", cf.toString(),
                "--samples", csv.toString(), "--rule", "majority", "--binary", "--out", bin.toString()).code()).isZero();
        try (org.obverse.io.samples.SampleReader in = SampleFiles.open(bin.resolve("logical.csv"), logical.variables(),
                org.obverse.io.samples.SampleCoding.BINARY)) {
            assertThat(in.readRemaining().toSpins()).isEqualTo(x.toSpins());
        }
        assertThat(Files.readString(bin.resolve("logical.csv"))).contains("0,1").doesNotContain("-1");

        Path disc = tmp.resolve("disc");
        assertThat(obverse("decode", "--problem", p.toString(), "--logical", q.toString(), "--chains", cf.toString(),
                "--samples", s.toString(), "--rule", "discard", "--out", disc.toString()).code()).isZero();
        assertThat(NpyVectors.readBool(disc.resolve("kept.npy"), 3)).containsExactly(true, false, false);
        assertThat(NpyVectors.readFloat64(disc.resolve("energies.npy"), 1)).hasSize(1);

        Path desc = tmp.resolve("desc");
        assertThat(obverse("decode", "--problem", p.toString(), "--logical", q.toString(), "--chains", cf.toString(),
                "--samples", s.toString(), "--rule", "descend", "--out", desc.toString()).code()).isZero();
        double[] ed = NpyVectors.readFloat64(desc.resolve("energies.npy"), 3);
        for (int k = 0; k < 3; k++) {
            assertThat(ed[k]).isLessThanOrEqualTo(e[k]);
        }

        Path narrow = tmp.resolve("narrow.npy");
        SampleFiles.writeAll(narrow, VariableIndex.of(1, 2, 3), false, SampleBlock.allDown(2, 3));
        Run wrong = obverse("decode", "--problem", p.toString(), "--logical", q.toString(), "--chains", cf.toString(),
                "--samples", narrow.toString(), "--rule", "majority", "--out", tmp.resolve("w").toString());
        assertThat(wrong.code()).isEqualTo(2);
        assertThat(wrong.err()).contains(narrow.toString());
        assertThat(wrong.err().strip().lines().count()).isEqualTo(1);
        Run rule = obverse("decode", "--problem", p.toString(), "--logical", q.toString(), "--chains", cf.toString(),
                "--samples", s.toString(), "--rule", "vote", "--out", tmp.resolve("v").toString());
        assertThat(rule.code()).isEqualTo(2);
        assertThat(rule.err()).contains("not one of discard, majority, descend");
    }
}
