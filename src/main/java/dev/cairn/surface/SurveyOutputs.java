package dev.cairn.surface;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.cairn.io.AtomicFiles;
import dev.cairn.body.OutputMetadata;
import dev.cairn.mesh.TriangleMesh;
import java.io.DataOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Writes a {@link SurveyResult} to a directory, each file atomically ({@link AtomicFiles}): {@code facets.csv} and
 * its sidecar {@code facets.csv.json}, {@code summary.json}, {@code zones.csv}, {@code surface.vtk} (legacy VTK
 * unstructured grid of triangles, binary encoding, every per-facet quantity as cell data, the survey's metadata as
 * field data) and the PNG maps of {@link SurveyMaps}. Columns and keys are documented in {@code docs/survey.md}.
 */
public final class SurveyOutputs {
    /** File names in the output directory. */
    public static final String CSV = "facets.csv";
    public static final String JSON = "summary.json";
    public static final String VTK = "surface.vtk";
    /** The JSON sidecar of facets.csv (survey metadata, column meanings, the CSV's SHA-256). */
    public static final String CSV_SIDECAR = "facets.csv.json";
    /** Every zone's footprint: one row per (facet, zone) membership. */
    public static final String ZONES_CSV = "zones.csv";

    /** The one-line caution carried by every output. */
    public static final String CAUTION = "Results must be verified independently before operational use; mission "
        + "rules and the responsible flight-dynamics authority decide.";

    /** Slope band edges for the area fractions, degrees; the last band is > 90 (lift-off). */
    public static final double[] SLOPE_BANDS = {0, 5, 10, 15, 20, 25, 30, 40, 60, 90};

    private SurveyOutputs() {
    }

    /**
     * Writes every output into {@code dir}; returns the paths written. All files are first written into a fresh
     * temporary folder beside {@code dir}, which then replaces {@code dir} by renames, so a reader never sees a
     * folder mixing the files of two runs, and a run that fails or is killed leaves the previous survey as it was
     * (or, killed between the two renames, no folder at all). An existing {@code dir} is replaced only when it holds
     * nothing but survey outputs (the files written here and PNG views).
     */
    public static List<Path> writeAll(SurveyResult r, Path dir) {
        return writeAll(r, dir, "unknown", SurveyMaps.GRID_W);
    }

    /**
     * As {@link #writeAll(SurveyResult, Path)}, with the Cairn version recorded in the metadata of
     * {@code surface.vtk} and {@code facets.csv.json}.
     */
    public static List<Path> writeAll(SurveyResult r, Path dir, String version) {
        return writeAll(r, dir, version, SurveyMaps.GRID_W);
    }

    /**
     * As {@link #writeAll(SurveyResult, Path, String)} with maps {@code mapGridWidth} pixels wide (see
     * {@link SurveyMaps}).
     */
    public static List<Path> writeAll(SurveyResult r, Path dir, String version, int mapGridWidth) {
        SurveyMaps.requireGridWidth(mapGridWidth);
        Path abs = dir.toAbsolutePath().normalize();
        Path parent = abs.getParent();
        String name = abs.getFileName().toString();
        Path tmp = null;
        try {
            Files.createDirectories(parent);
            requireReplaceable(abs);
            removeStale(parent, name);
            tmp = Files.createTempDirectory(parent, "." + name + ".");
            try {
                Files.setPosixFilePermissions(tmp, java.nio.file.attribute.PosixFilePermissions.fromString("rwxr-xr-x"));
            } catch (UnsupportedOperationException ignored) {
                // not a POSIX file system
            }
            List<Path> out = new ArrayList<>();
            OutputMetadata meta = metadata(r, version);
            Path csv = writeCsv(r, tmp.resolve(CSV));
            out.add(csv);
            out.add(writeCsvSidecar(r, csv, meta));
            out.add(writeJson(r, tmp.resolve(JSON)));
            out.add(writeVtk(r, tmp.resolve(VTK), meta));
            out.add(writeZonesCsv(r, tmp.resolve(ZONES_CSV)));
            out.addAll(SurveyMaps.writeAll(r, tmp, mapGridWidth));
            Path old = null;
            if (Files.exists(abs)) {
                old = parent.resolve(tmp.getFileName() + ".old");
                Files.move(abs, old, java.nio.file.StandardCopyOption.ATOMIC_MOVE);
            }
            Files.move(tmp, abs, java.nio.file.StandardCopyOption.ATOMIC_MOVE);
            tmp = null;
            if (old != null) {
                deleteSurveyFolder(old);
            }
            List<Path> moved = new ArrayList<>();
            for (Path p : out) {
                moved.add(abs.resolve(p.getFileName().toString()));
            }
            return moved;
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(dev.cairn.io.Messages.line("cannot write the survey into "
                + abs + ": " + e.getMessage()), e);
        } finally {
            if (tmp != null) {
                deleteSurveyFolder(tmp);
            }
        }
    }

