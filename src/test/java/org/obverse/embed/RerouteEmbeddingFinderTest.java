package org.obverse.embed;

import org.junit.jupiter.api.Test;
import org.obverse.device.CellLattice;
import org.obverse.device.QubitGraph;
import org.obverse.model.IsingProblem;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class RerouteEmbeddingFinderTest extends QuietTest {

    @Test
    void embeddingsFoundOnLatticesWithDefectsAreValid() {
        // Validity is judged by a check written apart from the finder (minor embedding as in
        // Choi, Quantum Inf. Process. 7, 193, 2008).
        Seeds.forEachCase(12, 500, (rng, seed) -> {
            int size = 4 + rng.nextInt(4);
            CellLattice lattice = CellLattice.of(size, size, 4);
            QubitGraph g = CellLattice.withRandomDefects(lattice.graph(), rng.nextInt(10), rng.nextInt(10), rng);
            int n = 6 + rng.nextInt(2 * size);
            IsingProblem logical = TestProblems.random(n, 0.3, rng);
            Chains chains = RerouteEmbeddingFinder.find(logical, g, FinderLimits.rounds(200), rng);
            assertThat(IndependentMinorCheck.isMinorEmbedding(logical, chains, g)).isTrue();
            assertThat(EmbeddingCheck.problems(logical, chains, g)).isEmpty();
        });
    }

    @Test
    void aCliqueOnADamagedGridAsTheDemoNeeds() {
        // K_12 on a 6 x 6 grid of K4,4 cells with missing qubits (the native clique would give K_24 on a perfect grid).
        CellLattice lattice = CellLattice.of(6, 6, 4);
        QubitGraph g = CellLattice.withRandomDefects(lattice.graph(), 6, 0, Seeds.rng(7));
        IsingProblem clique = TestProblems.complete(12);
        Chains chains = RerouteEmbeddingFinder.find(clique, g, FinderLimits.rounds(300), Seeds.rng(8));
        assertThat(IndependentMinorCheck.isMinorEmbedding(clique, chains, g)).isTrue();
    }

    @Test
    void sameSeedSameChains() {
        CellLattice lattice = CellLattice.of(4, 4, 4);
        IsingProblem logical = TestProblems.random(12, 0.4, Seeds.rng(1));
        Chains a = RerouteEmbeddingFinder.find(logical, lattice.graph(), FinderLimits.rounds(100), Seeds.rng(2));
        Chains b = RerouteEmbeddingFinder.find(logical, lattice.graph(), FinderLimits.rounds(100), Seeds.rng(2));
        assertThat(a).isEqualTo(b);
    }

    @Test
    void anImpossibleProblemFailsWithAClearMessage() {
        // K_9 has 36 edges; one K4,4 cell has 8 qubits, fewer than 9 vertices, and a 1 x 2 grid
        // (16 qubits, 36 couplers) cannot hold K_12's 66 edges between disjoint chains either.
        CellLattice lattice = CellLattice.of(1, 2, 4);
        assertThatThrownBy(() -> RerouteEmbeddingFinder.find(TestProblems.complete(12), lattice.graph(),
                FinderLimits.rounds(20), Seeds.rng(3)))
                .isInstanceOf(EmbeddingNotFoundException.class)
                .hasMessageContaining("no embedding of 12 logical variables")
                .hasMessageContaining("after 20 rounds");
        assertThatThrownBy(() -> RerouteEmbeddingFinder.find(TestProblems.complete(20), lattice.graph(),
                FinderLimits.rounds(20), Seeds.rng(3)))
                .hasMessageContaining("cannot fit 16 qubits");
    }

    @Test
    void bestOfSeveralTriesKeepsTheShortestLongestChain() {
        CellLattice lattice = CellLattice.of(5, 5, 4);
        QubitGraph g = CellLattice.withRandomDefects(lattice.graph(), 5, 5, Seeds.rng(11));
        IsingProblem logical = TestProblems.random(14, 0.3, Seeds.rng(12));
        Chains best = RerouteEmbeddingFinder.findBest(logical, g, FinderLimits.rounds(300), 4, Seeds.rng(13));
        assertThat(IndependentMinorCheck.isMinorEmbedding(logical, best, g)).isTrue();
        // Replay the tries (each seeded from the caller's generator in turn) and compare.
        org.apache.commons.rng.UniformRandomProvider rng = Seeds.rng(13);
        int shortest = Integer.MAX_VALUE;
        for (int t = 0; t < 4; t++) {
            Chains c = RerouteEmbeddingFinder.find(logical, g, FinderLimits.rounds(300),
                    org.apache.commons.rng.simple.RandomSource.XO_RO_SHI_RO_128_PP.create(rng.nextLong()));
            shortest = Math.min(shortest, c.maxLength());
        }
        assertThat(best.maxLength()).isEqualTo(shortest);
    }
}
