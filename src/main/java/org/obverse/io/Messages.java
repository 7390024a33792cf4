package org.obverse.io;

/**
 * Makes text safe to print as one line of an error message: control characters (line breaks,
 * terminal escapes, NUL …) and other invisible code points are written as {@code \n},
 * {@code \xNN} or {@code \}{@code uNNNN}, and the result is cut to a bounded length. Every
 * {@link BadInputException} message goes through {@link #oneLine}; values quoted from a file
 * go through {@link #excerpt}, so a message never echoes more than a short, escaped piece of
 * any input.
 */
public final class Messages {
    /** The longest message printed, in characters (a long path still fits). */
    public static final int MAX_MESSAGE = 600;
    /** The longest piece of a file's content quoted in a message, in characters before escaping. */
    public static final int MAX_EXCERPT = 40;

    private Messages() {
    }

    /** The text on one line, control characters escaped, cut to at most max characters (with "…"). */
    public static String oneLine(String text, int max) {
        if (text == null) {
            return "";
        }
        StringBuilder s = new StringBuilder(Math.min(text.length(), max) + 16);
        for (int i = 0; i < text.length() && s.length() <= max; ) {
            int cp = text.codePointAt(i);
            i += Character.charCount(cp);
            escape(s, cp);
        }
        if (s.length() > max) {
            s.setLength(Math.max(0, max - 1));
            s.append('…');
        }
        return s.toString();
    }

    /** A short escaped excerpt of a value read from a file (at most {@link #MAX_EXCERPT} characters of it). */
    public static String excerpt(String value) {
        if (value == null) {
            return "";
        }
        int cut = value.length() > MAX_EXCERPT ? value.offsetByCodePoints(0,
                Math.min(MAX_EXCERPT, value.codePointCount(0, value.length()))) : value.length();
        StringBuilder s = new StringBuilder();
        for (int i = 0; i < cut; ) {
            int cp = value.codePointAt(i);
            i += Character.charCount(cp);
            escape(s, cp);
        }
        if (cut < value.length()) {
            s.append('…');
        }
        return s.toString();
    }

    private static void escape(StringBuilder s, int cp) {
        switch (cp) {
            case '\n':
                s.append("\\n");
                return;
            case '\r':
                s.append("\\r");
                return;
            case '\t':
                s.append("\\t");
                return;
            default:
                break;
        }
        int type = Character.getType(cp);
        if (cp < 0x20 || cp == 0x7f) {
            s.append(String.format("\\x%02x", cp));
        } else if (type == Character.CONTROL || type == Character.FORMAT || type == Character.LINE_SEPARATOR
                || type == Character.PARAGRAPH_SEPARATOR || type == Character.SURROGATE
                || type == Character.UNASSIGNED || type == Character.PRIVATE_USE) {
            s.append(cp <= 0xffff ? String.format("\\u%04x", cp) : String.format("\\U%08x", cp));
        } else {
            s.appendCodePoint(cp);
        }
    }
}
