package dev.cairn.viewer;

import dev.cairn.io.InputException;
import dev.cairn.io.InputFiles;
import dev.cairn.io.Messages;
import dev.cairn.io.Numbers;
import java.io.BufferedReader;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;

/**
 * Marker points for {@code render --markers FILE.csv}: a CSV with a header naming {@code x_m}, {@code y_m},
 * {@code z_m} (metres, model frame; other columns ignored). With an {@code outcome} column (as in a deployment's
 * {@code landings.csv}) only rows whose outcome is {@code rest} are markers. Every value is checked (finite, within
 * {@link Numbers#MAX_POINT_M}); at most {@link #MAX_MARKERS} markers.
 */
public final class MarkerPoints {
    /** Most markers drawn (each is a small sphere in the scene). */
    static final int MAX_MARKERS = 100_000;

    private MarkerPoints() {
    }

    /** The x, y, z triples of {@code file}; one-line errors name the file and line. */
    public static double[] read(Path file) {
        InputFiles.requireRegularFile(file, "markers file");
        String f = Messages.path(file);
        try (BufferedReader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            String header = r.readLine();
            if (header == null) {
                throw InputException.at(f, 1, "empty file (expected a header with x_m,y_m,z_m)");
            }
            List<String> cols = Arrays.asList(header.strip().split(",", -1));
            int ix = cols.indexOf("x_m");
            int iy = cols.indexOf("y_m");
            int iz = cols.indexOf("z_m");
            int io = cols.indexOf("outcome");
            if (ix < 0 || iy < 0 || iz < 0) {
                throw InputException.at(f, 1, "the header must name the columns x_m, y_m and z_m");
            }
            double[] out = new double[3 * 1024];
            int n = 0;
            long line = 1;
            for (String s = r.readLine(); s != null; s = r.readLine()) {
                line++;
                if (s.isBlank() || s.startsWith("#")) {
                    continue;
                }
                String[] p = s.split(",", -1);
                if (p.length != cols.size()) {
                    throw InputException.at(f, line, p.length + " fields, the header has " + cols.size());
                }
                if (io >= 0 && !p[io].strip().equals("rest")) {
                    continue;
                }
                if (n == MAX_MARKERS) {
                    throw InputException.at(f, line, "more than " + MAX_MARKERS + " markers");
                }
                if (3 * n + 3 > out.length) {
                    out = Arrays.copyOf(out, 2 * out.length);
                }
                int[] idx = {ix, iy, iz};
                for (int k = 0; k < 3; k++) {
                    String v = p[idx[k]].strip();
                    double d;
                    if (!Numbers.isDecimal(v)) {
                        throw InputException.at(f, line, cols.get(idx[k]) + ": '" + v + "' is not a number");
                    }
                    d = Double.parseDouble(v);
                    if (!Double.isFinite(d) || Math.abs(d) > Numbers.MAX_POINT_M) {
                        throw InputException.at(f, line, cols.get(idx[k]) + ": " + v + " is not a finite coordinate "
                            + "within " + Numbers.MAX_POINT_M + " m");
                    }
                    out[3 * n + k] = d;
                }
                n++;
            }
            return Arrays.copyOf(out, 3 * n);
        } catch (IOException e) {
            throw InputException.at(f, 0, "cannot read: " + e.getMessage(), e);
        }
    }
}
