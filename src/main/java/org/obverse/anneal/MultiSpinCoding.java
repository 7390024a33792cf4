package org.obverse.anneal;

import org.obverse.model.IsingProblem;

/**
 * Multi-spin-coded Metropolis for problems whose every coupling is ±c and every field 0 or
 * ±c (one magnitude c): 64 independent reads advance together, one bit of a {@code long} per
 * read (set bit = spin +1), in the spirit of the multi-spin codes of Isakov, Zintchenko,
 * Rønnow &amp; Troyer, Comput. Phys. Commun. 192, 265 (2015).
 *
 * <p>A field is a coupling to a ghost spin fixed at +1. For spin k with d terms, a term is
 * unsatisfied when it adds +c to the energy; with m unsatisfied terms, flipping k changes the
 * energy by ΔE = 2c(d − 2m). The 64 counts m are added bit-sliced (four bit planes, d ≤ 15).
 * Reads with m ≥ d/2 flip. A read with an uphill move compares its own uniform U with the
 * acceptance threshold P(d, m) = ⌊exp(−β ΔE)·2⁶³⌋·2 (a 64-bit fixed-point fraction), bit by
 * bit from the most significant end with fresh random words: a read is decided at the first
 * bit where U and P differ, so every read gets an independent exact-to-2⁻⁶³ Bernoulli draw
 * from about ten random words per spin (not 64). Where a spin has at most six terms (the
 * K4,4 cell grid) the first ten bits are always drawn, a loop of fixed length that the
 * processor predicts; elsewhere the loop stops as soon as every read is decided.
 *
 * <p>Immutable after {@link #of}; the sweep kernel allocates nothing.
 */
public final class MultiSpinCoding implements WordSweeps {
    /** Largest number of terms (neighbours plus field) of one spin. */
    public static final int MAX_TERMS = 15;
    static final int LEVELS = 8;
    /** Threshold bits always drawn before the loop stops at the first fully decided word. */
    private static final int FIXED_ROUNDS = 10;
    /** Neighbours a spin of the padded lane path has (missing ones padded). */
    static final int PADDED = 6;

    final int n;
    private final double magnitude;
    final int[] start;
    final int[] neighbour;
    // The prepared problem, package-private: SteadyMultiSpin sweeps the same form.
    // -1 (all reads) where the coupling is antiferromagnetic (J > 0): then equal spins are unsatisfied.
    final long[] sameIsUnsatisfied;
    // Ghost term of spin k: bit pattern b_k ^ ghostMask[k] is "unsatisfied"; hasGhost[k] says whether k has a field.
    final long[] ghostMask;
    final boolean[] hasGhost;
    final int[] terms;
    // Spins without a field and with at most six neighbours (all of the K4,4 cell grid): their
    // neighbours padded to six a spin, a missing one as the spin itself with an "unsatisfied"
    // mask of 0 (b ^ b ^ 0 = 0 is never unsatisfied), so that one lane loop counts all six.
    final boolean[] sixPadded;
    final int[] padNeighbour;
    final long[] padSame;

    private MultiSpinCoding(int n, double magnitude, int[] start, int[] neighbour, long[] sameIsUnsatisfied,
                            long[] ghostMask, boolean[] hasGhost, int[] terms) {
        this.n = n;
        this.magnitude = magnitude;
        this.start = start;
        this.neighbour = neighbour;
        this.sameIsUnsatisfied = sameIsUnsatisfied;
        this.ghostMask = ghostMask;
        this.hasGhost = hasGhost;
        this.terms = terms;
        this.sixPadded = new boolean[n];
        this.padNeighbour = new int[PADDED * n];
        this.padSame = new long[PADDED * n];
        for (int k = 0; k < n; k++) {
            sixPadded[k] = !hasGhost[k] && start[k + 1] - start[k] <= PADDED;
            // Padded wherever there are at most six neighbours, field or not (SteadyMultiSpin
            // counts the field as a seventh term).
            int j = 0;
            for (int q = start[k]; start[k + 1] - start[k] <= PADDED && q < start[k + 1]; q++, j++) {
                padNeighbour[PADDED * k + j] = neighbour[q];
                padSame[PADDED * k + j] = sameIsUnsatisfied[q];
            }
            for (; j < PADDED; j++) {
                padNeighbour[PADDED * k + j] = k;
            }
        }
    }

