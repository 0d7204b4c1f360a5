package dev.cairn.regions;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.cairn.gravity.Constants;
import dev.cairn.io.InputException;
import dev.cairn.io.Messages;
import dev.cairn.io.InputFiles;
import dev.cairn.io.InputLimits;
import dev.cairn.mascon.SurfaceQuery;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.EdgeTable;
import dev.cairn.mesh.MeshInspector;
import dev.cairn.mesh.MeshReport;
import dev.cairn.mesh.ObjReader;
import dev.cairn.mesh.SurfaceCrossing;
import dev.cairn.mesh.TriangleMesh;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;

/**
 * Reads and checks a {@link BodyDescription}: reads each region's OBJ (metres after the length unit), requires a
 * closed, consistent surface, checks that the regions nest, settles the density to solve for, and builds the
 * {@link RegionBody}. Every problem is a one-line {@link InputException} naming the file, the region and the problem.
 *
 * <p>Nesting check: each vertex of one region is classified against every other region's surface by the solid-angle
 * winding number ({@link SurfaceQuery}); a vertex within {@link #ON_SURFACE_TOLERANCE} (relative to the outer shape's
 * size) of the other surface counts as on it and is compatible with both inside and outside. A region whose vertices
 * lie partly inside and partly outside another crosses it and is refused. Surfaces can also cross while every vertex
 * lies on the right side, when an edge of one pierces a facet of the other; that is found by
 * {@link SurfaceCrossing} (both ways round, for every pair of regions) and refused too.
 */
public final class RegionBodyLoader {
    /** Vertex-to-surface distance, relative to the outer shape's bounding-box diagonal, that counts as "on it". */
    public static final double ON_SURFACE_TOLERANCE = 1e-9;
    /** Most regions in one description (the nesting check is quadratic in the count; common practice, no source). */
    public static final int MAX_REGIONS = 64;

    private static final ObjectMapper MAPPER = dev.cairn.io.StrictJson.MAPPER;
    /**
     * System property that lets region shapes lie outside the description's own folder tree (off by default, so
     * a description cannot make the program read arbitrary files).
     */
    public static final String ALLOW_OUTSIDE_PROPERTY = "cairn.regions.allowOutside";

    private RegionBodyLoader() {
    }

    /** True when {@code path} names a body description (extension {@code .json}) rather than an OBJ. */
    public static boolean isDescription(Path path) {
        return path.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(".json");
    }

    /** Parses the JSON; syntax errors and unknown keys name the file and line. */
    public static BodyDescription read(Path file) {
        InputFiles.requireRegularFile(file, "body description");
        BodyDescription d;
        try {
            byte[] bytes = dev.cairn.io.StrictJson.bytes(file);
            com.fasterxml.jackson.databind.JsonNode tree = MAPPER.readTree(bytes);
            if (tree == null || !tree.isObject() || !tree.has("regions")) {
                throw new InputException(file + ": not a body description: no \"regions\" list (a model's own "
                    + "sidecar JSON is read automatically beside its OBJ: pass the OBJ instead)");
            }
            d = MAPPER.readValue(bytes, BodyDescription.class);
            if (d != null && d.regions != null && d.regions.size() > MAX_REGIONS) {
                throw new InputException(file + ": " + d.regions.size() + " regions, more than the " + MAX_REGIONS
                    + " accepted");
            }
        } catch (JsonProcessingException e) {
            throw InputException.json(file, e, "bad body description", "docs/mascons.md");
        } catch (IOException e) {
            throw new InputException(file + ": cannot read: " + e.getMessage(), e);
        }
        if (d == null || d.regions == null || d.regions.isEmpty()) {
            throw new InputException(file + ": not a body description: no \"regions\" list (a model's own sidecar "
                + "JSON is read automatically beside its OBJ: pass the OBJ instead)");
        }
        return d;
    }

