package org.obverse.samples;

import java.lang.invoke.MethodHandles;
import java.lang.invoke.VarHandle;
import java.nio.ByteOrder;

/**
 * Kernels between row-major stored bytes (one byte a spin, a row a read) and the bit-sliced
 * words of a {@link SampleBlock}, without a branch on the data.
 *
 * <p>Packing reads eight columns of a read as one little-endian long. The check is SWAR: a
 * spin byte b is valid iff t = b ⊕ 0x01 is 0x00 or 0xFE, that is iff t equals its own sign
 * bit times 0xFE; a binary byte iff its bits 1–7 are clear. The bit that matters (the sign of
 * t, or bit 0 of a binary value) of read j is shifted to bit j of its byte, so eight reads
 * OR into one long whose byte i holds column i's eight reads; an 8 × 8 byte transpose (three
 * rounds of delta swaps, Warren, Hacker's Delight, 2nd ed., Addison-Wesley 2012, §7-3) of the
 * eight such longs of 64 reads gives the column words. A block whose OR of checks is nonzero
 * is scanned again in row order for its first bad value. Unpacking is the mirror image: bit j
 * of every byte, moved to bit 0 and multiplied by (down ⊕ up), is read j's row. Reads that
 * do not fill a group of 8 (or 64) and columns past the last multiple of 8 go through plain,
 * still branch-free, loops.
 */
final class BitPack {
    private static final VarHandle LONGS = MethodHandles.byteArrayViewVarHandle(long[].class, ByteOrder.LITTLE_ENDIAN);
    private static final long ONES = 0x0101010101010101L;
    private static final long SIGNS = 0x8080808080808080L;

    private BitPack() {
    }

    /**
     * Packs count rows of n stored bytes from {@code src[at …]} into reads {@code toRead …} of
     * words (n words a block of 64 reads).
     *
     * @return −1, or the index in src of the first bad value
     */
    static int pack(byte[] src, int at, int count, int n, long[] words, int toRead, boolean binary) {
        int r = 0;
        int head = Math.min(count, (64 - (toRead & 63)) & 63);
        for (; r < head; r++) {
            int bad = packRow(src, at + r * n, n, words, toRead + r, binary);
            if (bad >= 0) {
                return bad;
            }
        }
        for (; count - r >= 64; r += 64) {
            int row0 = at + r * n;
            if (packBlock(src, row0, n, words, ((toRead + r) >>> 6) * n, binary) != 0) {
                for (int j = 0; j < 64; j++) {
                    int bad = firstBadScalar(src, row0 + j * n, n, binary);
                    if (bad >= 0) {
                        return bad;
                    }
                }
                throw new IllegalStateException("a block was flagged bad but holds no bad value");
            }
        }
        for (; r < count; r++) {
            int bad = packRow(src, at + r * n, n, words, toRead + r, binary);
            if (bad >= 0) {
                return bad;
            }
        }
        return -1;
    }

    /** One row into bit (read & 63) of its block's words; −1 or the first bad index. */
    private static int packRow(byte[] src, int row, int n, long[] words, int read, boolean binary) {
        int base = (read >>> 6) * n;
        int shift = read & 63;
        long clear = ~(1L << shift);
        int bad = 0;
        if (binary) {
            for (int k = 0; k < n; k++) {
                int v = src[row + k];
                bad |= v & ~1;
                words[base + k] = (words[base + k] & clear) | ((long) (v & 1) << shift);
            }
        } else {
            for (int k = 0; k < n; k++) {
                int u = src[row + k] + 1; // 0 for -1, 2 for +1
                bad |= u & ~2;
                words[base + k] = (words[base + k] & clear) | ((long) ((u >>> 1) & 1) << shift);
            }
        }
        return bad == 0 ? -1 : firstBadScalar(src, row, n, binary);
    }

    private static int firstBadScalar(byte[] src, int row, int n, boolean binary) {
        for (int k = 0; k < n; k++) {
            int v = src[row + k];
            if (binary ? (v & ~1) != 0 : v != 1 && v != -1) {
                return row + k;
            }
        }
        return -1;
    }

