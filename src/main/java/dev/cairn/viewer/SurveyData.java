package dev.cairn.viewer;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.cairn.io.InputException;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;

/**
 * A survey directory as the survey command writes it: {@code facets.csv} (one row per facet in OBJ order, columns
 * looked up by name) and {@code summary.json} (keys {@code model_sha256}, {@code facets}, {@code zones}, ...).
 * Values are SI as written by the survey (potential U &gt; 0, acceleration = grad U, model frame).
 *
 * <p>{@link #read(Path, Path, int)} refuses a survey that belongs to another model: the facet count of either file
 * or the SHA-256 of the OBJ bytes differs.
 */
public final class SurveyData {
    /** Columns the viewer needs; others are kept too and may be looked up by name. */
    public static final List<String> REQUIRED = List.of("facet", "cx_m", "cy_m", "cz_m", "lat_deg", "lon_deg",
        "slope_deg", "g_eff_m_s2", "potential_eff_m2_s2", "dynamic_height_m", "lift_off", "escape_speed_m_s", "zone");

    private static final ObjectMapper JSON = dev.cairn.io.StrictJson.MAPPER;
    /** Most columns a facets.csv may have (we write about twenty). */
    public static final int MAX_COLUMNS = 256;

    private final Path dir;
    private final int facets;
    private final Map<String, double[]> columns;
    private final String modelSha256;
    private final List<Zone> zones;
    private final List<Zone> sites;
    private final List<String> parameterLines;

    /**
     * A ranked landing zone or site: its rank (1 = best), the facets that belong to it, the mean of their facet
     * centroids (metres, model frame) from the {@code cx_m, cy_m, cz_m} columns, and its aim facet and aim point (the
     * aim facet's centroid, on the surface; labels stand there, since the mean centroid of a curved footprint can lie
     * inside the body). The aim facet is the one {@code summary.json} names ({@code sites[].aim_facet},
     * {@code zones[].best_aim_facet}); without it, the member facet whose centroid is nearest the mean centroid.
     */
    public record Zone(int rank, int[] facets, double[] centroid, int aimFacet, double[] aim) {
    }

    private SurveyData(Path dir, int facets, Map<String, double[]> columns, String modelSha256, List<Zone> zones,
                       JsonNode summary) {
        this.dir = dir;
        this.facets = facets;
        this.columns = columns;
        this.modelSha256 = modelSha256;
        List<Zone> siteList = columns.containsKey("site") && columns.containsKey("cx_m")
            ? zonesOf(columns.get("site"), columns, facets) : List.of();
        Path file = dir == null ? Path.of("summary.json") : dir.resolve("summary.json");
        this.zones = withAims(zones, aimFacets(summary, "zones", "best_aim_facet", facets, file), columns);
        this.sites = withAims(siteList, aimFacets(summary, "sites", "aim_facet", facets, file), columns);
        this.parameterLines = SurveyInfo.lines(summary);
    }

    /** Aim facets by rank from an array of objects of summary.json ({@code rank} and {@code key}); checked. */
    private static Map<Integer, Integer> aimFacets(JsonNode summary, String array, String key, int n, Path file) {
        Map<Integer, Integer> out = new HashMap<>();
        JsonNode a = summary == null ? null : summary.get(array);
        if (a == null || !a.isArray()) {
            return out;
        }
        for (JsonNode z : a) {
            JsonNode r = z.get("rank");
            JsonNode f = z.get(key);
            if (r == null || f == null || f.isNull()) {
                continue;
            }
            if (!r.canConvertToInt() || !r.isIntegralNumber() || !f.isIntegralNumber() || !f.canConvertToInt()
                || f.asInt() < 0 || f.asInt() >= n) {
                throw new InputException(file + ": " + array + "[]." + key + " " + f + " (rank " + r
                    + ") is not a facet index from 0 to " + (n - 1));
            }
            out.put(r.asInt(), f.asInt());
        }
        return out;
    }