    /** Why the problem cannot be multi-spin coded, or null where it can. */
    public static String unsupportedReason(IsingProblem p) {
        double c = magnitudeOf(p);
        if (c == 0.0) {
            return "the problem has no nonzero term";
        }
        for (int e = 0; e < p.edgeCount(); e++) {
            if (Math.abs(p.coupling(e)) != c) {
                return "coupling " + e + " is " + p.coupling(e) + "; multi-spin coding needs every coupling to be +-" + c;
            }
        }
        for (int k = 0; k < p.size(); k++) {
            double h = p.field(k);
            if (h != 0.0 && Math.abs(h) != c) {
                return "field of variable " + p.variables().id(k) + " is " + h
                        + "; multi-spin coding needs fields 0 or +-" + c;
            }
            int t = p.degree(k) + (h != 0.0 ? 1 : 0);
            if (t > MAX_TERMS) {
                return "variable " + p.variables().id(k) + " has " + t + " terms; multi-spin coding allows " + MAX_TERMS;
            }
        }
        return null;
    }

    private static double magnitudeOf(IsingProblem p) {
        if (p.edgeCount() > 0) {
            return Math.abs(p.coupling(0));
        }
        for (int k = 0; k < p.size(); k++) {
            if (p.field(k) != 0.0) {
                return Math.abs(p.field(k));
            }
        }
        return 0.0;
    }

    /**
     * The prepared form of a problem.
     *
     * @throws IllegalArgumentException where {@link #unsupportedReason} names a reason
     */
    public static MultiSpinCoding of(IsingProblem p) {
        String why = unsupportedReason(p);
        if (why != null) {
            throw new IllegalArgumentException(why);
        }
        int n = p.size();
        int[] start = p.adjacencyStarts();
        int[] neighbour = p.adjacencyVariables();
        int[] edge = p.adjacencyEdges();
        long[] same = new long[neighbour.length];
        for (int q = 0; q < neighbour.length; q++) {
            same[q] = p.coupling(edge[q]) > 0 ? -1L : 0L;
        }
        long[] ghost = new long[n];
        boolean[] has = new boolean[n];
        int[] terms = new int[n];
        for (int k = 0; k < n; k++) {
            double h = p.field(k);
            has[k] = h != 0.0;
            // h > 0: the term h·s is +c (unsatisfied) when s = +1, i.e. bit set.
            ghost[k] = h > 0 ? 0L : -1L;
            terms[k] = p.degree(k) + (has[k] ? 1 : 0);
        }
        return new MultiSpinCoding(n, magnitudeOf(p), start, neighbour, same, ghost, has, terms);
    }

    /** Number of spins. */
    @Override
    public int size() {
        return n;
    }

    /** The magnitude c. */
    public double magnitude() {
        return magnitude;
    }

    /** Length of the threshold table {@link #thresholds} fills. */
    public static int thresholdLength() {
        return (MAX_TERMS + 1) * LEVELS;
    }

    /**
     * The acceptance thresholds at inverse temperature beta. Output: {@code out[d·8 + m]} for
     * m &lt; d/2 holds ⌊exp(−β·2c(d − 2m))·2⁶³⌋·2 as an unsigned 64-bit fraction.
     */
    @Override
    public void thresholds(double beta, long[] out) {
        for (int d = 1; d <= MAX_TERMS; d++) {
            for (int m = 0; 2 * m < d && m < LEVELS; m++) {
                double p = StrictMath.exp(-beta * 2.0 * magnitude * (d - 2 * m));
                out[d * LEVELS + m] = ((long) (p * 0x1p63)) << 1;
            }
        }
    }

