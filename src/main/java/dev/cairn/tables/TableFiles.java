package dev.cairn.tables;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.type.TypeReference;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.cairn.io.AtomicFiles;
import dev.cairn.io.InputException;
import dev.cairn.io.Messages;
import dev.cairn.io.StrictJson;
import java.io.BufferedInputStream;
import java.io.BufferedReader;
import java.io.DataInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.DigestOutputStream;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;

/**
 * Table files: the data file (NumPy {@code .npy} or CSV) and its JSON sidecar {@code DATA.json} (e.g.
 * {@code table.npy.json}). The data file holds only the numbers (no time stamps), so the same table always gives
 * the same bytes; times, model identity, units, conventions and the accuracy report live in the sidecar.
 *
 * <p>CSV: a comment line starting with {@code #} (caution and conventions), one header line of column names, then
 * one row per node in node order, numbers written with
 * {@link Double#toString(double)} (shortest decimal that reads back to the same double; {@code NaN} for blanks).
 */
public final class TableFiles {
    /** Format words. */
    public static final String NPY = "npy";
    public static final String CSV = "csv";

    private static final ObjectMapper MAPPER = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    private TableFiles() {
    }

    /** Receives blocks of rows in node order: {@code rows} holds {@code count} rows (it may be reused after return). */
    @FunctionalInterface
    public interface RowSink {
        void accept(double[] rows, int count) throws IOException;
    }

    /** Delivers all rows of a table, in node order, to a sink. */
    @FunctionalInterface
    public interface RowSource {
        void forEach(RowSink sink) throws IOException;
    }

    /** The sidecar path of a data file: {@code DATA.json}. */
    public static Path sidecarPath(Path data) {
        return data.resolveSibling(data.getFileName() + ".json");
    }

    /** Format word from a file name: {@code .csv} gives csv, anything else npy. */
    public static String formatOf(Path file) {
        return file.getFileName().toString().toLowerCase(java.util.Locale.ROOT).endsWith(".csv") ? CSV : NPY;
    }

    /**
     * Writes the data file atomically.
     *
     * @param shape   data shape (grid shape plus the column axis); its product must match the rows delivered
     * @param columns column names (CSV header)
     * @return SHA-256 of the written bytes, hex
     */
    public static String writeData(Path out, String format, long[] shape, List<String> columns, RowSource source) {
        int cols = columns.size();
        String[] sha = new String[1];
        AtomicFiles.write(out, os -> {
            MessageDigest md = sha256();
            OutputStream o = new DigestOutputStream(os, md);
            long[] rowsWritten = {0};
            if (NPY.equals(format)) {
                o.write(Npy.header(shape));
                source.forEach((rows, count) -> {
                    Npy.writeDoubles(o, rows, 0, count * cols);
                    rowsWritten[0] += count;
                });
            } else if (CSV.equals(format)) {
                o.write(("# " + TableBuilder.CAUTION + " " + TableBuilder.CONVENTIONS + ".\n" + String.join(",", columns)
                    + "\n").getBytes(StandardCharsets.UTF_8));
                StringBuilder sb = new StringBuilder(1 << 16);
                source.forEach((rows, count) -> {
                    for (int r = 0; r < count; r++) {
                        for (int c = 0; c < cols; c++) {
                            if (c > 0) {
                                sb.append(',');
                            }
                            sb.append(rows[r * cols + c]);
                        }
                        sb.append('\n');
                        if (sb.length() > 1 << 15) {
                            o.write(sb.toString().getBytes(StandardCharsets.US_ASCII));
                            sb.setLength(0);
                        }
                    }
                    rowsWritten[0] += count;
                });
                o.write(sb.toString().getBytes(StandardCharsets.US_ASCII));
            } else {
                throw new InputException("--format: unknown format '" + format + "' (use npy or csv)");
            }
            long expected = 1;
            for (int i = 0; i + 1 < shape.length; i++) {
                expected *= shape[i];
            }
            if (rowsWritten[0] != expected) {
                throw new IOException("internal: " + rowsWritten[0] + " rows delivered for a table of " + expected);
            }
            o.flush();
            sha[0] = HexFormat.of().formatHex(md.digest());
        });
        return sha[0];
    }

    /** Writes the sidecar of {@code data} atomically. */
    public static void writeSidecar(Path data, Map<String, Object> meta) {
        AtomicFiles.writeString(sidecarPath(data), toJson(meta));
    }

