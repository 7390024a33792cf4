package org.obverse.io;

import java.io.Closeable;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CoderResult;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;

/**
 * Reads a text file as strict UTF-8, line by line: a byte sequence that is not UTF-8 is bad
 * input naming the file, the line and the byte offset (never a bare decoder exception), and a
 * line longer than {@link #MAX_LINE} characters is refused rather than read into memory. Every
 * CSV and JSON reader of obverse reads through this class. Not thread-safe; close it.
 */
public final class TextInput implements Closeable {
    /** The longest line read, in characters (a CSV record, quoted line breaks included, or a JSON line). */
    public static final int MAX_LINE = 1 << 20;
    /** The largest JSON file read, in bytes. */
    public static final long MAX_JSON_BYTES = 256L << 20;

    private final Path file;
    private final InputStream in;
    private final CharsetDecoder decoder = StandardCharsets.UTF_8.newDecoder()
            .onMalformedInput(CodingErrorAction.REPORT)
            .onUnmappableCharacter(CodingErrorAction.REPORT);
    private final ByteBuffer bytes = ByteBuffer.allocate(1 << 16);
    private final CharBuffer chars = CharBuffer.allocate(1 << 16);
    private boolean eof;
    private boolean flushed;
    private long bytesConsumed;
    // Line breaks among the characters decoded so far: the line of the next byte is this + 1.
    private long decodedBreaks;
    private long line;
    // Characters of the current buffer already scanned for line breaks.
    private int counted;

    private TextInput(Path file, InputStream in) {
        this.file = file;
        this.in = in;
        bytes.limit(0);
        chars.limit(0);
    }

    /** Opens a regular file for strict reading. */
    public static TextInput open(Path file) throws IOException {
        return new TextInput(file, InputFiles.openStream(file));
    }

    /**
     * Reads a whole file of at most maxBytes as strict UTF-8 (a leading byte-order mark dropped).
     *
     * @throws BadInputException for a larger file, malformed UTF-8 or anything but a regular file
     */
    public static String readAll(Path file, long maxBytes) throws IOException {
        long size = InputFiles.requireRegular(file);
        if (size > maxBytes) {
            throw tooLarge(file, size, maxBytes);
        }
        try (TextInput t = new TextInput(file, java.nio.file.Files.newInputStream(file))) {
            StringBuilder s = new StringBuilder((int) Math.min(size, Integer.MAX_VALUE - 8));
            long read = 0;
            while (t.fill()) {
                read += t.chars.remaining();
                if (read > maxBytes) {
                    throw tooLarge(file, read, maxBytes); // the file grew while being read
                }
                s.append(t.chars);
                t.chars.position(t.chars.limit());
            }
            if (s.length() > 0 && s.charAt(0) == '\uFEFF') {
                s.deleteCharAt(0);
            }
            return s.toString();
        }
    }

    private static BadInputException tooLarge(Path file, long size, long max) {
        return BadInputException.at(file, "", "is " + size + " bytes long, more than the " + max
                + " this reader accepts", "give the file this program wrote, or split it");
    }

    /** The file being read. */
    public Path file() {
        return file;
    }

    /** The number of the last line returned (1 for the first). */
    public long line() {
        return line;
    }

    /**
     * The next line without its end (LF, CRLF or a lone CR).
     *
     * @return the line, or null at the end of the file
     * @throws BadInputException for malformed UTF-8 or a line longer than {@link #MAX_LINE}
     */
    public String readLine() throws IOException {
        StringBuilder s = null;
        while (true) {
            if (!chars.hasRemaining() && !fill()) {
                if (s == null) {
                    return null;
                }
                line++;
                return s.toString();
            }
            int start = chars.position();
            int end = chars.limit();
            int i = start;
            while (i < end) {
                char c = chars.get(i);
                if (c == '\n' || c == '\r') {
                    break;
                }
                i++;
            }
            int len = i - start;
            if ((s == null ? 0 : s.length()) + (long) len > MAX_LINE) {
                throw BadInputException.at(file, "line " + (line + 1), "is longer than " + MAX_LINE + " characters",
                        "this is not a table this program wrote; check the file");
            }
            if (s == null) {
                s = new StringBuilder(Math.max(16, len));
            }
            s.append(chars.array(), chars.arrayOffset() + start, len);
            chars.position(i);
            if (i < end) {
                char c = chars.get();
                if (c == '\r') {
                    if (!chars.hasRemaining()) {
                        fill();
                    }
                    if (chars.hasRemaining() && chars.get(chars.position()) == '\n') {
                        chars.get();
                    }
                }
                line++;
                return s.toString();
            }
        }
    }

    /** Decodes more characters into {@code chars}; false at the end of the file. */
    private boolean fill() throws IOException {
        if (chars.hasRemaining()) {
            return true;
        }
        chars.clear();
        counted = 0;
        try {
            while (chars.position() == 0) {
                if (flushed) {
                    return false;
                }
                if (!eof && bytes.remaining() < 4) {
                    bytes.compact();
                    int n = in.read(bytes.array(), bytes.position(), bytes.remaining());
                    if (n < 0) {
                        eof = true;
                    } else {
                        bytes.position(bytes.position() + n);
                    }
                    bytes.flip();
                }
                int before = bytes.position();
                CoderResult r = decoder.decode(bytes, chars, eof);
                bytesConsumed += bytes.position() - before;
                countBreaks();
                if (r.isError()) {
                    throw BadInputException.at(file, "line " + (decodedBreaks + 1) + ", byte offset " + bytesConsumed,
                            "is not UTF-8 text (" + r.length() + " malformed byte" + (r.length() > 1 ? "s" : "") + ")",
                            "save the file as UTF-8");
                }
                if (eof && !bytes.hasRemaining()) {
                    decoder.flush(chars);
                    flushed = true;
                }
            }
            return true;
        } finally {
            chars.flip();
        }
    }

    // Counts line breaks in chars[counted, position) (called before flip).
    private void countBreaks() {
        int end = chars.position();
        for (int i = counted; i < end; i++) {
            if (chars.get(i) == '\n') {
                decodedBreaks++;
            }
        }
        counted = end;
    }

    @Override
    public void close() throws IOException {
        in.close();
    }
}