    /** Refuses to replace something that is not a folder of survey outputs. */
    private static void requireReplaceable(Path dir) throws java.io.IOException {
        if (!Files.exists(dir, java.nio.file.LinkOption.NOFOLLOW_LINKS)) {
            return;
        }
        if (!Files.isDirectory(dir, java.nio.file.LinkOption.NOFOLLOW_LINKS)) {
            throw new dev.cairn.io.InputException(dev.cairn.io.Messages.path(dir) + ": --out exists and is not a "
                + "folder");
        }
        try (var s = Files.list(dir)) {
            for (Path p : (Iterable<Path>) s::iterator) {
                if (!isSurveyFile(p)) {
                    throw new dev.cairn.io.InputException(dev.cairn.io.Messages.path(dir) + ": --out holds "
                        + dev.cairn.io.Messages.quote(p.getFileName().toString()) + ", which is not a survey output; "
                        + "choose a new or empty folder");
                }
            }
        }
    }

    private static boolean isSurveyFile(Path p) {
        String n = p.getFileName().toString();
        return Files.isRegularFile(p, java.nio.file.LinkOption.NOFOLLOW_LINKS) && (n.equals(CSV) || n.equals(JSON)
            || n.equals(VTK) || n.equals(CSV_SIDECAR) || n.equals(ZONES_CSV) || n.endsWith(".png") || n.startsWith(".") && n.endsWith(".tmp"));
    }

    /** Deletes a folder of survey outputs (only such files; the folder itself when then empty). */
    private static void deleteSurveyFolder(Path dir) {
        try (var s = Files.list(dir)) {
            for (Path p : (Iterable<Path>) s::iterator) {
                if (isSurveyFile(p)) {
                    Files.deleteIfExists(p);
                }
            }
            Files.deleteIfExists(dir);
        } catch (java.io.IOException ignored) {
            // best effort: a left-over hidden folder is removed by a later run
        }
    }

    /** Temporary and replaced folders that a killed run left beside {@code name} (older than ten minutes). */
    private static void removeStale(Path parent, String name) throws java.io.IOException {
        long now = System.currentTimeMillis();
        try (var s = Files.newDirectoryStream(parent, "." + name + ".*")) {
            for (Path p : s) {
                if (Files.isDirectory(p, java.nio.file.LinkOption.NOFOLLOW_LINKS)
                    && now - Files.getLastModifiedTime(p).toMillis() > 10 * 60 * 1000L) {
                    deleteSurveyFolder(p);
                }
            }
        }
    }

    /** {@code facets.csv}: header line first (no comment lines), one row per facet in OBJ order. */
    public static Path writeCsv(SurveyResult r, Path file) {
        AtomicFiles.write(file, os -> {
            StringBuilder sb = new StringBuilder(1 << 16);
            sb.append(FacetColumns.csvHeader()).append('\n');
            List<FacetColumns.Column> cols = FacetColumns.ALL;
            for (int f = 0; f < r.facets; f++) {
                for (int c = 0; c < cols.size(); c++) {
                    if (c > 0) {
                        sb.append(',');
                    }
                    append(sb, cols.get(c), r, f);
                }
                sb.append('\n');
                if (sb.length() > 1 << 20) {
                    flush(sb, os);
                }
            }
            flush(sb, os);
        });
        return file;
    }