    /** The zones with their aim facets: from summary.json when named there, else the member nearest the centroid. */
    private static List<Zone> withAims(List<Zone> list, Map<Integer, Integer> named, Map<String, double[]> cols) {
        double[] cx = cols.get("cx_m");
        double[] cy = cols.get("cy_m");
        double[] cz = cols.get("cz_m");
        if (cx == null || cy == null || cz == null) {
            return list;
        }
        List<Zone> out = new ArrayList<>();
        for (Zone z : list) {
            int aim = named.getOrDefault(z.rank(), -1);
            if (aim < 0) {
                double best = Double.POSITIVE_INFINITY;
                for (int f : z.facets()) {
                    double dx = cx[f] - z.centroid()[0];
                    double dy = cy[f] - z.centroid()[1];
                    double dz = cz[f] - z.centroid()[2];
                    double d = dx * dx + dy * dy + dz * dz;
                    if (d < best) {
                        best = d;
                        aim = f;
                    }
                }
            }
            out.add(new Zone(z.rank(), z.facets(), z.centroid(), aim, new double[] {cx[aim], cy[aim], cz[aim]}));
        }
        return List.copyOf(out);
    }

    /**
     * Reads and checks a survey directory against a model.
     *
     * @param dir         the survey directory
     * @param modelFile   the OBJ file the viewer shows (its bytes are hashed)
     * @param modelFacets facet count of the loaded model
     * @throws InputException (one line) on a missing or malformed file or a survey of another model
     */
    public static SurveyData read(Path dir, Path modelFile, int modelFacets) {
        Path summaryFile = dir.resolve("summary.json");
        Path csv = dir.resolve("facets.csv");
        if (!Files.isDirectory(dir)) {
            throw new InputException(dir + ": no such survey directory");
        }
        JsonNode summary = readSummary(summaryFile);
        String sha = text(summary, "model_sha256", summaryFile);
        JsonNode nf = summary.get("facets");
        if (nf == null || !nf.isIntegralNumber() || !nf.canConvertToInt()) {
            throw new InputException(summaryFile + ": missing or non-integer key 'facets'");
        }
        if (nf.asInt() != modelFacets) {
            throw new InputException(summaryFile + ": survey has " + nf.asInt() + " facets but model " + modelFile
                + " has " + modelFacets + ": this survey belongs to another model");
        }
        String actual = sha256(modelFile);
        if (!actual.equalsIgnoreCase(sha)) {
            throw new InputException(summaryFile + ": model_sha256 " + abbreviate(sha) + " does not match "
                + modelFile + " (" + abbreviate(actual) + "): this survey belongs to another model");
        }
        dev.cairn.io.RunInputs.register(summaryFile);
        dev.cairn.io.RunInputs.register(csv);
        Map<String, double[]> cols = readCsv(csv, modelFacets);
        requireZones(cols.get("zone"), csv, modelFacets);
        Path zonesCsv = dir.resolve("zones.csv");
        List<Zone> zones = Files.isRegularFile(zonesCsv) ? readZones(zonesCsv, cols, modelFacets)
            : zonesOf(cols.get("zone"), cols, modelFacets);
        return new SurveyData(dir, modelFacets, cols, actual, zones, summary);
    }

    /** Zone ranks are 0 (no zone) or whole numbers from 1 to the facet count: anything else is a damaged file. */
    private static void requireZones(double[] zone, Path csv, int n) {
        for (int f = 0; f < zone.length; f++) {
            double z = zone[f];
            // exact: ranks are integers written as such
            if (!Double.isNaN(z) && (z < 0 || z > n || z != Math.rint(z))) {
                throw InputException.at(csv.toString(), f + 2, "column 'zone': " + z + " is not a zone rank (0 for "
                    + "none, else a whole number from 1 to " + n + ")");
            }
        }
    }

