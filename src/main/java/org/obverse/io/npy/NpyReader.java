package org.obverse.io.npy;

import org.obverse.io.BadInputException;
import org.obverse.io.InputFiles;
import java.io.Closeable;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.Path;

/**
 * Reads an NPY file as a stream of elements in file order, so that a file larger than memory
 * can be read in chunks. The header is parsed and the file length checked against the shape
 * when the file is opened: a truncated file, or one with bytes after its data, is refused
 * before any data is handed out. Multi-byte elements are converted from the byte order the
 * dtype names. Not thread-safe; close it.
 */
public final class NpyReader implements Closeable {
    private static final int BUFFER = 1 << 16;

    private final Path file;
    private final FileChannel channel;
    private final NpyHeader header;
    private final long elements;
    private final ByteBuffer buffer;
    private long position;

    private NpyReader(Path file, FileChannel channel, NpyHeader header) {
        this.file = file;
        this.channel = channel;
        this.header = header;
        this.elements = header.elementCount();
        this.buffer = ByteBuffer.allocate(BUFFER).order(header.dtype().order());
        buffer.limit(0);
    }

    /**
     * Opens a file and reads its header.
     *
     * @throws BadInputException where the header is malformed or the length does not match the shape
     * @throws IOException where the file cannot be read
     */
    public static NpyReader open(Path file) throws IOException {
        FileChannel ch = InputFiles.openChannel(file);
        try {
            long size = ch.size();
            byte[] head = new byte[(int) Math.min(size, 4096)];
            readFully(ch, ByteBuffer.wrap(head), 0);
            long total = NpyHeader.headerLength(head, head.length, file);
            if (total > head.length) {
                if (total > size || total > Integer.MAX_VALUE - 8) {
                    throw BadInputException.at(file, "header", "the header length field says " + total
                            + " bytes but the file holds " + size, "the file is truncated or not NPY: write it again");
                }
                head = new byte[(int) total];
                readFully(ch, ByteBuffer.wrap(head), 0);
            }
            NpyHeader h = NpyHeader.parse(head, (int) Math.min(head.length, total), file);
            long need;
            try {
                need = Math.multiplyExact(h.elementCount(), (long) h.dtype().size());
            } catch (ArithmeticException e) {
                throw BadInputException.at(file, "header", "shape " + java.util.Arrays.toString(h.shape())
                        + " is too large", "check the file");
            }
            long data = size - h.dataOffset();
            if (data < need) {
                throw BadInputException.at(file, "byte offset " + size, "the file ends after " + data
                        + " data bytes; its shape " + java.util.Arrays.toString(h.shape()) + " of " + h.dtype().describe()
                        + " needs " + need, "the file is truncated: write it again");
            }
            if (data > need) {
                throw BadInputException.at(file, "byte offset " + (h.dataOffset() + need), (data - need)
                        + " bytes follow the data that the shape " + java.util.Arrays.toString(h.shape()) + " describes",
                        "the header and the data disagree: write the file again");
            }
            ch.position(h.dataOffset());
            return new NpyReader(file, ch, h);
        } catch (RuntimeException | IOException e) {
            ch.close();
            throw e;
        }
    }

    private static void readFully(FileChannel ch, ByteBuffer dst, long at) throws IOException {
        while (dst.hasRemaining()) {
            int got = ch.read(dst, at + dst.position());
            if (got < 0) {
                break;
            }
        }
    }

    /** The file being read. */
    public Path file() {
        return file;
    }

    public NpyHeader header() {
        return header;
    }

    /** Elements already handed out. */
    public long position() {
        return position;
    }

    /** Elements left to read. */
    public long remaining() {
        return elements - position;
    }

    /** Byte offset in the file of element i (in file order). */
    public long byteOffsetOf(long element) {
        return header.dataOffset() + element * header.dtype().size();
    }

    private boolean fill() throws IOException {
        buffer.compact();
        int got = channel.read(buffer);
        buffer.flip();
        return got > 0;
    }

    private void ensure(int bytes) throws IOException {
        while (buffer.remaining() < bytes) {
            if (!fill()) {
                // The length was checked on open, so this means the file changed under us.
                throw BadInputException.at(file, "byte offset " + byteOffsetOf(position), "the file ended early",
                        "the file was truncated while being read: write it again");
            }
        }
    }

    private int clamp(int len) {
        return (int) Math.min(len, remaining());
    }

    /**
     * Reads up to len one-byte elements as raw bytes (int8, uint8 or bool).
     *
     * @return the number read, 0 at the end
     */
    public int readBytes(byte[] dst, int off, int len) throws IOException {
        requireSize(1, "bytes");
        int n = clamp(len);
        int done = 0;
        int buffered = Math.min(n, buffer.remaining());
        buffer.get(dst, off, buffered);
        done += buffered;
        if (done < n) {
            // Large requests go straight from the channel into the caller's array.
            ByteBuffer direct = ByteBuffer.wrap(dst, off + done, n - done);
            while (direct.hasRemaining()) {
                if (channel.read(direct) < 0) {
                    throw BadInputException.at(file, "byte offset " + byteOffsetOf(position + direct.position() - off),
                            "the file ended early", "the file was truncated while being read: write it again");
                }
            }
            done = n;
        }
        position += n;
        return n;
    }

    /** Reads up to len float elements (float64 or float32) as doubles; returns the number read. */
    public int readDoubles(double[] dst, int off, int len) throws IOException {
        if (header.dtype().kind() != 'f') {
            throw wrongKind("floating-point");
        }
        int n = clamp(len);
        boolean wide = header.dtype().size() == 8;
        for (int i = 0; i < n; i++) {
            ensure(header.dtype().size());
            dst[off + i] = wide ? buffer.getDouble() : buffer.getFloat();
        }
        position += n;
        return n;
    }

    /** Reads up to len integer or bool elements that fit an int (up to 4 bytes; uint32 refused). */
    public int readInts(int[] dst, int off, int len) throws IOException {
        NpyDtype t = header.dtype();
        if (t.kind() == 'f' || t.size() > 4 || (t.kind() == 'u' && t.size() == 4)) {
            throw wrongKind("integer (up to 32 bits)");
        }
        int n = clamp(len);
        for (int i = 0; i < n; i++) {
            ensure(t.size());
            int v;
            switch (t.size()) {
                case 1:
                    v = t.kind() == 'i' ? buffer.get() : buffer.get() & 0xff;
                    break;
                case 2:
                    v = t.kind() == 'i' ? buffer.getShort() : buffer.getShort() & 0xffff;
                    break;
                default:
                    v = buffer.getInt();
                    break;
            }
            dst[off + i] = v;
        }
        position += n;
        return n;
    }

    private void requireSize(int size, String what) {
        if (header.dtype().size() != size) {
            throw wrongKind(what);
        }
    }

    private BadInputException wrongKind(String wanted) {
        return BadInputException.at(file, "header", "dtype " + header.dtype().describe() + " ('" + header.dtype().descr()
                + "') cannot be read as " + wanted, "give a file of the expected type");
    }

    @Override
    public void close() throws IOException {
        channel.close();
    }
}
