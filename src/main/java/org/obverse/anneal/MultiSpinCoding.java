package org.obverse.anneal;

import org.apache.commons.rng.UniformRandomProvider;
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
public final class MultiSpinCoding {
    /** Largest number of terms (neighbours plus field) of one spin. */
    public static final int MAX_TERMS = 15;
    private static final int LEVELS = 8;
    /** Threshold bits always drawn before the loop stops at the first fully decided word. */
    private static final int FIXED_ROUNDS = 10;

    private final int n;
    private final double magnitude;
    private final int[] start;
    private final int[] neighbour;
    // -1 (all reads) where the coupling is antiferromagnetic (J > 0): then equal spins are unsatisfied.
    private final long[] sameIsUnsatisfied;
    // Ghost term of spin k: bit pattern b_k ^ ghostMask[k] is "unsatisfied"; hasGhost[k] says whether k has a field.
    private final long[] ghostMask;
    private final boolean[] hasGhost;
    private final int[] terms;

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
     * k of the 64 reads and is updated in place. thresholds from {@link #thresholds}.
     */
    public void sweep(long[] bits, long[] thresholds, UniformRandomProvider rng) {
        for (int k = 0; k < n; k++) {
            sweepOne(bits, k, thresholds, rng);
        }
    }

    /** The Metropolis step of spin k for the 64 reads of bits. */
    private void sweepOne(long[] bits, int k, long[] thresholds, UniformRandomProvider rng) {
        {
            long b = bits[k];
            long c0 = 0;
            long c1 = 0;
            long c2 = 0;
            long c3 = 0;
            if (hasGhost[k]) {
                c0 = b ^ ghostMask[k];
            }
            for (int q = start[k]; q < start[k + 1]; q++) {
                long x = b ^ bits[neighbour[q]] ^ sameIsUnsatisfied[q];
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
            // eq(m) for the uphill levels m < d/2, at most 8 of them (d <= 15).
            long e0 = 0;
            long e1 = 0;
            long e2 = 0;
            long e3 = 0;
            long e4 = 0;
            long e5 = 0;
            long e6 = 0;
            long e7 = 0;
            long nc0 = ~c0;
            long nc1 = ~c1;
            long nc2 = ~c2;
            long low = ~c3;
            switch (uphillLevels) {
                case 8: e7 = c0 & c1 & c2 & low; // fall through
                case 7: e6 = nc0 & c1 & c2 & low; // fall through
                case 6: e5 = c0 & nc1 & c2 & low; // fall through
                case 5: e4 = nc0 & nc1 & c2 & low; // fall through
                case 4: e3 = c0 & c1 & nc2 & low; // fall through
                case 3: e2 = nc0 & c1 & nc2 & low; // fall through
                case 2: e1 = c0 & nc1 & nc2 & low; // fall through
                case 1: e0 = nc0 & nc1 & nc2 & low; // fall through
                default: break;
            }
            long undecided = e0 | e1 | e2 | e3 | e4 | e5 | e6 | e7;
            long accept = ~undecided;
            if (undecided != 0) {
                int base = d * LEVELS;
                if (uphillLevels <= 3) {
                    // Up to 6 terms, as everywhere on the K4,4 cell grid: three levels.
                    long p0 = thresholds[base];
                    long p1 = uphillLevels > 1 ? thresholds[base + 1] : 0;
                    long p2 = uphillLevels > 2 ? thresholds[base + 2] : 0;
                    accept |= decide(undecided, e0, p0, e1, p1, e2, p2, rng);
                } else if (uphillLevels == 4) {
                    long p0 = thresholds[base];
                    long p1 = uphillLevels > 1 ? thresholds[base + 1] : 0;
                    long p2 = uphillLevels > 2 ? thresholds[base + 2] : 0;
                    long p3 = uphillLevels > 3 ? thresholds[base + 3] : 0;
                    accept |= decide(undecided, e0, p0, e1, p1, e2, p2, e3, p3, rng);
                } else {
                    long below = 0;
                    long p0 = thresholds[base];
                    long p1 = thresholds[base + 1];
                    long p2 = thresholds[base + 2];
                    long p3 = thresholds[base + 3];
                    long p4 = thresholds[base + 4];
                    long p5 = uphillLevels > 5 ? thresholds[base + 5] : 0;
                    long p6 = uphillLevels > 6 ? thresholds[base + 6] : 0;
                    long p7 = uphillLevels > 7 ? thresholds[base + 7] : 0;
                    for (int bit = 63; bit >= 0 && undecided != 0; bit--) {
                        long pb = (e0 & -((p0 >>> bit) & 1L)) | (e1 & -((p1 >>> bit) & 1L))
                                | (e2 & -((p2 >>> bit) & 1L)) | (e3 & -((p3 >>> bit) & 1L))
                                | (e4 & -((p4 >>> bit) & 1L)) | (e5 & -((p5 >>> bit) & 1L))
                                | (e6 & -((p6 >>> bit) & 1L)) | (e7 & -((p7 >>> bit) & 1L));
                        long r = rng.nextLong();
                        below |= undecided & ~r & pb;
                        undecided &= ~(r ^ pb);
                    }
                    accept |= below;
                }
            }
            bits[k] = b ^ accept;
        }
    }

    /**
     * Four independent sweeps at once: {@code b0 … b3} are four blocks' words, each with its own
     * generator, and each ends exactly as {@link #sweep} would leave it with that generator (the
     * same draws in the same order). Spin k of the four blocks is visited together, so the
     * processor overlaps four independent chains of counting and of random draws; where spin k
     * has at most six terms (three uphill levels, as everywhere on the K4,4 cell grid) the four
     * acceptance tests run as one loop. Other spins take the one-word path per block.
     */
    public void sweep4(long[] b0, long[] b1, long[] b2, long[] b3, long[] thresholds, UniformRandomProvider r0,
                       UniformRandomProvider r1, UniformRandomProvider r2, UniformRandomProvider r3) {
        for (int k = 0; k < n; k++) {
            int d = terms[k];
            int uphillLevels = (d + 1) >>> 1;
            if (uphillLevels > 3) {
                sweepOne(b0, k, thresholds, r0);
                sweepOne(b1, k, thresholds, r1);
                sweepOne(b2, k, thresholds, r2);
                sweepOne(b3, k, thresholds, r3);
                continue;
            }
            // Counts of unsatisfied terms, bit-sliced (at most 6 terms: three planes suffice).
            long x0 = b0[k];
            long x1 = b1[k];
            long x2 = b2[k];
            long x3 = b3[k];
            long a0 = 0, a1 = 0, a2 = 0;
            long bb0 = 0, bb1 = 0, bb2 = 0;
            long cc0 = 0, cc1 = 0, cc2 = 0;
            long dd0 = 0, dd1 = 0, dd2 = 0;
            if (hasGhost[k]) {
                long g = ghostMask[k];
                a0 = x0 ^ g;
                bb0 = x1 ^ g;
                cc0 = x2 ^ g;
                dd0 = x3 ^ g;
            }
            for (int q = start[k]; q < start[k + 1]; q++) {
                int j = neighbour[q];
                long same = sameIsUnsatisfied[q];
                long y0 = x0 ^ b0[j] ^ same;
                long y1 = x1 ^ b1[j] ^ same;
                long y2 = x2 ^ b2[j] ^ same;
                long y3 = x3 ^ b3[j] ^ same;
                long t;
                t = a0 & y0; a0 ^= y0; y0 = a1 & t; a1 ^= t; a2 ^= y0;
                t = bb0 & y1; bb0 ^= y1; y1 = bb1 & t; bb1 ^= t; bb2 ^= y1;
                t = cc0 & y2; cc0 ^= y2; y2 = cc1 & t; cc1 ^= t; cc2 ^= y2;
                t = dd0 & y3; dd0 ^= y3; y3 = dd1 & t; dd1 ^= t; dd2 ^= y3;
            }
            // eq(m) for the uphill levels m < d/2 (at most three): m = 0, 1, 2.
            long e00 = ~a0 & ~a1 & ~a2;
            long e01 = uphillLevels > 1 ? a0 & ~a1 & ~a2 : 0;
            long e02 = uphillLevels > 2 ? ~a0 & a1 & ~a2 : 0;
            long e10 = ~bb0 & ~bb1 & ~bb2;
            long e11 = uphillLevels > 1 ? bb0 & ~bb1 & ~bb2 : 0;
            long e12 = uphillLevels > 2 ? ~bb0 & bb1 & ~bb2 : 0;
            long e20 = ~cc0 & ~cc1 & ~cc2;
            long e21 = uphillLevels > 1 ? cc0 & ~cc1 & ~cc2 : 0;
            long e22 = uphillLevels > 2 ? ~cc0 & cc1 & ~cc2 : 0;
            long e30 = ~dd0 & ~dd1 & ~dd2;
            long e31 = uphillLevels > 1 ? dd0 & ~dd1 & ~dd2 : 0;
            long e32 = uphillLevels > 2 ? ~dd0 & dd1 & ~dd2 : 0;
            if (uphillLevels == 0) {
                e00 = 0;
                e10 = 0;
                e20 = 0;
                e30 = 0;
            }
            long u0 = e00 | e01 | e02;
            long u1 = e10 | e11 | e12;
            long u2 = e20 | e21 | e22;
            long u3 = e30 | e31 | e32;
            boolean draw0 = u0 != 0;
            boolean draw1 = u1 != 0;
            boolean draw2 = u2 != 0;
            boolean draw3 = u3 != 0;
            long acc0 = ~u0;
            long acc1 = ~u1;
            long acc2 = ~u2;
            long acc3 = ~u3;
            if (draw0 | draw1 | draw2 | draw3) {
                int base = d * LEVELS;
                long p0 = thresholds[base];
                long p1 = uphillLevels > 1 ? thresholds[base + 1] : 0;
                long p2 = uphillLevels > 2 ? thresholds[base + 2] : 0;
                long w0 = 0, w1 = 0, w2 = 0, w3 = 0;
                for (int bit = 0; bit < FIXED_ROUNDS; bit++) {
                    long s0 = p0 >> 63;
                    long s1 = p1 >> 63;
                    long s2 = p2 >> 63;
                    p0 <<= 1;
                    p1 <<= 1;
                    p2 <<= 1;
                    if (draw0) {
                        long pb = (e00 & s0) | (e01 & s1) | (e02 & s2);
                        long r = r0.nextLong();
                        w0 |= u0 & ~r & pb;
                        u0 &= ~(r ^ pb);
                    }
                    if (draw1) {
                        long pb = (e10 & s0) | (e11 & s1) | (e12 & s2);
                        long r = r1.nextLong();
                        w1 |= u1 & ~r & pb;
                        u1 &= ~(r ^ pb);
                    }
                    if (draw2) {
                        long pb = (e20 & s0) | (e21 & s1) | (e22 & s2);
                        long r = r2.nextLong();
                        w2 |= u2 & ~r & pb;
                        u2 &= ~(r ^ pb);
                    }
                    if (draw3) {
                        long pb = (e30 & s0) | (e31 & s1) | (e32 & s2);
                        long r = r3.nextLong();
                        w3 |= u3 & ~r & pb;
                        u3 &= ~(r ^ pb);
                    }
                }
                if (draw0) {
                    acc0 |= w0 | finish(u0, e00, p0, e01, p1, e02, p2, r0);
                }
                if (draw1) {
                    acc1 |= w1 | finish(u1, e10, p0, e11, p1, e12, p2, r1);
                }
                if (draw2) {
                    acc2 |= w2 | finish(u2, e20, p0, e21, p1, e22, p2, r2);
                }
                if (draw3) {
                    acc3 |= w3 | finish(u3, e30, p0, e31, p1, e32, p2, r3);
                }
            }
            b0[k] = x0 ^ acc0;
            b1[k] = x1 ^ acc1;
            b2[k] = x2 ^ acc2;
            b3[k] = x3 ^ acc3;
        }
    }

    /** The reads still undecided after the fixed rounds, decided bit by bit (thresholds already shifted). */
    private static long finish(long undecided, long e0, long p0, long e1, long p1, long e2, long p2,
                               UniformRandomProvider rng) {
        long below = 0;
        for (int bit = FIXED_ROUNDS; bit < 64 && undecided != 0; bit++) {
            long pb = (e0 & (p0 >> 63)) | (e1 & (p1 >> 63)) | (e2 & (p2 >> 63));
            p0 <<= 1;
            p1 <<= 1;
            p2 <<= 1;
            long r = rng.nextLong();
            below |= undecided & ~r & pb;
            undecided &= ~(r ^ pb);
        }
        return below;
    }

    /**
     * The reads of {@code undecided} whose uniform U is below their level's threshold: bit by
     * bit from the top, a fresh random word per bit, until every read is decided.
     */
    /**
     * As the four-level form, for three levels. The first {@link #FIXED_ROUNDS} bits are
     * always drawn (a loop of fixed length, which the processor predicts); reads still
     * undecided after them (probability 2⁻¹⁰ each) continue bit by bit.
     */
    private static long decide(long undecided, long e0, long p0, long e1, long p1, long e2, long p2,
                               UniformRandomProvider rng) {
        long below = 0;
        for (int bit = 0; bit < FIXED_ROUNDS; bit++) {
            long pb = (e0 & (p0 >> 63)) | (e1 & (p1 >> 63)) | (e2 & (p2 >> 63));
            p0 <<= 1;
            p1 <<= 1;
            p2 <<= 1;
            long r = rng.nextLong();
            below |= undecided & ~r & pb;
            undecided &= ~(r ^ pb);
        }
        for (int bit = FIXED_ROUNDS; bit < 64 && undecided != 0; bit++) {
            long pb = (e0 & (p0 >> 63)) | (e1 & (p1 >> 63)) | (e2 & (p2 >> 63));
            p0 <<= 1;
            p1 <<= 1;
            p2 <<= 1;
            long r = rng.nextLong();
            below |= undecided & ~r & pb;
            undecided &= ~(r ^ pb);
        }
        return below;
    }

    private static long decide(long undecided, long e0, long p0, long e1, long p1, long e2, long p2, long e3, long p3,
                               UniformRandomProvider rng) {
        long below = 0;
        // The threshold bits are taken from the top: p >> 63 (arithmetic) is all ones where
        // the top bit is set; then each threshold shifts left by one.
        for (int bit = 0; bit < 64 && undecided != 0; bit++) {
            long pb = (e0 & (p0 >> 63)) | (e1 & (p1 >> 63)) | (e2 & (p2 >> 63)) | (e3 & (p3 >> 63));
            p0 <<= 1;
            p1 <<= 1;
            p2 <<= 1;
            p3 <<= 1;
            long r = rng.nextLong();
            below |= undecided & ~r & pb;
            undecided &= ~(r ^ pb);
        }
        return below;
    }
}
