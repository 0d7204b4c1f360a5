package dev.cairn.regions;

import dev.cairn.gravity.Constants;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.io.InputException;
import dev.cairn.mascon.DensityModel;
import dev.cairn.mascon.SurfaceQuery;
import dev.cairn.mass.MassProperties;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.EdgeTable;
import dev.cairn.mesh.TriangleMesh;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * A body of nested constant-density regions, checked and ready: region 0 is the outer shape; every other region
 * lies inside its parent (the smallest region containing it). Built by {@link RegionBodyLoader}.
 *
 * <p>Fields: {@link #superpositionField()} (polyhedron route: outer shape at its density, each inner region at its
 * density minus its parent's) and {@link #densityModel()} (mascon route: the density of the innermost region holding
 * a point, plus an optional gradient with depth below the outer surface). SI units, model frame, U &gt; 0, g = ∇U.
 */
public final class RegionBody {
    /** One checked region. */
    public record Region(String name, Path shape, TriangleMesh mesh, EdgeTable edges, double density,
                         double gradient, int parent, int depth, double volume) {
        /** Density contrast against the parent region (the outer region: its own density), kg/m^3. */
        double contrast(List<Region> all) {
            return parent < 0 ? density : density - all.get(parent).density;
        }
    }

    private final Path source;
    private final String name;
    private final List<Region> regions;
    private final SurfaceQuery[] queries;
    private MassProperties massProperties;
    private FieldModel field;
    private final java.util.Map<String, FieldModel> fastFields = new java.util.HashMap<>();

    private final BodyDescription description;
    private final String lengthUnit;

    RegionBody(Path source, String name, List<Region> regions, BodyDescription description, String lengthUnit) {
        this.description = description;
        this.lengthUnit = lengthUnit;
        this.source = source;
        this.name = name;
        this.regions = List.copyOf(regions);
        this.queries = new SurfaceQuery[regions.size()];
        for (int i = 0; i < queries.length; i++) {
            queries[i] = new SurfaceQuery(regions.get(i).mesh());
        }
    }

    /** The parsed description (as written in the file). */
    public BodyDescription description() {
        return description;
    }

    /** Length unit of the regions' OBJ files ("m" or "km"). */
    public String lengthUnit() {
        return lengthUnit;
    }

    /** The description file. */
    public Path source() {
        return source;
    }

    public String name() {
        return name;
    }

    /** The regions, outer shape first. */
    public List<Region> regions() {
        return regions;
    }

    /** The outer shape, metres. */
    public TriangleMesh outerMesh() {
        return regions.get(0).mesh();
    }

    /** True when some region has a density gradient (mascon route only). */
    public boolean hasGradient() {
        for (Region r : regions) {
            if (r.gradient() != 0) {
                return true;
            }
        }
        return false;
    }

    /** Total mass over the outer volume, kg/m^3. */
    public double bulkDensity() {
        return massProperties().mass() / regions.get(0).volume();
    }

    /** Total {@code G·M}, m^3/s^2 (constant region densities; a depth gradient is not included). */
    public double gm() {
        return Constants.G * massProperties().mass();
    }

    /**
     * The polyhedron route: sum of constant-density polyhedra (outer at its density, inner regions at their density
     * contrast against the containing region).
     *
     * @throws InputException when a region has a density gradient (only the mascon route can represent it)
     */
    public FieldModel superpositionField() {
        return superpositionField(dev.cairn.gravity.FieldSettings.EXACT, 0);
    }

    /**
     * The polyhedron route with each region's polyhedron evaluated as {@code settings} says for a job of
     * {@code points} points (the hierarchical model per region where it pays).
     */
    public FieldModel superpositionField(dev.cairn.gravity.FieldSettings settings, long points) {
        return superpositionField(settings, points, false);
    }

    /** As above; {@code onSurface} for a job whose points lie on the outer surface (a survey). */
    public synchronized FieldModel superpositionField(dev.cairn.gravity.FieldSettings settings, long points,
                                                      boolean onSurface) {
        FieldModel exactSum = exactSuperposition();
        boolean any = false;
        for (Region r : regions) {
            any |= settings.hierarchical(r.mesh().facetCount(), points, onSurface);
        }
        if (!any) {
            return exactSum;
        }
        String key = settings + (onSurface ? " surface" : "");
        if (fastFields.containsKey(key)) {
            return fastFields.get(key);
        }
        List<FieldModel> parts = new ArrayList<>();
        SuperpositionField exact = (SuperpositionField) exactSum;
        for (int i = 0; i < regions.size(); i++) {
            Region r = regions.get(i);
            dev.cairn.gravity.PolyhedronField pf = (dev.cairn.gravity.PolyhedronField) exact.part(i);
            parts.add(settings.hierarchical(r.mesh().facetCount(), points, onSurface)
                ? new dev.cairn.gravity.HierarchicalField(r.mesh(), pf, settings.effectiveTolerance(),
                    dev.cairn.util.ParallelChunks.defaultThreads())
                : pf);
        }
        FieldModel f = new SuperpositionField(parts, exact.describe() + String.format(Locale.ROOT,
            "; hierarchical where it pays, tolerance %.1e per region", settings.effectiveTolerance()));
        fastFields.put(key, f);
        return f;
    }

