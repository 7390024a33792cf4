package org.obverse.anneal;

import org.obverse.model.IsingProblem;

/**
 * The "steady" multi-spin kernel: the problems, bit layout, counts and acceptance thresholds of
 * {@link MultiSpinCoding} (64 reads a {@code long}, couplings ±c, fields 0 or ±c), with a draw
 * rule made for vector lanes. At every visit of every spin, each 64-read block draws exactly
 * {@link #FIXED_WORDS} random words from its own generator, whether or not any of its reads
 * is uphill, and then one more word per threshold bit while one of its uphill reads is still
 * undecided (at most 64 bits in all).
 *
 * <p>Each uphill read compares its own uniform U, one bit per word from the most significant
 * end, with the threshold P(d, m) = ⌊exp(−β ΔE)·2⁶³⌋·2 of {@link MultiSpinCoding#thresholds},
 * and flips where U &lt; P: the Metropolis acceptance min(1, exp(−β ΔE)) (Metropolis et al.,
 * J. Chem. Phys. 21, 1087, 1953) with a probability off by less than 2⁻⁶³ (the threshold's
 * truncation) plus the error of {@code StrictMath.exp} (below 1 ulp); a read still undecided
 * after all 64 bits has U = P and is refused. Reads at a
 * level or downhill move flip without a draw. The bits of a word that no undecided read looks
 * at are not used again.
 *
 * <p>Why a second rule: {@link MultiSpinCoding} draws its ten fixed words only where a block
 * has an uphill read and leaves about three blocks in 64 to a one-block finish after them;
 * both need per-block branches or masks in the lane loops. Here every lane draws the same
 * number of words, so the lane loops have none, and after twelve words about one block in 80
 * is left undecided at a visit (45 uphill reads · 2⁻¹²) (measured: 1.3 × the old rule's lane kernel per CPU-ns on the
 * 16 × 16 K4,4 glass, spec/sampling.md). The rule is per block, so the reads
 * do not depend on how blocks are grouped into lanes or threads; they differ from
 * {@link MultiSpinCoding}'s reads for the same seed (other draws), with the same distribution.
 *
 * <p>Immutable; {@link #sweepLanes} allocates nothing ({@link #sweep} two one-element arrays a call).
 */
public final class SteadyMultiSpin implements WordSweeps {
    /** Random words every block draws at every spin visit before the until-decided tail. */
    public static final int FIXED_WORDS = 12;

    private final MultiSpinCoding coding;

    private SteadyMultiSpin(MultiSpinCoding coding) {
        this.coding = coding;
    }

    /**
     * The prepared form of a problem.
     *
     * @throws IllegalArgumentException where {@link MultiSpinCoding#unsupportedReason} names a reason
     */
    public static SteadyMultiSpin of(IsingProblem p) {
        return new SteadyMultiSpin(MultiSpinCoding.of(p));
    }

    /** Number of spins. */
    @Override
    public int size() {
        return coding.n;
    }

    /** The thresholds at inverse temperature beta: {@link MultiSpinCoding#thresholds}. */
    @Override
    public void thresholds(double beta, long[] out) {
        coding.thresholds(beta, out);
    }

    /**
     * One sweep over spins 0 … n−1 for one block of 64 reads, the reference form of the rule:
     * {@code bits[k]} holds spin k of the 64 reads and is updated in place; the generator's
     * state ({@link XoroshiroState}) in {@code state}, advanced in place.
     */
    @Override
    public void sweep(long[] bits, long[] thresholds, long[] state) {
        long[] s0 = {state[0]};
        long[] s1 = {state[1]};
        for (int k = 0; k < coding.n; k++) {
            bits[k] ^= visit(bits, 1, 0, k, thresholds, s0, s1, 0);
        }
        state[0] = s0[0];
        state[1] = s1[0];
    }

