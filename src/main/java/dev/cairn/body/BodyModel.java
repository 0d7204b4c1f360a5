package dev.cairn.body;

import dev.cairn.io.InputException;
import dev.cairn.gravity.Constants;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.mass.MassProperties;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.EdgeTable;
import dev.cairn.mesh.MeshInspector;
import dev.cairn.mesh.MeshReport;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.SpinState;
import java.nio.file.Path;
import java.util.List;

/**
 * A loaded shape model with everything the commands need: the mesh in metres (outward-oriented when it could be
 * fixed), its check report, its density (if known), mass properties and spin state.
 */
public final class BodyModel {
    private final Path source;
    private final TriangleMesh mesh;
    private final EdgeTable edges;
    private final MeshReport report;
    private final List<String> warnings;
    private final String lengthUnit;
    private final double density;
    private final SpinState spin;
    private final ModelSidecar sidecar;
    private final dev.cairn.regions.RegionBody regions;
    private MassProperties massProperties;
    private PolyhedronField field;
    private dev.cairn.gravity.FieldSettings fieldSettings = dev.cairn.gravity.FieldSettings.AUTO;
    private final java.util.Map<Double, dev.cairn.gravity.HierarchicalField> fastFields = new java.util.HashMap<>();

    BodyModel(Path source, TriangleMesh mesh, EdgeTable edges, MeshReport report, List<String> warnings,
              String lengthUnit, double density, SpinState spin, ModelSidecar sidecar) {
        this(source, mesh, edges, report, warnings, lengthUnit, density, spin, sidecar, null);
    }

    /** As above, for a body description of density regions ({@code regions} non-null; density = bulk density). */
    BodyModel(Path source, TriangleMesh mesh, EdgeTable edges, MeshReport report, List<String> warnings,
              String lengthUnit, double density, SpinState spin, ModelSidecar sidecar,
              dev.cairn.regions.RegionBody regions) {
        this.regions = regions;
        this.source = source;
        this.mesh = mesh;
        this.edges = edges;
        this.report = report;
        this.warnings = warnings;
        this.lengthUnit = lengthUnit;
        this.density = density;
        this.spin = spin;
        this.sidecar = sidecar;
    }

    /**
     * The density regions when this body was loaded from a body description (.json), else null. For such a body
     * {@link #mesh()} is the outer shape, {@link #density()} the bulk density, {@link #massProperties()} and
     * {@link #gm()} the regions' totals, and {@link #fieldModel()} their superposition.
     */
    public dev.cairn.regions.RegionBody regions() {
        return regions;
    }

    /**
     * Every file this body was made of, in a fixed order: the OBJ and its sidecar (when read), or the body
     * description and each region's OBJ. A table fingerprints all of them, so a changed region file is noticed.
     */
    public List<Path> files() {
        List<Path> l = new java.util.ArrayList<>();
        l.add(source);
        if (regions != null) {
            for (dev.cairn.regions.RegionBody.Region r : regions.regions()) {
                l.add(r.shape());
            }
        } else if (sidecar != null) {
            l.add(ModelSidecar.pathFor(source));
        }
        return List.copyOf(l);
    }

    /** The OBJ file (or the body description file). */
    public Path source() {
        return source;
    }

    /** Display name: the sidecar's name or the file's base name. */
    public String name() {
        if (sidecar != null && sidecar.name != null) {
            return sidecar.name;
        }
        String fn = source.getFileName().toString();
        int dot = fn.lastIndexOf('.');
        return dot > 0 ? fn.substring(0, dot) : fn;
    }

    /** Mesh in metres; flipped to face outward when the file's facets faced inward. */
    public TriangleMesh mesh() {
        return mesh;
    }

    public EdgeTable edges() {
        return edges;
    }

    public MeshReport report() {
        return report;
    }

    /** Warnings met while loading (non-planar polygons, flipped orientation, unusual density, ...). */
    public List<String> warnings() {
        return warnings;
    }

    /** Length unit of the OBJ file ("m" or "km"). */
    public String lengthUnit() {
        return lengthUnit;
    }

