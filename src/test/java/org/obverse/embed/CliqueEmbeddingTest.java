package org.obverse.embed;

import org.junit.jupiter.api.Test;
import org.obverse.device.CellLattice;
import org.obverse.device.QubitGraph;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.testsupport.QuietTest;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class CliqueEmbeddingTest extends QuietTest {

    @Test
    void reachesThePublishedSizeWithChainsOfLengthMPlusOne() {
        // Boothby, King & Roy, Quantum Inf. Process. 15, 495 (2016): a defect-free m x m grid of
        // K4,4 cells holds a native clique embedding of K_{4m} whose chains all have length m + 1.
        for (int m = 1; m <= 8; m++) {
            CellLattice lattice = CellLattice.of(m, m, 4);
            QubitGraph g = lattice.graph();
            assertThat(CliqueEmbedding.maxSize(lattice)).isEqualTo(4 * m);
            Chains chains = CliqueEmbedding.of(lattice, 4 * m);
            IsingProblem clique = TestProblems.complete(4 * m);
            assertThat(chains.size()).isEqualTo(4 * m);
            for (int c = 0; c < chains.size(); c++) {
                assertThat(chains.length(c)).isEqualTo(m + 1);
            }
            assertThat(EmbeddingCheck.problems(clique, chains, g)).isEmpty();
            assertThat(IndependentMinorCheck.isMinorEmbedding(clique, chains, g)).isTrue();
        }
    }

    @Test
    void otherShoresAndNonSquareGrids() {
        // The same construction with shore t gives K_{t·m} (same source, stated for general t).
        CellLattice lattice = CellLattice.of(3, 5, 3);
        Chains chains = CliqueEmbedding.of(lattice, 9);
        assertThat(IndependentMinorCheck.isMinorEmbedding(TestProblems.complete(9), chains, lattice.graph())).isTrue();
        assertThat(chains.maxLength()).isEqualTo(4);
        assertThatThrownBy(() -> CliqueEmbedding.of(lattice, 10)).hasMessageContaining("at most 9");
    }

    @Test
    void forVariablesPutsSparseIdsOnCliqueVertices() {
        CellLattice lattice = CellLattice.of(2, 2, 4);
        Chains chains = CliqueEmbedding.forVariables(lattice, VariableIndex.of(40, 7, 12));
        assertThat(chains.logicalIds().toArray()).containsExactly(7, 12, 40);
        assertThat(chains.chainOf(7)).containsExactly(lattice.qubit(0, 0, 0, 0), lattice.qubit(0, 0, 1, 0),
                lattice.qubit(0, 1, 1, 0));
    }

    @Test
    void aRemovedQubitBreaksTheCliqueAndTheCheckSaysWhere() {
        CellLattice lattice = CellLattice.of(2, 2, 4);
        QubitGraph broken = lattice.graphWithout(new int[] {lattice.qubit(0, 0, 0, 0)}, new int[0][]);
        Chains chains = CliqueEmbedding.of(lattice, 8);
        assertThat(EmbeddingCheck.problems(TestProblems.complete(8), chains, broken))
                .anyMatch(p -> p.contains("qubit 0") && p.contains("not in the device's working graph"));
        assertThat(IndependentMinorCheck.isMinorEmbedding(TestProblems.complete(8), chains, broken)).isFalse();
    }

    @Test
    void avoidingDefectsStillGivesAValidCliqueWithShortChains() {
        org.obverse.testsupport.Seeds.forEachCase(10, 40, (rng, seed) -> {
            CellLattice lattice = CellLattice.of(8, 8, 4);
            QubitGraph g = CellLattice.withRandomDefects(lattice.graph(), 1 + rng.nextInt(8), rng.nextInt(8), rng);
            int n = 8 + rng.nextInt(13);
            Chains chains = CliqueEmbedding.avoidingDefects(lattice, g, TestProblems.complete(n).variables());
            assertThat(IndependentMinorCheck.isMinorEmbedding(TestProblems.complete(n), chains, g)).isTrue();
            // Chains are the construction's L shapes in an s x s square, s >= ceil(n / 4): length s + 1.
            assertThat(chains.maxLength()).isGreaterThanOrEqualTo((n + 3) / 4 + 1).isLessThanOrEqualTo(9);
        });
        // On a perfect lattice the smallest square is used: K_8 in 2 x 2 cells, chains of length 3.
        CellLattice lattice = CellLattice.of(5, 5, 4);
        assertThat(CliqueEmbedding.avoidingDefects(lattice, lattice.graph(), TestProblems.complete(8).variables()).maxLength())
                .isEqualTo(3);
        // Every qubit of a 1 x 1 lattice is needed for K_4; one missing makes it impossible.
        CellLattice one = CellLattice.of(1, 1, 4);
        assertThatThrownBy(() -> CliqueEmbedding.avoidingDefects(one, one.graphWithout(new int[] {0}, new int[0][]),
                TestProblems.complete(4).variables())).isInstanceOf(EmbeddingNotFoundException.class)
                .hasMessageContaining("no native clique of 4 variables");
    }
}