    /**
     * The reads of lane {@code lane} (words laid out with stride {@code stride}: spin k at
     * k·stride + lane) whose spin k flips, drawing from the state {@code s0[i], s1[i]}: any
     * spin, up to 15 terms, four count planes and eight uphill levels.
     */
    private long visit(long[] bits, int stride, int lane, int k, long[] thresholds, long[] s0, long[] s1, int i) {
        MultiSpinCoding c = coding;
        long b = bits[k * stride + lane];
        long c0 = c.hasGhost[k] ? b ^ c.ghostMask[k] : 0;
        long c1 = 0;
        long c2 = 0;
        long c3 = 0;
        for (int q = c.start[k]; q < c.start[k + 1]; q++) {
            long x = b ^ bits[c.neighbour[q] * stride + lane] ^ c.sameIsUnsatisfied[q];
            long t0 = c0 & x;
            c0 ^= x;
            long t1 = c1 & t0;
            c1 ^= t0;
            long t2 = c2 & t1;
            c2 ^= t1;
            c3 ^= t2;
        }
        int d = c.terms[k];
        int uphillLevels = (d + 1) >>> 1;
        // Reads with m unsatisfied terms for m < d/2, eight levels at most (so c3 = 0).
        long nc0 = ~c0;
        long nc1 = ~c1;
        long nc2 = ~c2;
        long low = ~c3;
        long e0 = uphillLevels > 0 ? nc0 & nc1 & nc2 & low : 0;
        long e1 = uphillLevels > 1 ? c0 & nc1 & nc2 & low : 0;
        long e2 = uphillLevels > 2 ? nc0 & c1 & nc2 & low : 0;
        long e3 = uphillLevels > 3 ? c0 & c1 & nc2 & low : 0;
        long e4 = uphillLevels > 4 ? nc0 & nc1 & c2 & low : 0;
        long e5 = uphillLevels > 5 ? c0 & nc1 & c2 & low : 0;
        long e6 = uphillLevels > 6 ? nc0 & c1 & c2 & low : 0;
        long e7 = uphillLevels > 7 ? c0 & c1 & c2 & low : 0;
        int base = d * MultiSpinCoding.LEVELS;
        long p0 = uphillLevels > 0 ? thresholds[base] : 0;
        long p1 = uphillLevels > 1 ? thresholds[base + 1] : 0;
        long p2 = uphillLevels > 2 ? thresholds[base + 2] : 0;
        long p3 = uphillLevels > 3 ? thresholds[base + 3] : 0;
        long p4 = uphillLevels > 4 ? thresholds[base + 4] : 0;
        long p5 = uphillLevels > 5 ? thresholds[base + 5] : 0;
        long p6 = uphillLevels > 6 ? thresholds[base + 6] : 0;
        long p7 = uphillLevels > 7 ? thresholds[base + 7] : 0;
        long undecided = e0 | e1 | e2 | e3 | e4 | e5 | e6 | e7;
        long accept = ~undecided;
        long a = s0[i];
        long y = s1[i];
        long below = 0;
        for (int bit = 0; bit < 64 && (bit < FIXED_WORDS || undecided != 0); bit++) {
            long pb = (e0 & (p0 >> 63)) | (e1 & (p1 >> 63)) | (e2 & (p2 >> 63)) | (e3 & (p3 >> 63))
                    | (e4 & (p4 >> 63)) | (e5 & (p5 >> 63)) | (e6 & (p6 >> 63)) | (e7 & (p7 >> 63));
            p0 <<= 1;
            p1 <<= 1;
            p2 <<= 1;
            p3 <<= 1;
            p4 <<= 1;
            p5 <<= 1;
            p6 <<= 1;
            p7 <<= 1;
            long r = Long.rotateLeft(a + y, 17) + a;
            long t = y ^ a;
            a = Long.rotateLeft(a, 49) ^ t ^ (t << 21);
            y = Long.rotateLeft(t, 28);
            below |= undecided & ~r & pb;
            undecided &= ~(r ^ pb);
        }
        s0[i] = a;
        s1[i] = y;
        return accept | below;
    }

