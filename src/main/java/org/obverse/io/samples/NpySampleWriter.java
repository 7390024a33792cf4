package org.obverse.io.samples;

import org.obverse.io.npy.NpyDtype;
import org.obverse.io.npy.NpyWriter;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

/**
 * Samples to an NPY {@code int8} file of shape {@code [reads, n]}, C order. Large chunks of a
 * block are written behind: the write of one chunk runs on a helper thread while the caller
 * unpacks the next into the other of two buffers, so the copy into the file overlaps the
 * work; commit, close and {@link #writeRows} wait for it first, and its failure is thrown there.
 */
final class NpySampleWriter extends SampleWriter {
    /** Chunks at least this large are written behind; smaller ones at once. */
    private static final int BEHIND_BYTES = 1 << 18;

    private final NpyWriter npy;
    private final Path target;
    private final int n;
    private final SampleCoding coding;
    private byte[] coded = new byte[0];
    private long written;
    private ExecutorService behind;
    private Future<?> pending;
    private byte[] inFlight;
    private byte[] spare = new byte[0];

    private NpySampleWriter(NpyWriter npy, Path target, int n, SampleCoding coding) {
        this.npy = npy;
        this.target = target;
        this.n = n;
        this.coding = coding;
    }

    static NpySampleWriter create(Path target, int n, boolean force, SampleCoding coding) throws IOException {
        return new NpySampleWriter(NpyWriter.create(target, force, NpyDtype.INT8, n), target, n, coding);
    }

    @Override
    public Path target() {
        return target;
    }

    @Override
    public int variables() {
        return n;
    }

    @Override
    public long readsWritten() {
        return n == 0 ? 0 : written / n;
    }

    @Override
    public void writeRows(byte[] spins, int fromRow, int count) throws IOException {
        int from = fromRow * n;
        int len = count * n;
        checkSpins(spins, from, len);
        finishPending();
        written += len;
        if (coding == SampleCoding.SPIN) {
            npy.writeBytes(spins, from, len);
        } else {
            if (coded.length < len) {
                coded = new byte[len];
            }
            for (int i = 0; i < len; i++) {
                coded[i] = (byte) ((spins[from + i] + 1) >> 1);
            }
            npy.writeBytes(coded, 0, len);
        }
    }

    @Override
    byte storedDown() {
        return coding.encode(-1);
    }

    @Override
    byte[] storedBuffer(int len) {
        if (spare.length < len) {
            spare = new byte[len];
        }
        return spare;
    }

    @Override
    void writeStored(byte[] stored, int count) throws IOException {
        int len = count * n;
        finishPending();
        written += len;
        if (len < BEHIND_BYTES) {
            npy.writeBytes(stored, 0, len);
            return;
        }
        if (behind == null) {
            behind = Executors.newSingleThreadExecutor(r -> {
                Thread t = new Thread(r, "npy-write-behind " + target.getFileName());
                t.setDaemon(true);
                return t;
            });
        }
        // The caller fills the other buffer next; this one is the file's until the write is done.
        byte[] free = inFlight != null && inFlight != stored ? inFlight : new byte[0];
        inFlight = stored;
        spare = free;
        pending = behind.submit(() -> {
            try {
                npy.writeBytes(stored, 0, len);
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        });
    }

    /** Waits for the write behind, if any, and throws its failure. */
    private void finishPending() throws IOException {
        if (pending == null) {
            return;
        }
        Future<?> f = pending;
        pending = null;
        try {
            f.get();
        } catch (ExecutionException e) {
            Throwable c = e.getCause();
            if (c instanceof UncheckedIOException) {
                throw ((UncheckedIOException) c).getCause();
            }
            if (c instanceof RuntimeException) {
                throw (RuntimeException) c;
            }
            throw new IOException(c);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new java.io.InterruptedIOException("interrupted while writing " + target);
        }
    }

    @Override
    public void commit() throws IOException {
        finishPending();
        stopBehind();
        npy.commit();
    }

    @Override
    public void close() throws IOException {
        try {
            finishPending();
        } catch (IOException | RuntimeException e) {
            // The file is discarded below; the failure was or will be reported by the caller's path.
        } finally {
            stopBehind();
            npy.close();
        }
    }

    private void stopBehind() {
        if (behind != null) {
            behind.shutdown();
            behind = null;
        }
    }
}
