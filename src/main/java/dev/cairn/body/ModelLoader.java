package dev.cairn.body;

import dev.cairn.io.RunInputs;
import dev.cairn.io.Messages;
import dev.cairn.io.InputLimits;
import dev.cairn.io.InputFiles;
import dev.cairn.io.InputException;
import dev.cairn.gravity.Constants;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.EdgeTable;
import dev.cairn.mesh.MeshInspector;
import dev.cairn.mesh.MeshReport;
import dev.cairn.mesh.ObjReader;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.SpinState;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * Loads a shape model: reads {@code NAME.obj} (and {@code NAME.json} beside it when present), converts to metres,
 * inspects the mesh, turns an inward-facing closed surface outward, and settles density and spin from the request,
 * then the sidecar, then defaults (no density; no spin).
 */
public final class ModelLoader {
    /** See {@link InputLimits#DENSITY_WARN_LOW}. */
    public static final double DENSITY_WARN_LOW = InputLimits.DENSITY_WARN_LOW;
    /** See {@link InputLimits#DENSITY_WARN_HIGH}. */
    public static final double DENSITY_WARN_HIGH = InputLimits.DENSITY_WARN_HIGH;
    /** See {@link InputLimits#DENSITY_MIN}. */
    public static final double DENSITY_MIN = InputLimits.DENSITY_MIN;
    /** See {@link InputLimits#DENSITY_MAX}. */
    public static final double DENSITY_MAX = InputLimits.DENSITY_MAX;
    /**
     * Spin periods outside this range (seconds) are refused: 1 s is far below the fastest-spinning small bodies
     * (minutes), 1e12 s (about 32,000 years) is as good as no spin (common practice, no source).
     */
    public static final double SPIN_PERIOD_MIN_S = 1;
    public static final double SPIN_PERIOD_MAX_S = 1e12;

    private ModelLoader() {
    }

    /** Metres per model unit for "m" or "km". */
    public static double metresPer(String unit, String where) {
        return InputLimits.metresPer(unit, where);
    }

    /**
     * Loads {@code obj} with the given request. A path ending in {@code .json} is a body description of density
     * regions ({@link dev.cairn.regions.RegionBodyLoader}; a model's own sidecar is never passed as the model, it is
     * found beside its OBJ): the body's mesh is then the outer shape and its field the regions' superposition.
     */
    public static BodyModel load(Path obj, ModelRequest req) {
        requireRegularFile(obj, "model");
        RunInputs.register(obj);
        if (dev.cairn.regions.RegionBodyLoader.isDescription(obj)) {
            return loadDescription(obj, req);
        }
        Path sidecarPath = ModelSidecar.pathFor(obj);
        if (Files.exists(sidecarPath) && !Files.isRegularFile(sidecarPath)) {
            throw new InputException(Messages.path(sidecarPath) + ": not a regular file (the model's sidecar must be "
                + "a JSON file)");
        }
        ModelSidecar side = Files.isRegularFile(sidecarPath) && !sidecarPath.equals(obj)
            ? ModelSidecar.read(sidecarPath) : null;
        if (side != null) {
            RunInputs.register(sidecarPath);
        }
        String unit = req.lengthUnit() != null ? req.lengthUnit()
            : side != null && side.lengthUnit != null ? side.lengthUnit : "m";
        double scale = metresPer(unit, req.lengthUnit() != null ? "--units" : sidecarPath.toString());
        ObjReader.Result read = ObjReader.read(obj, scale);
        List<String> warnings = new ArrayList<>(read.warnings());
        TriangleMesh mesh = read.mesh();
        EdgeTable edges = EdgeTable.of(mesh);
        MeshReport report = MeshInspector.inspect(mesh, edges);
        TriangleMesh oriented = MeshInspector.orientOutward(mesh, edges, report, obj.toString(), warnings);
        if (oriented != mesh) {
            mesh = oriented;
            edges = EdgeTable.of(mesh);
            report = MeshInspector.inspect(mesh, edges);
        }
        MeshInspector.requireMeasurable(mesh, report, obj.toString());
        MeshInspector.requireNoSelfIntersection(mesh, report, obj.toString());
        double density = resolveDensity(obj, req, side, sidecarPath, mesh, warnings);
        SpinState spin = resolveSpin(req, side, sidecarPath);
        return new BodyModel(obj, mesh, edges, report, List.copyOf(warnings), unit, density, spin, side);
    }

    /**
     * Refuses a missing file or one that is not a regular file (a directory, device or FIFO), naming it.
     *
     * @param what e.g. "model", "points file"
     */
    public static void requireRegularFile(Path file, String what) {
        InputFiles.requireRegularFile(file, what);
    }

    /** A body description: regions' densities, outer shape as the mesh, spin from the description or request. */
    private static BodyModel loadDescription(Path file, ModelRequest req) {
        if (req.density() != null || req.mass() != null) {
            throw new InputException(file + ": --density and --mass do not apply to a body description (densities "
                + "come from its regions; --gm works with solve_density_of)");
        }
        List<String> warnings = new ArrayList<>();
        dev.cairn.regions.RegionBody rb = dev.cairn.regions.RegionBodyLoader.load(file, req.lengthUnit(), req.gm(),
            warnings);
        ModelSidecar view = new ModelSidecar();
        view.name = rb.name();
        view.lengthUnit = rb.lengthUnit();
        view.spinPeriodS = rb.description().spinPeriodS;
        view.spinAxis = rb.description().spinAxis;
        SpinState spin = resolveSpin(req, view, file);
        TriangleMesh outer = rb.outerMesh();
        EdgeTable edges = rb.regions().get(0).edges();
        return new BodyModel(file, outer, edges, MeshInspector.inspect(outer, edges), List.copyOf(warnings),
            rb.lengthUnit(), rb.bulkDensity(), spin, view, rb);
    }