    /**
     * {@link #sweep} for {@code lanes.count()} blocks at once, each with its own generator state
     * in {@code lanes}: every block ends exactly as {@link #sweep} leaves it (the same draws in
     * the same order). {@code bits} holds the blocks interleaved: spin k of lane i at
     * {@code bits[k·lanes + i]}. A spin with at most six neighbours (the K4,4 cell grid), with
     * or without a field, is one lane loop that counts, twelve lane loops that draw and decide,
     * and a one-lane finish for the blocks still undecided; a spin with more neighbours takes
     * the one-lane step of {@link #sweep} lane by lane.
     */
    @Override
    public void sweepLanes(long[] bits, long[] thresholds, MultiSpinCoding.Lanes lanes) {
        MultiSpinCoding c = coding;
        int m = lanes.count;
        for (int k = 0; k < c.n; k++) {
            if (c.start[k + 1] - c.start[k] <= MultiSpinCoding.PADDED) {
                paddedVisit(bits, k, thresholds, lanes);
            } else {
                int row = k * m;
                for (int i = 0; i < m; i++) {
                    bits[row + i] ^= visit(bits, m, i, k, thresholds, lanes.s0, lanes.s1, i);
                }
            }
        }
    }

    /**
     * Spin k (at most six neighbours, padded to six, and its field if it has one: at most seven
     * terms) of every lane. The count of unsatisfied terms, a0 + 2·a1 + 4·a2, comes from three
     * full adders; an uphill read has count m &lt; 4, so a2 = 0 and the threshold bit of its
     * level is the choice h0 ^ (a0 &amp; (h0 ^ h1)) ^ (a1 &amp; (h0 ^ h2)) ^ (a0 &amp; a1 &amp;
     * (h0 ^ h1 ^ h2 ^ h3)) by its planes a0, a1: two planes in place of four level masks. The
     * flips start as the reads that are not uphill and gain every read decided below its
     * threshold.
     */
    private void paddedVisit(long[] bits, int k, long[] thresholds, MultiSpinCoding.Lanes lanes) {
        MultiSpinCoding c = coding;
        int m = lanes.count;
        long[] s0 = lanes.s0;
        long[] s1 = lanes.s1;
        long[] one = lanes.e0;
        long[] two = lanes.e1;
        long[] und = lanes.undecided;
        long[] flip = lanes.below;
        int d = c.terms[k];
        int uphillLevels = (d + 1) >>> 1;
        int row = k * m;
        int o = MultiSpinCoding.PADDED * k;
        int r0 = c.padNeighbour[o] * m;
        int r1 = c.padNeighbour[o + 1] * m;
        int r2 = c.padNeighbour[o + 2] * m;
        int r3 = c.padNeighbour[o + 3] * m;
        int r4 = c.padNeighbour[o + 4] * m;
        int r5 = c.padNeighbour[o + 5] * m;
        long u0 = c.padSame[o];
        long u1 = c.padSame[o + 1];
        long u2 = c.padSame[o + 2];
        long u3 = c.padSame[o + 3];
        long u4 = c.padSame[o + 4];
        long u5 = c.padSame[o + 5];
        // The field's term b ^ g where there is one, else 0 (never unsatisfied).
        long fieldOn = c.hasGhost[k] ? -1L : 0L;
        long g = c.ghostMask[k];
        long on0 = uphillLevels > 0 ? -1L : 0L;
        long on1 = uphillLevels > 1 ? -1L : 0L;
        long on2 = uphillLevels > 2 ? -1L : 0L;
        long on3 = uphillLevels > 3 ? -1L : 0L;
        for (int i = 0; i < m; i++) {
            long b = bits[row + i];
            long x0 = b ^ bits[r0 + i] ^ u0;
            long x1 = b ^ bits[r1 + i] ^ u1;
            long x2 = b ^ bits[r2 + i] ^ u2;
            long x3 = b ^ bits[r3 + i] ^ u3;
            long x4 = b ^ bits[r4 + i] ^ u4;
            long x5 = b ^ bits[r5 + i] ^ u5;
            long x6 = (b ^ g) & fieldOn;
            long y01 = x0 ^ x1;
            long sa = y01 ^ x2;
            long ca = (x0 & x1) | (x2 & y01);
            long y34 = x3 ^ x4;
            long sb = y34 ^ x5;
            long cb = (x3 & x4) | (x5 & y34);
            long yab = sa ^ sb;
            long a0 = yab ^ x6;
            long k0 = (sa & sb) | (x6 & yab);
            long z = ca ^ cb;
            long a1 = z ^ k0;
            long a2 = (ca & cb) | (k0 & z);
            long na0 = ~a0;
            long na1 = ~a1;
            long up = ~a2 & ((na1 & na0 & on0) | (na1 & a0 & on1) | (a1 & na0 & on2) | (a1 & a0 & on3));
            one[i] = a0;
            two[i] = a1;
            und[i] = up;
            flip[i] = ~up;
        }
        int base = d * MultiSpinCoding.LEVELS;
        long p0 = uphillLevels > 0 ? thresholds[base] : 0;
        long p1 = uphillLevels > 1 ? thresholds[base + 1] : 0;
        long p2 = uphillLevels > 2 ? thresholds[base + 2] : 0;
        long p3 = uphillLevels > 3 ? thresholds[base + 3] : 0;
        // A level that is not uphill has no reads: its bit counts as set for "every bit set".
        long offMask1 = ~on1;
        long offMask2 = ~on2;
        long offMask3 = ~on3;
        for (int bit = 0; bit < FIXED_WORDS; bit++) {
            long h0 = p0 >> 63;
            long h1 = p1 >> 63;
            long h2 = p2 >> 63;
            long h3 = p3 >> 63;
            p0 <<= 1;
            p1 <<= 1;
            p2 <<= 1;
            p3 <<= 1;
            if ((h0 | h1 | h2 | h3) == 0) {
                drawAndRefuse(m, s0, s1, und);
            } else if ((h0 & (h1 | offMask1) & (h2 | offMask2) & (h3 | offMask3)) == -1L) {
                drawAndTake(m, s0, s1, und, flip);
            } else if (on3 == 0) {
                drawAndDecide(m, s0, s1, und, flip, one, two, h0, h0 ^ h1, h0 ^ h2);
            } else {
                drawAndDecide4(m, s0, s1, und, flip, one, two, h0, h0 ^ h1, h0 ^ h2, h0 ^ h1 ^ h2 ^ h3);
            }
        }
        long left = 0;
        for (int i = 0; i < m; i++) {
            left |= und[i];
        }
        if (left != 0) {
            finish(m, s0, s1, und, flip, one, two, p0, p1, p2, p3);
        }
        for (int i = 0; i < m; i++) {
            bits[row + i] ^= flip[i];
        }
    }

