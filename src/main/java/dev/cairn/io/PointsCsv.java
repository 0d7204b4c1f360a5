package dev.cairn.io;

import java.io.BufferedReader;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;

/**
 * Reads field points from CSV: one point per line {@code x,y,z} in metres, model frame. Blank lines and lines
 * starting with {@code #} are skipped, and so is a first non-comment line without any numeric field (a header).
 * Extra columns are refused: a malformed row is an {@link InputException} naming the file and line.
 */
public final class PointsCsv {
    private PointsCsv() {
    }

    /** Returns the points as {@code 3n} doubles, metres. */
    public static double[] read(Path file) {
        InputFiles.requireRegularFile(file, "points file");
        RunInputs.register(file);
        double[] xyz = new double[3 * 256];
        int n = 0;
        boolean first = true;
        long lineNo = 0;
        try (BufferedReader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            String line;
            while ((line = r.readLine()) != null) {
                lineNo++;
                if (lineNo == 1 && line.startsWith("\uFEFF")) {
                    line = line.substring(1); // UTF-8 byte-order mark
                }
                String t = line.strip();
                if (t.isEmpty() || t.startsWith("#")) {
                    continue;
                }
                String[] parts = t.split(",", -1);
                // A header has no numeric field; a first row with some numeric fields is data (and may be malformed).
                boolean header = first && java.util.Arrays.stream(parts).noneMatch(f -> looksNumeric(f.strip()));
                first = false;
                if (header) {
                    continue;
                }
                if (parts.length != 3) {
                    throw InputException.at(file.toString(), lineNo, "row " + lineNo + " has " + parts.length
                        + " field(s), expected x,y,z");
                }
                if (3 * n + 3 > xyz.length) {
                    xyz = Arrays.copyOf(xyz, xyz.length * 2);
                }
                for (int k = 0; k < 3; k++) {
                    String p = parts[k].strip();
                    double v = Numbers.isDecimal(p) ? Double.parseDouble(p) : Double.NaN;
                    if (!Double.isFinite(v)) {
                        throw InputException.at(file.toString(), lineNo, "row " + lineNo + ": " + Messages.quote(p)
                            + " is not a finite number");
                    }
                    if (Math.abs(v) > Numbers.MAX_POINT_M) {
                        throw InputException.at(file.toString(), lineNo, "row " + lineNo + ": " + Messages.quote(p)
                            + " m is beyond the " + Numbers.MAX_POINT_M + " m this program accepts for field points");
                    }
                    xyz[3 * n + k] = v;
                }
                n++;
            }
        } catch (IOException e) {
            throw new InputException(file + ": cannot read: " + e.getMessage(), e);
        }
        if (n == 0) {
            throw new InputException(Messages.path(file) + ": no points found");
        }
        return Arrays.copyOf(xyz, 3 * n);
    }

    private static boolean looksNumeric(String s) {
        if (s.isEmpty()) {
            return false;
        }
        char c = s.charAt(0);
        return (c >= '0' && c <= '9') || c == '-' || c == '+' || c == '.';
    }
}
