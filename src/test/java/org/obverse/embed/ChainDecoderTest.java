package org.obverse.embed;

import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.samples.SampleBlock;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class ChainDecoderTest extends QuietTest {
    // Hand-built case: v0 = {10}, v1 = {11, 12}, v2 = {13, 14, 15}, v3 = {16, 17, 18, 19}, v4 = {20, 21}.
    private static final Chains CHAINS = Chains.of(new int[] {0, 1, 2, 3, 4},
            new int[][] {{10}, {11, 12}, {13, 14, 15}, {16, 17, 18, 19}, {20, 21}});
    private static final VariableIndex QUBITS = VariableIndex.of(10, 11, 12, 13, 14, 15, 16, 17, 18, 19, 20, 21);
    // h1 = +1 (a tie in v1 settles at -1), J03 = -1 (a tie in v3 follows v0), v4 has no terms (coin).
    private static final IsingProblem LOGICAL = IsingProblem.builder().field(1, 1.0).coupling(0, 3, -1.0)
            .field(2, 0.25).variable(4).build();
    private static final byte[][] READS = {
        //  v0  v1      v2          v3              v4
        {1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1},
        {-1, 1, -1, 1, 1, -1, 1, 1, 1, -1, 1, 1},
        {1, -1, -1, -1, -1, -1, 1, 1, -1, -1, -1, -1},
        {-1, 1, 1, -1, 1, 1, -1, 1, -1, 1, 1, 1},
    };

    private static SampleBlock block(byte[][] rows) {
        int n = rows[0].length;
        byte[] flat = new byte[rows.length * n];
        for (int r = 0; r < rows.length; r++) {
            System.arraycopy(rows[r], 0, flat, r * n, n);
        }
        return SampleBlock.fromSpins(flat, rows.length, n);
    }

    private static int[][] spins(SampleBlock b) {
        int[][] out = new int[b.reads()][b.variables()];
        for (int r = 0; r < b.reads(); r++) {
            for (int k = 0; k < b.variables(); k++) {
                out[r][k] = b.spin(r, k);
            }
        }
        return out;
    }

    @Test
    void majorityOnHandBuiltReadsIncludingTies() {
        // Expected values worked by hand from the rule in ChainDecoder's class comment.
        DecodedSamples d = ChainDecoder.of(LOGICAL, CHAINS, QUBITS, ChainBreakRule.MAJORITY, 1).decode(block(READS));
        int[][] x = spins(d.logical());
        assertThat(x[0]).containsExactly(1, 1, 1, 1, 1);
        // v1 tied, f1 = h1 = +1 > 0 so -1; v2 two of three up; v3 three of four up.
        assertThat(x[1]).containsExactly(-1, -1, 1, 1, 1);
        // v3 tied, f3 = J03·x0 = -1 < 0 so +1.
        assertThat(x[2]).containsExactly(1, -1, -1, 1, -1);
        // v3 tied, x0 = -1 so f3 = +1 and v3 = -1.
        assertThat(x[3]).containsExactly(-1, 1, 1, -1, 1);
        assertThat(d.brokenChains()).containsExactly(0, 3, 1, 2);
        assertThat(d.kept()).containsExactly(true, true, true, true);
        assertThat(d.breaksPerChain()).containsExactly(0, 1, 2, 3, 0);
        assertThat(d.brokenFraction()).isEqualTo(6.0 / 20);
        assertThat(d.brokenReadFraction()).isEqualTo(0.75);
        for (int r = 0; r < 4; r++) {
            byte[] s = new byte[5];
            for (int k = 0; k < 5; k++) {
                s[k] = (byte) x[r][k];
            }
            assertThat(d.energies()[r]).isEqualTo(LOGICAL.energy(s));
        }
    }

    @Test
    void discardDropsEveryReadWithABrokenChainButCountsIt() {
        DecodedSamples d = ChainDecoder.of(LOGICAL, CHAINS, QUBITS, ChainBreakRule.DISCARD, 1).decode(block(READS));
        assertThat(d.reads()).isEqualTo(4);
        assertThat(d.keptReads()).isEqualTo(1);
        assertThat(d.kept()).containsExactly(true, false, false, false);
        assertThat(d.brokenChains()).containsExactly(0, 3, 1, 2);
        assertThat(spins(d.logical())[0]).containsExactly(1, 1, 1, 1, 1);
        assertThat(d.energies()).containsExactly(0.0 + 1 + 0.25 - 1);
    }

    @Test
    void aTieWithNoPullTakesTheSpinOfAQubitOfItsChain() {
        // v4 has no terms: f4 = 0, so the seeded coin picks one of its two qubits. Over 400
        // tied reads both outcomes occur (failure probability 2 · 2^-400 for a fair coin).
        byte[][] rows = new byte[400][];
        for (int r = 0; r < rows.length; r++) {
            rows[r] = READS[0].clone();
            rows[r][10] = (byte) (r % 2 == 0 ? 1 : -1);
            rows[r][11] = (byte) -rows[r][10];
        }
        DecodedSamples d = ChainDecoder.of(LOGICAL, CHAINS, QUBITS, ChainBreakRule.MAJORITY, 5).decode(block(rows));
        int up = 0;
        for (int r = 0; r < rows.length; r++) {
            up += d.logical().spin(r, 4) > 0 ? 1 : 0;
        }
        assertThat(up).isBetween(1, 399);
        DecodedSamples again = ChainDecoder.of(LOGICAL, CHAINS, QUBITS, ChainBreakRule.MAJORITY, 5).decode(block(rows));
        assertThat(again.logical().words()).isEqualTo(d.logical().words());
    }

    @Test
    void bitSlicedDecodingMatchesAPlainPerReadDecoder() {
        // Differential check against a direct count per read (fields generic, so f = 0 never occurs).
        Seeds.forEachCase(20, 300, (rng, seed) -> {
            int n = 3 + rng.nextInt(12);
            IsingProblem logical = randomLogical(n, rng, false);
            Chains chains = randomChains(n, 1 + rng.nextInt(7), rng);
            VariableIndex qubits = chains.allQubits();
            int reads = 1 + rng.nextInt(200);
            byte[] flat = randomSpins(reads * qubits.size(), rng);
            SampleBlock phys = SampleBlock.fromSpins(flat, reads, qubits.size());
            DecodedSamples d = ChainDecoder.of(logical, chains, qubits, ChainBreakRule.MAJORITY, seed).decode(phys);
            DecodedSamples disc = ChainDecoder.of(logical, chains, qubits, ChainBreakRule.DISCARD, seed).decode(phys);
            int kept = 0;
            for (int r = 0; r < reads; r++) {
                int[] x = new int[n];
                boolean[] tied = new boolean[n];
                int broken = 0;
                for (int c = 0; c < n; c++) {
                    int plus = 0;
                    int[] q = chains.chain(c);
                    for (int qubit : q) {
                        plus += flat[r * qubits.size() + qubits.indexOf(qubit)] > 0 ? 1 : 0;
                    }
                    broken += plus != 0 && plus != q.length ? 1 : 0;
                    x[c] = 2 * plus > q.length ? 1 : -1;
                    tied[c] = 2 * plus == q.length;
                }
                for (int c = 0; c < n; c++) {
                    if (tied[c]) {
                        double f = logical.field(c);
                        for (int e = 0; e < logical.edgeCount(); e++) {
                            int o = logical.edgeU(e) == c ? logical.edgeV(e) : logical.edgeV(e) == c ? logical.edgeU(e) : -1;
                            if (o >= 0 && !(o > c && tied[o])) {
                                f += logical.coupling(e) * x[o];
                            }
                        }
                        x[c] = f < 0 ? 1 : -1;
                    }
                }
                assertThat(d.brokenChains()[r]).isEqualTo(broken);
                byte[] xs = new byte[n];
                for (int c = 0; c < n; c++) {
                    xs[c] = (byte) x[c];
                }
                // Energies equal IsingProblem.energy bit for bit (same order, same ±1 products).
                assertThat(d.energies()[r]).isEqualTo(logical.energy(xs));
                for (int c = 0; c < n; c++) {
                    assertThat(d.logical().spin(r, c)).as("read %d chain %d", r, c).isEqualTo(x[c]);
                }
                if (broken == 0) {
                    for (int c = 0; c < n; c++) {
                        assertThat(disc.logical().spin(kept, c)).isEqualTo(x[c]);
                    }
                    kept++;
                }
            }
            assertThat(disc.keptReads()).isEqualTo(kept);
        });
    }

    @Test
    void descendNeverEndsAboveMajorityAndEndsInALocalMinimum() {
        Seeds.forEachCase(15, 700, (rng, seed) -> {
            int n = 4 + rng.nextInt(20);
            IsingProblem logical = randomLogical(n, rng, rng.nextBoolean());
            Chains chains = randomChains(n, 1 + rng.nextInt(5), rng);
            VariableIndex qubits = chains.allQubits();
            int reads = 1 + rng.nextInt(130);
            SampleBlock phys = SampleBlock.fromSpins(randomSpins(reads * qubits.size(), rng), reads, qubits.size());
            DecodedSamples maj = ChainDecoder.of(logical, chains, qubits, ChainBreakRule.MAJORITY, seed).decode(phys);
            DecodedSamples desc = ChainDecoder.of(logical, chains, qubits, ChainBreakRule.DESCEND, seed).decode(phys);
            double[] em = maj.energies();
            double[] ed = desc.energies();
            byte[] x = desc.logical().toSpins();
            for (int r = 0; r < reads; r++) {
                assertThat(ed[r]).isLessThanOrEqualTo(em[r]);
                byte[] s = java.util.Arrays.copyOfRange(x, r * n, (r + 1) * n);
                for (int k = 0; k < n; k++) {
                    s[k] = (byte) -s[k];
                    // No single flip lowers the energy by more than rounding (1e-9 absolute here).
                    assertThat(logical.energy(s)).isGreaterThan(ed[r] - 1e-9);
                    s[k] = (byte) -s[k];
                }
            }
            assertThat(desc.brokenChains()).isEqualTo(maj.brokenChains());
        });
    }

    @Test
    void decodingCommutesWithChainLevelGauges() {
        // decode(g·s) under the gauged logical problem = g ∘ decode(s), for random chain gauges g.
        // Integer couplings and no fields make f = 0 ties (the coin) frequent.
        for (ChainBreakRule rule : new ChainBreakRule[] {ChainBreakRule.MAJORITY, ChainBreakRule.DESCEND}) {
            Seeds.forEachCase(20, 900, (rng, seed) -> {
                int n = 3 + rng.nextInt(10);
                IsingProblem logical = randomLogical(n, rng, true);
                Chains chains = randomChains(n, 2 + 2 * rng.nextInt(3), rng);
                VariableIndex qubits = chains.allQubits();
                int reads = 1 + rng.nextInt(150);
                byte[] flat = randomSpins(reads * qubits.size(), rng);
                int[] g = new int[n];
                byte[] gauged = flat.clone();
                for (int c = 0; c < n; c++) {
                    g[c] = rng.nextBoolean() ? 1 : -1;
                    if (g[c] < 0) {
                        for (int q : chains.chain(c)) {
                            for (int r = 0; r < reads; r++) {
                                gauged[r * qubits.size() + qubits.indexOf(q)] *= -1;
                            }
                        }
                    }
                }
                double[] h = logical.fields();
                double[] j = logical.couplings();
                for (int k = 0; k < n; k++) {
                    h[k] *= g[k];
                }
                for (int e = 0; e < j.length; e++) {
                    j[e] *= g[logical.edgeU(e)] * g[logical.edgeV(e)];
                }
                IsingProblem gaugedLogical = IsingProblem.of(logical.variables(), h, logical.edgeUs(), logical.edgeVs(), j,
                        logical.offset());
                DecodedSamples a = ChainDecoder.of(logical, chains, qubits, rule, seed)
                        .decode(SampleBlock.fromSpins(flat, reads, qubits.size()));
                DecodedSamples b = ChainDecoder.of(gaugedLogical, chains, qubits, rule, seed)
                        .decode(SampleBlock.fromSpins(gauged, reads, qubits.size()));
                for (int r = 0; r < reads; r++) {
                    for (int c = 0; c < n; c++) {
                        assertThat(b.logical().spin(r, c)).isEqualTo(g[c] * a.logical().spin(r, c));
                    }
                }
                assertThat(b.energies()).isEqualTo(a.energies());
                assertThat(b.brokenChains()).isEqualTo(a.brokenChains());
            });
        }
    }

    @Test
    void samplesOfTheWrongWidthAndChainsOffTheProblemAreRefused() {
        ChainDecoder d = ChainDecoder.of(LOGICAL, CHAINS, QUBITS, ChainBreakRule.MAJORITY, 1);
        assertThatThrownBy(() -> d.decode(SampleBlock.allDown(3, 11)))
                .hasMessageContaining("samples have 11 columns but the physical problem has 12 qubits");
        assertThatThrownBy(() -> ChainDecoder.of(LOGICAL, CHAINS, VariableIndex.of(10, 11, 12), ChainBreakRule.MAJORITY, 1))
                .hasMessageContaining("uses qubit 13, which the physical problem does not have");
        assertThatThrownBy(() -> ChainBreakRule.named("vote")).hasMessageContaining("discard, majority, descend");
    }

    static IsingProblem randomLogical(int n, UniformRandomProvider rng, boolean integerNoFields) {
        IsingBuilder b = IsingProblem.builder();
        for (int i = 0; i < n; i++) {
            b.variable(2 * i);
            if (!integerNoFields) {
                b.field(2 * i, 2 * rng.nextDouble() - 1);
            }
            for (int k = i + 1; k < n; k++) {
                if (rng.nextDouble() < 0.4) {
                    b.coupling(2 * i, 2 * k, integerNoFields ? rng.nextInt(3) - 1 : 2 * rng.nextDouble() - 1);
                }
            }
        }
        return b.build();
    }

    /** n chains with lengths 1 … maxLength on shuffled qubit ids (no graph needed for decoding). */
    static Chains randomChains(int n, int maxLength, UniformRandomProvider rng) {
        int[][] q = new int[n][];
        int total = 0;
        int[] len = new int[n];
        for (int c = 0; c < n; c++) {
            len[c] = 1 + rng.nextInt(maxLength);
            total += len[c];
        }
        int[] ids = new int[total];
        for (int i = 0; i < total; i++) {
            ids[i] = 5 * i + 3;
        }
        for (int i = total - 1; i > 0; i--) {
            int k = rng.nextInt(i + 1);
            int t = ids[i];
            ids[i] = ids[k];
            ids[k] = t;
        }
        int p = 0;
        int[] logical = new int[n];
        for (int c = 0; c < n; c++) {
            q[c] = java.util.Arrays.copyOfRange(ids, p, p + len[c]);
            p += len[c];
            logical[c] = 2 * c;
        }
        return Chains.of(logical, q);
    }

    static byte[] randomSpins(int count, UniformRandomProvider rng) {
        byte[] s = new byte[count];
        for (int i = 0; i < count; i++) {
            s[i] = (byte) (rng.nextBoolean() ? 1 : -1);
        }
        return s;
    }
}