    /** A survey from columns in memory (no files, no checks), for colouring tests and callers that built it. */
    static SurveyData ofColumns(Map<String, double[]> columns, int facets) {
        double[] zone = columns.getOrDefault("zone", new double[facets]);
        List<Zone> zones = columns.containsKey("cx_m") ? zonesOf(zone, columns, facets) : List.of();
        return new SurveyData(null, facets, Map.copyOf(columns), "", zones, null);
    }

    private static String abbreviate(String sha) {
        return sha.length() > 12 ? sha.substring(0, 12) + "…" : sha;
    }

    private static JsonNode readSummary(Path file) {
        if (!Files.isRegularFile(file)) {
            throw new InputException(file + ": no such file (not a survey directory?)");
        }
        try {
            JsonNode n = JSON.readTree(dev.cairn.io.StrictJson.bytes(file));
            if (n == null || !n.isObject()) {
                throw new InputException(file + ": expected a JSON object");
            }
            return n;
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw InputException.json(file, e, "bad JSON", null);
        } catch (IOException e) {
            throw new InputException(file + ": cannot read: " + e.getMessage(), e);
        }
    }

    private static String text(JsonNode n, String key, Path file) {
        JsonNode v = n.get(key);
        if (v == null || !v.isTextual()) {
            throw new InputException(file + ": missing or non-text key '" + key + "'");
        }
        return v.asText();
    }

