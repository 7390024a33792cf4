package org.obverse.io.npy;

import org.obverse.io.BadInputException;
import org.obverse.io.output.PendingFile;
import java.io.Closeable;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.file.Path;
import java.util.Arrays;

/**
 * Writes an NPY file (format 1.0, C order) as a stream of elements whose first axis is not
 * known in advance: the header is written with room for the first axis to grow, the data is
 * appended, and {@link #commit()} writes the final shape into the header and renames the file
 * into place. The other axes are fixed when the writer is made. Closing without commit leaves
 * nothing behind. Not thread-safe.
 */
public final class NpyWriter implements Closeable {
    private static final int BUFFER = 1 << 16;

    private final PendingFile out;
    private final NpyDtype dtype;
    private final long[] innerShape;
    private final long rowElements;
    private final int headerLength;
    private final ByteBuffer buffer;
    private long elements;

    private NpyWriter(PendingFile out, NpyDtype dtype, long[] innerShape, int headerLength) {
        this.out = out;
        this.dtype = dtype;
        this.innerShape = innerShape;
        long r = 1;
        for (long d : innerShape) {
            r *= d;
        }
        this.rowElements = r;
        this.headerLength = headerLength;
        this.buffer = ByteBuffer.allocate(BUFFER).order(dtype.order());
    }

    /**
     * Starts a file of arrays of shape {@code [rows, innerShape...]}: {@code create(p, force,
     * FLOAT64)} for a vector, {@code create(p, force, INT8, n)} for rows of n.
     *
     * @throws BadInputException where the target exists and force is false
     */
    public static NpyWriter create(Path target, boolean force, NpyDtype dtype, long... innerShape) throws IOException {
        long[] shape = new long[innerShape.length + 1];
        System.arraycopy(innerShape, 0, shape, 1, innerShape.length);
        byte[] header = NpyHeader.of(dtype, shape).encode(0);
        PendingFile f = PendingFile.create(target, force);
        try {
            NpyWriter w = new NpyWriter(f, dtype, innerShape.clone(), header.length);
            f.channel().write(ByteBuffer.wrap(header));
            return w;
        } catch (IOException | RuntimeException e) {
            f.close();
            throw e;
        }
    }

    public NpyDtype dtype() {
        return dtype;
    }

    /** Elements written so far. */
    public long elements() {
        return elements;
    }

    private void room(int bytes) throws IOException {
        if (buffer.remaining() < bytes) {
            flush();
        }
    }

    private void flush() throws IOException {
        buffer.flip();
        while (buffer.hasRemaining()) {
            out.channel().write(buffer);
        }
        buffer.clear();
    }

    /** Appends one-byte elements (int8, uint8, bool). */
    public void writeBytes(byte[] src, int off, int len) throws IOException {
        if (dtype.size() != 1) {
            throw new IllegalStateException("writer of " + dtype.describe() + " takes no raw bytes");
        }
        if (len >= BUFFER) {
            flush();
            ByteBuffer b = ByteBuffer.wrap(src, off, len);
            while (b.hasRemaining()) {
                out.channel().write(b);
            }
        } else {
            room(len);
            buffer.put(src, off, len);
        }
        elements += len;
    }

    /** Appends float64 elements. */
    public void writeDoubles(double[] src, int off, int len) throws IOException {
        if (!dtype.sameKind(NpyDtype.FLOAT64)) {
            throw new IllegalStateException("writer of " + dtype.describe() + " takes no float64");
        }
        for (int i = 0; i < len; i++) {
            room(8);
            buffer.putDouble(src[off + i]);
        }
        elements += len;
    }

    /** Appends int32 elements. */
    public void writeInts(int[] src, int off, int len) throws IOException {
        if (!dtype.sameKind(NpyDtype.INT32)) {
            throw new IllegalStateException("writer of " + dtype.describe() + " takes no int32");
        }
        for (int i = 0; i < len; i++) {
            room(4);
            buffer.putInt(src[off + i]);
        }
        elements += len;
    }

    /**
     * Writes the final shape into the header and renames the file into place.
     *
     * @throws IllegalStateException where the elements written do not fill whole rows
     */
    public void commit() throws IOException {
        if (rowElements != 0 && elements % rowElements != 0) {
            throw new IllegalStateException(elements + " elements do not fill rows of " + rowElements);
        }
        flush();
        long[] shape = new long[innerShape.length + 1];
        shape[0] = rowElements == 0 ? 0 : elements / rowElements;
        System.arraycopy(innerShape, 0, shape, 1, innerShape.length);
        byte[] header = NpyHeader.of(dtype, shape).encode(headerLength);
        if (header.length != headerLength) {
            throw new IllegalStateException("header grew from " + headerLength + " to " + header.length + " bytes");
        }
        ByteBuffer h = ByteBuffer.wrap(header);
        long at = 0;
        while (h.hasRemaining()) {
            at += out.channel().write(h, at);
        }
        out.commit();
    }

    /** Discards the file unless committed. */
    @Override
    public void close() throws IOException {
        out.close();
    }

    @Override
    public String toString() {
        return "NpyWriter[" + out.target() + ", " + dtype + ", rows of " + Arrays.toString(innerShape) + "]";
    }
}