    private FieldModel exactSuperposition() {
        if (field == null) {
            if (hasGradient()) {
                throw new InputException(source + ": a density gradient (density_gradient_kg_m3_per_m) is only "
                    + "modelled by mascons: use --model mascon");
            }
            List<FieldModel> parts = new ArrayList<>();
            StringBuilder d = new StringBuilder("superposition of " + regions.size() + " constant-density polyhedra (");
            for (int i = 0; i < regions.size(); i++) {
                Region r = regions.get(i);
                double c = r.contrast(regions);
                parts.add(new PolyhedronField(r.mesh(), r.edges(), c));
                d.append(i == 0 ? "" : ", ").append(r.name()).append(' ')
                    .append(String.format(Locale.ROOT, "%.6g", r.density())).append(" kg/m^3");
            }
            field = new SuperpositionField(parts, d.append(')').toString());
        }
        return field;
    }

    /** The mascon route's density: innermost region's density plus its gradient times the depth. */
    public DensityModel densityModel() {
        double uniform = regions.get(0).density();
        for (Region r : regions) {
            if (r.density() != uniform || r.gradient() != 0) {
                uniform = Double.NaN;
            }
        }
        final double uni = uniform;
        return new RegionDensity(uni, null);
    }

    /** Density of the regions; with {@code local} non-null, valid only near the point it was made for. */
    private final class RegionDensity implements DensityModel {
        private final double uni;
        private final SurfaceQuery.Local[] local;
        private final boolean gradient = hasGradient();

        RegionDensity(double uni, SurfaceQuery.Local[] local) {
            this.uni = uni;
            this.local = local;
        }

        @Override
        public DensityModel near(double x, double y, double z, double radius) {
            SurfaceQuery.Local[] l = new SurfaceQuery.Local[queries.length];
            for (int i = 0; i < l.length; i++) {
                // With a gradient the depth below the outer surface must stay exact (no far-mode lower bound).
                l[i] = local != null ? local[i].near(x, y, z, radius)
                    : queries[i].near(x, y, z, radius, i == 0 && gradient);
            }
            return new RegionDensity(uni, l);
        }

        @Override
        public void query(double x, double y, double z, double[] out) {
            double best = Double.POSITIVE_INFINITY;
            int inner = -1;
            double depth = 0;
            for (int i = 0; i < queries.length; i++) {
                if (local != null) {
                    local[i].windingAndDistance(x, y, z, out);
                } else {
                    queries[i].windingAndDistance(x, y, z, out);
                }
                best = Math.min(best, out[1]);
                if (i == 0) {
                    depth = out[1];
                }
                if (out[0] > 0.5 && (inner < 0 || regions.get(i).depth() > regions.get(inner).depth())) {
                    inner = i;
                }
            }
            if (inner < 0) {
                out[0] = 0;
            } else {
                Region r = regions.get(inner);
                out[0] = r.density() + r.gradient() * depth;
            }
            out[1] = best;
        }

        @Override
        public TriangleMesh outerShape() {
            return outerMesh();
        }

        @Override
        public double uniformDensity() {
            return uni;
        }
}

    /**
     * Mass properties of the whole body (constant region densities): volume, area, equivalent and Brillouin radii of
     * the outer shape; mass, centre of mass and inertia (about the centre of mass) summed over the regions' density
     * contrasts; density = bulk density.
     */
    public synchronized MassProperties massProperties() {
        if (massProperties != null) {
            return massProperties;
        }
        MassProperties outer = MassPropertiesCalculator.compute(outerMesh(), regions.get(0).density());
        double[] ref = outer.centerOfMass();
        double mass = 0;
        double[] first = new double[3];
        double[] inertiaRef = new double[9];
        for (Region r : regions) {
            double c = r.contrast(regions);
            MassProperties mp = i(r, c);
            double m = mp.mass();
            double[] d = {mp.centerOfMass()[0] - ref[0], mp.centerOfMass()[1] - ref[1], mp.centerOfMass()[2] - ref[2]};
            mass += m;
            for (int k = 0; k < 3; k++) {
                first[k] += m * d[k];
            }
            addParallelAxis(inertiaRef, mp.inertia(), m, d, 1);
        }
        double[] dc = {first[0] / mass, first[1] / mass, first[2] / mass};
        addParallelAxis(inertiaRef, new double[9], mass, dc, -1);
        double[] com = {ref[0] + dc[0], ref[1] + dc[1], ref[2] + dc[2]};
        double[] moments = new double[3];
        double[] axes = new double[9];
        MassPropertiesCalculator.principal(inertiaRef, moments, axes);
        double[] v = outerMesh().xyz();
        double b = 0;
        for (int i = 0; i < v.length; i += 3) {
            double dx = v[i] - com[0];
            double dy = v[i + 1] - com[1];
            double dz = v[i + 2] - com[2];
            b = Math.max(b, dx * dx + dy * dy + dz * dz);
        }
        massProperties = new MassProperties(outer.volume(), outer.surfaceArea(), mass / outer.volume(), mass, com,
            inertiaRef, moments, axes, outer.equivalentRadius(), Math.sqrt(b));
        return massProperties;
    }

    private static MassProperties i(Region r, double density) {
        return MassPropertiesCalculator.compute(r.mesh(), density);
    }

    /** acc += sign·(I + m(|d|²·1 − d dᵀ)) for sign = 1; acc −= m(|d|²·1 − d dᵀ) for sign = −1 (I ignored). */
    private static void addParallelAxis(double[] acc, double[] inertia, double m, double[] d, int sign) {
        double d2 = d[0] * d[0] + d[1] * d[1] + d[2] * d[2];
        for (int a = 0; a < 3; a++) {
            for (int b = 0; b < 3; b++) {
                double shift = m * ((a == b ? d2 : 0) - d[a] * d[b]);
                acc[3 * a + b] += sign > 0 ? inertia[3 * a + b] + shift : -shift;
            }
        }
    }
}