    /** SWAR check of len values from src[from …]; −1 or the index of the first bad one. */
    static int firstBad(byte[] src, int from, int len, boolean binary) {
        int end = from + len;
        int i = from;
        for (; i + 256 <= end; i += 256) {
            long bad = 0;
            for (int p = i; p < i + 256; p += 8) {
                long x = (long) LONGS.get(src, p);
                if (binary) {
                    bad |= x & ~ONES;
                } else {
                    long t = x ^ ONES;
                    bad |= t ^ (((t & SIGNS) >>> 7) * 0xFE);
                }
            }
            if (bad != 0) {
                return firstBadScalar(src, i, 256, binary);
            }
        }
        int left = end - i;
        return left == 0 ? -1 : firstBadScalar(src, i, left, binary);
    }

    /** 64 rows from src[row0 …] into the n words at base; nonzero where some value is bad. */
    private static long packBlock(byte[] src, int row0, int n, long[] words, int base, boolean binary) {
        long bad = 0;
        int n8 = n & ~7;
        long[] ms = new long[8];
        for (int k0 = 0; k0 < n8; k0 += 8) {
            // m[g]: byte i = column k0 + i, bit j = read 8g + j (the bit sits at 8i + 7 for a
            // spin's sign, 8i for a binary value, and one shift per read moves it to 8i + j).
            for (int g = 0; g < 8; g++) {
                long m = 0;
                int p = row0 + 8 * g * n + k0;
                if (binary) {
                    for (int j = 0; j < 8; j++, p += n) {
                        long x = (long) LONGS.get(src, p);
                        bad |= x & ~ONES;
                        m |= (x & ONES) << j;
                    }
                } else {
                    for (int j = 0; j < 8; j++, p += n) {
                        long t = (long) LONGS.get(src, p) ^ ONES; // 0x00 for +1, 0xFE for -1
                        long s = t & SIGNS;
                        bad |= t ^ ((s >>> 7) * 0xFE);
                        m |= s >>> (7 - j);
                    }
                    m = ~m; // set where s = +1
                }
                ms[g] = m;
            }
            long m0 = ms[0];
            long m1 = ms[1];
            long m2 = ms[2];
            long m3 = ms[3];
            long m4 = ms[4];
            long m5 = ms[5];
            long m6 = ms[6];
            long m7 = ms[7];
            // An 8 x 8 byte transpose: word i takes byte i of m0 … m7.
            long t;
            t = ((m0 >>> 8) ^ m1) & 0x00FF00FF00FF00FFL; m1 ^= t; m0 ^= t << 8;
            t = ((m2 >>> 8) ^ m3) & 0x00FF00FF00FF00FFL; m3 ^= t; m2 ^= t << 8;
            t = ((m4 >>> 8) ^ m5) & 0x00FF00FF00FF00FFL; m5 ^= t; m4 ^= t << 8;
            t = ((m6 >>> 8) ^ m7) & 0x00FF00FF00FF00FFL; m7 ^= t; m6 ^= t << 8;
            t = ((m0 >>> 16) ^ m2) & 0x0000FFFF0000FFFFL; m2 ^= t; m0 ^= t << 16;
            t = ((m1 >>> 16) ^ m3) & 0x0000FFFF0000FFFFL; m3 ^= t; m1 ^= t << 16;
            t = ((m4 >>> 16) ^ m6) & 0x0000FFFF0000FFFFL; m6 ^= t; m4 ^= t << 16;
            t = ((m5 >>> 16) ^ m7) & 0x0000FFFF0000FFFFL; m7 ^= t; m5 ^= t << 16;
            t = ((m0 >>> 32) ^ m4) & 0x00000000FFFFFFFFL; m4 ^= t; m0 ^= t << 32;
            t = ((m1 >>> 32) ^ m5) & 0x00000000FFFFFFFFL; m5 ^= t; m1 ^= t << 32;
            t = ((m2 >>> 32) ^ m6) & 0x00000000FFFFFFFFL; m6 ^= t; m2 ^= t << 32;
            t = ((m3 >>> 32) ^ m7) & 0x00000000FFFFFFFFL; m7 ^= t; m3 ^= t << 32;
            int w = base + k0;
            words[w] = m0;
            words[w + 1] = m1;
            words[w + 2] = m2;
            words[w + 3] = m3;
            words[w + 4] = m4;
            words[w + 5] = m5;
            words[w + 6] = m6;
            words[w + 7] = m7;
        }
        for (int k = n8; k < n; k++) {
            long c = 0;
            int p = row0 + k;
            for (int j = 0; j < 64; j++, p += n) {
                int v = src[p];
                if (binary) {
                    bad |= v & ~1;
                    c |= (long) (v & 1) << j;
                } else {
                    int u = v + 1;
                    bad |= u & ~2;
                    c |= (long) ((u >>> 1) & 1) << j;
                }
            }
            words[base + k] = c;
        }
        return bad;
    }

