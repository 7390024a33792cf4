package org.obverse.embed;

import java.util.stream.IntStream;
import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.bits.BitSlicedCounter;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.random.LegacyStreams;
import org.obverse.samples.EnergyKernel;
import org.obverse.samples.SampleBlock;

/**
 * Turns physical reads (columns = ascending qubit ids of the physical problem, in the source
 * frame) into logical reads (columns = ascending logical ids) under a {@link ChainBreakRule}.
 * Immutable and thread-safe; {@link #decode} works on 64 reads at a time on the bit-sliced
 * words of a {@link SampleBlock}.
 *
 * <p>Per 64-read word and chain of length L: broken = OR over the chain's qubits of
 * (word XOR first word); the number of +1 qubits is counted bit-sliced (a ripple counter of
 * ⌈log2(L + 1)⌉ planes) and compared with L / 2, all 64 reads at once.
 *
 * <p>Tie rule (an even chain with exactly half of its qubits at +1), gauge-covariant: tied
 * chains are settled one at a time in ascending logical id; chain v takes the value that lowers
 * the logical energy given the others, −sign(f_v) with f_v = h_v + Σ_u J_uv x_u, where a tied
 * chain not yet settled counts as x_u = 0. Where f_v = 0 exactly, v takes the spin of one of its
 * own qubits, drawn uniformly from a seeded generator (one stream per 64-read block, from the
 * seed and the block number, XO_RO_SHI_RO_128_PP). Flipping a chain's qubits and gauging the
 * logical problem with the same sign flips f_v and that qubit exactly, so decoding commutes
 * with every chain-level gauge; a fixed preference for +1 would not.
 *
 * <p>Descend: from the majority read, repeatedly flip the variable whose flip lowers the
 * energy most (the lowest position among equals), until no flip lowers it by more than a
 * rounding margin (10⁻¹² of the largest local field bound); the result is never above the
 * majority energy.
 */
public final class ChainDecoder {
    private static final int BLOCKS_PER_TASK = 32;

    private final IsingProblem logical;
    private final ChainBreakRule rule;
    private final long seed;
    private final int physicalColumns;
    private final int[] chainStart;
    private final int[] chainColumns;
    private final double[] fields;
    private final double[] couplings;
    private final int[] edgeU;
    private final int[] edgeV;
    private final int[] adjStart;
    private final int[] adjVar;
    private final int[] adjEdge;
    private final int countPlanes;
    private final int brokenPlanes;
    private final double descentMargin;
    // IsingProblem.energy bit for bit (the bit counters where they give the same bits).
    private final EnergyKernel energy;

    private ChainDecoder(IsingProblem logical, Chains chains, VariableIndex physical, ChainBreakRule rule, long seed) {
        this.logical = logical;
        this.rule = rule;
        this.seed = seed;
        this.physicalColumns = physical.size();
        int n = logical.size();
        chainStart = new int[n + 1];
        for (int c = 0; c < n; c++) {
            chainStart[c + 1] = chainStart[c] + chains.length(c);
        }
        chainColumns = new int[chainStart[n]];
        boolean[] used = new boolean[physical.size()];
        for (int c = 0; c < n; c++) {
            int[] q = chains.chain(c);
            for (int i = 0; i < q.length; i++) {
                int col = physical.indexOf(q[i]);
                if (col < 0) {
                    throw new IllegalArgumentException("chain of logical id " + chains.logicalId(c) + " uses qubit " + q[i]
                            + ", which the physical problem does not have");
                }
                if (used[col]) {
                    throw new IllegalArgumentException("qubit " + q[i] + " is in more than one chain; chains must be disjoint");
                }
                used[col] = true;
                chainColumns[chainStart[c] + i] = col;
            }
        }
        fields = logical.fields();
        couplings = logical.couplings();
        edgeU = logical.edgeUs();
        edgeV = logical.edgeVs();
        adjStart = logical.adjacencyStarts();
        adjVar = logical.adjacencyVariables();
        adjEdge = logical.adjacencyEdges();
        countPlanes = bitsFor(Math.max(1, chains.maxLength()));
        brokenPlanes = bitsFor(Math.max(1, n));
        double bound = 0.0;
        for (int k = 0; k < n; k++) {
            double b = Math.abs(fields[k]);
            for (int p = adjStart[k]; p < adjStart[k + 1]; p++) {
                b += Math.abs(couplings[adjEdge[p]]);
            }
            bound = Math.max(bound, b);
        }
        descentMargin = 1e-12 * bound;
        energy = EnergyKernel.exact(logical);
    }

    /**
     * A decoder.
     *
     * @param logical  Input: the logical problem (energies, ties and descent use it)
     * @param chains   Input: a chain for every logical variable (others are ignored)
     * @param physical Input: the physical problem's qubit ids, whose ascending order is the column order of the samples
     * @param rule     the chain-break rule
     * @param seed     seed of the tie coin
     * @throws IllegalArgumentException where a variable has no chain, or a chain qubit is not a physical column or is
     *                                  in two chains
     */
    public static ChainDecoder of(IsingProblem logical, Chains chains, VariableIndex physical, ChainBreakRule rule,
                                  long seed) {
        return new ChainDecoder(logical, chains.restrictedTo(logical.variables()), physical, rule, seed);
    }

