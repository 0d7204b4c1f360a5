package dev.cairn.io;

/**
 * The one formatter of user-facing message text: every error and warning line is a single line of at most
 * {@link #MAX_LINE} characters, with control and direction-changing characters escaped ({@code \n}, {@code \x00},
 * {@code \\u202e}) and quoted values shortened. Used by {@link InputException} and by the command line's standard
 * error writer, so no path of the program can put a raw control character or a megabyte token on the terminal.
 */
public final class Messages {
    /** Longest line the command line prints on standard error, characters. */
    public static final int MAX_LINE = 300;
    /** Longest quoted value inside a message, characters (before escaping). */
    public static final int MAX_QUOTED = 40;
    /** Longest file path inside a message, characters. */
    public static final int MAX_PATH = 120;

    private Messages() {
    }

    /** True for characters that must not reach a terminal raw: C0/C1 controls, DEL, bidi and line separators. */
    public static boolean isUnsafe(int c) {
        return c < 0x20 || c == 0x7f || (c >= 0x80 && c < 0xa0) || (c >= 0x200b && c <= 0x200f)
            || (c >= 0x2028 && c <= 0x202e) || (c >= 0x2066 && c <= 0x2069) || c == 0xfeff || c == 0xfffe
            || c == 0xffff || (c >= 0xd800 && c <= 0xdfff);
    }

    /** {@code s} with every unsafe character escaped ({@code \n}, {@code \t}, {@code \r}, else {@code \\xNN}, {@code \\uNNNN}). */
    public static String escape(String s) {
        if (s == null) {
            return "null";
        }
        StringBuilder b = null;
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            if (!isUnsafe(c)) {
                if (b != null) {
                    b.append(c);
                }
                continue;
            }
            if (Character.isHighSurrogate(c) && i + 1 < s.length() && Character.isLowSurrogate(s.charAt(i + 1))) {
                if (b != null) {
                    b.append(c).append(s.charAt(i + 1));
                }
                i++;
                continue; // a proper pair (e.g. an emoji) is printable
            }
            if (b == null) {
                b = new StringBuilder(s.length() + 16).append(s, 0, i);
            }
            switch (c) {
                case '\n' -> b.append("\\n");
                case '\r' -> b.append("\\r");
                case '\t' -> b.append("\\t");
                default -> b.append(c < 0x100 ? String.format("\\x%02x", (int) c) : String.format("\\u%04x", (int) c));
            }
        }
        return b == null ? s : b.toString();
    }

    /** A value for a message: escaped, cut to {@link #MAX_QUOTED} characters with its full length, in quotes. */
    public static String quote(String value) {
        if (value == null) {
            return "null";
        }
        String v = value.length() > MAX_QUOTED
            ? value.substring(0, MAX_QUOTED) + "... (" + value.length() + " characters)" : value;
        return "'" + escape(v) + "'";
    }

    /** A file path for a message: escaped, long paths shortened in the middle to {@link #MAX_PATH} characters. */
    public static String path(Object path) {
        String p = escape(String.valueOf(path));
        return shorten(p, MAX_PATH);
    }

    /** One line: escaped, then cut in the middle to at most {@code max} characters. */
    public static String line(String s, int max) {
        return shorten(escape(s), max);
    }

    /** One line of at most {@link #MAX_LINE} characters. */
    public static String line(String s) {
        return line(s, MAX_LINE);
    }

    private static String shorten(String s, int max) {
        if (s.length() <= max) {
            return s;
        }
        String mid = " ... ";
        int head = (max - mid.length()) * 2 / 3;
        int tail = max - mid.length() - head;
        return s.substring(0, head) + mid + s.substring(s.length() - tail);
    }
}