    /** Reads fromRead … fromRead+count-1 into row-major bytes at out[0 …]: down for a clear bit, up for a set one. */
    static void unpack(long[] words, int n, int fromRead, int count, byte[] out, byte down, byte up) {
        int r = 0;
        int head = Math.min(count, (8 - (fromRead & 7)) & 7);
        for (; r < head; r++) {
            unpackRow(words, n, fromRead + r, out, r * n, down, up);
        }
        long downs = (down & 0xFFL) * ONES;
        long diff = (down ^ up) & 0xFFL;
        int n8 = n & ~7;
        for (; count - r >= 8; r += 8) {
            int read = fromRead + r;
            int base = (read >>> 6) * n;
            int sh = read & 63; // a multiple of 8
            int row0 = r * n;
            for (int k0 = 0; k0 < n8; k0 += 8) {
                int w = base + k0;
                long m = ((words[w] >>> sh) & 0xFF)
                        | ((words[w + 1] >>> sh) & 0xFF) << 8
                        | ((words[w + 2] >>> sh) & 0xFF) << 16
                        | ((words[w + 3] >>> sh) & 0xFF) << 24
                        | ((words[w + 4] >>> sh) & 0xFF) << 32
                        | ((words[w + 5] >>> sh) & 0xFF) << 40
                        | ((words[w + 6] >>> sh) & 0xFF) << 48
                        | ((words[w + 7] >>> sh) & 0xFF) << 56;
                // Byte i = column k0 + i, bit j = read: bit j of every byte, moved to bit 0, is read j's row.
                int p = row0 + k0;
                for (int j = 0; j < 8; j++, p += n) {
                    // Eight byte stores, not one long through a VarHandle: the quick compiler (C1),
                    // which short commands run under, calls the VarHandle instead of inlining it.
                    long v = downs ^ (((m >>> j) & ONES) * diff);
                    out[p] = (byte) v;
                    out[p + 1] = (byte) (v >>> 8);
                    out[p + 2] = (byte) (v >>> 16);
                    out[p + 3] = (byte) (v >>> 24);
                    out[p + 4] = (byte) (v >>> 32);
                    out[p + 5] = (byte) (v >>> 40);
                    out[p + 6] = (byte) (v >>> 48);
                    out[p + 7] = (byte) (v >>> 56);
                }
            }
            for (int k = n8; k < n; k++) {
                long word = words[base + k] >>> sh;
                int p = row0 + k;
                for (int j = 0; j < 8; j++, p += n) {
                    out[p] = (byte) (down ^ (-((word >>> j) & 1) & diff));
                }
            }
        }
        for (; r < count; r++) {
            unpackRow(words, n, fromRead + r, out, r * n, down, up);
        }
    }

    private static void unpackRow(long[] words, int n, int read, byte[] out, int row, byte down, byte up) {
        int base = (read >>> 6) * n;
        int shift = read & 63;
        int diff = (down ^ up) & 0xFF;
        for (int k = 0; k < n; k++) {
            out[row + k] = (byte) (down ^ (-(int) ((words[base + k] >>> shift) & 1) & diff));
        }
    }
}