    /**
     * {@code zones.csv}: header {@code zone,facet,aim}, then one row per facet of every zone footprint (zone rank
     * increasing, then facet index), {@code aim} 1 for the zone's aim facets. Footprints of different zones may share
     * facets; the {@code zone} column of facets.csv holds only the best rank, this file every membership.
     */
    public static Path writeZonesCsv(SurveyResult r, Path file) {
        AtomicFiles.write(file, os -> {
            StringBuilder sb = new StringBuilder(1 << 16);
            sb.append("zone,facet,aim\n");
            for (int k = 0; k < r.zones.size(); k++) {
                int rank = k + 1;
                for (int f : r.zoneFootprints.get(k)) {
                    sb.append(rank).append(',').append(f).append(',').append(r.aimZone[f] == rank ? 1 : 0)
                        .append('\n');
                    if (sb.length() > 1 << 20) {
                        flush(sb, os);
                    }
                }
            }
            flush(sb, os);
        });
        return file;
    }

    private static void append(StringBuilder sb, FacetColumns.Column c, SurveyResult r, int f) {
        double v = c.getter().value(r, f);
        if (c.integer()) {
            sb.append((long) v);
        } else {
            sb.append(v);
        }
    }

    private static void flush(StringBuilder sb, OutputStream os) throws IOException {
        os.write(sb.toString().getBytes(StandardCharsets.UTF_8));
        sb.setLength(0);
    }

    /**
     * {@code surface.vtk}: legacy VTK 3.0 ("VTK User's Guide", "VTK File Formats") unstructured grid of triangles
     * (cell type 5, {@code VTK_TRIANGLE}) in the format's BINARY encoding (big-endian IEEE doubles and 32-bit ints after
     * ASCII keyword lines, so NaN and full precision survive). Read unaided by VTK 9 ({@code vtkUnstructuredGridReader},
     * {@code vtkDataSetReader}), ParaView and meshio 5 (which reads neither POLYDATA nor string arrays, nor a dataset
     * FIELD placed before the points). Layout:
     * <ol>
     * <li>{@code POINTS}, {@code CELLS}, {@code CELL_TYPES};</li>
     * <li>{@code FIELD FieldData}: the survey's {@link OutputMetadata} (numbers as double arrays, texts as
     *     {@code unsigned_char} arrays of their UTF-8 bytes), placed after the cell types so that meshio reads it
     *     into {@code field_data};</li>
     * <li>{@code CELL_DATA}: {@code SCALARS slope_deg} first (the active scalar), {@code VECTORS gravity_m_s2} (the
     *     active vector), then one {@code FIELD} with every other {@link FacetColumns} column (integer columns as
     *     {@code int}), {@code normal} and {@code accel_eff_m_s2} (3 components). A FIELD rather than more SCALARS:
     *     VTK's legacy reader keeps only the first SCALARS and VECTORS unless told otherwise.</li>
     * </ol>
     */
    public static Path writeVtk(SurveyResult r, Path file, OutputMetadata meta) {
        TriangleMesh mesh = r.target.mesh();
        AtomicFiles.write(file, os -> {
            DataOutputStream out = new DataOutputStream(os);
            String title = ("Cairn surface survey of " + r.target.name().replaceAll("[\\r\\n]", " ")
                + ": SI units, U > 0, acceleration = grad U; verify independently before operational use");
            if (title.length() > 255) {
                title = title.substring(0, 255);
            }
            ascii(out, "# vtk DataFile Version 3.0\n" + title + "\nBINARY\nDATASET UNSTRUCTURED_GRID\n");
            double[] xyz = mesh.xyz();
            int nv = mesh.vertexCount();
            ascii(out, "POINTS " + nv + " double\n");
            for (double v : xyz) {
                out.writeDouble(v);
            }
            int nf = r.facets;
            int[] tri = mesh.tri();
            ascii(out, "\nCELLS " + nf + " " + 4L * nf + "\n");
            for (int f = 0; f < nf; f++) {
                out.writeInt(3);
                out.writeInt(tri[3 * f]);
                out.writeInt(tri[3 * f + 1]);
                out.writeInt(tri[3 * f + 2]);
            }
            ascii(out, "\nCELL_TYPES " + nf + "\n");
            for (int f = 0; f < nf; f++) {
                out.writeInt(VTK_TRIANGLE);
            }
            ascii(out, "\n");
            Map<String, double[]> numbers = meta.numbers();
            Map<String, String> texts = meta.texts();
            ascii(out, "FIELD FieldData " + (numbers.size() + texts.size()) + "\n");
            for (Map.Entry<String, String> e : texts.entrySet()) {
                byte[] b = e.getValue().getBytes(StandardCharsets.UTF_8);
                ascii(out, e.getKey() + " 1 " + b.length + " unsigned_char\n");
                out.write(b);
                ascii(out, "\n");
            }
            for (Map.Entry<String, double[]> e : numbers.entrySet()) {
                double[] v = e.getValue();
                ascii(out, e.getKey() + " " + v.length + " 1 double\n");
                for (double x : v) {
                    out.writeDouble(x);
                }
                ascii(out, "\n");
            }
            ascii(out, "CELL_DATA " + nf + "\n");
            FacetColumns.Column slope = FacetColumns.byName(VTK_ACTIVE_SCALAR);
            ascii(out, "SCALARS " + slope.name() + " double 1\nLOOKUP_TABLE default\n");
            for (int f = 0; f < nf; f++) {
                out.writeDouble(slope.getter().value(r, f));
            }
            ascii(out, "\n");
            vectors(out, "VECTORS " + VTK_ACTIVE_VECTOR + " double\n", r.gVec);
            ascii(out, "FIELD CellArrays " + (FacetColumns.ALL.size() - 1 + 2) + "\n");
            for (FacetColumns.Column c : FacetColumns.ALL) {
                if (c == slope) {
                    continue;
                }
                ascii(out, c.name() + " 1 " + nf + (c.integer() ? " int\n" : " double\n"));
                for (int f = 0; f < nf; f++) {
                    double v = c.getter().value(r, f);
                    if (c.integer()) {
                        out.writeInt((int) v);
                    } else {
                        out.writeDouble(v);
                    }
                }
                ascii(out, "\n");
            }
            vectors(out, "normal 3 " + nf + " double\n", r.normal);
            vectors(out, "accel_eff_m_s2 3 " + nf + " double\n", r.aEffVec);
            out.flush();
        });
        return file;
    }

