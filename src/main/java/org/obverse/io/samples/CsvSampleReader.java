package org.obverse.io.samples;

import org.obverse.io.BadInputException;
import org.obverse.io.InputFiles;
import org.obverse.io.Messages;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.obverse.model.VariableIndex;

/**
 * Samples from a CSV file: a header line of variable ids, then one line per read of −1/1 (or
 * 0/1 where binary). Columns are matched to variables by id, so the header may list the ids
 * in any order; each id of the problem must appear exactly once. Blank lines are skipped; a
 * line may end in CR LF. Parsed byte by byte from a buffer: no per-line strings.
 */
final class CsvSampleReader extends SampleReader {
    private static final int EOF = -1;

    private final Path file;
    private final InputStream in;
    private final SampleCoding coding;
    // Set once the header is read: the ids by file column, and each column's position.
    private int[] headerIds;
    private int[] target;
    private final byte[] buf = new byte[1 << 16];
    private int pos;
    private int lim;
    private long line = 1;
    private long done;
    // The read being parsed, for messages.
    private long current;
    private boolean ended;
    private final StringBuilder token = new StringBuilder();

    private CsvSampleReader(Path file, InputStream in, SampleCoding coding) {
        this.file = file;
        this.in = in;
        this.coding = coding;
    }

    static CsvSampleReader open(Path file, VariableIndex expected, SampleCoding coding) throws IOException {
        InputStream in = InputFiles.openStream(file);
        try {
            CsvSampleReader r = new CsvSampleReader(file, in, coding);
            int[] ids = r.header();
            VariableIndex index = expected != null ? expected : VariableIndex.of(ids);
            int[] target = new int[ids.length];
            boolean[] seen = new boolean[index.size()];
            for (int c = 0; c < ids.length; c++) {
                int k = index.indexOf(ids[c]);
                if (k < 0) {
                    throw BadInputException.at(file, "line 1, column " + c, "variable id " + ids[c]
                            + " is not a variable of the problem", "give the samples of this problem");
                }
                if (seen[k]) {
                    throw BadInputException.at(file, "line 1, column " + c, "variable id " + ids[c] + " is given twice",
                            "name each variable once in the header");
                }
                seen[k] = true;
                target[c] = k;
            }
            for (int k = 0; k < seen.length; k++) {
                if (!seen[k]) {
                    throw BadInputException.at(file, "line 1", "the header lacks variable id " + index.id(k) + " ("
                            + ids.length + " ids for " + index.size() + " variables)",
                            "give one column per variable of the problem");
                }
            }
            r.headerIds = ids;
            r.target = target;
            return r;
        } catch (RuntimeException | IOException e) {
            in.close();
            throw e;
        }
    }

    private int next() throws IOException {
        if (pos == lim) {
            if (ended) {
                return EOF;
            }
            lim = in.read(buf, 0, buf.length);
            pos = 0;
            if (lim <= 0) {
                lim = 0;
                ended = true;
                return EOF;
            }
        }
        return buf[pos++] & 0xff;
    }

    private void back() {
        pos--;
    }

    private int[] header() throws IOException {
        List<Integer> ids = new ArrayList<>();
        int c = next();
        // A UTF-8 byte order mark, as some spreadsheet programs write.
        if (c == 0xEF) {
            if (next() != 0xBB || next() != 0xBF) {
                throw BadInputException.at(file, "line 1", "the header does not start with a variable id",
                        "the first line must list the variable ids, separated by commas");
            }
            c = next();
        }
        if (c == EOF) {
            throw BadInputException.at(file, "line 1", "the file is empty", "the first line must list the variable ids");
        }
        back();
        while (true) {
            token.setLength(0);
            c = next();
            while (c != ',' && c != '\n' && c != EOF) {
                if (c != '\r') {
                    token.append((char) (c & 0xff));
                }
                c = next();
            }
            String t = token.toString().trim();
            int id;
            try {
                id = Integer.parseInt(t);
            } catch (NumberFormatException e) {
                id = -1;
            }
            if (id < 0) {
                throw BadInputException.at(file, "line 1, column " + ids.size(), "header value '" + Messages.excerpt(t)
                        + "' is not a variable id (an integer >= 0)", "the first line must list the variable ids");
            }
            ids.add(id);
            if (c != ',') {
                break;
            }
        }
        line = 2;
        int[] out = new int[ids.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = ids.get(i);
        }
        return out;
    }

    @Override
    public Path file() {
        return file;
    }

    @Override
    public int variables() {
        return headerIds.length;
    }

    @Override
    public long reads() {
        return -1;
    }

    @Override
    public long readsDone() {
        return done;
    }

    @Override
    public int readRows(byte[] rows, int maxRows) throws IOException {
        int n = headerIds.length;
        int count = 0;
        while (count < maxRows) {
            current = done + count;
            if (!readRow(rows, count * n)) {
                break;
            }
            count++;
        }
        done += count;
        return count;
    }

    /** Parses one line into rows[base …]; false at the end of the file. */
    private boolean readRow(byte[] rows, int base) throws IOException {
        int n = headerIds.length;
        int col = 0;
        while (true) {
            int c = next();
            while (c == ' ' || c == '\t') {
                c = next();
            }
            if (col == 0 && (c == '\n' || c == '\r' || c == EOF)) {
                if (c == EOF) {
                    return false;
                }
                if (c == '\n') {
                    line++;
                }
                continue; // a blank line
            }
            token.setLength(0);
            boolean negative = false;
            if (c == '-' || c == '+') {
                negative = c == '-';
                token.append((char) c);
                c = next();
            }
            int value = 0;
            int digits = 0;
            while (c >= '0' && c <= '9') {
                if (digits < 9) {
                    value = value * 10 + (c - '0');
                }
                digits++;
                token.append((char) c);
                c = next();
            }
            while (c == ' ' || c == '\t' || c == '\r') {
                c = next();
            }
            boolean endOfField = c == ',' || c == '\n' || c == EOF;
            if (!endOfField) {
                while (c != ',' && c != '\n' && c != EOF && token.length() < 40) {
                    token.append((char) (c & 0xff));
                    c = next();
                }
            }
            int s = 0;
            if (endOfField && digits > 0 && digits < 9) {
                if (coding == SampleCoding.SPIN) {
                    s = value == 1 ? (negative ? -1 : 1) : 0;
                } else if (!negative) {
                    s = value == 1 ? 1 : value == 0 ? -1 : 0;
                }
            }
            if (col >= n) {
                throw BadInputException.at(file, place(col), "the line has more than the header's " + n + " values",
                        "give one value per header id");
            }
            if (s == 0) {
                throw BadInputException.at(file, place(col), "holds '" + Messages.excerpt(token.toString()) + "'; " + coding.rule(),
                        coding == SampleCoding.SPIN ? "write -1 or 1 (0/1 files need the binary coding)" : "write 0 or 1");
            }
            rows[base + target[col]] = (byte) s;
            col++;
            if (c != ',') {
                if (col < n) {
                    throw BadInputException.at(file, "line " + line + " (read " + current + ")", "has " + col
                            + " values; the header has " + n, "give one value per header id");
                }
                line++;
                return true;
            }
        }
    }

    private String place(int col) {
        return "line " + line + " (read " + current + "), column " + col
                + (col < headerIds.length ? " (id " + headerIds[col] + ")" : "");
    }

    @Override
    public void close() throws IOException {
        in.close();
    }
}