    /**
     * One sweep over spins 0 … n−1 for 64 reads. Input and output: {@code bits[k]} holds spin
     * k of the 64 reads and is updated in place. thresholds from {@link #thresholds}; the
     * generator's state in {@code state} ({@link XoroshiroState}, advanced in place): the draws
     * of {@code RandomStreams.generator} with that state, run in local variables. Where spin k
     * has an uphill read, the first {@link #FIXED_ROUNDS} threshold bits are drawn when it has
     * at most six terms; otherwise (and after them) bits are drawn until every read is decided.
     *
     * <p>This one-word kernel, {@link #sweep4} and {@link #sweepLanes} are deliberate hot-kernel
     * variants of one step (measured: {@code SamplerBench multiSpinBareState,
     * multiSpinFourWordsBareState, multiSpinLanesOne, multiSpinLanesFour}, spec/sampling.md): each
     * leaves every block with the same bits and the same generator state.
     */
    @Override
    public void sweep(long[] bits, long[] thresholds, long[] state) {
        for (int k = 0; k < n; k++) {
            int uphillLevels = (terms[k] + 1) >>> 1;
            bits[k] ^= uphillLevels <= 3 ? acceptFew(bits, k, thresholds, state, 0) : acceptMany(bits, k, thresholds, state, 0);
        }
    }

    /**
     * Four independent sweeps at once: {@code b0 … b3} are four blocks' words, with the four
     * generators' states in {@code state} (block i at {@code state[2i], state[2i + 1]}), each
     * advanced in place: every block ends as {@link #sweep} would leave it with its own state.
     * Spin k of the four blocks is visited together; the random draws run in local variables,
     * so the four independent chains of draws overlap in the processor. (A deliberate variant:
     * the lane kernel on four blocks measured about 30 % slower per CPU-ns.)
     */
    public void sweep4(long[] b0, long[] b1, long[] b2, long[] b3, long[] thresholds, long[] state) {
        for (int k = 0; k < n; k++) {
            int uphillLevels = (terms[k] + 1) >>> 1;
            if (uphillLevels <= 3) {
                long a0 = acceptFew(b0, k, thresholds, state, 0);
                long a1 = acceptFew(b1, k, thresholds, state, 2);
                long a2 = acceptFew(b2, k, thresholds, state, 4);
                long a3 = acceptFew(b3, k, thresholds, state, 6);
                b0[k] ^= a0;
                b1[k] ^= a1;
                b2[k] ^= a2;
                b3[k] ^= a3;
            } else {
                b0[k] ^= acceptMany(b0, k, thresholds, state, 0);
                b1[k] ^= acceptMany(b1, k, thresholds, state, 2);
                b2[k] ^= acceptMany(b2, k, thresholds, state, 4);
                b3[k] ^= acceptMany(b3, k, thresholds, state, 6);
            }
        }
    }

    /**
     * The reads of {@code bits} whose spin k flips, for a spin with at most six terms (three
     * uphill levels), drawing from the state at {@code state[at], state[at + 1]}: the three-plane
     * count and the fixed rounds in local variables (the hot step on the K4,4 cell grid).
     */
    private long acceptFew(long[] bits, int k, long[] thresholds, long[] state, int at) {
        long b = bits[k];
        long c0 = 0;
        long c1 = 0;
        long c2 = 0;
        if (hasGhost[k]) {
            c0 = b ^ ghostMask[k];
        }
        for (int q = start[k]; q < start[k + 1]; q++) {
            long x = b ^ bits[neighbour[q]] ^ sameIsUnsatisfied[q];
            long t0 = c0 & x;
            c0 ^= x;
            long t1 = c1 & t0;
            c1 ^= t0;
            c2 ^= t1;
        }
        int d = terms[k];
        int uphillLevels = (d + 1) >>> 1;
        long e0 = uphillLevels > 0 ? ~c0 & ~c1 & ~c2 : 0;
        long e1 = uphillLevels > 1 ? c0 & ~c1 & ~c2 : 0;
        long e2 = uphillLevels > 2 ? ~c0 & c1 & ~c2 : 0;
        long undecided = e0 | e1 | e2;
        if (undecided == 0) {
            return -1L;
        }
        int base = d * LEVELS;
        long p0 = thresholds[base];
        long p1 = uphillLevels > 1 ? thresholds[base + 1] : 0;
        long p2 = uphillLevels > 2 ? thresholds[base + 2] : 0;
        long s0 = state[at];
        long s1 = state[at + 1];
        long below = 0;
        long accept = ~undecided;
        for (int bit = 0; bit < FIXED_ROUNDS; bit++) {
            long pb = (e0 & (p0 >> 63)) | (e1 & (p1 >> 63)) | (e2 & (p2 >> 63));
            p0 <<= 1;
            p1 <<= 1;
            p2 <<= 1;
            long r = Long.rotateLeft(s0 + s1, 17) + s0;
            long t = s1 ^ s0;
            s0 = Long.rotateLeft(s0, 49) ^ t ^ (t << 21);
            s1 = Long.rotateLeft(t, 28);
            below |= undecided & ~r & pb;
            undecided &= ~(r ^ pb);
        }
        state[at] = s0;
        state[at + 1] = s1;
        if (undecided != 0) {
            below |= finishLane(undecided, e0, p0, e1, p1, e2, p2, state, at);
        }
        return accept | below;
    }