    private static int bitsFor(int max) {
        return 32 - Integer.numberOfLeadingZeros(max);
    }

    public ChainBreakRule rule() {
        return rule;
    }

    /** Decodes every read, with logical energies. */
    public DecodedSamples decode(SampleBlock physical) {
        return decode(physical, true);
    }

    /**
     * Decodes every read.
     *
     * @param physical     Input: physical reads, not modified
     * @param withEnergies whether to work out the logical energies (else {@link DecodedSamples#energies()} is empty)
     * @throws IllegalArgumentException where the reads do not have one column per physical qubit
     */
    public DecodedSamples decode(SampleBlock physical, boolean withEnergies) {
        if (physical.variables() != physicalColumns) {
            throw new IllegalArgumentException("samples have " + physical.variables() + " columns but the physical problem has "
                    + physicalColumns + " qubits; give samples of that problem");
        }
        int reads = physical.reads();
        int n = logical.size();
        int blocks = physical.blockCount();
        long[] out = new long[blocks * n];
        int[] broken = new int[reads];
        long[] anyBroken = new long[blocks];
        double[] energies = withEnergies ? new double[reads] : new double[0];
        int tasks = (blocks + BLOCKS_PER_TASK - 1) / BLOCKS_PER_TASK;
        long[][] perTaskBreaks = new long[tasks][];
        IntStream range = IntStream.range(0, tasks);
        if (tasks > 1) {
            range = range.parallel();
        }
        range.forEach(t -> {
            Workspace w = new Workspace(n, countPlanes, brokenPlanes);
            int from = t * BLOCKS_PER_TASK;
            int to = Math.min(blocks, (t + 1) * BLOCKS_PER_TASK);
            for (int b = from; b < to; b++) {
                decodeBlock(physical, b, out, broken, anyBroken, w);
            }
            if (withEnergies) {
                // The task's decoded blocks, final now (ties settled, descent done).
                int first = from << 6;
                SampleBlock mine = SampleBlock.wrap(java.util.Arrays.copyOfRange(out, from * n, to * n),
                        Math.min(reads, to << 6) - first, n);
                energy.copy().energies(mine, energies, first);
            }
            perTaskBreaks[t] = w.breaksPerChain;
        });
        long[] breaksPerChain = new long[n];
        for (long[] p : perTaskBreaks) {
            for (int c = 0; c < n; c++) {
                breaksPerChain[c] += p[c];
            }
        }
        SampleBlock all = SampleBlock.wrap(out, reads, n);
        boolean[] kept = new boolean[reads];
        if (rule != ChainBreakRule.DISCARD) {
            java.util.Arrays.fill(kept, true);
            return new DecodedSamples(all, kept, broken, energies, breaksPerChain);
        }
        int keptCount = 0;
        for (int r = 0; r < reads; r++) {
            kept[r] = ((anyBroken[r >>> 6] >>> (r & 63)) & 1L) == 0;
            if (kept[r]) {
                keptCount++;
            }
        }
        SampleBlock compact = SampleBlock.allDown(keptCount, n);
        long[] dst = compact.words();
        double[] keptEnergies = withEnergies ? new double[keptCount] : new double[0];
        int d = 0;
        for (int r = 0; r < reads; r++) {
            if (!kept[r]) {
                continue;
            }
            int src = (r >>> 6) * n;
            int shift = r & 63;
            int base = (d >>> 6) * n;
            long bit = 1L << (d & 63);
            for (int c = 0; c < n; c++) {
                if (((out[src + c] >>> shift) & 1L) != 0) {
                    dst[base + c] |= bit;
                }
            }
            if (withEnergies) {
                keptEnergies[d] = energies[r];
            }
            d++;
        }
        return new DecodedSamples(compact, kept, broken, keptEnergies, breaksPerChain);
    }

    /** Per-task buffers, so that the block loop allocates nothing. */
    private static final class Workspace {
        final long[] count;
        final long[] brokenCount;
        final long[] tie;
        final long[] breaksPerChain;
        final byte[] spins;
        final double[] localField;

        Workspace(int n, int countPlanes, int brokenPlanes) {
            count = new long[countPlanes];
            brokenCount = new long[brokenPlanes];
            tie = new long[n];
            breaksPerChain = new long[n];
            spins = new byte[n];
            localField = new double[n];
        }
    }

