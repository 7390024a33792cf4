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
    /** Chunks of at least this many stored bytes are packed on two cores. */
    private static final long PARALLEL_BYTES = 1L << 20;
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
     *
     * @throws IllegalArgumentException at the first value that is not −1 or +1, naming read and column
     */
    public void packRows(byte[] spins, int fromRow, int count, int toRead) {
        int bad = packChecked(spins, fromRow, count, toRead, false);
        if (bad >= 0) {
            int n = variables;
            throw new IllegalArgumentException("read " + (bad / n) + ", column " + (bad % n) + " holds " + spins[bad]
                    + "; spins must be -1 or +1");
        }
    }

    /**
     * Checks and packs {@code count} stored rows of {@code src} (row-major, from row
     * {@code fromRow}) into reads {@code toRead …} in one branch-free pass: stored values are
     * −1/+1, or 0/1 where {@code binary} (then 1 means s = +1). Every live bit of those reads
     * is set or cleared; other reads are left as they are.
     *
     * @return −1 where every value is valid, else the index in {@code src} of the first bad
     *         value in row-major order (reads up to that value's block are packed, later ones
     *         are not)
     */
    public int packChecked(byte[] src, int fromRow, int count, int toRead, boolean binary) {
        int n = variables;
        if (fromRow < 0 || count < 0 || toRead < 0 || (long) toRead + count > reads
                || ((long) fromRow + count) * n > src.length) {
            throw new IllegalArgumentException(count + " rows from row " + fromRow + " into read " + toRead
                    + " do not fit " + src.length + " values or " + reads + " reads of " + n);
        }
        int at = fromRow * n;
        // Large chunks: two halves on two cores, split at a 64-read boundary so that each
        // writes its own words; the first half's bad value comes first in row order.
        int headRows = (64 - (toRead & 63)) & 63;
        if ((long) count * n >= PARALLEL_BYTES && count - headRows >= 128) {
            int split = headRows + ((count - headRows) / 128) * 64;
            java.util.concurrent.ForkJoinTask<Integer> second = java.util.concurrent.ForkJoinTask.adapt(
                    () -> BitPack.pack(src, at + split * n, count - split, n, words, toRead + split, binary)).fork();
            int first = BitPack.pack(src, at, split, n, words, toRead, binary);
            int later = second.join();
            return first >= 0 ? first : later;
        }
        return BitPack.pack(src, at, count, n, words, toRead, binary);
    }

    /**
     * Checks stored values without packing them, eight at a time and branch-free: −1/+1, or
     * 0/1 where {@code binary}.
     *
     * @return −1 where all of {@code values[from … from+len)} are valid, else the index of the first bad one
     */
    public static int firstBadValue(byte[] values, int from, int len, boolean binary) {
        if (from < 0 || len < 0 || (long) from + len > values.length) {
            throw new IllegalArgumentException(len + " values from " + from + " do not fit " + values.length);
        }
        return BitPack.firstBad(values, from, len, binary);
    }

    /** Unpacks reads {@code fromRead … fromRead+count-1} into row-major ±1 values at {@code out[0…]}. */
    public void unpackRows(int fromRead, int count, byte[] out) {
        unpackRows(fromRead, count, out, (byte) -1, (byte) 1);
    }

    /**
     * Unpacks reads {@code fromRead … fromRead+count-1} into row-major stored values at
     * {@code out[0…]}: {@code down} where s = −1, {@code up} where s = +1 (−1/+1 for spins,
     * 0/1 for binary values). Branch-free, 8 × 8 bit blocks at a time.
     */
    public void unpackRows(int fromRead, int count, byte[] out, byte down, byte up) {
        if (fromRead < 0 || count < 0 || (long) fromRead + count > reads || (long) count * variables > out.length) {
            throw new IllegalArgumentException(count + " reads from read " + fromRead + " do not fit " + out.length
                    + " values or " + reads + " reads of " + variables);
        }
        BitPack.unpack(words, variables, fromRead, count, out, down, up);
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