    /**
     * As {@link #acceptFew} for a spin with more than six terms (four to eight uphill levels):
     * bit by bit until every read is decided. The one step for such spins in every variant.
     */
    private long acceptMany(long[] bits, int k, long[] thresholds, long[] state, int at) {
        return acceptMany(bits, 1, 0, k, thresholds, state, at);
    }

    /** {@link #acceptMany} for lane {@code lane} of words laid out with stride {@code stride} (spin k at k·stride). */
    private long acceptMany(long[] bits, int stride, int lane, int k, long[] thresholds, long[] state, int at) {
        long b = bits[k * stride + lane];
        long c0 = 0;
        long c1 = 0;
        long c2 = 0;
        long c3 = 0;
        if (hasGhost[k]) {
            c0 = b ^ ghostMask[k];
        }
        for (int q = start[k]; q < start[k + 1]; q++) {
            long x = b ^ bits[neighbour[q] * stride + lane] ^ sameIsUnsatisfied[q];
            long t0 = c0 & x;
            c0 ^= x;
            long t1 = c1 & t0;
            c1 ^= t0;
            long t2 = c2 & t1;
            c2 ^= t1;
            c3 ^= t2;
        }
        int d = terms[k];
        int uphillLevels = (d + 1) >>> 1;
        long nc0 = ~c0;
        long nc1 = ~c1;
        long nc2 = ~c2;
        long low = ~c3;
        long e0 = nc0 & nc1 & nc2 & low;
        long e1 = c0 & nc1 & nc2 & low;
        long e2 = nc0 & c1 & nc2 & low;
        long e3 = c0 & c1 & nc2 & low;
        long e4 = uphillLevels > 4 ? nc0 & nc1 & c2 & low : 0;
        long e5 = uphillLevels > 5 ? c0 & nc1 & c2 & low : 0;
        long e6 = uphillLevels > 6 ? nc0 & c1 & c2 & low : 0;
        long e7 = uphillLevels > 7 ? c0 & c1 & c2 & low : 0;
        int base = d * LEVELS;
        long p0 = thresholds[base];
        long p1 = thresholds[base + 1];
        long p2 = thresholds[base + 2];
        long p3 = thresholds[base + 3];
        long p4 = uphillLevels > 4 ? thresholds[base + 4] : 0;
        long p5 = uphillLevels > 5 ? thresholds[base + 5] : 0;
        long p6 = uphillLevels > 6 ? thresholds[base + 6] : 0;
        long p7 = uphillLevels > 7 ? thresholds[base + 7] : 0;
        long undecided = e0 | e1 | e2 | e3 | e4 | e5 | e6 | e7;
        long accept = ~undecided;
        long s0 = state[at];
        long s1 = state[at + 1];
        long below = 0;
        for (int bit = 63; bit >= 0 && undecided != 0; bit--) {
            long pb = (e0 & -((p0 >>> bit) & 1L)) | (e1 & -((p1 >>> bit) & 1L))
                    | (e2 & -((p2 >>> bit) & 1L)) | (e3 & -((p3 >>> bit) & 1L))
                    | (e4 & -((p4 >>> bit) & 1L)) | (e5 & -((p5 >>> bit) & 1L))
                    | (e6 & -((p6 >>> bit) & 1L)) | (e7 & -((p7 >>> bit) & 1L));
            long r = Long.rotateLeft(s0 + s1, 17) + s0;
            long t = s1 ^ s0;
            s0 = Long.rotateLeft(s0, 49) ^ t ^ (t << 21);
            s1 = Long.rotateLeft(t, 28);
            below |= undecided & ~r & pb;
            undecided &= ~(r ^ pb);
        }
        state[at] = s0;
        state[at + 1] = s1;
        return accept | below;
    }

