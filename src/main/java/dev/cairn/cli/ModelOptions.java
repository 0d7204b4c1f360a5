package dev.cairn.cli;

import dev.cairn.body.BodyModel;
import dev.cairn.io.InputException;
import dev.cairn.body.ModelLoader;
import dev.cairn.body.ModelRequest;
import java.nio.file.Path;
import java.nio.file.Paths;
import picocli.CommandLine.ArgGroup;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/**
 * Options shared by every command that reads a shape model: the model file (default: the bundled demo body),
 * its length unit and its density, mass or GM. Spin options live in {@link SpinOptions}.
 */
public final class ModelOptions {
    @Parameters(index = "0", arity = "0..1", paramLabel = "MODEL",
        description = "Shape model (OBJ) or body description of density regions (.json). Default: the bundled "
            + "demo body.")
    Path model;

    @Option(names = "--units", paramLabel = "m|km", description = "Length unit of the OBJ coordinates (default: "
        + "the sidecar's length_unit, else m).")
    String units;

    @ArgGroup(exclusive = true, multiplicity = "0..1")
    MassChoice mass;

    static final class MassChoice {
        @Option(names = "--density", paramLabel = "KG_M3", description = "Bulk density, kg/m^3.")
        Double density;
        @Option(names = "--gm", paramLabel = "M3_S2", description = "GM of the body, m^3/s^2 (sets the density).")
        Double gm;
        @Option(names = "--mass", paramLabel = "KG", description = "Mass of the body, kg (sets the density).")
        Double massKg;
    }

    @Option(names = "--debug", description = "Print stack traces on errors.")
    boolean debug;

    @Option(names = "--tolerance", paramLabel = "REL", description = "Relative tolerance on |g| and U of the "
        + "hierarchical (fast) polyhedron field, 1e-13 to 1e-2; giving it selects that model (default: 1e-10, used "
        + "for jobs of 1000 points or more on bodies of 4096 facets or more, surveys from 60000; docs/fast-field.md).")
    Double tolerance;

    @Option(names = "--exact", description = "Evaluate the polyhedron field by the exact direct sum (O(facets) per "
        + "point) instead of the hierarchical model.")
    boolean exact;

    /** The field settings these options ask for. */
    public dev.cairn.gravity.FieldSettings fieldSettings() {
        if (exact && tolerance != null) {
            throw new InputException("--exact and --tolerance exclude each other");
        }
        if (exact) {
            return dev.cairn.gravity.FieldSettings.EXACT;
        }
        if (tolerance == null) {
            return dev.cairn.gravity.FieldSettings.AUTO;
        }
        double t = tolerance;
        if (!(t >= dev.cairn.gravity.HierarchicalField.MIN_TOLERANCE
            && t <= dev.cairn.gravity.HierarchicalField.MAX_TOLERANCE)) {
            throw new InputException("--tolerance: " + t + " is outside 1e-13 to 1e-2");
        }
        return dev.cairn.gravity.FieldSettings.tolerance(t);
    }

    /** The bundled demo body: {@code $CAIRN_HOME/shape-models/} (set by tools/cairn), else ./shape-models/. */
    public static Path demoModel() {
        String home = System.getProperty("cairn.home");
        if (home == null) {
            home = System.getenv("CAIRN_HOME");
        }
        Path dir = home != null ? Paths.get(home, "shape-models") : Paths.get("shape-models");
        return dir.resolve(DEMO_MODEL_FILE);
    }

    /** File name of the bundled demo body in shape-models/. */
    public static final String DEMO_MODEL_FILE = "demo-bilobe.obj";

    /** The model path asked for, or the demo body. */
    public Path modelPath() {
        return model != null ? model : demoModel();
    }

    /** Builds the load request from these options and the given spin options (may be null). */
    public ModelRequest request(SpinOptions spin) {
        if (units != null && !units.equals("m") && !units.equals("km")) {
            throw new InputException("--units: unknown length unit '" + units + "' (use m or km)");
        }
        return new ModelRequest(units,
            mass == null ? null : mass.density,
            mass == null ? null : mass.gm,
            mass == null ? null : mass.massKg,
            spin == null ? null : spin.periodSeconds(),
            spin == null ? null : spin.axis());
    }

    /** Loads the model. */
    public BodyModel load(SpinOptions spin) {
        dev.cairn.gravity.FieldSettings settings = fieldSettings();
        BodyModel body = ModelLoader.load(modelPath(), request(spin));
        body.useField(settings);
        return body;
    }
}
