package org.obverse.campaign;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.embed.ChainStrength;
import org.obverse.io.codec.ChainList;
import org.obverse.io.codec.ChainsCodec;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.model.IsingProblem;
import org.obverse.testsupport.QuietTest;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/** EmbedStep: the written meta states the energy identity, checked over every logical state. */
class EmbedStepTest extends QuietTest {
    @TempDir
    Path dir;

    /** Rounding of a few sums of fractions. */
    private static final double TOL = 1e-12;

    @Test
    void foundChainsAreWrittenAndTheMetaIdentityHoldsOnEveryUnbrokenRead() throws Exception {
        Path out = dir.resolve("phys.json");
        EmbedStep.Result r = EmbedStep.run(new EmbedStep.Request(Path.of("examples/logical.json"), null,
                Path.of("examples/device.json"), ChainStrength.uniform(-1.5), Double.NaN, out, null,
                new EmbedStep.Search(EmbedStep.Finder.REROUTE, 7, 200, 4, 0), false));
        assertThat(r.chainsWritten()).isEqualTo(dir.resolve("phys.chains.json"));
        assertThat(r.found()).isNotNull();
        ChainList chains = ChainsCodec.read(r.chainsWritten());
        ProblemFile pf = ProblemCodec.read(out);
        IsingProblem phys = pf.spin();
        IsingProblem logical = ProblemCodec.read(Path.of("examples/logical.json")).spin();
        double scale = pf.meta().get("scale").asDouble();
        double chainEnergy = pf.meta().get("chain_energy").asDouble();
        assertThat(pf.meta().get("chain_coupling").asDouble()).isEqualTo(-1.5);
        assertThat(pf.meta().get("logical_variables").asInt()).isEqualTo(logical.size());
        // Every logical state, spread over its chains (no chain broken): E_phys = scale E_log +
        // chain_energy (the embedding identity of spec/chains.md; brute force, common practice).
        int n = logical.size();
        for (int mask = 0; mask < 1 << n; mask++) {
            byte[] x = new byte[n];
            byte[] y = new byte[phys.size()];
            for (int v = 0; v < n; v++) {
                x[v] = (byte) ((mask >> v & 1) == 1 ? 1 : -1);
                int id = logical.variables().id(v);
                for (int k = 0; k < chains.logicalIds().length; k++) {
                    if (chains.logicalIds()[k] == id) {
                        for (int qubit : chains.qubitGroups()[k]) {
                            y[phys.variables().indexOf(qubit)] = x[v];
                        }
                    }
                }
            }
            assertThat(phys.energy(y)).isCloseTo(scale * logical.energy(x) + chainEnergy, within(TOL));
        }

        // The same seed finds the same chains, in memory.
        Path again = dir.resolve("again.json");
        EmbedStep.run(new EmbedStep.Request(Path.of("examples/logical.json"), null, Path.of("examples/device.json"),
                ChainStrength.uniform(-1.5), Double.NaN, again, dir.resolve("again-chains.json"),
                new EmbedStep.Search(EmbedStep.Finder.REROUTE, 7, 200, 4, 0), false));
        assertThat(Files.readString(dir.resolve("again-chains.json"))).isEqualTo(Files.readString(r.chainsWritten()));
        assertThat(Files.readString(again)).isEqualTo(Files.readString(out));
    }
}
