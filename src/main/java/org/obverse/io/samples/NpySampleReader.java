package org.obverse.io.samples;

import org.obverse.io.BadInputException;
import org.obverse.io.npy.NpyDtype;
import org.obverse.io.npy.NpyHeader;
import org.obverse.io.npy.NpyReader;
import java.io.IOException;
import java.nio.file.Path;
import org.obverse.model.VariableIndex;
import org.obverse.samples.SampleBlock;

/** Samples from an NPY {@code int8} file of shape {@code [reads, n]} in C order. */
final class NpySampleReader extends SampleReader {
    private final NpyReader npy;
    private final SampleCoding coding;
    private final int n;
    private final long reads;
    private long done;

    private NpySampleReader(NpyReader npy, SampleCoding coding, int n, long reads) {
        this.npy = npy;
        this.coding = coding;
        this.n = n;
        this.reads = reads;
    }

    static NpySampleReader open(Path file, VariableIndex expected, SampleCoding coding) throws IOException {
        NpyReader npy = NpyReader.open(file);
        try {
            NpyHeader h = npy.header();
            String layout = "samples are NPY int8 of shape [reads, n] in C order";
            if (!h.dtype().sameKind(NpyDtype.INT8)) {
                throw BadInputException.at(file, "header", "dtype is " + h.dtype().describe() + " ('" + h.dtype().descr()
                        + "'), not int8", layout + ": save with numpy.save(path, samples.astype(numpy.int8))");
            }
            if (h.ndim() != 2) {
                throw BadInputException.at(file, "header", "shape " + java.util.Arrays.toString(h.shape()) + " has "
                        + h.ndim() + " axes, not 2", layout);
            }
            // With one row or one column C and Fortran order hold the same bytes.
            if (h.fortranOrder() && h.axis(0) > 1 && h.axis(1) > 1) {
                throw BadInputException.at(file, "header", "fortran_order is True", layout
                        + ": save numpy.ascontiguousarray(samples) instead");
            }
            if (h.axis(1) > Integer.MAX_VALUE - 8) {
                throw BadInputException.at(file, "header", h.axis(1) + " columns are too many", layout);
            }
            int width = (int) h.axis(1);
            if (h.axis(0) > SampleFiles.MAX_READS || width == 0 && h.axis(0) > SampleFiles.MAX_READS_WITHOUT_COLUMNS) {
                throw BadInputException.at(file, "header", "shape " + java.util.Arrays.toString(h.shape()) + " has more reads "
                        + "than the limit " + (width == 0 ? SampleFiles.MAX_READS_WITHOUT_COLUMNS + " for a file without columns"
                        : SampleFiles.MAX_READS), "split the samples over several files");
            }
            if (expected != null && width != expected.size()) {
                throw BadInputException.at(file, "header", "shape " + java.util.Arrays.toString(h.shape()) + " has "
                        + width + " columns but the problem has " + expected.size() + " variables",
                        "give the samples of this problem (column k = its k-th smallest variable id)");
            }
            return new NpySampleReader(npy, coding, width, h.axis(0));
        } catch (RuntimeException e) {
            npy.close();
            throw e;
        }
    }

    @Override
    public Path file() {
        return npy.file();
    }

    @Override
    public int variables() {
        return n;
    }

    @Override
    public long reads() {
        return reads;
    }

    @Override
    public long readsDone() {
        return done;
    }

    @Override
    public int readRows(byte[] rows, int maxRows) throws IOException {
        long first = done;
        int count = readStored(rows, maxRows);
        int len = count * n;
        boolean binary = storedBinary();
        int bad = SampleBlock.firstBadValue(rows, 0, len, binary);
        if (bad >= 0) {
            throw badStored(first, bad, rows[bad]);
        }
        if (binary) {
            for (int i = 0; i < len; i++) {
                rows[i] = (byte) (2 * rows[i] - 1);
            }
        }
        return count;
    }

    @Override
    int readStored(byte[] rows, int maxRows) throws IOException {
        int count = (int) Math.min(maxRows, reads - done);
        if (count <= 0) {
            return 0;
        }
        int len = count * n;
        int got = npy.readBytes(rows, 0, len);
        if (got != len) {
            throw BadInputException.at(file(), "read " + (done + got / Math.max(1, n)), "the data ended early",
                    "the file is truncated: write it again");
        }
        done += count;
        return count;
    }

    @Override
    boolean storedBinary() {
        return coding == SampleCoding.BINARY;
    }

    @Override
    BadInputException badStored(long firstRead, int index, byte b) {
        long read = firstRead + index / n;
        int column = index % n;
        long offset = npy.byteOffsetOf(firstRead * n + index);
        return BadInputException.at(file(), "read " + read + ", column " + column + " (byte offset " + offset + ")",
                "holds " + b + "; " + coding.rule(), coding == SampleCoding.SPIN
                        ? "write spins as int8 -1/+1 (0/1 files need the binary coding)"
                        : "write binary values as int8 0/1");
    }

    @Override
    public void close() throws IOException {
        npy.close();
    }
}
