package org.obverse.io.samples;

import org.obverse.io.BadInputException;
import java.io.Closeable;
import java.io.IOException;
import java.nio.file.Path;
import java.util.Arrays;
import org.obverse.samples.SampleBlock;

/**
 * A samples file read as a stream of reads, a chunk at a time, so that files larger than
 * memory can be processed: {@link #readRows} gives row-major spins (−1/+1, column k = the
 * k-th smallest variable id), {@link #nextBlock} packs them into a bit-sliced block. Every
 * value is checked as it is read; a bad one is reported with the file, read and column. Made
 * by {@link SampleFiles#open}. Not thread-safe; close it.
 */
public abstract class SampleReader implements Closeable {
    private byte[] scratch = new byte[0];

    SampleReader() {
    }

    /** The file being read. */
    public abstract Path file();

    /** Spins per read. */
    public abstract int variables();

    /** Reads in the file where the layout states it in advance (NPY), else −1 (CSV). */
    public abstract long reads();

    /** Reads handed out so far. */
    public abstract long readsDone();

    /**
     * Reads up to maxRows reads into {@code rows[0 … count·n)} as −1/+1, column k at
     * {@code rows[r·n + k]}.
     *
     * @return count, 0 at the end of the file
     * @throws BadInputException at the first value that breaks the layout
     */
    public abstract int readRows(byte[] rows, int maxRows) throws IOException;

    /**
     * The next up to maxReads reads packed into a block. The block {@code reuse} is filled and
     * returned when it holds exactly as many reads as are read (a full chunk); otherwise (the
     * last, shorter chunk, or a null reuse) a fitting block is made.
     *
     * @return the block, or null at the end of the file
     */
    public SampleBlock nextBlock(int maxReads, SampleBlock reuse) throws IOException {
        if (maxReads <= 0) {
            throw new IllegalArgumentException("maxReads " + maxReads + " must be > 0");
        }
        int n = variables();
        long need = (long) maxReads * n;
        if (need > Integer.MAX_VALUE - 8) {
            throw new IllegalArgumentException(maxReads + " reads of " + n + " spins do not fit one chunk");
        }
        if (scratch.length < need) {
            scratch = new byte[(int) need];
        }
        long first = readsDone();
        int got = readStored(scratch, maxReads);
        if (got == 0) {
            return null;
        }
        SampleBlock block;
        if (reuse != null && reuse.reads() == got && reuse.variables() == n) {
            block = reuse;
            // Packing sets or clears every live bit; clear the whole array so padding bits are clear too.
            if ((got & 63) != 0) {
                Arrays.fill(block.words(), 0L);
            }
        } else {
            block = SampleBlock.allDown(got, n);
        }
        // One branch-free pass checks and packs; only a chunk with a bad value is scanned again.
        int bad = block.packChecked(scratch, 0, got, 0, storedBinary());
        if (bad >= 0) {
            throw badStored(first, bad, scratch[bad]);
        }
        return block;
    }

    /**
     * Reads up to maxRows rows as stored, possibly unchecked: −1/+1, or 0/1 where
     * {@link #storedBinary()}. The default hands out the checked spins of {@link #readRows}.
     */
    int readStored(byte[] rows, int maxRows) throws IOException {
        return readRows(rows, maxRows);
    }

    /** Whether {@link #readStored} gives 0/1 values rather than spins. */
    boolean storedBinary() {
        return false;
    }

    /** The error for stored value {@code index} of the chunk whose first read is {@code firstRead}. */
    RuntimeException badStored(long firstRead, int index, byte value) {
        int n = variables();
        return BadInputException.at(file(), "read " + (firstRead + index / n) + ", column " + index % n,
                "holds " + value + "; spins must be -1 or +1", "write spins as -1/+1");
    }

    /** Reads the rest of the file into one block. */
    public SampleBlock readRemaining() throws IOException {
        int n = variables();
        int chunk = Math.max(64, (1 << 20) / Math.max(1, n) / 64 * 64);
        java.util.List<SampleBlock> parts = new java.util.ArrayList<>();
        long total = 0;
        for (SampleBlock b = nextBlock(chunk, null); b != null; b = nextBlock(chunk, null)) {
            parts.add(b);
            total += b.reads();
        }
        if (total > Integer.MAX_VALUE) {
            throw BadInputException.at(file(), "", total + " reads are too many for one block", "read it in chunks");
        }
        SampleBlock all = SampleBlock.allDown((int) total, n);
        int at = 0;
        for (SampleBlock b : parts) {
            // Chunks are multiples of 64 reads except the last, so whole words copy across.
            System.arraycopy(b.words(), 0, all.words(), (at >>> 6) * n, b.words().length);
            at += b.reads();
        }
        return all;
    }

    @Override
    public abstract void close() throws IOException;
}