    /**
     * The working arrays of {@link #sweepLanes} and {@link SteadyMultiSpin#sweepLanes} for a
     * number of 64-read blocks (lanes): the generator state of each lane ({@link XoroshiroState})
     * and scratch, one array per quantity so that the lane loops compile to vector
     * instructions. Not shared between threads.
     */
    public static final class Lanes {
        final int count;
        final long[] s0;
        final long[] s1;
        private final long[] c0;
        private final long[] c1;
        private final long[] c2;
        final long[] e0;
        final long[] e1;
        private final long[] e2;
        final long[] undecided;
        final long[] below;
        private final long[] keep;
        private final long[] draw;
        private final long[] saved0;
        private final long[] saved1;
        private final long[] one = new long[2];

        /** Working arrays for {@code count} ≥ 1 lanes. */
        public Lanes(int count) {
            if (count < 1) {
                throw new IllegalArgumentException("lanes " + count + " must be >= 1");
            }
            this.count = count;
            s0 = new long[count];
            s1 = new long[count];
            c0 = new long[count];
            c1 = new long[count];
            c2 = new long[count];
            e0 = new long[count];
            e1 = new long[count];
            e2 = new long[count];
            undecided = new long[count];
            below = new long[count];
            keep = new long[count];
            draw = new long[count];
            saved0 = new long[count];
            saved1 = new long[count];
        }

        public int count() {
            return count;
        }

        /** Sets the generator state of a lane. */
        public void setState(int lane, long a, long b) {
            s0[lane] = a;
            s1[lane] = b;
        }

        /** The generator state of a lane, {a, b}, as a new array. */
        public long[] state(int lane) {
            return new long[] {s0[lane], s1[lane]};
        }
    }

