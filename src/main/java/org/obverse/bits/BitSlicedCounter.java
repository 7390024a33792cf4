package org.obverse.bits;

/**
 * Counting on 64 lanes at once: a count kept bit-sliced, word p holding bit p of every lane's
 * count (a vertical counter), and kernels that add words into it and compare it with a
 * constant. Static kernels over caller-owned {@code long[]} planes; nothing allocates.
 *
 * <p>{@link #countLanes} counts, for each of the 64 bit lanes, how many of a list of words have
 * that bit set. Sixteen words at a time pass through a tree of carry-save adders
 * (full adders on whole words: three words in, a sum and a carry word out), which keeps the
 * low four bits of every lane's count in the words ones, twos, fours and eights; each
 * carry out of the tree (worth 16) ripples into a vertical counter of higher bits. This is
 * the Harley–Seal scheme (Warren, Hacker's Delight, 2nd ed., Addison-Wesley 2012, §5-1;
 * Muła, Kurz and Lemire, The Computer Journal 61(1), 2018). Cost: about six word
 * operations per input word.
 */
public final class BitSlicedCounter {
    private BitSlicedCounter() {
    }

    /**
     * counts[r] = number of words x[0 … size) with bit r set.
     *
     * @param planes Workspace of at least 32 words; overwritten
     * @param counts Output of 64 entries
     */
    public static void countLanes(long[] x, int size, long[] planes, int[] counts) {
        long ones = 0;
        long twos = 0;
        long fours = 0;
        long eights = 0;
        // Planes for the count's bits from 16 upwards: enough for size / 16, all zero at first.
        int used = 32 - Integer.numberOfLeadingZeros(size >>> 4);
        java.util.Arrays.fill(planes, 0, used, 0L);
        int i = 0;
        for (; i + 16 <= size; i += 16) {
            long u;
            long twosA;
            long twosB;
            long foursA;
            long foursB;
            long eightsA;
            long eightsB;
            // Each step is a carry-save adder: (high, low) = a + b + c on every lane.
            u = ones ^ x[i];
            twosA = (ones & x[i]) | (u & x[i + 1]);
            ones = u ^ x[i + 1];
            u = ones ^ x[i + 2];
            twosB = (ones & x[i + 2]) | (u & x[i + 3]);
            ones = u ^ x[i + 3];
            u = twos ^ twosA;
            foursA = (twos & twosA) | (u & twosB);
            twos = u ^ twosB;
            u = ones ^ x[i + 4];
            twosA = (ones & x[i + 4]) | (u & x[i + 5]);
            ones = u ^ x[i + 5];
            u = ones ^ x[i + 6];
            twosB = (ones & x[i + 6]) | (u & x[i + 7]);
            ones = u ^ x[i + 7];
            u = twos ^ twosA;
            foursB = (twos & twosA) | (u & twosB);
            twos = u ^ twosB;
            u = fours ^ foursA;
            eightsA = (fours & foursA) | (u & foursB);
            fours = u ^ foursB;
            u = ones ^ x[i + 8];
            twosA = (ones & x[i + 8]) | (u & x[i + 9]);
            ones = u ^ x[i + 9];
            u = ones ^ x[i + 10];
            twosB = (ones & x[i + 10]) | (u & x[i + 11]);
            ones = u ^ x[i + 11];
            u = twos ^ twosA;
            foursA = (twos & twosA) | (u & twosB);
            twos = u ^ twosB;
            u = ones ^ x[i + 12];
            twosA = (ones & x[i + 12]) | (u & x[i + 13]);
            ones = u ^ x[i + 13];
            u = ones ^ x[i + 14];
            twosB = (ones & x[i + 14]) | (u & x[i + 15]);
            ones = u ^ x[i + 15];
            u = twos ^ twosA;
            foursB = (twos & twosA) | (u & twosB);
            twos = u ^ twosB;
            u = fours ^ foursA;
            eightsB = (fours & foursA) | (u & foursB);
            fours = u ^ foursB;
            u = eights ^ eightsA;
            long sixteens = (eights & eightsA) | (u & eightsB);
            eights = u ^ eightsB;
            ripple(planes, used, sixteens);
        }
        for (; i < size; i++) {
            long c = x[i];
            long t = ones & c;
            ones ^= c;
            c = t;
            t = twos & c;
            twos ^= c;
            c = t;
            t = fours & c;
            fours ^= c;
            c = t;
            t = eights & c;
            eights ^= c;
            ripple(planes, used, t);
        }
        for (int r = 0; r < 64; r++) {
            int c = (int) ((ones >>> r) & 1) | (int) ((twos >>> r) & 1) << 1 | (int) ((fours >>> r) & 1) << 2
                    | (int) ((eights >>> r) & 1) << 3;
            counts[r] = c | lane(planes, used, r) << 4;
        }
    }

    /**
     * Adds one word into a vertical counter: lane r of planes[0 … planeCount) gains bit r of
     * {@code word} (a ripple-carry add on every lane; a carry out of the top plane is lost).
     * Stops as soon as no lane carries, which pays where words are sparse or planes many.
     *
     * @param planes Input and output: the counter, modified
     */
    public static void add(long[] planes, int planeCount, long word) {
        long carry = word;
        for (int p = 0; p < planeCount && carry != 0L; p++) {
            long t = planes[p] & carry;
            planes[p] ^= carry;
            carry = t;
        }
    }

    /** Lanes whose count in planes[0 … planeCount) is at least t (0 ≤ t &lt; 2^planeCount). */
    public static long atLeast(long[] planes, int planeCount, int t) {
        long gt = 0L;
        long eq = -1L;
        for (int p = planeCount - 1; p >= 0; p--) {
            if (((t >>> p) & 1) != 0) {
                eq &= planes[p];
            } else {
                gt |= eq & planes[p];
                eq &= ~planes[p];
            }
        }
        return gt | eq;
    }

    /** Lanes whose count in planes[0 … planeCount) equals t. */
    public static long exactly(long[] planes, int planeCount, int t) {
        long eq = -1L;
        for (int p = planeCount - 1; p >= 0; p--) {
            eq &= ((t >>> p) & 1) != 0 ? planes[p] : ~planes[p];
        }
        return eq;
    }

    /** The count of lane r in planes[0 … planeCount). */
    public static int lane(long[] planes, int planeCount, int r) {
        int c = 0;
        for (int p = 0; p < planeCount; p++) {
            c |= (int) ((planes[p] >>> r) & 1L) << p;
        }
        return c;
    }

    /**
     * Adds one word of carries (each worth 16) into the vertical counter planes[0 … used).
     * Unlike {@link #add}, a fixed number of steps without an early exit (a deliberate
     * variant): here carries stop at unpredictable depths, and a mispredicted branch costs more
     * than the few extra word operations.
     */
    private static void ripple(long[] planes, int used, long carry) {
        for (int p = 0; p < used; p++) {
            long t = planes[p] & carry;
            planes[p] ^= carry;
            carry = t;
        }
    }
}