    /** True when a density, mass or GM was given. */
    public boolean hasDensity() {
        return !Double.isNaN(density);
    }

    /** Density, kg/m^3 (NaN when none was given). */
    public double density() {
        return density;
    }

    public SpinState spin() {
        return spin;
    }

    /** The sidecar read beside the model, or null. */
    public ModelSidecar sidecar() {
        return sidecar;
    }

    /**
     * Mass properties at the model's density, or at 1 kg/m^3 when none was given (mass then equals volume). For a body
     * description: the regions combined, inertia about the combined centre of mass.
     */
    public synchronized MassProperties massProperties() {
        if (massProperties == null && regions != null) {
            massProperties = regions.massProperties();
        }
        if (massProperties == null) {
            massProperties = MassPropertiesCalculator.compute(mesh, hasDensity() ? density : 1.0);
        }
        return massProperties;
    }

    /** {@code G·M}, m^3/s^2 (NaN without a density). */
    public double gm() {
        return hasDensity() ? Constants.G * density * massProperties().volume() : Double.NaN;
    }

    /**
     * The constant-density polyhedron field of this model (a body description: the outer shape at the bulk density,
     * which has the right GM but not the regions' field; use {@link #fieldModel()} for that).
     *
     * @throws InputException when the surface is not fit for the polyhedron field or no density was given
     */
    public synchronized PolyhedronField polyhedronField() {
        if (field == null) {
            requireFitForGravity();
            requireDensity();
            field = new PolyhedronField(mesh, edges, density);
        }
        return field;
    }

    /**
     * The gravity field model of this body as loaded: the constant-density polyhedron for a plain shape model, the
     * superposition of the regions' polyhedra for a body description.
     * Every command that evaluates "the field of the body" calls this, so that other body kinds (e.g. several
     * density regions) plug in here.
     *
     * @throws InputException when the field cannot be built (surface not fit, no density)
     */
    public FieldModel fieldModel() {
        return fieldModel(Long.MAX_VALUE);
    }

    /**
     * As {@link #fieldModel()} for a job of about {@code points} field points: with the automatic choice of
     * {@link #fieldSettings()}, the hierarchical model only where it pays (large body, many points).
     */
    public synchronized FieldModel fieldModel(long points) {
        return fieldModel(points, false);
    }

    /** The field for a survey: {@link #fieldModel(long)} for one point per facet, all on the surface. */
    public FieldModel surfaceFieldModel() {
        return fieldModel(mesh.facetCount(), true);
    }

    private synchronized FieldModel fieldModel(long points, boolean onSurface) {
        if (regions != null) {
            return regions.superpositionField(fieldSettings, points, onSurface);
        }
        PolyhedronField exact = polyhedronField();
        if (!fieldSettings.hierarchical(mesh.facetCount(), points, onSurface)) {
            return exact;
        }
        double tol = fieldSettings.effectiveTolerance();
        return fastFields.computeIfAbsent(tol, t -> new dev.cairn.gravity.HierarchicalField(mesh, exact, t,
            dev.cairn.util.ParallelChunks.defaultThreads()));
    }

    /** How the polyhedron field is evaluated (exact, or hierarchical at a tolerance; default automatic). */
    public synchronized dev.cairn.gravity.FieldSettings fieldSettings() {
        return fieldSettings;
    }

    /** Sets how {@link #fieldModel()} evaluates the polyhedron field. */
    public synchronized void useField(dev.cairn.gravity.FieldSettings settings) {
        this.fieldSettings = java.util.Objects.requireNonNull(settings);
    }

    /** Throws a one-line {@link InputException} when the surface is not closed, consistent and non-degenerate. */
    public void requireFitForGravity() {
        MeshInspector.requireFitForGravity(mesh, report, source.toString(), new java.util.ArrayList<>());
    }

    /** Throws a one-line {@link InputException} when no density, mass or GM is known. */
    public void requireDensity() {
        if (!hasDensity()) {
            throw new InputException(source + ": no density known: give --density, --gm or --mass, or put "
                + "density_kg_m3 in " + ModelSidecar.pathFor(source).getFileName());
        }
    }
}
