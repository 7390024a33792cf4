package org.obverse.io.samples;

import org.obverse.io.output.PendingFile;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import org.obverse.model.VariableIndex;

/** Samples to CSV: a header of the variable ids in ascending order, then one line per read. */
final class CsvSampleWriter extends SampleWriter {
    private final PendingFile out;
    private final int n;
    private final SampleCoding coding;
    private final ByteBuffer buffer = ByteBuffer.allocate(1 << 16);
    private long reads;

    private CsvSampleWriter(PendingFile out, int n, SampleCoding coding) {
        this.out = out;
        this.n = n;
        this.coding = coding;
    }

    static CsvSampleWriter create(Path target, VariableIndex variables, boolean force, SampleCoding coding)
            throws IOException {
        PendingFile f = PendingFile.create(target, force);
        try {
            CsvSampleWriter w = new CsvSampleWriter(f, variables.size(), coding);
            StringBuilder h = new StringBuilder();
            for (int k = 0; k < variables.size(); k++) {
                if (k > 0) {
                    h.append(',');
                }
                h.append(variables.id(k));
            }
            h.append('\n');
            byte[] bytes = h.toString().getBytes(StandardCharsets.US_ASCII);
            for (byte b : bytes) {
                w.put(b);
            }
            return w;
        } catch (IOException | RuntimeException e) {
            f.close();
            throw e;
        }
    }

    private void put(byte b) throws IOException {
        if (!buffer.hasRemaining()) {
            flush();
        }
        buffer.put(b);
    }

    private void flush() throws IOException {
        buffer.flip();
        while (buffer.hasRemaining()) {
            out.channel().write(buffer);
        }
        buffer.clear();
    }

    @Override
    public Path target() {
        return out.target();
    }

    @Override
    public int variables() {
        return n;
    }

    @Override
    public long readsWritten() {
        return reads;
    }

    @Override
    public void writeRows(byte[] spins, int fromRow, int count) throws IOException {
        checkSpins(spins, fromRow * n, count * n);
        for (int r = 0; r < count; r++) {
            int row = (fromRow + r) * n;
            for (int k = 0; k < n; k++) {
                if (k > 0) {
                    put((byte) ',');
                }
                int v = coding.encode(spins[row + k]);
                if (v < 0) {
                    put((byte) '-');
                }
                put((byte) ('0' + Math.abs(v)));
            }
            put((byte) '\n');
        }
        reads += count;
    }

    @Override
    public void commit() throws IOException {
        flush();
        out.commit();
    }

    @Override
    public void close() throws IOException {
        out.close();
    }
}
