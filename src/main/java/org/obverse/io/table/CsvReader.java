package org.obverse.io.table;

import org.obverse.io.BadInputException;
import org.obverse.io.Messages;
import org.obverse.io.TextInput;
import java.io.Closeable;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Streams a CSV file (RFC 4180: comma separated, fields may be quoted with {@code "}, a
 * doubled quote inside a quoted field is one quote, quoted fields may hold commas and line
 * breaks; CRLF or LF line ends) one record at a time, so a table of any length is read in
 * constant memory. The first record is the header. Blank lines are skipped. Every error names
 * the file and the line.
 */
public final class CsvReader implements Closeable {
    private final Path file;
    private final TextInput in;
    private final String[] header;
    private final Map<String, Integer> columns = new HashMap<>();
    private long line;
    private long recordLine;

    private CsvReader(Path file, TextInput in) throws IOException {
        this.file = file;
        this.in = in;
        String[] h = next();
        if (h == null) {
            throw BadInputException.at(file, "line 1", "the file is empty", "a CSV file starts with a header line");
        }
        if (h.length > 0 && h[0].startsWith("\uFEFF")) {
            h[0] = h[0].substring(1);
        }
        for (int i = 0; i < h.length; i++) {
            h[i] = h[i].trim();
            if (columns.putIfAbsent(h[i], i) != null) {
                throw BadInputException.at(file, "header", "column " + h[i] + " appears twice", "name each column once");
            }
        }
        this.header = h;
    }

    /**
     * Opens a file and reads its header.
     *
     * @throws BadInputException for anything but a regular file, text that is not UTF-8, an
     *                           overlong line (see {@link TextInput}) or a bad header
     */
    public static CsvReader open(Path file) throws IOException {
        TextInput in = TextInput.open(file);
        try {
            return new CsvReader(file, in);
        } catch (IOException | RuntimeException e) {
            in.close();
            throw e;
        }
    }

    /** The header's column names, in order. */
    public List<String> header() {
        return Arrays.asList(header.clone());
    }

    /** The index of a column, or −1. */
    public int column(String name) {
        return columns.getOrDefault(name, -1);
    }

    /**
     * The indices of the required columns, in the order given.
     *
     * @throws BadInputException listing every missing column
     */
    public int[] require(String what, String... names) {
        int[] idx = new int[names.length];
        List<String> missing = new ArrayList<>();
        for (int i = 0; i < names.length; i++) {
            idx[i] = column(names[i]);
            if (idx[i] < 0) {
                missing.add(names[i]);
            }
        }
        if (!missing.isEmpty()) {
            throw BadInputException.at(file, "header", "missing column" + (missing.size() > 1 ? "s " : " ")
                    + String.join(", ", missing), what + " needs the columns " + String.join(",", names)
                    + " (spec/results.md)");
        }
        return idx;
    }

    /** The file being read. */
    public Path file() {
        return file;
    }

    /** The line on which the last record returned started. */
    public long line() {
        return recordLine;
    }

    /**
     * The next record of exactly the header's width.
     *
     * @return the fields, or null at the end of the file
     * @throws BadInputException for a record of another width or an unterminated quote
     */
    public String[] record() throws IOException {
        String[] r = next();
        if (r != null && r.length != header.length) {
            throw BadInputException.at(file, "line " + recordLine, "has " + r.length + " fields but the header has "
                    + header.length, "give every row one field per column (quote fields that hold commas)");
        }
        return r;
    }

    /** A parse error at the current record naming the column and the value. */
    public BadInputException error(int column, String value, String problem, String remedy) {
        return BadInputException.at(file, "line " + recordLine + ", column " + header[column],
                "value '" + Messages.excerpt(value) + "' " + problem, remedy);
    }

    private String[] next() throws IOException {
        while (true) {
            String text = in.readLine();
            if (text == null) {
                return null;
            }
            line++;
            recordLine = line;
            if (text.isBlank()) {
                continue;
            }
            List<String> fields = new ArrayList<>();
            StringBuilder field = new StringBuilder();
            boolean quoted = false;
            int i = 0;
            while (true) {
                if (i == text.length()) {
                    if (quoted) {
                        String more = in.readLine();
                        if (more == null) {
                            throw BadInputException.at(file, "line " + recordLine, "a quoted field is not closed",
                                    "close it with a double quote");
                        }
                        line++;
                        if (field.length() + (long) more.length() > TextInput.MAX_LINE) {
                            throw BadInputException.at(file, "line " + recordLine, "a quoted field runs over more than "
                                    + TextInput.MAX_LINE + " characters", "close the quoted field with a double quote");
                        }
                        field.append('\n');
                        text = more;
                        i = 0;
                        continue;
                    }
                    fields.add(field.toString());
                    break;
                }
                char ch = text.charAt(i++);
                if (quoted) {
                    if (ch == '"') {
                        if (i < text.length() && text.charAt(i) == '"') {
                            field.append('"');
                            i++;
                        } else {
                            quoted = false;
                        }
                    } else {
                        field.append(ch);
                    }
                } else if (ch == '"' && field.length() == 0) {
                    quoted = true;
                } else if (ch == ',') {
                    fields.add(field.toString());
                    field.setLength(0);
                } else {
                    field.append(ch);
                }
            }
            return fields.toArray(new String[0]);
        }
    }

    @Override
    public void close() throws IOException {
        in.close();
    }

    /** Quotes a field for CSV output when it needs it. */
    public static String quote(String field) {
        if (field.isEmpty() || field.chars().noneMatch(c -> c == ',' || c == '"' || c == '\n' || c == '\r')
                && field.strip().equals(field)) {
            return field;
        }
        return '"' + field.replace("\"", "\"\"") + '"';
    }
}