    /** Pretty JSON of a map (key order kept), ending with a newline. */
    public static String toJson(Object value) {
        try {
            return MAPPER.writeValueAsString(value) + "\n";
        } catch (JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    /**
     * Reads a JSON object strictly ({@link StrictJson}: no duplicate keys, no trailing content, no null top level);
     * errors name the file and line. Typed access to its keys goes through {@link StrictJson.Fields}.
     */
    public static Map<String, Object> readJson(Path file) {
        return StrictJson.readObject(file, "bad JSON");
    }

    /** Largest table file this program reads back into memory, elements (values). */
    public static final long MAX_READ_VALUES = Integer.MAX_VALUE - 8;

    /** SHA-256 of a file, hex. */
    public static String sha256(Path file) {
        try (InputStream in = Files.newInputStream(file)) {
            MessageDigest md = sha256();
            byte[] buf = new byte[1 << 16];
            int n;
            while ((n = in.read(buf)) > 0) {
                md.update(buf, 0, n);
            }
            return HexFormat.of().formatHex(md.digest());
        } catch (IOException e) {
            throw new InputException(file + ": cannot read: " + e.getMessage(), e);
        }
    }

    /** SHA-256 of a string's UTF-8 bytes, hex. */
    public static String sha256(String text) {
        return HexFormat.of().formatHex(sha256().digest(text.getBytes(StandardCharsets.UTF_8)));
    }

    private static MessageDigest sha256() {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
    }

    /** A source reading the rows of an {@code .npy} file of shape {@code (..., cols)}. */
    public static RowSource npySource(Path file, int cols) {
        return npySource(file, cols, -1);
    }

    /**
     * As {@link #npySource(Path, int)}, also requiring {@code expectedRows} rows (when not negative); the header is
     * checked against the file size before any row is read.
     */
    public static RowSource npySource(Path file, int cols, long expectedRows) {
        return sink -> {
            try (DataInputStream in = new DataInputStream(new BufferedInputStream(Files.newInputStream(file), 1 << 16))) {
                long[] shape = Npy.readHeader(in, file.toString(), Files.size(file));
                long rows = 1;
                for (int i = 0; i + 1 < shape.length; i++) {
                    rows *= shape[i];
                }
                if (shape.length < 2 || shape[shape.length - 1] != cols) {
                    throw new InputException(Messages.path(file) + ": shape " + java.util.Arrays.toString(shape)
                        + " does not have " + cols + " columns");
                }
                if (expectedRows >= 0 && rows != expectedRows) {
                    throw new InputException(Messages.path(file) + ": " + rows + " rows, its sidecar says "
                        + expectedRows);
                }
                int block = 4096;
                double[] buf = new double[block * cols];
                for (long r = 0; r < rows; r += block) {
                    int m = (int) Math.min(block, rows - r);
                    Npy.readDoubles(in, buf, 0, m * cols);
                    sink.accept(buf, m);
                }
            }
        };
    }

    /**
     * Reads a table: the data file (format from its sidecar's {@code data_format}) and its sidecar.
     *
     * @throws InputException when a file is missing or malformed (naming the file and line)
     */
    public static Table read(Path data) {
        Path side = sidecarPath(data);
        if (!Files.isRegularFile(data)) {
            throw new InputException(data + ": no such file");
        }
        if (!Files.isRegularFile(side)) {
            throw new InputException(side + ": no such file (the metadata sidecar of " + data.getFileName() + ")");
        }
        Map<String, Object> meta = readJson(side);
        StrictJson.Fields f = new StrictJson.Fields(meta, side, "");
        List<String> columns = f.strings("columns", 1, 1000);
        long[] shape = f.integers("shape", 2, 4, 1, Integer.MAX_VALUE);
        int cols = columns.size();
        long rowsL = rowCount(shape, side);
        if (shape[shape.length - 1] != cols || (double) rowsL * cols > MAX_READ_VALUES) {
            throw new InputException(side + ": shape " + java.util.Arrays.toString(shape) + " does not fit " + cols
                + " columns in memory");
        }
        dev.cairn.io.MemoryBudget.require(8.0 * rowsL * cols, Messages.path(data) + ": reading the table");
        String format = f.has("data_format") ? f.string("data_format") : formatOf(data);
        if (!NPY.equals(format) && !CSV.equals(format)) {
            throw new InputException(side + ": key 'data_format' must be \"npy\" or \"csv\", got "
                + Messages.quote(format));
        }
        if (f.has("data_sha256") && !f.string("data_sha256").equalsIgnoreCase(sha256(data))) {
            throw new InputException(Messages.path(data) + ": data does not match the SHA-256 in its sidecar "
                + "(damaged or changed)");
        }
        int rows = (int) rowsL;
        double[] values = new double[rows * cols];
        try {
            if (NPY.equals(format)) {
                try (DataInputStream in = new DataInputStream(new BufferedInputStream(Files.newInputStream(data), 1 << 16))) {
                    long[] s = Npy.readHeader(in, data.toString(), Files.size(data));
                    if (!java.util.Arrays.equals(s, shape)) {
                        throw new InputException(data + ": shape " + java.util.Arrays.toString(s)
                            + " differs from the sidecar's " + java.util.Arrays.toString(shape));
                    }
                    Npy.readDoubles(in, values, 0, values.length);
                } catch (java.io.EOFException e) {
                    throw new InputException(data + ": truncated data (fewer values than the shape says)", e);
                }
            } else {
                readCsv(data, columns, values, rows);
            }
        } catch (IOException e) {
            throw new InputException(data + ": cannot read: " + e.getMessage(), e);
        }
        Grid grid = gridFromJson(meta, side, values, rows, cols);
        return new Table(grid, columns, values, meta);
    }

    /** Product of all but the last entry of a shape, refusing overflow. */
    static long rowCount(long[] shape, Object where) {
        long rows = 1;
        for (int i = 0; i + 1 < shape.length; i++) {
            if (shape[i] < 1 || rows > Integer.MAX_VALUE / shape[i]) {
                throw new InputException(Messages.path(where) + ": shape " + java.util.Arrays.toString(shape)
                    + " is not a table this program can hold");
            }
            rows *= shape[i];
        }
        return rows;
    }

    private static void readCsv(Path data, List<String> columns, double[] values, int rows) throws IOException {
        int cols = columns.size();
        try (BufferedReader r = Files.newBufferedReader(data, StandardCharsets.UTF_8)) {
            String header = r.readLine();
            long lineNo = 1;
            while (header != null && header.startsWith("#")) {
                header = r.readLine();
                lineNo++;
            }
            if (header == null || !header.equals(String.join(",", columns))) {
                throw InputException.at(data.toString(), lineNo, "header does not match the sidecar's columns");
            }
            int row = 0;
            String line;
            while ((line = r.readLine()) != null) {
                lineNo++;
                if (line.isEmpty()) {
                    continue;
                }
                if (row >= rows) {
                    throw InputException.at(data.toString(), lineNo, "more rows than the sidecar's shape");
                }
                String[] p = line.split(",", -1);
                if (p.length != cols) {
                    throw InputException.at(data.toString(), lineNo, p.length + " fields, expected " + cols);
                }
                for (int c = 0; c < cols; c++) {
                    if (p[c].equals("NaN")) {
                        values[row * cols + c] = Double.NaN; // blank (excluded interior) node
                    } else if (dev.cairn.io.Numbers.isDecimal(p[c])) {
                        values[row * cols + c] = Double.parseDouble(p[c]);
                    } else {
                        throw InputException.at(data.toString(), lineNo, Messages.quote(p[c]) + " is not a number");
                    }
                }
                row++;
            }
            if (row != rows) {
                throw new InputException(data + ": " + row + " rows, the sidecar's shape says " + rows);
            }
        }
    }

    static Grid gridFromJson(Map<String, Object> meta, Path side, double[] values, int rows, int cols) {
        StrictJson.Fields g = new StrictJson.Fields(meta, side, "").object("grid");
        String kind = g.string("kind");
        double far = dev.cairn.io.Numbers.MAX_POINT_M;
        Grid grid;
        switch (kind) {
            case "box": {
                long[] n = g.integers("nodes", 3, 3, 2, Integer.MAX_VALUE);
                grid = new BoxGrid(g.numbers("origin_m", 3, 3, -far, far), g.numbers("spacing_m", 3, 3, 0, far),
                    new int[] {(int) n[0], (int) n[1], (int) n[2]});
                break;
            }
            case "sphere":
                grid = new SphereGrid(g.numbers("centre_m", 3, 3, -far, far), g.numbers("radii_m", 1, 1_000_000, 0,
                    far), g.number("lat_step_deg", 0, 180), g.number("lon_step_deg", 0, 360));
                break;
            case "points": {
                if (cols < 3) {
                    throw new InputException(side + ": a points table needs its x, y, z columns");
                }
                double[] xyz = new double[3 * rows];
                for (int i = 0; i < rows; i++) {
                    System.arraycopy(values, i * cols, xyz, 3 * i, 3);
                }
                grid = new PointGrid(xyz, g.optString("source"), g.optString("source_sha256"));
                break;
            }
            default:
                throw new InputException(side + ": unknown grid kind " + Messages.quote(kind));
        }
        if (grid.nodeCount() != rows) {
            throw new InputException(side + ": grid has " + grid.nodeCount() + " nodes but the data has " + rows
                + " rows");
        }
        return grid;
    }

    /** Deletes a file if present (for clean-up of our own outputs). */
    static void deleteQuietly(Path p) {
        try {
            Files.deleteIfExists(p);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
