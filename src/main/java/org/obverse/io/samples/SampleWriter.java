package org.obverse.io.samples;

import java.io.Closeable;
import java.io.IOException;
import java.nio.file.Path;
import org.obverse.samples.SampleBlock;

/**
 * A samples file written as a stream of reads under a temporary name: append rows or blocks,
 * then {@link #commit()} renames the finished file into place. Closing without commit (an
 * exception on the way) leaves nothing behind. Made by {@link SampleFiles#create}. Not
 * thread-safe.
 */
public abstract class SampleWriter implements Closeable {
    private static final int CHUNK_BYTES = 1 << 20;
    private byte[] scratch = new byte[0];

    SampleWriter() {
    }

    /** The file that commit creates. */
    public abstract Path target();

    /** Spins per read. */
    public abstract int variables();

    /** Reads written so far. */
    public abstract long readsWritten();

    /**
     * Appends count reads of row-major −1/+1 spins from {@code spins[fromRow·n …]}; the array is
     * not modified.
     *
     * @throws IllegalArgumentException at a value that is not −1 or +1
     */
    public abstract void writeRows(byte[] spins, int fromRow, int count) throws IOException;

    /** Appends every read of a block. */
    public void writeBlock(SampleBlock block) throws IOException {
        int n = variables();
        if (block.variables() != n) {
            throw new IllegalArgumentException("block has " + block.variables() + " spins per read; file has " + n);
        }
        int chunk = Math.max(64, CHUNK_BYTES / Math.max(1, n) / 64 * 64);
        chunk = Math.min(chunk, Math.max(1, block.reads()));
        for (int at = 0; at < block.reads(); at += chunk) {
            int count = Math.min(chunk, block.reads() - at);
            byte[] buffer = storedBuffer(count * n);
            // The block's bits are spins by construction: unpack straight into the stored coding, no re-check.
            block.unpackRows(at, count, buffer, storedDown(), (byte) 1);
            writeStored(buffer, count);
        }
    }

    /** A buffer of at least len bytes for the next {@link #writeStored} call. */
    byte[] storedBuffer(int len) {
        if (scratch.length < len) {
            scratch = new byte[len];
        }
        return scratch;
    }

    /** The stored value of s = −1 that {@link #writeStored} takes (s = +1 is stored as 1 in both codings). */
    byte storedDown() {
        return -1;
    }

    /**
     * Appends count rows of stored values (−1 or {@link #storedDown()} for s = −1, 1 for
     * s = +1) that the program made itself, so they need no check. The array is one that
     * {@link #storedBuffer} gave; a writer may keep it until its next call. The default writes
     * them as spins through {@link #writeRows}.
     */
    void writeStored(byte[] stored, int count) throws IOException {
        writeRows(stored, 0, count);
    }

    static void checkSpins(byte[] spins, int from, int len) {
        int i = SampleBlock.firstBadValue(spins, from, len, false);
        if (i >= 0) {
            throw new IllegalArgumentException("value " + spins[i] + " at index " + i + " is not a spin -1 or +1");
        }
    }

    /** Finishes the file and renames it into place. */
    public abstract void commit() throws IOException;

    /** Discards the file unless committed. */
    @Override
    public abstract void close() throws IOException;
}