    /** VTK cell type of a linear triangle ({@code VTK_TRIANGLE} in {@code vtkCellType.h}). */
    public static final int VTK_TRIANGLE = 5;
    /** The active scalar (SCALARS) of {@code surface.vtk}. */
    public static final String VTK_ACTIVE_SCALAR = "slope_deg";
    /** The active vector (VECTORS) of {@code surface.vtk}: gravity g = grad U, m/s^2. */
    public static final String VTK_ACTIVE_VECTOR = "gravity_m_s2";

    private static void ascii(DataOutputStream out, String s) throws IOException {
        out.write(s.getBytes(StandardCharsets.US_ASCII));
    }

    private static void vectors(DataOutputStream out, String header, double[] v) throws IOException {
        ascii(out, header);
        for (double x : v) {
            out.writeDouble(x);
        }
        ascii(out, "\n");
    }

    /**
     * The survey's metadata (model, density, GM, spin, G, conventions, version) carried by {@code surface.vtk} and
     * the sidecar {@code facets.csv.json}.
     */
    public static OutputMetadata metadata(SurveyResult r, String version) {
        SurveyTarget t = r.target;
        return new OutputMetadata("cairn surface survey", t.source() == null ? null : t.source().toString(),
            t.source() == null ? null : sha256(t.source()), t.density(), t.field().gm(), t.spin().periodSeconds(),
            t.spin().axis(), t.centreOfMass(), t.field().describe(), version);
    }

