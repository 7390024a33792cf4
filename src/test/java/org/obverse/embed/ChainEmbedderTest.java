package org.obverse.embed;

import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.device.CellLattice;
import org.obverse.device.DeviceLimits;
import org.obverse.device.LimitCheck;
import org.obverse.device.QubitGraph;
import org.obverse.device.ValueRange;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

class ChainEmbedderTest extends QuietTest {
    /**
     * The identity is exact in real arithmetic; in doubles each spread term h/L (J/c) is rounded
     * and summed back L (c) times, so the two sides differ by a few ulps of the sum of |terms|.
     */
    private static final double RELATIVE_ROUNDING = 1e-12;

    private static DeviceLimits device(QubitGraph g) {
        // An asymmetric coupling range with an extended negative side (common practice, no source).
        return DeviceLimits.builder(ValueRange.of(-2, 2), ValueRange.of(-2, 1)).graph(g).build();
    }

    private static byte[] spread(EmbeddedProblem ep, byte[] logical) {
        VariableIndex q = ep.physical().variables();
        byte[] s = new byte[q.size()];
        Chains c = ep.chains();
        for (int v = 0; v < c.size(); v++) {
            for (int qubit : c.chain(v)) {
                s[q.indexOf(qubit)] = logical[v];
            }
        }
        return s;
    }

    private static double magnitude(IsingProblem p) {
        double m = Math.abs(p.offset());
        for (int k = 0; k < p.size(); k++) {
            m += Math.abs(p.field(k));
        }
        for (int e = 0; e < p.edgeCount(); e++) {
            m += Math.abs(p.coupling(e));
        }
        return m;
    }

    @Test
    void unbrokenSamplesObeyTheEmbeddingIdentity() {
        // E_phys = scale · E_logical + (chain couplers) · V for every unbroken sample: Choi,
        // Quantum Inf. Process. 7, 193 (2008), §3, the even spreading of fields and couplings.
        Seeds.forEachCase(25, 1000, (rng, seed) -> {
            int size = 3 + rng.nextInt(4);
            CellLattice lattice = CellLattice.of(size, size, 4);
            QubitGraph g = CellLattice.withRandomDefects(lattice.graph(), rng.nextInt(8), rng.nextInt(8), rng);
            IsingProblem logical = TestProblems.random(4 + rng.nextInt(8), 0.35, rng);
            Chains chains = RerouteEmbeddingFinder.find(logical, g, FinderLimits.rounds(300), rng);
            double v = -0.5 - 1.5 * rng.nextDouble();
            EmbeddedProblem ep = ChainEmbedder.embed(logical, chains, device(g), ChainStrength.uniform(v));
            assertThat(LimitCheck.violations(ep.physical(), device(g))).isEmpty();
            for (int r = 0; r < 20; r++) {
                byte[] s = randomSpins(logical.size(), rng);
                double physical = ep.physical().energy(spread(ep, s));
                double expected = ep.scale() * logical.energy(s) + ep.chainCouplerCount() * v;
                assertThat(physical).isCloseTo(expected, within(RELATIVE_ROUNDING * (magnitude(ep.physical()) + 1)));
                assertThat(ep.logicalEnergy(physical)).isCloseTo(logical.energy(s),
                        within(RELATIVE_ROUNDING * (magnitude(logical) + 1) / Math.min(1, ep.scale())));
            }
        });
    }

    @Test
    void perChainStrengthsKeepTheIdentityWithTheirSum() {
        Seeds.forEachCase(10, 2000, (rng, seed) -> {
            CellLattice lattice = CellLattice.of(4, 4, 4);
            QubitGraph g = CellLattice.withRandomDefects(lattice.graph(), 4, 4, rng);
            IsingProblem logical = TestProblems.random(8, 0.5, rng);
            Chains chains = RerouteEmbeddingFinder.find(logical, g, FinderLimits.rounds(300), rng);
            ChainStrength.Mode mode = rng.nextBoolean() ? ChainStrength.Mode.LENGTH : ChainStrength.Mode.DEGREE;
            EmbeddedProblem ep = ChainEmbedder.embed(logical, chains, device(g), new ChainStrength(-1.5, mode));
            double sum = 0;
            double strongest = 0;
            for (int c = 0; c < chains.size(); c++) {
                sum += ep.chainCouplers(c) * ep.chainCoupling(c);
                strongest = Math.min(strongest, ep.chainCoupling(c));
                int a = mode == ChainStrength.Mode.LENGTH ? ep.chains().length(c) : Math.max(1, logical.degree(c));
                assertThat(ep.chainCoupling(c)).isLessThan(0).isGreaterThanOrEqualTo(-1.5);
                // Proportional: V_c / a_c is the same for every chain.
                assertThat(ep.chainCoupling(c) / a).isCloseTo(ep.chainCoupling(0)
                        / (mode == ChainStrength.Mode.LENGTH ? ep.chains().length(0) : Math.max(1, logical.degree(0))),
                        within(1e-12));
            }
            assertThat(strongest).isEqualTo(-1.5);
            assertThat(ep.chainEnergy()).isCloseTo(sum, within(1e-9));
            byte[] s = randomSpins(logical.size(), rng);
            assertThat(ep.physical().energy(spread(ep, s)))
                    .isCloseTo(ep.scale() * logical.energy(s) + ep.chainEnergy(), within(1e-9));
        });
    }