    private void decodeBlock(SampleBlock physical, int b, long[] out, int[] broken, long[] anyBroken,
                             Workspace w) {
        long[] in = physical.words();
        int base = b * physicalColumns;
        int n = logical.size();
        int outBase = b * n;
        long valid = physical.validMask(b);
        long[] cnt = w.count;
        long[] bc = w.brokenCount;
        java.util.Arrays.fill(bc, 0L);
        long any = 0L;
        long anyTie = 0L;
        for (int c = 0; c < n; c++) {
            int s = chainStart[c];
            int len = chainStart[c + 1] - s;
            long first = in[base + chainColumns[s]];
            long up;
            long tie = 0L;
            long brk = 0L;
            if (len == 1) {
                up = first;
            } else if (len == 2) {
                long second = in[base + chainColumns[s + 1]];
                up = first & second;
                brk = first ^ second;
                tie = brk;
            } else {
                int planes = bitsFor(len);
                for (int p = 0; p < planes; p++) {
                    cnt[p] = 0L;
                }
                for (int i = 0; i < len; i++) {
                    long word = in[base + chainColumns[s + i]];
                    brk |= word ^ first;
                    BitSlicedCounter.add(cnt, planes, word);
                }
                up = BitSlicedCounter.atLeast(cnt, planes, len / 2 + 1);
                if ((len & 1) == 0) {
                    tie = BitSlicedCounter.exactly(cnt, planes, len / 2);
                }
            }
            brk &= valid;
            tie &= valid;
            out[outBase + c] = up & valid;
            w.tie[c] = tie;
            anyTie |= tie;
            any |= brk;
            if (brk != 0L) {
                w.breaksPerChain[c] += Long.bitCount(brk);
                BitSlicedCounter.add(bc, bc.length, brk);
            }
        }
        anyBroken[b] = any;
        int first = b << 6;
        int live = Math.min(64, physical.reads() - first);
        if (any != 0L) {
            for (int r = 0; r < live; r++) {
                broken[first + r] = BitSlicedCounter.lane(bc, bc.length, r);
            }
        }
        if (rule == ChainBreakRule.DISCARD) {
            return;
        }
        if (anyTie != 0L) {
            settleTies(in, base, out, outBase, b, w.tie);
        }
        if (rule == ChainBreakRule.DESCEND) {
            for (int r = 0; r < live; r++) {
                descendRead(out, outBase, r, w.spins, w.localField);
            }
        }
    }

    private void settleTies(long[] in, int base, long[] out, int outBase, int block, long[] tie) {
        UniformRandomProvider coin = null;
        int n = logical.size();
        for (int c = 0; c < n; c++) {
            long pending = tie[c];
            while (pending != 0L) {
                int r = Long.numberOfTrailingZeros(pending);
                pending &= pending - 1;
                double f = fields[c];
                for (int p = adjStart[c]; p < adjStart[c + 1]; p++) {
                    int u = adjVar[p];
                    if (u > c && ((tie[u] >>> r) & 1L) != 0L) {
                        continue;
                    }
                    long x = (out[outBase + u] >>> r) & 1L;
                    f += x != 0L ? couplings[adjEdge[p]] : -couplings[adjEdge[p]];
                }
                boolean plus;
                if (f < 0) {
                    plus = true;
                } else if (f > 0) {
                    plus = false;
                } else {
                    if (coin == null) {
                        coin = LegacyStreams.decodeTies(seed, block);
                    }
                    int s = chainStart[c];
                    int pick = coin.nextInt(chainStart[c + 1] - s);
                    plus = ((in[base + chainColumns[s + pick]] >>> r) & 1L) != 0L;
                }
                if (plus) {
                    out[outBase + c] |= 1L << r;
                } else {
                    out[outBase + c] &= ~(1L << r);
                }
            }
        }
    }

    private void unpack(long[] out, int outBase, int r, byte[] x) {
        for (int c = 0; c < x.length; c++) {
            x[c] = (byte) ((((out[outBase + c] >>> r) & 1L) << 1) - 1);
        }
    }

    private void descendRead(long[] out, int outBase, int r, byte[] x, double[] f) {
        unpack(out, outBase, r, x);
        int n = x.length;
        double start = logical.energy(x);
        for (int k = 0; k < n; k++) {
            double s = fields[k];
            for (int p = adjStart[k]; p < adjStart[k + 1]; p++) {
                s += couplings[adjEdge[p]] * x[adjVar[p]];
            }
            f[k] = s;
        }
        boolean changed = false;
        long stepsLeft = 1000L * n + 1000L;
        while (stepsLeft-- > 0) {
            // Flipping k changes the energy by -2 x_k f_k: pick the largest x_k f_k above the margin.
            int best = -1;
            double gain = descentMargin;
            for (int k = 0; k < n; k++) {
                double g = x[k] * f[k];
                if (g > gain) {
                    gain = g;
                    best = k;
                }
            }
            if (best < 0) {
                break;
            }
            x[best] = (byte) -x[best];
            changed = true;
            for (int p = adjStart[best]; p < adjStart[best + 1]; p++) {
                f[adjVar[p]] += 2.0 * couplings[adjEdge[p]] * x[best];
            }
        }
        if (!changed || logical.energy(x) > start) {
            return;
        }
        long bit = 1L << r;
        for (int c = 0; c < n; c++) {
            if (x[c] > 0) {
                out[outBase + c] |= bit;
            } else {
                out[outBase + c] &= ~bit;
            }
        }
    }
}
