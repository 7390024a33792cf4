package org.obverse.samples;

import java.lang.invoke.MethodHandles;
import java.lang.invoke.VarHandle;
import java.nio.ByteOrder;

/**
 * Kernels between row-major stored bytes (one byte a spin, a row a read) and the bit-sliced
 * words of a {@link SampleBlock}, without a branch on the data.
 *
 * <p>Packing takes eight columns of eight reads at a time as eight little-endian longs. The
 * check is SWAR: a spin byte b is valid iff b ⊕ 0x01 is 0x00 or 0xFE, that is iff it equals
 * its own sign bit times 0xFE; a binary byte iff its bits 1–7 are clear. The bit of each byte
 * (the inverted sign of a spin, bit 0 of a binary value) is gathered into one byte per read
 * by a multiply, the eight bytes form an 8 × 8 bit matrix, and a transpose (three
 * delta swaps, Warren, Hacker's Delight, 2nd ed., Addison-Wesley 2012, §7-3) turns it into
 * one byte per column: eight reads of that column's word. Any bad value found by the
 * block-wide OR of the checks sends the block to a scalar scan that finds the first one.
 * Unpacking is the mirror image, with a table that spreads a byte's bits over eight bytes.
 * Rows that do not fill a group of 8 (or 64) reads and columns past the last multiple of 8
 * go through plain, still branch-free, loops.
 */
final class BitPack {
    private static final VarHandle LONGS = MethodHandles.byteArrayViewVarHandle(long[].class, ByteOrder.LITTLE_ENDIAN);
    private static final long ONES = 0x0101010101010101L;
    private static final long SIGNS = 0x8080808080808080L;
    // Multiplying 0/1 bytes by this gathers byte i's bit into bit 56 + i.
    private static final long GATHER = 0x0102040810204080L;
    /** Byte b spread over eight bytes: byte i = bit i of b (0 or 1). */
    private static final long[] SPREAD = new long[256];

    static {
        for (int b = 0; b < 256; b++) {
            long v = 0;
            for (int i = 0; i < 8; i++) {
                v |= (long) ((b >>> i) & 1) << (8 * i);
            }
            SPREAD[b] = v;
        }
    }

    private BitPack() {
    }

    /** Transposes an 8 × 8 bit matrix held as bit 8·row + column. */
    static long transpose8(long x) {
        long t = (x ^ (x >>> 7)) & 0x00AA00AA00AA00AAL;
        x = x ^ t ^ (t << 7);
        t = (x ^ (x >>> 14)) & 0x0000CCCC0000CCCCL;
        x = x ^ t ^ (t << 14);
        t = (x ^ (x >>> 28)) & 0x00000000F0F0F0F0L;
        return x ^ t ^ (t << 28);
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
        for (int k0 = 0; k0 < n8; k0 += 8) {
            long c0 = 0;
            long c1 = 0;
            long c2 = 0;
            long c3 = 0;
            long c4 = 0;
            long c5 = 0;
            long c6 = 0;
            long c7 = 0;
            for (int g = 0; g < 8; g++) {
                long m = 0;
                int p = row0 + 8 * g * n + k0;
                for (int j = 0; j < 8; j++, p += n) {
                    long x = (long) LONGS.get(src, p);
                    long up;
                    if (binary) {
                        bad |= x & ~ONES;
                        up = x & ONES;
                    } else {
                        long t = x ^ ONES;
                        long s = t & SIGNS;
                        bad |= t ^ ((s >>> 7) * 0xFE);
                        up = (~x & SIGNS) >>> 7;
                    }
                    m |= ((up * GATHER) >>> 56) << (8 * j);
                }
                // Now byte j = read 8g + j, bit i = column k0 + i; transposed, byte i = column, bit j = read.
                m = transpose8(m);
                int sh = 8 * g;
                c0 |= (m & 0xFF) << sh;
                c1 |= ((m >>> 8) & 0xFF) << sh;
                c2 |= ((m >>> 16) & 0xFF) << sh;
                c3 |= ((m >>> 24) & 0xFF) << sh;
                c4 |= ((m >>> 32) & 0xFF) << sh;
                c5 |= ((m >>> 40) & 0xFF) << sh;
                c6 |= ((m >>> 48) & 0xFF) << sh;
                c7 |= (m >>> 56) << sh;
            }
            int w = base + k0;
            words[w] = c0;
            words[w + 1] = c1;
            words[w + 2] = c2;
            words[w + 3] = c3;
            words[w + 4] = c4;
            words[w + 5] = c5;
            words[w + 6] = c6;
            words[w + 7] = c7;
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
                // Byte i = column k0 + i, bit j = read; transposed, byte j = read, bit i = column.
                m = transpose8(m);
                int p = row0 + k0;
                for (int j = 0; j < 8; j++, p += n) {
                    LONGS.set(out, p, downs ^ (SPREAD[(int) ((m >>> (8 * j)) & 0xFF)] * diff));
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