    @Test
    void termsAreSpreadEvenlyAndTheScaleFillsTheSymmetricRange() {
        // Hand-built: logical h_0 = 0.6, h_1 = -0.3, J_01 = 0.8 on a 1 x 2 lattice of K2,2.
        CellLattice lattice = CellLattice.of(1, 2, 2);
        QubitGraph g = lattice.graph();
        int a0 = lattice.qubit(0, 0, 0, 0);
        int a1 = lattice.qubit(0, 0, 1, 0);
        int b0 = lattice.qubit(0, 1, 1, 0);
        int b1 = lattice.qubit(0, 1, 0, 0);
        Chains chains = Chains.of(new int[] {0, 1}, new int[][] {{a0, a1}, {b0, b1}});
        IsingProblem logical = IsingProblem.builder().field(0, 0.6).field(1, -0.3).coupling(0, 1, 0.8).offset(2).build();
        EmbeddedProblem ep = ChainEmbedder.embed(logical, chains, device(g), ChainStrength.uniform(-2));
        IsingProblem p = ep.physical();
        VariableIndex q = p.variables();
        // Spread terms: h 0.3 on a0, a1; -0.15 on b0, b1; J 0.8 over one coupler (a1, b0).
        // Fit: fields |0.3 s| <= 2, coupling |0.8 s| <= min(2, 1) = 1, so s = 1.25 (the coupling binds).
        assertThat(ep.scale()).isEqualTo(1.25);
        assertThat(p.field(q.indexOf(a0))).isEqualTo(0.375);
        assertThat(p.field(q.indexOf(b1))).isEqualTo(-0.1875);
        assertThat(p.coupling(p.edgeBetween(q.indexOf(a1), q.indexOf(b0)))).isEqualTo(1.0);
        assertThat(p.coupling(p.edgeBetween(q.indexOf(a0), q.indexOf(a1)))).isEqualTo(-2.0);
        assertThat(p.coupling(p.edgeBetween(q.indexOf(b0), q.indexOf(b1)))).isEqualTo(-2.0);
        assertThat(ep.chainCouplerCount()).isEqualTo(2);
        assertThat(p.edgeCount()).isEqualTo(3);
        assertThat(p.offset()).isEqualTo(2.5);
        // A fixed scale that does not fit is refused.
        assertThatThrownBy(() -> ChainEmbedder.embed(logical, chains, device(g), ChainStrength.uniform(-2), 2.0))
                .hasMessageContaining("scale 2.0");
    }

    @Test
    void everyCouplerInsideAChainCarriesTheChainCoupling() {
        // The native clique's chains in a full lattice each have m couplers inside them
        // (a path of m + 1 qubits; Boothby, King & Roy 2016): count them independently.
        CellLattice lattice = CellLattice.of(3, 3, 4);
        Chains chains = CliqueEmbedding.of(lattice, 12);
        EmbeddedProblem ep = ChainEmbedder.embed(TestProblems.complete(12), chains, device(lattice.graph()),
                ChainStrength.uniform(-1.75));
        assertThat(ep.chainCouplerCount()).isEqualTo(12 * 3);
        long atV = java.util.stream.IntStream.range(0, ep.physical().edgeCount())
                .filter(e -> ep.physical().coupling(e) == -1.75).count();
        assertThat(atV).isEqualTo(36);
    }