    /** {@link #drawAndDecide} with a fourth level (count 3, both planes set). */
    private static void drawAndDecide4(int m, long[] s0, long[] s1, long[] und, long[] flip, long[] one, long[] two,
                                       long h0, long g1, long g2, long g3) {
        for (int i = 0; i < m; i++) {
            long x = s0[i];
            long y = s1[i];
            long r = Long.rotateLeft(x + y, 17) + x;
            long t = y ^ x;
            s0[i] = Long.rotateLeft(x, 49) ^ t ^ (t << 21);
            s1[i] = Long.rotateLeft(t, 28);
            long a0 = one[i];
            long a1 = two[i];
            long pb = h0 ^ (a0 & g1) ^ (a1 & g2) ^ (a0 & a1 & g3);
            long un = und[i];
            flip[i] |= un & ~r & pb;
            und[i] = un & ~(r ^ pb);
        }
    }

    /**
     * One fixed round in one lane loop: every lane's next word compared with the threshold bit
     * h0 ^ (one &amp; g1) ^ (two &amp; g2) of each undecided read.
     */
    private static void drawAndDecide(int m, long[] s0, long[] s1, long[] und, long[] flip, long[] one, long[] two,
                                      long h0, long g1, long g2) {
        for (int i = 0; i < m; i++) {
            long x = s0[i];
            long y = s1[i];
            long r = Long.rotateLeft(x + y, 17) + x;
            long t = y ^ x;
            s0[i] = Long.rotateLeft(x, 49) ^ t ^ (t << 21);
            s1[i] = Long.rotateLeft(t, 28);
            long pb = h0 ^ (one[i] & g1) ^ (two[i] & g2);
            long un = und[i];
            flip[i] |= un & ~r & pb;
            und[i] = un & ~(r ^ pb);
        }
    }

