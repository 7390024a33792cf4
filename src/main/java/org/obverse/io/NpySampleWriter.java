package org.obverse.io;

import java.io.IOException;
import java.nio.file.Path;

/** Samples to an NPY {@code int8} file of shape {@code [reads, n]}, C order. */
final class NpySampleWriter extends SampleWriter {
    private final NpyWriter npy;
    private final Path target;
    private final int n;
    private final SampleCoding coding;
    private byte[] coded = new byte[0];

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
        return n == 0 ? 0 : npy.elements() / n;
    }

    @Override
    public void writeRows(byte[] spins, int fromRow, int count) throws IOException {
        int from = fromRow * n;
        int len = count * n;
        checkSpins(spins, from, len);
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
    void writeStored(byte[] stored, int count) throws IOException {
        npy.writeBytes(stored, 0, count * n);
    }

    @Override
    public void commit() throws IOException {
        npy.commit();
    }

    @Override
    public void close() throws IOException {
        npy.close();
    }
}
