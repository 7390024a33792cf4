package org.obverse.samples;

import org.obverse.model.IsingProblem;
import org.obverse.samples.GeneratedProblems.Values;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;
import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * Energy kernels over bit-sliced blocks against the per-read definition
 * E(s) = offset + Σ h_i s_i + Σ J_ij s_i s_j as {@link IsingProblem#energy(byte[])} computes it.
 */
class EnergyKernelTest extends QuietTest {
    private static long bits(double d) {
        return Double.doubleToRawLongBits(d);
    }

    /** The planner's choice and each mechanism forced on every term it can take. */
    private static EnergyKernel[] allFast(IsingProblem p) {
        return new EnergyKernel[] {EnergyKernel.of(p), EnergyKernel.tables(p), EnergyKernel.counters(p),
            FastEnergy.plan(p, Integer.MAX_VALUE, 1), FastEnergy.plan(p, 2, 1)};
    }

    @Test
    void exactKernelEqualsTheDefinitionBitForBit() {
        Seeds.forEachCase(150, 10_000, (rng, seed) -> {
            Values kind = Values.values()[rng.nextInt(3)];
            IsingProblem p = GeneratedProblems.problem(rng, kind, 90);
            int reads = 1 + rng.nextInt(200);
            byte[] s = GeneratedProblems.spins(rng, reads * p.size());
            SampleBlock block = SampleBlock.fromSpins(s, reads, p.size());
            double[] e = EnergyKernel.exact(p).energies(block);
            for (int r = 0; r < reads; r++) {
                assertThat(bits(e[r])).as("read %d", r).isEqualTo(bits(p.energy(GeneratedProblems.row(s, r, p.size()))));
            }
        });
    }

    /**
     * Problems on a grid of 2^q with terms up to 2^50 grid steps (some past the bound, where the
     * exact kernel keeps its per-read order), zero energies and a −0.0 offset included: the
     * exact kernel equals the per-read definition on the raw bits whichever way it computes.
     */
    @Test
    void exactKernelRegroupsOnlyWhereNoSumRoundsAndKeepsTheBits() {
        int[] regrouped = new int[2];
        Seeds.forEachCase(300, 15_000, (rng, seed) -> {
            int q = rng.nextInt(61) - 30;
            int magnitudeBits = rng.nextBoolean() ? 1 + rng.nextInt(8) : 45 + rng.nextInt(6);
            int n = 1 + rng.nextInt(70);
            double[] h = new double[n];
            for (int k = 0; k < n; k++) {
                h[k] = rng.nextInt(3) == 0 ? 0.0 : Math.scalb((double) (rng.nextLong() >> (64 - magnitudeBits)), q);
            }
            int cap = n * (n - 1) / 2;
            int[] u = new int[cap];
            int[] v = new int[cap];
            double[] j = new double[cap];
            double density = rng.nextDouble() * 0.3;
            int e = 0;
            for (int x = 0; x < n; x++) {
                for (int y = x + 1; y < n; y++) {
                    if (rng.nextDouble() < density) {
                        u[e] = x;
                        v[e] = y;
                        j[e++] = Math.scalb((double) (rng.nextLong() >> (64 - magnitudeBits)), q);
                    }
                }
            }
            double offset = rng.nextInt(4) == 0 ? -0.0 : Math.scalb((double) (rng.nextInt(2001) - 1000), q);
            int[] ids = java.util.stream.IntStream.range(0, n).toArray();
            IsingProblem p = IsingProblem.of(org.obverse.model.VariableIndex.of(ids), h, java.util.Arrays.copyOf(u, e),
                    java.util.Arrays.copyOf(v, e), java.util.Arrays.copyOf(j, e), offset);
            int reads = 1 + rng.nextInt(200);
            byte[] s = GeneratedProblems.spins(rng, reads * n);
            ExactEnergy exact = (ExactEnergy) EnergyKernel.exact(p);
            regrouped[exact.regroups() ? 1 : 0]++;
            double[] got = exact.copy().energies(SampleBlock.fromSpins(s, reads, n));
            for (int r = 0; r < reads; r++) {
                assertThat(bits(got[r])).as("read %d, regrouped %s", r, exact.regroups())
                        .isEqualTo(bits(p.energy(GeneratedProblems.row(s, r, n))));
            }
        });
        // Both ways are exercised: small magnitudes regroup, 50-bit ones mostly do not.
        assertThat(regrouped[0]).isGreaterThan(30);
        assertThat(regrouped[1]).isGreaterThan(100);
    }

    @Test
    void exactKernelRegroupsIntegerAndHalfIntegerProblemsButNotGaussianOnes() {
        int[] ids = {0, 1, 2};
        IsingProblem halves = IsingProblem.of(org.obverse.model.VariableIndex.of(ids), new double[] {0.5, -0.25, 0},
                new int[] {0, 1}, new int[] {1, 2}, new double[] {1, -1}, 0.0);
        IsingProblem real = IsingProblem.of(org.obverse.model.VariableIndex.of(ids), new double[] {0.1, 0, 0},
                new int[] {0}, new int[] {1}, new double[] {1}, 0.0);
        assertThat(((ExactEnergy) EnergyKernel.exact(halves)).regroups()).isTrue();
        assertThat(((ExactEnergy) EnergyKernel.exact(real)).regroups()).isFalse();
        assertThat(EnergyKernel.exact(halves).tolerance()).isZero();
    }

    @Test
    void fastKernelsAgreeWithExactWithinTheStatedTolerance() {
        Seeds.forEachCase(150, 20_000, (rng, seed) -> {
            Values kind = rng.nextBoolean() ? Values.REAL : Values.FEW;
            IsingProblem p = GeneratedProblems.problem(rng, kind, 120);
            int reads = 1 + rng.nextInt(260);
            SampleBlock block = SampleBlock.fromSpins(GeneratedProblems.spins(rng, reads * p.size()), reads, p.size());
            double[] exact = EnergyKernel.exact(p).energies(block);
            double sumAbs = Math.abs(p.offset());
            for (int k = 0; k < p.size(); k++) {
                sumAbs += Math.abs(p.field(k));
            }
            for (int e = 0; e < p.edgeCount(); e++) {
                sumAbs += Math.abs(p.coupling(e));
            }
            for (EnergyKernel k : allFast(p)) {
                double tol = k.tolerance();
                // The bound must be meaningful: far below the scale of the energies themselves.
                assertThat(tol).isLessThan(1e-9 * Math.max(sumAbs, Double.MIN_NORMAL));
                double[] fast = k.energies(block);
                for (int r = 0; r < reads; r++) {
                    assertThat(Math.abs(fast[r] - exact[r])).as("%s read %d", k.method(), r).isLessThanOrEqualTo(tol);
                }
            }
        });
    }

    @Test
    void fastKernelsAreExactOnIntegerProblems() {
        // Every term and partial sum is a small integer, exactly representable: no rounding anywhere.
        Seeds.forEachCase(100, 30_000, (rng, seed) -> {
            IsingProblem p = GeneratedProblems.problem(rng, Values.INTEGER, 100);
            int reads = 1 + rng.nextInt(200);
            SampleBlock block = SampleBlock.fromSpins(GeneratedProblems.spins(rng, reads * p.size()), reads, p.size());
            double[] exact = EnergyKernel.exact(p).energies(block);
            for (EnergyKernel k : allFast(p)) {
                assertThat(k.energies(block)).as(k.toString()).containsExactly(exact);
            }
        });
    }

    @Test
    void plannerCountsSharedValuesAndTablesTheRest() {
        Seeds.forEachCase(20, 40_000, (rng, seed) -> {
            int n = 40;
            int[] ids = new int[n];
            for (int k = 0; k < n; k++) {
                ids[k] = 3 * k;
            }
            // All pairs: 780 couplers, ±1 values only: two counted groups, nothing tabled.
            int m = n * (n - 1) / 2;
            int[] u = new int[m];
            int[] v = new int[m];
            double[] j = new double[m];
            double[] real = new double[m];
            int e = 0;
            for (int a = 0; a < n; a++) {
                for (int b = a + 1; b < n; b++) {
                    u[e] = a;
                    v[e] = b;
                    j[e] = rng.nextBoolean() ? 1 : -1;
                    real[e++] = rng.nextDouble() - 0.5;
                }
            }
            org.obverse.model.VariableIndex index = org.obverse.model.VariableIndex.of(ids);
            IsingProblem pm = IsingProblem.of(index, new double[n], u, v, j, 0);
            assertThat(EnergyKernel.of(pm).method()).isEqualTo(EnergyKernel.Method.COUNTERS);
            assertThat(((FastEnergy) EnergyKernel.of(pm)).groupCount()).isEqualTo(2);
            IsingProblem gauss = IsingProblem.of(index, new double[n], u, v, real, 0);
            assertThat(EnergyKernel.of(gauss).method()).isEqualTo(EnergyKernel.Method.TABLES);
            double[] h = new double[n];
            for (int k = 0; k < n; k++) {
                h[k] = rng.nextDouble();
            }
            IsingProblem mixed = IsingProblem.of(index, h, u, v, j, 0);
            assertThat(EnergyKernel.of(mixed).method()).isEqualTo(EnergyKernel.Method.COUNTERS_AND_TABLES);
            assertThat(EnergyKernel.exact(mixed).method()).isEqualTo(EnergyKernel.Method.EXACT);
            // Dense real-valued clusters of eight consecutive positions get their own tables.
            FastEnergy dense = (FastEnergy) EnergyKernel.of(gauss);
            assertThat(dense.clusterCount()).isEqualTo(n / 8);
            // 28 couplers in each of the 5 clusters leave 780 - 140 to the byte tables.
            assertThat(dense.byteTabledCount()).isEqualTo(m - 5 * 28);
            assertThat(((FastEnergy) EnergyKernel.tables(gauss)).clusterCount()).isZero();
        });
    }

    @Test
    void bitTransposeMovesBitEightIPlusBToEightBPlusI() {
        // The definition of transposing an 8 x 8 bit matrix stored row by row in the bytes of a word.
        Seeds.forEachCase(200, 45_000, (rng, seed) -> {
            long x = rng.nextLong();
            long t = FastEnergy.transposeBits(x);
            for (int i = 0; i < 8; i++) {
                for (int b = 0; b < 8; b++) {
                    assertThat((t >>> (8 * b + i)) & 1).isEqualTo((x >>> (8 * i + b)) & 1);
                }
            }
        });
    }

    @Test
    void copiesHaveTheirOwnWorkspaceAndOffsetsPlaceResults() {
        Seeds.forEachCase(20, 50_000, (rng, seed) -> {
            IsingProblem p = GeneratedProblems.problem(rng, Values.REAL, 60);
            SampleBlock a = SampleBlock.fromSpins(GeneratedProblems.spins(rng, 100 * p.size()), 100, p.size());
            SampleBlock b = SampleBlock.fromSpins(GeneratedProblems.spins(rng, 70 * p.size()), 70, p.size());
            EnergyKernel k = EnergyKernel.of(p);
            EnergyKernel c = k.copy();
            double[] out = new double[5 + 100 + 70];
            k.energies(a, out, 5);
            c.energies(b, out, 105);
            double[] ea = EnergyKernel.exact(p).energies(a);
            double[] eb = EnergyKernel.exact(p).energies(b);
            for (int r = 0; r < 100; r++) {
                assertThat(Math.abs(out[5 + r] - ea[r])).isLessThanOrEqualTo(k.tolerance());
            }
            for (int r = 0; r < 70; r++) {
                assertThat(Math.abs(out[105 + r] - eb[r])).isLessThanOrEqualTo(k.tolerance());
            }
            assertThat(out[0]).isZero();
        });
    }

    @Test
    void refusesBlocksOfAnotherWidthAndShortOutputs() {
        IsingProblem p = GeneratedProblems.problem(Seeds.rng(1), Values.REAL, 10);
        SampleBlock wrong = SampleBlock.allDown(3, p.size() + 1);
        assertThatThrownBy(() -> EnergyKernel.of(p).energies(wrong)).isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("spins per read");
        SampleBlock right = SampleBlock.allDown(3, p.size());
        assertThatThrownBy(() -> EnergyKernel.exact(p).energies(right, new double[3], 1))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("cannot hold 3");
    }
}