    /**
     * Loads and checks a body description.
     *
     * @param unitOverride "m"/"km" from the command line, or null for the description's length_unit (default m)
     * @param gmOverride   measured GM from the command line (m^3/s^2), or null for the description's
     * @param warnings     receives non-fatal warnings (modified)
     */
    public static RegionBody load(Path file, String unitOverride, Double gmOverride, List<String> warnings) {
        BodyDescription d = read(file);
        String where = file.toString();
        String unit = unitOverride != null ? unitOverride : d.lengthUnit != null ? d.lengthUnit : "m";
        double scale = InputLimits.metresPer(unit, unitOverride != null ? "--units" : where);
        Path dir = file.toAbsolutePath().normalize().getParent();
        Path realDir = realPath(dir);
        boolean anywhere = Boolean.getBoolean(ALLOW_OUTSIDE_PROPERTY);
        int n = d.regions.size();
        Set<String> names = new HashSet<>();
        TriangleMesh[] meshes = new TriangleMesh[n];
        EdgeTable[] edges = new EdgeTable[n];
        double[] volumes = new double[n];
        String[] rn = new String[n];
        Path[] paths = new Path[n];
        for (int i = 0; i < n; i++) {
            BodyDescription.Region r = d.regions.get(i);
            if (r == null) {
                throw new InputException(where + ": region " + (i + 1) + " is empty");
            }
            rn[i] = r.name != null ? r.name : "region " + (i + 1);
            if (!names.add(rn[i])) {
                throw new InputException(where + ": two regions are named " + Messages.quote(rn[i]));
            }
            String label = "region " + Messages.quote(rn[i]);
            if (r.shape == null || r.shape.isBlank()) {
                throw new InputException(where + ": " + label + " has no \"shape\" (path of its OBJ)");
            }
            if (r.density != null && (!(r.density >= 0) || !Double.isFinite(r.density))) {
                throw new InputException(where + ": " + label + ": density_kg_m3 must be zero (a void) or "
                    + "positive, got " + r.density);
            }
            if (r.density != null && r.density > 0) {
                InputLimits.requireDensityInRange(r.density, where + ": " + label + ": density ");
            }
            if (r.densityGradient != null && !Double.isFinite(r.densityGradient)) {
                throw new InputException(where + ": " + label + ": density_gradient_kg_m3_per_m must be "
                    + "a finite number");
            }
            try {
                paths[i] = dir.resolve(r.shape).normalize();
            } catch (java.nio.file.InvalidPathException e) {
                throw new InputException(where + ": " + label + ": shape " + Messages.quote(r.shape)
                    + " is not a valid path");
            }
            if (!anywhere && !realPath(paths[i]).startsWith(realDir)) {
                throw new InputException(where + ": " + label + ": shape " + Messages.quote(r.shape) + " lies outside "
                    + "the description's folder; region files must be in its folder tree (or set -D"
                    + ALLOW_OUTSIDE_PROPERTY + "=true)");
            }
            if (!Files.isRegularFile(paths[i])) {
                throw new InputException(where + ": " + label + ": shape file " + Messages.quote(r.shape)
                    + (Files.exists(paths[i]) ? " is not a regular file" : " not found"));
            }
            dev.cairn.io.RunInputs.register(paths[i]);
            ObjReader.Result read = ObjReader.read(paths[i], scale);
            warnings.addAll(read.warnings());
            TriangleMesh mesh = read.mesh();
            EdgeTable et = EdgeTable.of(mesh);
            MeshReport rep = MeshInspector.inspect(mesh, et);
            TriangleMesh fixed = MeshInspector.requireFitForGravity(mesh, rep, paths[i].toString(), warnings);
            if (fixed != mesh) {
                mesh = fixed;
                et = EdgeTable.of(mesh);
                rep = MeshInspector.inspect(mesh, et);
            }
            MeshInspector.requireMeasurable(mesh, rep, paths[i].toString());
            MeshInspector.requireNoSelfIntersection(mesh, rep, paths[i].toString());
            meshes[i] = mesh;
            edges[i] = et;
            volumes[i] = MassPropertiesCalculator.unitDensity(mesh).volume();
        }
        dev.cairn.io.RunInputs.register(file);
        int[] parent = nesting(where, rn, meshes, volumes);
        int[] depth = new int[n];
        for (int i = 1; i < n; i++) {
            for (int p = parent[i]; p >= 0; p = parent[p]) {
                depth[i]++;
            }
        }
        double[] rho = new double[n];
        double[] grad = new double[n];
        int solve = -1;
        if (d.solveDensityOf != null) {
            for (int i = 0; i < n; i++) {
                if (rn[i].equals(d.solveDensityOf)) {
                    solve = i;
                }
            }
            if (solve < 0) {
                throw new InputException(where + ": solve_density_of names '" + d.solveDensityOf
                    + "', which is not a region");
            }
        }
        for (int i = 0; i < n; i++) {
            BodyDescription.Region r = d.regions.get(i);
            grad[i] = r.densityGradient == null ? 0 : r.densityGradient;
            if (r.density == null && i != solve) {
                throw new InputException(where + ": region '" + rn[i] + "' has no density_kg_m3");
            }
            rho[i] = r.density == null ? 0 : r.density;
            // The density across the region must stay in range: |gradient| times the outer size is its spread.
            double[] ob = meshes[0].boundingBox();
            double size = Math.max(ob[3] - ob[0], Math.max(ob[4] - ob[1], ob[5] - ob[2]));
            if (Math.abs(grad[i]) * size > InputLimits.DENSITY_MAX) {
                throw new InputException(where + ": region " + Messages.quote(rn[i]) + ": density gradient " + grad[i]
                    + " kg/m^3 per m changes the density by more than " + InputLimits.DENSITY_MAX
                    + " kg/m^3 across the body");
            }
        }
        Double gm = gmOverride != null ? gmOverride : d.measuredGm;
        if (gm != null && (!(gm > 0) || !Double.isFinite(gm))) {
            throw new InputException((gmOverride != null ? "--gm" : where) + ": GM must be a positive number, got "
                + gm);
        }
        double[] own = volumes.clone();
        for (int i = 1; i < n; i++) {
            own[parent[i]] -= volumes[i];
        }
        if (solve >= 0) {
            if (gm == null) {
                throw new InputException(where + ": solve_density_of needs measured_gm_m3_s2 (or --gm)");
            }
            for (double g : grad) {
                if (g != 0) {
                    throw new InputException(where + ": cannot solve a density with a density gradient present");
                }
            }
            double others = 0;
            for (int i = 0; i < n; i++) {
                if (i != solve) {
                    others += rho[i] * own[i];
                }
            }
            double value = (gm / Constants.G - others) / own[solve];
            if (!(value >= 0)) {
                throw new InputException(where + ": no non-negative density of region '" + rn[solve]
                    + "' gives GM " + gm + " m^3/s^2 (the other regions alone already give "
                    + String.format(Locale.ROOT, "%.6g", Constants.G * others) + " m^3/s^2)");
            }
            InputLimits.requireDensityInRange(value, where + ": solved density of region " + Messages.quote(rn[solve])
                + " is ");
            rho[solve] = value;
            warnings.add(where + ": density of region '" + rn[solve] + "' solved from GM " + gm + " m^3/s^2: "
                + String.format(Locale.ROOT, "%.6g", value) + " kg/m^3");
        } else if (gm != null) {
            double mass = 0;
            for (int i = 0; i < n; i++) {
                mass += rho[i] * own[i];
            }
            double rel = (Constants.G * mass - gm) / gm;
            if (Math.abs(rel) > 0.01) {
                warnings.add(where + ": the regions' GM " + String.format(Locale.ROOT, "%.6g", Constants.G * mass)
                    + " m^3/s^2 differs from the measured " + gm + " m^3/s^2 by "
                    + String.format(Locale.ROOT, "%.2f", 100 * rel) + " %");
            }
        }
        for (int i = 0; i < n; i++) {
            if (rho[i] > 0 && (rho[i] < InputLimits.DENSITY_WARN_LOW || rho[i] > InputLimits.DENSITY_WARN_HIGH)) {
                warnings.add(where + ": region '" + rn[i] + "': density " + String.format(Locale.ROOT, "%.4g", rho[i])
                    + " kg/m^3 is outside the usual 100-8000 kg/m^3 of small bodies; check the units");
            }
        }
        List<RegionBody.Region> list = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            list.add(new RegionBody.Region(rn[i], paths[i], meshes[i], edges[i], rho[i], grad[i], parent[i], depth[i],
                volumes[i]));
        }
        return new RegionBody(file, d.name != null ? d.name : base(file), list, d, unit);
    }

    /** Parent of each region (−1 for the outer one), after checking that the regions nest. */
    private static int[] nesting(String where, String[] rn, TriangleMesh[] meshes, double[] volumes) {
        int n = meshes.length;
        double[] bb = meshes[0].boundingBox();
        double tol = ON_SURFACE_TOLERANCE * Math.sqrt(sq(bb[3] - bb[0]) + sq(bb[4] - bb[1]) + sq(bb[5] - bb[2]));
        SurfaceQuery[] q = new SurfaceQuery[n];
        for (int i = 0; i < n; i++) {
            q[i] = new SurfaceQuery(meshes[i]);
        }
        // in[i][j]: vertices of j strictly inside i; out[i][j]: strictly outside i.
        int[][] in = new int[n][n];
        int[][] out = new int[n][n];
        double[] wd = new double[2];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                if (i == j) {
                    continue;
                }
                double[] v = meshes[j].xyz();
                for (int k = 0; k < v.length; k += 3) {
                    q[i].windingAndDistance(v[k], v[k + 1], v[k + 2], wd);
                    if (wd[1] <= tol) {
                        continue;
                    }
                    if (wd[0] > 0.5) {
                        in[i][j]++;
                    } else {
                        out[i][j]++;
                    }
                }
            }
        }
        for (int j = 1; j < n; j++) {
            if (out[j][0] == 0 && in[j][0] == 0) {
                throw new InputException(where + ": region " + Messages.quote(rn[j]) + " is the outer shape "
                    + Messages.quote(rn[0]) + " again (every vertex of each lies on the other); a region must lie "
                    + "inside the outer shape");
            }
            if (out[0][j] > 0) {
                throw new InputException(where + ": region '" + rn[j] + "' extends outside the outer shape '" + rn[0]
                    + "': " + out[0][j] + " of " + meshes[j].vertexCount() + " vertices lie outside it");
            }
        }
        int[] parent = new int[n];
        parent[0] = -1;
        for (int j = 1; j < n; j++) {
            parent[j] = 0;
            for (int i = 1; i < n; i++) {
                if (i == j) {
                    continue;
                }
                if (in[i][j] > 0 && out[i][j] > 0) {
                    throw new InputException(where + ": regions '" + rn[i] + "' and '" + rn[j] + "' overlap: "
                        + in[i][j] + " of " + meshes[j].vertexCount() + " vertices of '" + rn[j] + "' lie inside '"
                        + rn[i] + "' and " + out[i][j] + " outside; regions must nest or be disjoint");
                }
                if (out[i][j] == 0 && out[j][i] == 0) {
                    throw new InputException(where + ": regions '" + rn[i] + "' and '" + rn[j]
                        + "' overlap: they occupy the same volume");
                }
                if (out[i][j] == 0 && (volumes[i] < volumes[parent[j]] || parent[j] == 0)) {
                    parent[j] = i;
                }
            }
        }
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                int[] c = i == j ? null : SurfaceCrossing.firstCrossing(meshes[i], meshes[j], ON_SURFACE_TOLERANCE);
                if (c != null) {
                    String which = i == 0 ? "region '" + rn[j] + "' crosses the outer shape '" + rn[0] + "'"
                        : j == 0 ? "region '" + rn[i] + "' crosses the outer shape '" + rn[0] + "'"
                        : "regions '" + rn[i] + "' and '" + rn[j] + "' cross";
                    throw new InputException(where + ": " + which + ": edge " + (c[0] + 1) + "-" + (c[1] + 1) + " of '"
                        + rn[j] + "' (1-based vertices) pierces facet " + (c[2] + 1) + " of '" + rn[i]
                        + "'; regions must nest or be disjoint");
                }
            }
        }
        return parent;
    }

    private static Path realPath(Path p) {
        try {
            return p.toRealPath();
        } catch (IOException | SecurityException e) {
            return p.toAbsolutePath().normalize();
        }
    }

    private static double sq(double x) {
        return x * x;
    }

    private static String base(Path p) {
        String fn = p.getFileName().toString();
        int dot = fn.lastIndexOf('.');
        return dot > 0 ? fn.substring(0, dot) : fn;
    }
}