    /** A round where every level's threshold bit is 0: a read drawing a 1 is refused. */
    private static void drawAndRefuse(int m, long[] s0, long[] s1, long[] und) {
        for (int i = 0; i < m; i++) {
            long x = s0[i];
            long y = s1[i];
            long r = Long.rotateLeft(x + y, 17) + x;
            long t = y ^ x;
            s0[i] = Long.rotateLeft(x, 49) ^ t ^ (t << 21);
            s1[i] = Long.rotateLeft(t, 28);
            und[i] &= ~r;
        }
    }

    /** A round where every level's threshold bit is 1: a read drawing a 0 flips. */
    private static void drawAndTake(int m, long[] s0, long[] s1, long[] und, long[] flip) {
        for (int i = 0; i < m; i++) {
            long x = s0[i];
            long y = s1[i];
            long r = Long.rotateLeft(x + y, 17) + x;
            long t = y ^ x;
            s0[i] = Long.rotateLeft(x, 49) ^ t ^ (t << 21);
            s1[i] = Long.rotateLeft(t, 28);
            long un = und[i];
            flip[i] |= un & ~r;
            und[i] = un & r;
        }
    }

    /**
     * The lanes with reads still undecided after the fixed words (thresholds already shifted by
     * them): one word per bit, lane by lane, until decided or the 64 bits are used.
     */
    private static void finish(int m, long[] s0, long[] s1, long[] und, long[] flip, long[] one, long[] two, long p0,
                               long p1, long p2, long p3) {
        for (int i = 0; i < m; i++) {
            long undecided = und[i];
            if (undecided == 0) {
                continue;
            }
            long a0 = one[i];
            long a1 = two[i];
            long q0 = p0;
            long q1 = p1;
            long q2 = p2;
            long q3 = p3;
            long a = s0[i];
            long y = s1[i];
            long taken = 0;
            for (int bit = FIXED_WORDS; bit < 64 && undecided != 0; bit++) {
                long h0 = q0 >> 63;
                long h1 = q1 >> 63;
                long h2 = q2 >> 63;
                long pb = h0 ^ (a0 & (h0 ^ h1)) ^ (a1 & (h0 ^ h2)) ^ (a0 & a1 & (h0 ^ h1 ^ h2 ^ (q3 >> 63)));
                q0 <<= 1;
                q1 <<= 1;
                q2 <<= 1;
                q3 <<= 1;
                long r = Long.rotateLeft(a + y, 17) + a;
                long t = y ^ a;
                a = Long.rotateLeft(a, 49) ^ t ^ (t << 21);
                y = Long.rotateLeft(t, 28);
                taken |= undecided & ~r & pb;
                undecided &= ~(r ^ pb);
            }
            s0[i] = a;
            s1[i] = y;
            flip[i] |= taken;
            und[i] = 0;
        }
    }
}