    @Test
    void badChainsAndCouplingsAreRefusedWithAClearLine() {
        CellLattice lattice = CellLattice.of(2, 2, 4);
        QubitGraph g = lattice.graphWithout(new int[] {lattice.qubit(1, 1, 0, 3)}, new int[0][]);
        IsingProblem logical = IsingProblem.builder().coupling(0, 1, 1).coupling(1, 2, -1).build();
        int[][] good = {{lattice.qubit(0, 0, 0, 0)}, {lattice.qubit(0, 0, 1, 0)}, {lattice.qubit(0, 0, 0, 1)}};
        assertThat(ChainEmbedder.embed(logical, Chains.of(new int[] {0, 1, 2}, good), device(g),
                ChainStrength.uniform(-1)).physical().size()).isEqualTo(3);

        int[][] disconnected = {{lattice.qubit(0, 0, 0, 0), lattice.qubit(0, 0, 0, 2)}, good[1], good[2]};
        assertThatThrownBy(() -> ChainEmbedder.embed(logical, Chains.of(new int[] {0, 1, 2}, disconnected), device(g),
                ChainStrength.uniform(-1))).hasMessageContaining("chain of logical id 0 is not connected");

        int[][] overlapping = {good[0], {good[1][0], good[0][0]}, good[2]};
        assertThatThrownBy(() -> ChainEmbedder.embed(logical, Chains.of(new int[] {0, 1, 2}, overlapping), device(g),
                ChainStrength.uniform(-1))).hasMessageContaining("qubit 0 is in the chains of logical ids 0 and 1");

        int[][] missing = {good[0], good[1], {lattice.qubit(1, 1, 0, 3)}};
        assertThatThrownBy(() -> ChainEmbedder.embed(logical, Chains.of(new int[] {0, 1, 2}, missing), device(g),
                ChainStrength.uniform(-1))).hasMessageContaining("uses qubit " + lattice.qubit(1, 1, 0, 3))
                .hasMessageContaining("not in the device's working graph");

        int[][] apart = {good[0], good[1], {lattice.qubit(1, 1, 1, 0)}};
        assertThatThrownBy(() -> ChainEmbedder.embed(logical, Chains.of(new int[] {0, 1, 2}, apart), device(g),
                ChainStrength.uniform(-1))).hasMessageContaining("logical coupling (1, 2) has no working coupler");

        assertThatThrownBy(() -> ChainEmbedder.embed(logical, Chains.of(new int[] {0, 1}, new int[][] {good[0], good[1]}),
                device(g), ChainStrength.uniform(-1))).hasMessageContaining("logical variable 2 has no chain");

        int[][] longer = {{lattice.qubit(0, 0, 0, 0), lattice.qubit(0, 0, 1, 1)}, good[1], good[2]};
        assertThatThrownBy(() -> ChainEmbedder.embed(logical, Chains.of(new int[] {0, 1, 2}, longer), device(g),
                ChainStrength.uniform(-2.5))).hasMessageContaining("chain coupling -2.5 is outside the coupling range [-2.0, 1.0]");
        assertThatThrownBy(() -> ChainStrength.uniform(0)).hasMessageContaining("other than 0");
    }

    @Test
    void aCouplingSumRangeTheChainsBreakIsReported() {
        // Native clique chains in 3 x 3 cells, logical fields only: a middle qubit of a chain has two
        // chain couplers and nothing else, so with V = -2 its coupling sum is -4, outside [-3, 3].
        CellLattice lattice = CellLattice.of(3, 3, 4);
        DeviceLimits limits = DeviceLimits.builder(ValueRange.of(-2, 2), ValueRange.of(-2, 1))
                .couplingSum(ValueRange.of(-3, 3)).graph(lattice.graph()).build();
        org.obverse.model.IsingBuilder fieldsOnly = IsingProblem.builder();
        for (int v = 0; v < 12; v++) {
            fieldsOnly.field(v, 0.1 * (v + 1));
        }
        IsingProblem logical = fieldsOnly.build();
        assertThatThrownBy(() -> ChainEmbedder.embed(logical, CliqueEmbedding.of(lattice, 12), limits,
                ChainStrength.uniform(-2))).hasMessageContaining("coupling sum at")
                .hasMessageContaining("per-qubit coupling-sum range [-3.0, 3.0]");
    }

    private static byte[] randomSpins(int n, UniformRandomProvider rng) {
        byte[] s = new byte[n];
        for (int k = 0; k < n; k++) {
            s[k] = (byte) (rng.nextBoolean() ? 1 : -1);
        }
        return s;
    }
}