    /**
     * {@link #sweep} for {@code lanes.count()} blocks at once, each with its own generator
     * state in {@code lanes}: every block ends exactly as {@link #sweep} would leave it with its
     * generator (the same draws in the same order). {@code bits} holds the blocks interleaved:
     * spin k of lane i at {@code bits[k·lanes + i]}. Every step is a loop over the lanes on
     * arrays (counting, the fixed threshold rounds with their random draws, the update), which
     * the JIT compiles to vector instructions: this is where the speed comes from. A lane with
     * no uphill read at spin k draws nothing (its state is kept by a mask); the rare reads still
     * undecided after the fixed rounds, and spins with more than six terms, take the one-lane
     * paths.
     */
    @Override
    public void sweepLanes(long[] bits, long[] thresholds, Lanes lanes) {
        int m = lanes.count;
        long[] s0 = lanes.s0;
        long[] s1 = lanes.s1;
        long[] c0 = lanes.c0;
        long[] c1 = lanes.c1;
        long[] c2 = lanes.c2;
        long[] e0 = lanes.e0;
        long[] e1 = lanes.e1;
        long[] e2 = lanes.e2;
        long[] und = lanes.undecided;
        long[] below = lanes.below;
        long[] keep = lanes.keep;
        long[] one = lanes.one;
        for (int k = 0; k < n; k++) {
            int d = terms[k];
            int uphillLevels = (d + 1) >>> 1;
            int row = k * m;
            if (sixPadded[k]) {
                sixTermVisit(bits, k, thresholds, lanes);
                continue;
            }
            if (uphillLevels > 3) {
                for (int i = 0; i < m; i++) {
                    one[0] = s0[i];
                    one[1] = s1[i];
                    bits[row + i] ^= acceptMany(bits, m, i, k, thresholds, one, 0);
                    s0[i] = one[0];
                    s1[i] = one[1];
                }
                continue;
            }
            // Counts of unsatisfied terms, bit-sliced: at most six terms, three planes.
            long g = hasGhost[k] ? ghostMask[k] : 0L;
            long ghostOn = hasGhost[k] ? -1L : 0L;
            for (int i = 0; i < m; i++) {
                c0[i] = (bits[row + i] ^ g) & ghostOn;
                c1[i] = 0;
                c2[i] = 0;
            }
            for (int q = start[k]; q < start[k + 1]; q++) {
                int other = neighbour[q] * m;
                long same = sameIsUnsatisfied[q];
                for (int i = 0; i < m; i++) {
                    long x = bits[row + i] ^ bits[other + i] ^ same;
                    long a0 = c0[i];
                    long t0 = a0 & x;
                    c0[i] = a0 ^ x;
                    long a1 = c1[i];
                    c1[i] = a1 ^ t0;
                    c2[i] ^= a1 & t0;
                }
            }
            // eq(m) for the uphill levels m < d/2 (at most three).
            long on0 = uphillLevels > 0 ? -1L : 0L;
            long on1 = uphillLevels > 1 ? -1L : 0L;
            long on2 = uphillLevels > 2 ? -1L : 0L;
            for (int i = 0; i < m; i++) {
                long a0 = c0[i];
                long a1 = c1[i];
                long a2 = c2[i];
                long f0 = ~(a0 | a1 | a2) & on0;
                long f1 = a0 & ~(a1 | a2) & on1;
                long f2 = a1 & ~(a0 | a2) & on2;
                e0[i] = f0;
                e1[i] = f1;
                e2[i] = f2;
                und[i] = f0 | f1 | f2;
                below[i] = 0;
            }
            // A lane with no uphill read draws nothing: the rounds below run every lane's
            // generator, and such lanes get their state back afterwards.
            long some = 0;
            long all = -1L;
            for (int i = 0; i < m; i++) {
                long u = und[i];
                long kp = (u | -u) >> 63;
                keep[i] = kp;
                some |= kp;
                all &= kp;
            }
            int base = d * LEVELS;
            long p0 = uphillLevels > 0 ? thresholds[base] : 0;
            long p1 = uphillLevels > 1 ? thresholds[base + 1] : 0;
            long p2 = uphillLevels > 2 ? thresholds[base + 2] : 0;
            if (some != 0) {
                if (all == 0) {
                    System.arraycopy(s0, 0, lanes.saved0, 0, m);
                    System.arraycopy(s1, 0, lanes.saved1, 0, m);
                }
                long[] r = lanes.draw;
                for (int bit = 0; bit < FIXED_ROUNDS; bit++) {
                    long h0 = p0 >> 63;
                    long h1 = p1 >> 63;
                    long h2 = p2 >> 63;
                    p0 <<= 1;
                    p1 <<= 1;
                    p2 <<= 1;
                    draws(m, s0, s1, r);
                    decide(m, r, und, below, e0, e1, e2, h0, h1, h2);
                }
                if (all == 0) {
                    restore(m, s0, lanes.saved0, keep);
                    restore(m, s1, lanes.saved1, keep);
                }
            } else {
                p0 <<= FIXED_ROUNDS;
                p1 <<= FIXED_ROUNDS;
                p2 <<= FIXED_ROUNDS;
            }
            long left = 0;
            for (int i = 0; i < m; i++) {
                left |= und[i];
            }
            if (left != 0) {
                for (int i = 0; i < m; i++) {
                    if (und[i] != 0) {
                        one[0] = s0[i];
                        one[1] = s1[i];
                        below[i] |= finishLane(und[i], e0[i], p0, e1[i], p1, e2[i], p2, one, 0);
                        s0[i] = one[0];
                        s1[i] = one[1];
                    }
                }
            }
            for (int i = 0; i < m; i++) {
                bits[row + i] ^= ~(e0[i] | e1[i] | e2[i]) | below[i];
            }
        }
    }

