package dev.cairn.fuzz;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Random;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Seeded mutations of input files for the reader fuzz tests: byte flips, truncations, deleted, duplicated and
 * swapped lines, hostile numbers in place of numeric tokens, control characters, and (for JSON) wrong value types,
 * missing, extra and duplicated keys and trailing content. Common practice for fuzzing, no source.
 */
final class Mutator {
    /** Numbers that have broken readers: non-finite, overflowing, underflowing, odd syntaxes, huge integers. */
    static final String[] HOSTILE_NUMBERS = {"1e400", "-1e400", "NaN", "nan", "Infinity", "-Infinity", "inf", "1e308",
        "-1e308", "1e200", "1e154", "1e-320", "4.9e-324", "0", "-0", "0.0", "0x1p3", "1f", "2d", "1e9", "2147483647",
        "-2147483648", "2147483648", "9223372036854775807", "99999999999999999999999", "-1", "1e-300", "1e100",
        "1e-150", "1.", ".5", "+3", "--1", "1e", "1,5", "0x10", "١٢٣", ""};
    /** Characters that must never reach a terminal raw. */
    static final String[] CONTROL = {"\u0000", "\u000b", "\u202e", "\u001b[31m", "\r", "\n", "\t", "\u0007", "\uFEFF",
        "\u2028"};
    private static final Pattern NUMBER = Pattern.compile("[-+]?(\\d+\\.?\\d*|\\.\\d+)([eE][-+]?\\d+)?");

    private final Random rnd;

    Mutator(long seed) {
        rnd = new Random(seed);
    }

    Random random() {
        return rnd;
    }

    <T> T pick(T[] a) {
        return a[rnd.nextInt(a.length)];
    }

    String hostileNumber() {
        if (rnd.nextInt(40) == 0) {
            return "1" + "0".repeat(20000 + rnd.nextInt(20000)); // a huge token: the error line must stay short
        }
        return pick(HOSTILE_NUMBERS);
    }

    /** One to three mutations of a text file. */
    byte[] mutateText(byte[] in, String[] hostileLines) {
        byte[] b = in;
        int n = 1 + rnd.nextInt(3);
        for (int i = 0; i < n; i++) {
            b = mutateOnce(b, hostileLines);
        }
        return b;
    }

    private byte[] mutateOnce(byte[] in, String[] hostileLines) {
        String s = new String(in, StandardCharsets.UTF_8);
        List<String> lines = new ArrayList<>(Arrays.asList(s.split("\n", -1)));
        switch (rnd.nextInt(10)) {
            case 0: { // flip a byte
                if (in.length == 0) {
                    return in;
                }
                byte[] b = in.clone();
                b[rnd.nextInt(b.length)] = (byte) rnd.nextInt(256);
                return b;
            }
            case 1: // truncate
                return Arrays.copyOf(in, in.length == 0 ? 0 : rnd.nextInt(in.length));
            case 2:
                if (!lines.isEmpty()) {
                    lines.remove(rnd.nextInt(lines.size()));
                }
                break;
            case 3:
                if (!lines.isEmpty()) {
                    int k = rnd.nextInt(lines.size());
                    lines.add(k, lines.get(k));
                }
                break;
            case 4:
                if (lines.size() > 1) {
                    int a = rnd.nextInt(lines.size());
                    int c = rnd.nextInt(lines.size());
                    String t = lines.get(a);
                    lines.set(a, lines.get(c));
                    lines.set(c, t);
                }
                break;
            case 5:
            case 6:
                return replaceNumber(s).getBytes(StandardCharsets.UTF_8);
            case 7: { // control character somewhere
                int p = s.isEmpty() ? 0 : rnd.nextInt(s.length());
                return (s.substring(0, p) + pick(CONTROL) + s.substring(p)).getBytes(StandardCharsets.UTF_8);
            }
            case 8:
                if (hostileLines.length > 0) {
                    lines.add(rnd.nextInt(lines.size() + 1), pick(hostileLines));
                }
                break;
            default: { // a random printable junk token in place of a number
                return replaceNumberWith(s, pick(new String[] {"a", "x1", "1/a/b", "\"1\"", "null", "true", "{}", "[]",
                    "1 2", "1e99999", "0x", "#"})).getBytes(StandardCharsets.UTF_8);
            }
        }
        return String.join("\n", lines).getBytes(StandardCharsets.UTF_8);
    }

    String replaceNumber(String s) {
        return replaceNumberWith(s, hostileNumber());
    }

    String replaceNumberWith(String s, String with) {
        Matcher m = NUMBER.matcher(s);
        List<int[]> spans = new ArrayList<>();
        while (m.find()) {
            spans.add(new int[] {m.start(), m.end()});
        }
        if (spans.isEmpty()) {
            return s + with;
        }
        int[] sp = spans.get(rnd.nextInt(spans.size()));
        return s.substring(0, sp[0]) + with + s.substring(sp[1]);
    }