    /**
     * {@code facets.csv.json}: the sidecar of {@code facets.csv}, written atomically after it: the survey's
     * {@link OutputMetadata}, the CSV's SHA-256, layout and every column with its meaning and unit.
     */
    public static Path writeCsvSidecar(SurveyResult r, Path csv, OutputMetadata meta) {
        Map<String, Object> extra = new LinkedHashMap<>();
        extra.put("data_layout", "CSV, UTF-8; header line of column names first (no comment lines), then one row "
            + "per facet in OBJ order; integers without a decimal point, NaN where a value does not apply");
        extra.put("rows", r.facets);
        List<Map<String, Object>> cols = new ArrayList<>();
        for (FacetColumns.Column c : FacetColumns.ALL) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("name", c.name());
            m.put("integer", c.integer());
            m.put("description", c.description());
            cols.add(m);
        }
        extra.put("columns", cols);
        return meta.writeSidecar(csv, extra);
    }

    /** {@code summary.json}. */
    public static Path writeJson(SurveyResult r, Path file) {
        try {
            ObjectMapper m = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
            AtomicFiles.writeString(file, m.writeValueAsString(summary(r)) + "\n");
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
        return file;
    }

    /** SHA-256 (hex) of a file's bytes. */
    public static String sha256(Path file) {
        try {
            MessageDigest md = MessageDigest.getInstance("SHA-256");
            try (java.io.InputStream in = Files.newInputStream(file)) {
                byte[] buf = new byte[1 << 16];
                int n;
                while ((n = in.read(buf)) > 0) {
                    md.update(buf, 0, n);
                }
            }
            byte[] h = md.digest();
            StringBuilder sb = new StringBuilder();
            for (byte b : h) {
                sb.append(String.format("%02x", b));
            }
            return sb.toString();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read " + file + ": " + e.getMessage(), e);
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
    }

    /** The summary as an ordered map (what summary.json holds). */
    public static Map<String, Object> summary(SurveyResult r) {
        SurveyTarget t = r.target;
        SurveyParameters p = r.parameters;
        Map<String, Object> j = new LinkedHashMap<>();
        j.put("tool", "cairn survey");
        j.put("name", t.name());
        j.put("model", t.source() == null ? null : t.source().toString());
        j.put("model_sha256", t.source() == null ? null : sha256(t.source()));
        j.put("facets", r.facets);
        j.put("vertices", t.mesh().vertexCount());
        j.put("field_model", t.field().describe());
        j.put("field_accuracy", r.fieldCheck() == null ? null : r.fieldCheck().json());
        Map<String, Object> par = new LinkedHashMap<>();
        par.put("density_kg_m3", Double.isNaN(t.density()) ? null : t.density());
        par.put("gm_m3_s2", t.field().gm());
        par.put("volume_m3", t.volume());
        par.put("equivalent_radius_m", t.equivalentRadius());
        par.put("center_of_mass_m", t.centreOfMass());
        double period = t.spin().periodSeconds();
        par.put("spin_period_s", Double.isInfinite(period) ? null : period);
        par.put("spin_period_h", Double.isInfinite(period) ? null : period / 3600);
        par.put("spin_rate_rad_s", t.spin().omega());
        par.put("spin_axis", t.spin().axis());
        par.put("max_slope_deg", p.maxSlopeDeg());
        par.put("zone_radius_m", p.zoneRadiusM());
        par.put("max_roughness_deg", p.maxRoughnessDeg());
        par.put("site_radius_m", p.siteRadius());
        par.put("hover_altitudes_m", r.hoverAltitudes);
        par.put("dynamic_height_reference", "area-weighted mean of the effective potential over the surface");
        par.put("reference_potential_eff_m2_s2", r.referencePotentialEff);
        par.put("dynamic_height_divisor_m_s2", r.meanGEff);
        j.put("parameters", par);
        j.put("statistics", statistics(r));
        j.put("site_count", r.sites.size());
        j.put("sites", sites(r));
        j.put("slope_bands", slopeBands(r));
        List<Map<String, Object>> zones = new ArrayList<>();
        for (LandingZone z : r.zones) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("rank", z.rank());
            m.put("score", z.score());
            m.put("centroid_m", z.centroid());
            m.put("lat_deg", z.latDeg());
            m.put("lon_deg", z.lonDeg());
            m.put("area_m2", z.areaM2());
            m.put("aim_area_m2", z.aimAreaM2());
            m.put("facet_count", z.facetCount());
            m.put("aim_facet_count", z.aimFacetCount());
            m.put("best_aim_facet", z.bestFacet());
            m.put("best_aim_point_m", z.bestPoint());
            m.put("best_aim_lat_deg", z.bestLatDeg());
            m.put("best_aim_lon_deg", z.bestLonDeg());
            m.put("max_slope_deg", z.maxSlopeDeg());
            m.put("mean_slope_deg", z.meanSlopeDeg());
            m.put("roughness_deg", z.roughnessDeg());
            m.put("dynamic_height_range_m", z.dynamicHeightRangeM());
            m.put("mean_g_eff_m_s2", z.meanGravityEff());
            m.put("mean_g_m_s2", z.meanGravity());
            m.put("mean_escape_speed_m_s", z.meanEscapeSpeed());
            m.put("min_escape_speed_m_s", z.minEscapeSpeed());
            zones.add(m);
        }
        j.put("zone_count", zones.size());
        j.put("zones", zones);
        List<Map<String, Object>> hover = new ArrayList<>();
        for (HoverPoint h : r.hovering) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("altitude_m", h.altitudeM());
            m.put("rank", h.rank());
            m.put("facet", h.facet());
            m.put("position_m", h.position());
            m.put("lat_deg", h.latDeg());
            m.put("lon_deg", h.lonDeg());
            m.put("hover_accel_m_s2", h.hoverAccel());
            m.put("g_m_s2", h.gravity());
            hover.add(m);
        }
        j.put("hovering", hover);
        j.put("map_layers", mapLayers(r));
        Map<String, Object> conv = new LinkedHashMap<>();
        conv.put("units", "SI: m, s, kg; angles in degrees");
        conv.put("potential", "U > 0 (U -> GM/r far away); gravity g = grad U points toward the body");
        conv.put("frame", "model (body-fixed) frame; spin axis through the centre of mass");
        conv.put("effective_potential", "V = U + w^2 |w_hat x (r - c)|^2 / 2; a_eff = grad V = g + w^2 r_perp");
        conv.put("normal_components", "positive inward (toward the body); lift_off = 1 where -n.a_eff < 0");
        conv.put("slope", "angle between the inward facet normal and a_eff, deg; > 90 means lift-off");
        conv.put("dynamic_height", "(V_ref - V) / mean|a_eff|, m; increases with altitude; V_ref = area-weighted "
            + "mean of V");
        conv.put("lat_lon", "about the spin pole from the centre of mass; east longitude from the model +x axis "
            + "projected on the equator, (-180, 180]");
        conv.put("escape_speed", "launch along the outward normal, relative to the surface, from inertial energy "
            + "|v + w x r|^2 / 2 - U = 0 (energy treated as conserved; estimate for non-axisymmetric bodies)");
        conv.put("hover_accel", "|a_eff|: thrust acceleration to stay at rest in the body frame");
        conv.put("sites", "discs of radius site_radius_m (every facet with a point within it) about aim points, "
            + "chosen greedily by score; centres at least 2 site radii apart and no facet in two sites");
        conv.put("zones", "connected aim facets whose whole disc of radius zone_radius_m has slope < max_slope_deg "
            + "and RMS normal spread <= max_roughness_deg; see docs/survey.md for the score");
        j.put("conventions", conv);
        j.put("notes", r.notes);
        j.put("survey_seconds", r.seconds);
        Map<String, Object> stages = new LinkedHashMap<>();
        stages.put("field_at_centroids", r.stageSeconds[0]);
        stages.put("discs_and_zones", r.stageSeconds[1]);
        stages.put("hovering", r.stageSeconds[2]);
        j.put("stage_seconds", stages);
        j.put("caution", CAUTION);
        return j;
    }

    /** Ranked landing sites for summary.json. */
    private static List<Map<String, Object>> sites(SurveyResult r) {
        List<Map<String, Object>> out = new ArrayList<>();
        for (LandingSite s : r.sites) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("rank", s.rank());
            m.put("score", s.score());
            m.put("aim_facet", s.facet());
            m.put("aim_point_m", s.position());
            m.put("lat_deg", s.latDeg());
            m.put("lon_deg", s.lonDeg());
            m.put("zone", s.zone());
            m.put("map_layer", r.mapLayer[s.facet()]);
            m.put("facet_count", s.facetCount());
            m.put("area_m2", s.areaM2());
            m.put("max_slope_deg", s.maxSlopeDeg());
            m.put("mean_slope_deg", s.meanSlopeDeg());
            m.put("roughness_deg", s.roughnessDeg());
            m.put("dynamic_height_range_m", s.dynamicHeightRangeM());
            m.put("mean_g_eff_m_s2", s.meanGravityEff());
            m.put("mean_g_m_s2", s.meanGravity());
            m.put("mean_escape_speed_m_s", s.meanEscapeSpeed());
            m.put("min_escape_speed_m_s", s.minEscapeSpeed());
            m.put("safe_area_fraction", s.safeAreaFraction());
            out.add(m);
        }
        return out;
    }

    /** Map layers: how much of the surface each layer of the lat/lon maps shows, and how much the outer one hides. */
    private static Map<String, Object> mapLayers(SurveyResult r) {
        int max = 1;
        for (int l : r.mapLayer) {
            max = Math.max(max, l);
        }
        double total = 0;
        double[] a = new double[max + 1];
        for (int f = 0; f < r.facets; f++) {
            total += r.area[f];
            a[r.mapLayer[f]] += r.area[f];
        }
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("layers", Math.min(max, LatLonRaster.MAX_LAYERS));
        m.put("hidden_on_outer_maps_area_fraction", r.hiddenAreaFraction());
        List<Double> per = new ArrayList<>();
        double unmapped = a[0];
        for (int l = 1; l <= max; l++) {
            if (l <= LatLonRaster.MAX_LAYERS) {
                per.add(a[l] / total);
            } else {
                unmapped += a[l];
            }
        }
        m.put("area_fraction_per_layer", per);
        m.put("on_no_map_area_fraction", unmapped / total);
        return m;
    }

    private static Map<String, Object> statistics(SurveyResult r) {
        Map<String, Object> s = new LinkedHashMap<>();
        String[] names = {"slope_deg", "g_m_s2", "g_eff_m_s2", "g_normal_m_s2", "g_eff_normal_m_s2",
            "potential_m2_s2", "potential_eff_m2_s2", "dynamic_height_m", "escape_speed_m_s",
            "escape_speed_min_m_s", "hover_accel_m_s2", "roughness_deg"};
        for (String n : names) {
            FacetColumns.Column c = FacetColumns.ALL.stream().filter(k -> k.name().equals(n)).findFirst()
                .orElseThrow();
            double min = Double.POSITIVE_INFINITY;
            double max = Double.NEGATIVE_INFINITY;
            double sum = 0;
            double sa = 0;
            for (int f = 0; f < r.facets; f++) {
                double v = c.getter().value(r, f);
                if (Double.isNaN(v)) {
                    continue;
                }
                min = Math.min(min, v);
                max = Math.max(max, v);
                sum += r.area[f] * v;
                sa += r.area[f];
            }
            Map<String, Object> q = new LinkedHashMap<>();
            q.put("min", sa > 0 ? min : null);
            q.put("mean_area_weighted", sa > 0 ? sum / sa : null);
            q.put("max", sa > 0 ? max : null);
            s.put(n, q);
        }
        double total = 0;
        double lift = 0;
        for (int f = 0; f < r.facets; f++) {
            total += r.area[f];
            if (r.liftOff[f]) {
                lift += r.area[f];
            }
        }
        double below = 0;
        for (int f = 0; f < r.facets; f++) {
            below += r.slope[f] < r.parameters.maxSlopeDeg() ? r.area[f] : 0;
        }
        s.put("surface_area_m2", total);
        s.put("below_max_slope_area_fraction", below / total);
        s.put("lift_off_area_fraction", lift / total);
        return s;
    }

    /** Area fractions by slope band, plus the fraction below the limit. */
    static List<Map<String, Object>> slopeBands(SurveyResult r) {
        double[] b = SLOPE_BANDS;
        double[] a = new double[b.length];
        double total = 0;
        for (int f = 0; f < r.facets; f++) {
            total += r.area[f];
            double s = r.slope[f];
            int k = b.length - 1;
            for (int i = 1; i < b.length; i++) {
                if (s < b[i]) {
                    k = i - 1;
                    break;
                }
            }
            a[k] += r.area[f];
        }
        List<Map<String, Object>> out = new ArrayList<>();
        for (int i = 0; i < b.length; i++) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("from_deg", b[i]);
            m.put("to_deg", i + 1 < b.length ? b[i + 1] : 180.0);
            m.put("area_fraction", a[i] / total);
            out.add(m);
        }
        return out;
    }
}