    /** SHA-256 of a file's bytes as lower-case hex. */
    public static String sha256(Path file) {
        try (InputStream in = Files.newInputStream(file)) {
            MessageDigest md = MessageDigest.getInstance("SHA-256");
            byte[] buf = new byte[1 << 16];
            int r;
            while ((r = in.read(buf)) > 0) {
                md.update(buf, 0, r);
            }
            return HexFormat.of().formatHex(md.digest());
        } catch (IOException e) {
            throw new InputException(file + ": cannot read: " + e.getMessage(), e);
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
    }

    private static Map<String, double[]> readCsv(Path file, int n) {
        if (!Files.isRegularFile(file)) {
            throw new InputException(file + ": no such file (not a survey directory?)");
        }
        String f = file.toString();
        try (BufferedReader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            String header = r.readLine();
            if (header == null) {
                throw InputException.at(f, 1, "empty file, expected a header line");
            }
            String[] names = header.trim().split(",", -1);
            if (names.length > MAX_COLUMNS) {
                throw InputException.at(f, 1, names.length + " columns, more than the " + MAX_COLUMNS + " accepted");
            }
            Map<String, Integer> index = new HashMap<>();
            for (int i = 0; i < names.length; i++) {
                if (index.put(names[i].trim(), i) != null) {
                    throw InputException.at(f, 1, "column " + dev.cairn.io.Messages.quote(names[i].trim())
                        + " appears twice");
                }
            }
            for (String req : REQUIRED) {
                if (!index.containsKey(req)) {
                    throw InputException.at(f, 1, "missing column '" + req + "'");
                }
            }
            double[][] data = new double[names.length][n];
            boolean[] strict = new boolean[names.length];
            boolean[] text = new boolean[names.length];
            for (String req : REQUIRED) {
                strict[index.get(req)] = true;
            }
            int row = 0;
            long lineNo = 1;
            String line;
            int facetCol = index.get("facet");
            while ((line = r.readLine()) != null) {
                lineNo++;
                if (line.isBlank()) {
                    continue;
                }
                if (row >= n) {
                    throw InputException.at(f, lineNo, "more rows than the model's " + n
                        + " facets: this survey belongs to another model");
                }
                int start = 0;
                for (int c = 0; c < names.length; c++) {
                    int end = line.indexOf(',', start);
                    if (end < 0) {
                        if (c != names.length - 1) {
                            throw InputException.at(f, lineNo, "expected " + names.length + " fields, got " + (c + 1));
                        }
                        end = line.length();
                    }
                    if (strict[c]) {
                        data[c][row] = parse(line, start, end, f, lineNo, names[c]);
                    } else if (text[c]) {
                        data[c][row] = Double.NaN;
                    } else {
                        double v = parseLenient(line, start, end);
                        data[c][row] = v;
                        // a column holding text once is taken as a text column (no more parse attempts)
                        text[c] = Double.isNaN(v) && !isNanText(line, start, end);
                    }
                    start = end + 1;
                }
                if (start <= line.length()) {
                    throw InputException.at(f, lineNo, "more than " + names.length + " fields");
                }
                // exact comparison: facet indices are integers written as such
                if (data[facetCol][row] != row) {
                    throw InputException.at(f, lineNo, "facet " + data[facetCol][row] + " where " + row
                        + " was expected (rows must follow the OBJ facet order)");
                }
                row++;
            }
            if (row != n) {
                throw new InputException(f + ": " + row + " facet rows but the model has " + n
                    + " facets: this survey belongs to another model");
            }
            Map<String, double[]> cols = new HashMap<>();
            for (Map.Entry<String, Integer> e : index.entrySet()) {
                cols.put(e.getKey(), data[e.getValue()]);
            }
            return cols;
        } catch (IOException e) {
            throw new InputException(f + ": cannot read: " + e.getMessage(), e);
        }
    }

    private static double parse(String line, int start, int end, String file, long lineNo, String column) {
        String s = line.substring(start, end).trim();
        if (s.isEmpty() || s.equalsIgnoreCase("nan")) {
            return Double.NaN;
        }
        double v = dev.cairn.io.Numbers.isDecimal(s) ? Double.parseDouble(s) : Double.NaN;
        if (!Double.isFinite(v)) {
            throw InputException.at(file, lineNo, "column " + dev.cairn.io.Messages.quote(column) + ": "
                + dev.cairn.io.Messages.quote(s) + " is not a finite number");
        }
        return v;
    }

    private static boolean isNanText(String line, int start, int end) {
        String s = line.substring(start, end).trim();
        return s.isEmpty() || s.equalsIgnoreCase("nan");
    }

    /** Columns the viewer does not need may hold text: those cells read as NaN. */
    private static double parseLenient(String line, int start, int end) {
        String s = line.substring(start, end).trim();
        return dev.cairn.io.Numbers.isDecimal(s) ? Double.parseDouble(s) : Double.NaN;
    }

    private static List<Zone> zonesOf(double[] zone, Map<String, double[]> cols, int n) {
        int maxRank = 0;
        for (double z : zone) {
            if (z > maxRank && z <= n) { // ranks beyond the facet count cannot occur (refused by read)
                maxRank = (int) Math.round(z);
            }
        }
        int[] count = new int[maxRank + 1];
        for (double z : zone) {
            if (z >= 1 && Math.round(z) <= maxRank) {
                count[(int) Math.round(z)]++;
            }
        }
        double[] cx = cols.get("cx_m");
        double[] cy = cols.get("cy_m");
        double[] cz = cols.get("cz_m");
        List<Zone> out = new ArrayList<>();
        for (int r = 1; r <= maxRank; r++) {
            if (count[r] == 0) {
                continue;
            }
            int[] members = new int[count[r]];
            int k = 0;
            double sx = 0;
            double sy = 0;
            double sz = 0;
            for (int f = 0; f < n; f++) {
                if (zone[f] >= 1 && (int) Math.round(zone[f]) == r) {
                    members[k++] = f;
                    sx += cx[f];
                    sy += cy[f];
                    sz += cz[f];
                }
            }
            out.add(new Zone(r, members, new double[] {sx / k, sy / k, sz / k}, -1, null));
        }
        return List.copyOf(out);
    }

    /**
     * Every zone footprint from {@code zones.csv} (header {@code zone,facet,aim}; footprints may overlap, which the
     * {@code zone} column of facets.csv cannot show). Ranks and facets are checked (integers, facet in range).
     */
    private static List<Zone> readZones(Path file, Map<String, double[]> cols, int n) {
        String f = file.toString();
        Map<Integer, List<Integer>> byRank = new java.util.TreeMap<>();
        try (BufferedReader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            String header = r.readLine();
            if (header == null || !header.trim().startsWith("zone,facet")) {
                throw InputException.at(f, 1, "expected the header 'zone,facet,aim'");
            }
            long lineNo = 1;
            long rows = 0;
            String line;
            while ((line = r.readLine()) != null) {
                lineNo++;
                if (line.isBlank()) {
                    continue;
                }
                String[] p = line.split(",", -1);
                int zone;
                int facet;
                try {
                    zone = Integer.parseInt(p[0].trim());
                    facet = p.length > 1 ? Integer.parseInt(p[1].trim()) : -1;
                } catch (NumberFormatException e) {
                    throw InputException.at(f, lineNo, "zone and facet must be integers: '" + line + "'");
                }
                if (zone < 1 || facet < 0 || facet >= n) {
                    throw InputException.at(f, lineNo, "zone " + zone + " or facet " + facet
                        + " out of range (zone >= 1, facet 0.." + (n - 1) + ")");
                }
                if (++rows > 64L * n) {
                    throw InputException.at(f, lineNo, "more than 64 zone memberships per facet");
                }
                byRank.computeIfAbsent(zone, k -> new ArrayList<>()).add(facet);
            }
        } catch (IOException e) {
            throw new InputException(f + ": cannot read: " + e.getMessage(), e);
        }
        double[] cx = cols.get("cx_m");
        double[] cy = cols.get("cy_m");
        double[] cz = cols.get("cz_m");
        List<Zone> out = new ArrayList<>();
        for (Map.Entry<Integer, List<Integer>> e : byRank.entrySet()) {
            int[] members = e.getValue().stream().mapToInt(Integer::intValue).sorted().distinct().toArray();
            double sx = 0;
            double sy = 0;
            double sz = 0;
            for (int q : members) {
                sx += cx[q];
                sy += cy[q];
                sz += cz[q];
            }
            int k = members.length;
            out.add(new Zone(e.getKey(), members, new double[] {sx / k, sy / k, sz / k}, -1, null));
        }
        return List.copyOf(out);
    }

    /** The survey directory. */
    public Path directory() {
        return dir;
    }

    public int facets() {
        return facets;
    }

    /** SHA-256 of the model the survey was checked against. */
    public String modelSha256() {
        return modelSha256;
    }

    /** The values of a column by name (shared array: do not modify). */
    public double[] column(String name) {
        double[] c = columns.get(name);
        if (c == null) {
            throw new InputException(dir.resolve("facets.csv") + ": no column '" + name + "'");
        }
        return c;
    }

    /** Names of every column of the survey. */
    public java.util.Set<String> columnNames() {
        return columns.keySet();
    }

    /** True when the survey has this column. */
    public boolean hasColumn(String name) {
        return columns.containsKey(name);
    }

    /** Value of a column for one facet (NaN when the column is absent). */
    public double value(String name, int facet) {
        double[] c = columns.get(name);
        return c == null ? Double.NaN : c[facet];
    }

    /**
     * Ranked landing zones, by rank: every footprint from {@code zones.csv} when present, else from the {@code zone}
     * column (best rank per facet); centroid = mean of facet centroids (m).
     */
    public List<Zone> zones() {
        return zones;
    }

    /**
     * The survey's parameters in plain words, one item per line (spin, density and GM, field model and its accuracy,
     * landing limits); "survey parameters not recorded" when summary.json lacks them.
     */
    public List<String> parameterLines() {
        return parameterLines;
    }

    /** {@link #parameterLines()} joined on one line with " · ". */
    public String parametersLine() {
        return String.join("  ·  ", parameterLines);
    }

    /** Ranked landing sites from the {@code site} column (empty for surveys without it), by rank. */
    public List<Zone> sites() {
        return sites;
    }
}
