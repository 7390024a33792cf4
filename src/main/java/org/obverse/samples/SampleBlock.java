package org.obverse.samples;

/**
 * Reads of n spins stored bit-sliced: one {@code long} holds one spin across 64 reads. Word
 * {@code b * n + k} holds spin k of reads 64b … 64b + 63, bit r for read 64b + r; a set bit
 * means s = +1 (x = 1), a clear bit s = −1. Bits past the last read of the last block are
 * clear and must be ignored: {@link #validMask(int)} marks the live ones.
 *
 * <p>Mutable on purpose: it is the working buffer of the kernels, which read and write
 * {@link #words()} directly. Cost: n · ⌈reads / 64⌉ longs.
 */
public final class SampleBlock {
    private final int reads;
    private final int variables;
    private final long[] words;

    private SampleBlock(int reads, int variables, long[] words) {
        this.reads = reads;
        this.variables = variables;
        this.words = words;
    }

    /** A block whose every spin is −1. */
    public static SampleBlock allDown(int reads, int variables) {
        if (reads < 0 || variables < 0) {
            throw new IllegalArgumentException("reads " + reads + " and variables " + variables + " must be >= 0");
        }
        long size = (long) blocksFor(reads) * variables;
        if (size > Integer.MAX_VALUE - 8) {
            throw new IllegalArgumentException(reads + " reads of " + variables + " spins do not fit one block; split them");
        }
        return new SampleBlock(reads, variables, new long[(int) size]);
    }

    /**
     * Packs row-major ±1 spins ({@code spins[read * n + k]}). Input is not modified.
     *
     * @throws IllegalArgumentException at the first value that is not −1 or +1, naming read and column
     */
    public static SampleBlock fromSpins(byte[] spins, int reads, int variables) {
        if ((long) reads * variables != spins.length) {
            throw new IllegalArgumentException(spins.length + " values are not " + reads + " reads of " + variables);
        }
        SampleBlock b = allDown(reads, variables);
        b.packRows(spins, 0, reads, 0);
        return b;
    }

    /** Wraps existing words (not copied); length must be n · ⌈reads / 64⌉. */
    public static SampleBlock wrap(long[] words, int reads, int variables) {
        if (words.length != (long) blocksFor(reads) * variables) {
            throw new IllegalArgumentException(words.length + " words do not hold " + reads + " reads of " + variables);
        }
        return new SampleBlock(reads, variables, words);
    }

    /** Number of 64-read blocks needed for the reads. */
    public static int blocksFor(int reads) {
        return (reads + 63) >>> 6;
    }

    /**
     * Packs {@code count} rows of ±1 spins from {@code spins} (row-major, starting at row
     * {@code fromRow}) into reads {@code toRead …}. Used when streaming a file in chunks.
     */
    public void packRows(byte[] spins, int fromRow, int count, int toRead) {
        int n = variables;
        for (int r = 0; r < count; r++) {
            int read = toRead + r;
            int base = (read >>> 6) * n;
            long bit = 1L << (read & 63);
            int row = (fromRow + r) * n;
            for (int k = 0; k < n; k++) {
                byte s = spins[row + k];
                if (s == 1) {
                    words[base + k] |= bit;
                } else if (s == -1) {
                    words[base + k] &= ~bit;
                } else {
                    throw new IllegalArgumentException("read " + (fromRow + r) + ", column " + k + " holds " + s
                            + "; spins must be -1 or +1");
                }
            }
        }
    }

    /** Unpacks reads {@code fromRead … fromRead+count-1} into row-major ±1 values at {@code out[0…]}. */
    public void unpackRows(int fromRead, int count, byte[] out) {
        int n = variables;
        for (int r = 0; r < count; r++) {
            int read = fromRead + r;
            int base = (read >>> 6) * n;
            int shift = read & 63;
            int row = r * n;
            for (int k = 0; k < n; k++) {
                out[row + k] = (byte) ((((words[base + k] >>> shift) & 1L) << 1) - 1);
            }
        }
    }

    /** All reads as row-major ±1 values. */
    public byte[] toSpins() {
        byte[] out = new byte[reads * variables];
        unpackRows(0, reads, out);
        return out;
    }

    public int reads() {
        return reads;
    }

    public int variables() {
        return variables;
    }

    public int blockCount() {
        return blocksFor(reads);
    }

    /** Spin k of a read: −1 or +1. */
    public int spin(int read, int k) {
        return (int) (((words[(read >>> 6) * variables + k] >>> (read & 63)) & 1L) * 2 - 1);
    }

    /** Sets spin k of a read to s (−1 or +1). */
    public void setSpin(int read, int k, int s) {
        int w = (read >>> 6) * variables + k;
        long bit = 1L << (read & 63);
        if (s > 0) {
            words[w] |= bit;
        } else {
            words[w] &= ~bit;
        }
    }

    /** The word of spin k in block b. */
    public long word(int block, int k) {
        return words[block * variables + k];
    }

    /** Mask of the live reads of block b: all ones except in a partial last block. */
    public long validMask(int block) {
        int live = reads - (block << 6);
        return live >= 64 ? -1L : (1L << live) - 1;
    }

    /** The backing array (not a copy): kernels read and write it in place. */
    public long[] words() {
        return words;
    }

    /** An independent copy. */
    public SampleBlock copy() {
        return new SampleBlock(reads, variables, words.clone());
    }
}
