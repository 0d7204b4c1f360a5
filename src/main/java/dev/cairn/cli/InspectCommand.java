package dev.cairn.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.cairn.body.BodyModel;
import dev.cairn.mass.MassProperties;
import dev.cairn.mesh.MeshReport;
import java.io.PrintWriter;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code cairn inspect}: mesh checks and mass properties of a shape model. */
@Command(name = "inspect", mixinStandardHelpOptions = true,
    header = "Check a shape model and report its mass properties.",
    description = {"Check a shape model and report its mass properties (SI units, model frame).",
        "Inertia is about the centre of mass, model axes."})
public final class InspectCommand implements Callable<Integer> {
    @Mixin
    ModelOptions model = new ModelOptions();

    @Option(names = "--json", description = "Print one JSON object instead of the text report.")
    boolean json;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        BodyModel body = model.load(null);
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        for (String w : body.warnings()) {
            err.println("cairn: warning: " + w);
        }
        MeshReport r = body.report();
        MassProperties mp = body.massProperties();
        if (json) {
            ObjectMapper m = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
            out.println(m.writeValueAsString(toJson(body, r, mp)));
        } else {
            printText(out, body, r, mp);
        }
        out.flush();
        return 0;
    }

    static Map<String, Object> toJson(BodyModel body, MeshReport r, MassProperties mp) {
        Map<String, Object> j = new LinkedHashMap<>();
        j.put("model", body.source().toString());
        j.put("length_unit", body.lengthUnit());
        j.put("facets", r.facets());
        j.put("vertices", r.vertices());
        j.put("edges", r.edges());
        j.put("closed", r.closed());
        j.put("consistently_oriented", r.inconsistentEdges() == 0);
        j.put("fit_for_gravity", r.fitForGravity());
        j.put("boundary_edges", r.boundaryEdges());
        j.put("non_manifold_edges", r.nonManifoldEdges());
        j.put("inconsistent_edges", r.inconsistentEdges());
        j.put("degenerate_facets", r.degenerateFacets());
        j.put("sliver_facets", r.sliverFacets());
        j.put("duplicate_vertices", r.duplicateVertices());
        j.put("unused_vertices", r.unusedVertices());
        j.put("components", r.components());
        j.put("euler_characteristic", r.eulerCharacteristic());
        j.put("genus", r.genus());
        j.put("bounding_box_m", r.boundingBox());
        j.put("volume_m3", mp.volume());
        j.put("surface_area_m2", mp.surfaceArea());
        boolean known = body.hasDensity();
        j.put("density_kg_m3", known ? mp.density() : null);
        j.put("mass_kg", known ? mp.mass() : null);
        j.put("gm_m3_s2", known ? mp.gm() : null);
        j.put("center_of_mass_m", mp.centerOfMass());
        j.put("inertia_kg_m2", known ? rows(mp.inertia()) : null);
        j.put("principal_moments_kg_m2", known ? mp.principalMoments() : null);
        j.put("principal_axes", rows(mp.principalAxes()));
        j.put("equivalent_radius_m", mp.equivalentRadius());
        j.put("brillouin_radius_m", mp.brillouinRadius());
        j.put("spin_period_s", Double.isInfinite(body.spin().periodSeconds()) ? null : body.spin().periodSeconds());
        j.put("spin_axis", body.spin().axis());
        j.put("warnings", body.warnings());
        return j;
    }

    private static double[][] rows(double[] m) {
        return new double[][] {{m[0], m[1], m[2]}, {m[3], m[4], m[5]}, {m[6], m[7], m[8]}};
    }

    private static void printText(PrintWriter out, BodyModel body, MeshReport r, MassProperties mp) {
        out.printf(Locale.ROOT, "Model        %s (length unit %s)%n", body.source(), body.lengthUnit());
        out.printf(Locale.ROOT, "Mesh         %d vertices, %d facets, %d edges%n", r.vertices(), r.facets(), r.edges());
        out.printf(Locale.ROOT, "Surface      %s, %s; %d component(s), Euler characteristic %d, genus %s%n",
            r.closed() ? "closed" : "OPEN (" + r.boundaryEdges() + " boundary, " + r.nonManifoldEdges()
                + " non-manifold edges)",
            r.inconsistentEdges() == 0 ? "consistently oriented" : r.inconsistentEdges() + " inconsistently oriented edges",
            r.components(), r.eulerCharacteristic(), r.genus() < 0 ? "n/a" : String.valueOf(r.genus()));
        out.printf(Locale.ROOT, "Facets       %d degenerate (zero area), %d slivers%n", r.degenerateFacets(),
            r.sliverFacets());
        out.printf(Locale.ROOT, "Vertices     %d duplicate, %d unused%n", r.duplicateVertices(), r.unusedVertices());
        double[] b = r.boundingBox();
        out.printf(Locale.ROOT, "Bounding box x [%.6g, %.6g] y [%.6g, %.6g] z [%.6g, %.6g] m%n", b[0], b[3], b[1], b[4],
            b[2], b[5]);
        out.printf(Locale.ROOT, "Gravity      %s%n", r.fitForGravity() ? "fit for the polyhedron field"
            : "NOT fit for the polyhedron field (see above)");
        out.printf(Locale.ROOT, "Volume       %.9g m^3%n", mp.volume());
        out.printf(Locale.ROOT, "Area         %.9g m^2%n", mp.surfaceArea());
        out.printf(Locale.ROOT, "Eq. radius   %.6g m (sphere of equal volume)%n", mp.equivalentRadius());
        double[] c = mp.centerOfMass();
        out.printf(Locale.ROOT, "Centre of mass [%.6g, %.6g, %.6g] m%n", c[0], c[1], c[2]);
        out.printf(Locale.ROOT, "Brillouin radius %.6g m (about the centre of mass)%n", mp.brillouinRadius());
        if (body.hasDensity()) {
            out.printf(Locale.ROOT, "Density      %.6g kg/m^3%n", mp.density());
            out.printf(Locale.ROOT, "Mass         %.9g kg, GM %.9g m^3/s^2%n", mp.mass(), mp.gm());
            double[] in = mp.inertia();
            out.printf(Locale.ROOT, "Inertia      [[%.6g, %.6g, %.6g], [%.6g, %.6g, %.6g], [%.6g, %.6g, %.6g]] kg m^2"
                + " (about the centre of mass, model axes)%n", in[0], in[1], in[2], in[3], in[4], in[5], in[6], in[7], in[8]);
            double[] pm = mp.principalMoments();
            out.printf(Locale.ROOT, "Principal    %.6g, %.6g, %.6g kg m^2%n", pm[0], pm[1], pm[2]);
        } else {
            out.println("Density      not given (use --density, --gm or --mass, or the model sidecar)");
        }
        double[] ax = mp.principalAxes();
        for (int k = 0; k < 3; k++) {
            out.printf(Locale.ROOT, "Axis %d       [%.6f, %.6f, %.6f]%n", k + 1, ax[3 * k], ax[3 * k + 1], ax[3 * k + 2]);
        }
        if (!Double.isInfinite(body.spin().periodSeconds())) {
            double[] s = body.spin().axis();
            out.printf(Locale.ROOT, "Spin         period %.6g s (%.4g h), pole [%.4f, %.4f, %.4f]%n",
                body.spin().periodSeconds(), body.spin().periodSeconds() / 3600, s[0], s[1], s[2]);
        }
    }
}