    private static double resolveDensity(Path obj, ModelRequest req, ModelSidecar side, Path sidecarPath,
                                         TriangleMesh mesh, List<String> warnings) {
        int given = (req.density() != null ? 1 : 0) + (req.gm() != null ? 1 : 0) + (req.mass() != null ? 1 : 0);
        if (given > 1) {
            throw new InputException("give only one of --density, --gm and --mass");
        }
        Double density = req.density();
        Double gm = req.gm();
        Double mass = req.mass();
        String where = "command line";
        if (given == 0 && side != null) {
            int s = (side.densityKgM3 != null ? 1 : 0) + (side.gmM3S2 != null ? 1 : 0) + (side.massKg != null ? 1 : 0);
            if (s > 1) {
                throw new InputException(sidecarPath + ": give only one of density_kg_m3, gm_m3_s2 and mass_kg");
            }
            density = side.densityKgM3;
            gm = side.gmM3S2;
            mass = side.massKg;
            where = sidecarPath.toString();
        }
        if (density == null && gm == null && mass == null) {
            return Double.NaN;
        }
        double value = density != null ? density : gm != null ? gm : mass;
        String what = density != null ? "density" : gm != null ? "GM" : "mass";
        if (!(value > 0) || !Double.isFinite(value)) {
            throw new InputException(where + ": " + what + " must be a positive number, got " + value);
        }
        double rho;
        if (density != null) {
            rho = density;
        } else {
            double volume = MassPropertiesCalculator.unitDensity(mesh).volume();
            if (!(volume > 0)) {
                throw new InputException(obj + ": cannot derive a density from GM or mass: the enclosed volume is "
                    + volume + " m^3 (is the surface closed?)");
            }
            rho = gm != null ? gm / (Constants.G * volume) : mass / volume;
        }
        requireDensityInRange(rho, density != null ? where + ": density "
            : where + ": " + what + " " + value + " gives a density of ");
        if (rho < DENSITY_WARN_LOW || rho > DENSITY_WARN_HIGH) {
            warnings.add(where + ": density " + String.format(java.util.Locale.ROOT, "%.4g", rho)
                + " kg/m^3 is outside the usual 100-8000 kg/m^3 of small bodies; check the units");
        }
        return rho;
    }

    /**
     * Refuses a density outside [{@link #DENSITY_MIN}, {@link #DENSITY_MAX}] kg/m^3.
     *
     * @param prefix start of the message, e.g. {@code "--gm 1e308 gives a density of "} or {@code "file: density "}
     */
    public static void requireDensityInRange(double rho, String prefix) {
        InputLimits.requireDensityInRange(rho, prefix);
    }

    /** Refuses a spin period outside [{@link #SPIN_PERIOD_MIN_S}, {@link #SPIN_PERIOD_MAX_S}] seconds. */
    public static void requireSpinPeriodInRange(double period, String where) {
        if (!(period >= SPIN_PERIOD_MIN_S && period <= SPIN_PERIOD_MAX_S)) {
            throw new InputException(where + ": spin period must be between " + SPIN_PERIOD_MIN_S + " s and "
                + SPIN_PERIOD_MAX_S + " s, got " + period + " s");
        }
    }

    /** Refuses a spin axis that is not three finite numbers of non-zero length. */
    static void requireAxis(double[] axis, String where) {
        if (axis.length != 3) {
            throw new InputException(where + ": spin_axis must have 3 components");
        }
        double n = 0;
        for (double a : axis) {
            if (!Double.isFinite(a)) {
                throw new InputException(where + ": spin axis components must be finite numbers, got " + a);
            }
            n = Math.max(n, Math.abs(a));
        }
        if (!(n > 0)) {
            throw new InputException(where + ": spin axis must not be the zero vector");
        }
    }

    private static SpinState resolveSpin(ModelRequest req, ModelSidecar side, Path sidecarPath) {
        Double period = req.spinPeriod() != null ? req.spinPeriod() : side != null ? side.spinPeriodS : null;
        double[] axis = req.spinAxis() != null ? req.spinAxis()
            : side != null && side.spinAxis != null ? side.spinAxis : new double[] {0, 0, 1};
        requireAxis(axis, req.spinAxis() != null ? "--spin-axis" : sidecarPath.toString());
        if (period != null) {
            requireSpinPeriodInRange(period, req.spinPeriod() != null ? "--spin-period" : sidecarPath.toString());
        }
        try {
            return new SpinState(period == null ? Double.POSITIVE_INFINITY : period, axis);
        } catch (IllegalArgumentException e) {
            throw new InputException((req.spinAxis() != null ? "--spin-axis" : sidecarPath.toString()) + ": "
                + e.getMessage());
        }
    }
}