    /**
     * One visit of spin k (no field, at most six neighbours) in {@link #sweepLanes}: the same
     * draws and decisions as the general lane step, in fewer and larger loops. The six padded
     * terms are counted by two full adders in one lane loop (no count arrays), and each fixed
     * round draws and decides in one loop. Measured: the general lane step spends most of its
     * time in loop overhead and in loads and stores of its scratch arrays, not in the draws.
     */
    private void sixTermVisit(long[] bits, int k, long[] thresholds, Lanes lanes) {
        int m = lanes.count;
        long[] s0 = lanes.s0;
        long[] s1 = lanes.s1;
        long[] e0 = lanes.e0;
        long[] e1 = lanes.e1;
        long[] e2 = lanes.e2;
        long[] und = lanes.undecided;
        long[] below = lanes.below;
        long[] keep = lanes.keep;
        int d = terms[k];
        int uphillLevels = (d + 1) >>> 1;
        int row = k * m;
        int o = PADDED * k;
        int r0 = padNeighbour[o] * m;
        int r1 = padNeighbour[o + 1] * m;
        int r2 = padNeighbour[o + 2] * m;
        int r3 = padNeighbour[o + 3] * m;
        int r4 = padNeighbour[o + 4] * m;
        int r5 = padNeighbour[o + 5] * m;
        long u0 = padSame[o];
        long u1 = padSame[o + 1];
        long u2 = padSame[o + 2];
        long u3 = padSame[o + 3];
        long u4 = padSame[o + 4];
        long u5 = padSame[o + 5];
        long on0 = uphillLevels > 0 ? -1L : 0L;
        long on1 = uphillLevels > 1 ? -1L : 0L;
        long on2 = uphillLevels > 2 ? -1L : 0L;
        for (int i = 0; i < m; i++) {
            long b = bits[row + i];
            long x0 = b ^ bits[r0 + i] ^ u0;
            long x1 = b ^ bits[r1 + i] ^ u1;
            long x2 = b ^ bits[r2 + i] ^ u2;
            long x3 = b ^ bits[r3 + i] ^ u3;
            long x4 = b ^ bits[r4 + i] ^ u4;
            long x5 = b ^ bits[r5 + i] ^ u5;
            // Two full adders give two sums and two carries; the count is a0 + 2·a1 + 4·a2.
            long y01 = x0 ^ x1;
            long sa = y01 ^ x2;
            long ca = (x0 & x1) | (x2 & y01);
            long y34 = x3 ^ x4;
            long sb = y34 ^ x5;
            long cb = (x3 & x4) | (x5 & y34);
            long a0 = sa ^ sb;
            long k0 = sa & sb;
            long z = ca ^ cb;
            long a1 = z ^ k0;
            long a2 = (ca & cb) | (k0 & z);
            long f0 = ~(a0 | a1 | a2) & on0;
            long f1 = a0 & ~(a1 | a2) & on1;
            long f2 = a1 & ~(a0 | a2) & on2;
            e0[i] = f0;
            e1[i] = f1;
            e2[i] = f2;
            und[i] = f0 | f1 | f2;
            below[i] = 0;
        }
        long some = 0;
        long all = -1L;
        for (int i = 0; i < m; i++) {
            long u = und[i];
            long kp = (u | -u) >> 63;
            keep[i] = kp;
            some |= kp;
            all &= kp;
        }
        int base = d * LEVELS;
        long p0 = uphillLevels > 0 ? thresholds[base] : 0;
        long p1 = uphillLevels > 1 ? thresholds[base + 1] : 0;
        long p2 = uphillLevels > 2 ? thresholds[base + 2] : 0;
        if (some != 0) {
            if (all == 0) {
                System.arraycopy(s0, 0, lanes.saved0, 0, m);
                System.arraycopy(s1, 0, lanes.saved1, 0, m);
            }
            for (int bit = 0; bit < FIXED_ROUNDS; bit++) {
                long h0 = p0 >> 63;
                long h1 = p1 >> 63;
                long h2 = p2 >> 63;
                p0 <<= 1;
                p1 <<= 1;
                p2 <<= 1;
                drawAndDecide(m, s0, s1, und, below, e0, e1, e2, h0, h1, h2);
            }
            if (all == 0) {
                restore(m, s0, lanes.saved0, keep);
                restore(m, s1, lanes.saved1, keep);
            }
        } else {
            p0 <<= FIXED_ROUNDS;
            p1 <<= FIXED_ROUNDS;
            p2 <<= FIXED_ROUNDS;
        }
        long left = 0;
        for (int i = 0; i < m; i++) {
            left |= und[i];
        }
        if (left != 0) {
            long[] one = lanes.one;
            for (int i = 0; i < m; i++) {
                if (und[i] != 0) {
                    one[0] = s0[i];
                    one[1] = s1[i];
                    below[i] |= finishLane(und[i], e0[i], p0, e1[i], p1, e2[i], p2, one, 0);
                    s0[i] = one[0];
                    s1[i] = one[1];
                }
            }
        }
        for (int i = 0; i < m; i++) {
            bits[row + i] ^= ~(e0[i] | e1[i] | e2[i]) | below[i];
        }
    }