    /** JSON-aware mutations (on the text, so duplicated keys and trailing content can be made too). */
    byte[] mutateJson(byte[] in) {
        String s = new String(in, StandardCharsets.UTF_8);
        int choice = rnd.nextInt(12);
        Matcher keys = Pattern.compile("\"([A-Za-z_0-9]+)\"\\s*:\\s*").matcher(s);
        List<int[]> kv = new ArrayList<>();
        while (keys.find()) {
            kv.add(new int[] {keys.start(), keys.end()});
        }
        if (choice < 4 || kv.isEmpty()) {
            return mutateText(in, new String[] {"}", "{", "\"x\": 1,", ",", "[", "]"});
        }
        int[] k = kv.get(rnd.nextInt(kv.size()));
        int vEnd = valueEnd(s, k[1]);
        String value = s.substring(k[1], vEnd);
        String key = s.substring(k[0], k[1]);
        switch (choice) {
            case 4: // wrong type
                return (s.substring(0, k[1]) + pick(new String[] {"\"16\"", "null", "[]", "{}", "true", "\"\"", "-1",
                    "0", "1.5", "1e400", "\"x\"", "[1]", "[\"a\",2]", "2147483648", "\"0x2a\""}) + s.substring(vEnd))
                    .getBytes(StandardCharsets.UTF_8);
            case 5: // delete the key and its value
                return (s.substring(0, k[0]) + s.substring(skipComma(s, vEnd))).getBytes(StandardCharsets.UTF_8);
            case 6: // duplicate the key with another value
                return (s.substring(0, k[0]) + key + pick(new String[] {"1", "\"a\"", "null"}) + ", " + s.substring(k[0]))
                    .getBytes(StandardCharsets.UTF_8);
            case 7: // extra unknown key
                return (s.substring(0, k[0]) + "\"zz_extra\": 1, " + s.substring(k[0])).getBytes(StandardCharsets.UTF_8);
            case 8: // trailing content
                return (s + pick(new String[] {"{}", "x", "]", " {\"a\": 1}", "\u0000"})).getBytes(StandardCharsets.UTF_8);
            case 9: // a number inside the value replaced by a hostile one
                return (s.substring(0, k[1]) + replaceNumber(value) + s.substring(vEnd)).getBytes(StandardCharsets.UTF_8);
            case 10: // a long or control-laden string value
                return (s.substring(0, k[1]) + "\"" + pick(new String[] {"a".repeat(100000), "..\\/..\\/etc\\/passwd",
                    "/etc/hostname", "x\\u0000y", "line\\nbreak", "\\u202eevil", "../outside.obj"}) + "\""
                    + s.substring(vEnd)).getBytes(StandardCharsets.UTF_8);
            default:
                return mutateText(in, new String[0]);
        }
    }

    private static int skipComma(String s, int p) {
        int q = p;
        while (q < s.length() && Character.isWhitespace(s.charAt(q))) {
            q++;
        }
        return q < s.length() && s.charAt(q) == ',' ? q + 1 : p;
    }

    /** End of the JSON value starting at {@code p} (balanced brackets, strings skipped). */
    private static int valueEnd(String s, int p) {
        int depth = 0;
        boolean str = false;
        for (int i = p; i < s.length(); i++) {
            char c = s.charAt(i);
            if (str) {
                if (c == '\\') {
                    i++;
                } else if (c == '"') {
                    str = false;
                    if (depth == 0) {
                        return i + 1;
                    }
                }
                continue;
            }
            if (c == '"') {
                str = true;
            } else if (c == '[' || c == '{') {
                depth++;
            } else if (c == ']' || c == '}') {
                if (depth == 0) {
                    return i;
                }
                depth--;
                if (depth == 0) {
                    return i + 1;
                }
            } else if (c == ',' && depth == 0) {
                return i;
            }
        }
        return s.length();
    }

    /** Byte-level mutation of a binary file (flip, truncate, extend, zero a block, overwrite header bytes). */
    byte[] mutateBinary(byte[] in) {
        byte[] b = in.clone();
        switch (rnd.nextInt(6)) {
            case 0:
                if (b.length > 0) {
                    b[rnd.nextInt(b.length)] ^= (byte) (1 << rnd.nextInt(8));
                }
                return b;
            case 1:
                return Arrays.copyOf(b, b.length == 0 ? 0 : rnd.nextInt(b.length));
            case 2:
                return Arrays.copyOf(b, b.length + 1 + rnd.nextInt(64));
            case 3: {
                int from = b.length == 0 ? 0 : rnd.nextInt(b.length);
                Arrays.fill(b, from, Math.min(b.length, from + 8 + rnd.nextInt(64)), (byte) 0);
                return b;
            }
            case 4: // header length bytes of a .npy (offsets 8, 9)
                if (b.length > 10) {
                    b[8 + rnd.nextInt(2)] = (byte) rnd.nextInt(256);
                }
                return b;
            default: { // the shape text of a .npy header
                String s = new String(b, StandardCharsets.ISO_8859_1);
                int i = s.indexOf("'shape': (");
                if (i < 0) {
                    b[rnd.nextInt(Math.max(1, b.length))] = (byte) rnd.nextInt(256);
                    return b;
                }
                int j = s.indexOf(')', i);
                String repl = pick(new String[] {"0x2a, 14", "", "-1, 14", "99999999999, 14", "2, 2, 2, 2, 2, 2, 2, 99",
                    "a", "9223372036854775807, 14", "0, 14", "1,", "3, 14"});
                String t = s.substring(0, i + 10) + repl + s.substring(j);
                return t.getBytes(StandardCharsets.ISO_8859_1);
            }
        }
    }
}