    /** One fixed round in one loop: every lane's next word, compared with the threshold bit. */
    private static void drawAndDecide(int m, long[] s0, long[] s1, long[] und, long[] below, long[] e0, long[] e1,
                                      long[] e2, long h0, long h1, long h2) {
        for (int i = 0; i < m; i++) {
            long x = s0[i];
            long y = s1[i];
            long r = Long.rotateLeft(x + y, 17) + x;
            long t = y ^ x;
            s0[i] = Long.rotateLeft(x, 49) ^ t ^ (t << 21);
            s1[i] = Long.rotateLeft(t, 28);
            long pb = (e0[i] & h0) | (e1[i] & h1) | (e2[i] & h2);
            long un = und[i];
            below[i] |= un & ~r & pb;
            und[i] = un & ~(r ^ pb);
        }
    }

    /** The next word of every lane's generator into r (a loop the JIT vectorises). */
    private static void draws(int m, long[] s0, long[] s1, long[] r) {
        for (int i = 0; i < m; i++) {
            long x = s0[i];
            long y = s1[i];
            r[i] = Long.rotateLeft(x + y, 17) + x;
            long t = y ^ x;
            s0[i] = Long.rotateLeft(x, 49) ^ t ^ (t << 21);
            s1[i] = Long.rotateLeft(t, 28);
        }
    }

    /** One threshold bit (h0 … h2 all ones where set) compared with every lane's draw. */
    private static void decide(int m, long[] r, long[] und, long[] below, long[] e0, long[] e1, long[] e2, long h0,
                               long h1, long h2) {
        for (int i = 0; i < m; i++) {
            long x = r[i];
            long pb = (e0[i] & h0) | (e1[i] & h1) | (e2[i] & h2);
            long un = und[i];
            below[i] |= un & ~x & pb;
            und[i] = un & ~(x ^ pb);
        }
    }

    /** s[i] back to saved[i] where keep[i] is 0. */
    private static void restore(int m, long[] s, long[] saved, long[] keep) {
        for (int i = 0; i < m; i++) {
            s[i] = saved[i] ^ ((s[i] ^ saved[i]) & keep[i]);
        }
    }

    /**
     * The reads still undecided after the fixed rounds (thresholds already shifted by them),
     * decided bit by bit from the state at {@code state[at], state[at + 1]}: the rare tail of
     * the three-level step, shared by every variant.
     */
    private static long finishLane(long undecided, long e0, long p0, long e1, long p1, long e2, long p2, long[] state,
                                   int at) {
        long s0 = state[at];
        long s1 = state[at + 1];
        long below = 0;
        for (int bit = FIXED_ROUNDS; bit < 64 && undecided != 0; bit++) {
            long pb = (e0 & (p0 >> 63)) | (e1 & (p1 >> 63)) | (e2 & (p2 >> 63));
            p0 <<= 1;
            p1 <<= 1;
            p2 <<= 1;
            long r = Long.rotateLeft(s0 + s1, 17) + s0;
            long t = s1 ^ s0;
            s0 = Long.rotateLeft(s0, 49) ^ t ^ (t << 21);
            s1 = Long.rotateLeft(t, 28);
            below |= undecided & ~r & pb;
            undecided &= ~(r ^ pb);
        }
        state[at] = s0;
        state[at + 1] = s1;
        return below;
    }
}
