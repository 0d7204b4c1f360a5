package dev.cairn.regions;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.gravity.Constants;
import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.body.BodyModel;
import dev.cairn.body.ModelLoader;
import dev.cairn.body.ModelRequest;
import dev.cairn.mascon.MasconGenerator;
import dev.cairn.mascon.MasconSet;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ProgressListener;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Bodies of several density regions: superposition, the shell theorem, solving a density, a depth gradient. */
class RegionFieldTest {
    /** Superposition of fields (linear in density) reproduces a single body: issue requirement. */
    private static final double SUPERPOSITION_TOL = 1e-12;
    /**
     * Departure of a level-3 icosphere's exterior field from a point mass (its discretisation error; measured 5.5e-7
     * in U and 2.5e-6 in g at r = 2R for one sphere): tolerance for the shell theorem.
     */
    private static final double SHELL_U_TOL = 1e-6;
    private static final double SHELL_G_TOL = 5e-6;
    /** Volume deficit of a level-3 icosphere against its circumscribed sphere (0.86 %). */
    private static final double ICOSPHERE_VOLUME_DEFICIT = 0.01;

    @TempDir
    Path dir;

    private static double[] at(FieldModel f, double x, double y, double z) {
        double[] out = new double[FieldSample.SIZE];
        f.newEvaluator().evaluate(x, y, z, true, out, 0);
        return out;
    }

    private static final double[][] POINTS = {{3000, 200, -100}, {-500, 2500, 900}, {100, -200, 2400},
        {1200, 300, -400}, {0, 0, 0}};

    @Test
    void equalDensitiesGiveTheSingleBodyField() throws Exception {
        // Superposition: outer at ρ plus inner at ρ − ρ = 0 is the homogeneous body (linearity of Newtonian gravity).
        TriangleMesh outer = Shapes.icosphere(2, 2000);
        TriangleMesh inner = Shapes.box(-300, -500, -200, 600, 400, 700);
        TestFiles.obj(dir, "outer.obj", outer);
        TestFiles.obj(dir, "inner.obj", inner);
        Path desc = TestFiles.json(dir, "body.json", "{\"regions\": ["
            + "{\"name\": \"mantle\", \"shape\": \"outer.obj\", \"density_kg_m3\": 1900},"
            + "{\"name\": \"block\", \"shape\": \"inner.obj\", \"density_kg_m3\": 1900}]}");
        BodyModel body = ModelLoader.load(desc, ModelRequest.DEFAULTS);
        assertNotNull(body.regions());
        FieldModel single = new PolyhedronField(outer, 1900);
        for (double[] p : POINTS) {
            double[] a = at(body.fieldModel(), p[0], p[1], p[2]);
            double[] b = at(single, p[0], p[1], p[2]);
            double gn = FieldSample.accelerationNorm(b, 0) + 1e-300;
            assertEquals(b[FieldSample.U], a[FieldSample.U], SUPERPOSITION_TOL * b[FieldSample.U]);
            for (int k = FieldSample.AX; k <= FieldSample.AZ; k++) {
                assertEquals(b[k], a[k], SUPERPOSITION_TOL * Math.max(gn, 1e-6));
            }
        }
        assertEquals(single.gm(), body.gm(), SUPERPOSITION_TOL * single.gm());
    }

    @Test
    void contrastSumEqualsTheDirectSumOfDisjointPieces() throws Exception {
        // The same body built two ways: outer at ρ1 + inner at (ρ2 − ρ1), against the shell (outer with an inward
        // facing cavity) at ρ1 plus the inner at ρ2. Linearity of the potential in the density.
        TriangleMesh outer = Shapes.icosphere(2, 2000);
        TriangleMesh inner = Shapes.box(-300, -500, -200, 600, 400, 700);
        TestFiles.obj(dir, "outer.obj", outer);
        TestFiles.obj(dir, "inner.obj", inner);
        Path desc = TestFiles.json(dir, "body.json", "{\"regions\": ["
            + "{\"name\": \"mantle\", \"shape\": \"outer.obj\", \"density_kg_m3\": 1500},"
            + "{\"name\": \"block\", \"shape\": \"inner.obj\", \"density_kg_m3\": 4200}]}");
        BodyModel body = ModelLoader.load(desc, ModelRequest.DEFAULTS);
        FieldModel shell = new PolyhedronField(TestFiles.union(outer, inner.flipped()), 1500);
        FieldModel block = new PolyhedronField(inner, 4200);
        for (double[] p : POINTS) {
            double[] a = at(body.fieldModel(), p[0], p[1], p[2]);
            double[] s = at(shell, p[0], p[1], p[2]);
            double[] b = at(block, p[0], p[1], p[2]);
            double u = s[FieldSample.U] + b[FieldSample.U];
            assertEquals(u, a[FieldSample.U], SUPERPOSITION_TOL * u);
            double scale = Math.abs(s[FieldSample.AX]) + Math.abs(b[FieldSample.AX]) + Math.abs(s[FieldSample.AY])
                + Math.abs(b[FieldSample.AY]) + Math.abs(s[FieldSample.AZ]) + Math.abs(b[FieldSample.AZ]);
            for (int k = FieldSample.AX; k <= FieldSample.GZZ; k++) {
                if (k == FieldSample.LAPLACIAN) {
                    continue;
                }
                assertEquals(s[k] + b[k], a[k], SUPERPOSITION_TOL * (k <= FieldSample.AZ ? scale : 1e-4),
                    "slot " + k);
            }
        }
        // Mass: ρ1 (V_outer − V_inner) + ρ2 V_inner.
        double vo = MassPropertiesCalculator.unitDensity(outer).volume();
        double vi = MassPropertiesCalculator.unitDensity(inner).volume();
        assertEquals(1500 * (vo - vi) + 4200 * vi, body.massProperties().mass(), 1e-12 * 1500 * vo);
    }

    @Test
    void concentricDenserCoreActsAsAPointMassOutside() throws Exception {
        // Shell theorem (Newton, Principia I, prop. 71; any mechanics text): outside a spherically layered body,
        // U = GM/r and g = −GM r/r^3.
        double r1 = 1000;
        double r2 = 450;
        TestFiles.obj(dir, "outer.obj", Shapes.icosphere(3, r1));
        TestFiles.obj(dir, "core.obj", Shapes.icosphere(3, r2));
        Path desc = TestFiles.json(dir, "body.json", "{\"regions\": ["
            + "{\"name\": \"mantle\", \"shape\": \"outer.obj\", \"density_kg_m3\": 1500},"
            + "{\"name\": \"core\", \"shape\": \"core.obj\", \"density_kg_m3\": 5000}]}");
        BodyModel body = ModelLoader.load(desc, ModelRequest.DEFAULTS);
        double gm = body.gm();
        double sphereGm = Constants.G * 4 * Math.PI / 3 * (1500 * r1 * r1 * r1 + 3500 * r2 * r2 * r2);
        assertEquals(sphereGm, gm, ICOSPHERE_VOLUME_DEFICIT * sphereGm, "GM of the true spheres");
        double[][] dirs = {{1, 0, 0}, {0, 1, 0}, {0, 0, -1}, {0.6, 0.48, 0.64}, {-0.36, 0.48, -0.8}};
        for (double r : new double[] {2 * r1, 3 * r1}) {
            for (double[] d : dirs) {
                double[] s = at(body.fieldModel(), r * d[0], r * d[1], r * d[2]);
                assertEquals(gm / r, s[FieldSample.U], SHELL_U_TOL * gm / r, "U = GM/r");
                double g = gm / (r * r);
                for (int k = 0; k < 3; k++) {
                    assertEquals(-g * d[k], s[FieldSample.AX + k], SHELL_G_TOL * g, "g = -GM r/r^3");
                }
            }
        }
        // The mascon route sees the same mass (lattice with region densities).
        MasconSet set = MasconGenerator.lattice(body.regions().densityModel(), 100, 3, 2, ProgressListener.NONE);
        assertEquals(body.massProperties().mass(), set.totalMass(), 1e-3 * body.massProperties().mass(),
            "lattice mascons with region densities");
    }

    @Test
    void solvesOneRegionsDensityFromGm() throws Exception {
        // Mass balance: GM/G = ρ_mantle (V_o − V_c) + ρ_core V_c, solved for ρ_core.
        TriangleMesh outer = Shapes.icosphere(2, 1000);
        TriangleMesh core = TestFiles.shifted(Shapes.icosphere(2, 300), 100, 0, -50);
        TestFiles.obj(dir, "outer.obj", outer);
        TestFiles.obj(dir, "core.obj", core);
        double vo = MassPropertiesCalculator.unitDensity(outer).volume();
        double vc = MassPropertiesCalculator.unitDensity(core).volume();
        double gm = Constants.G * (1400 * (vo - vc) + 3300 * vc);
        Path desc = TestFiles.json(dir, "body.json", "{\"regions\": ["
            + "{\"name\": \"mantle\", \"shape\": \"outer.obj\", \"density_kg_m3\": 1400},"
            + "{\"name\": \"core\", \"shape\": \"core.obj\"}], \"measured_gm_m3_s2\": " + gm
            + ", \"solve_density_of\": \"core\"}");
        BodyModel body = ModelLoader.load(desc, ModelRequest.DEFAULTS);
        assertEquals(3300, body.regions().regions().get(1).density(), 1e-9);
        assertEquals(gm, body.gm(), 1e-12 * gm);
        assertTrue(body.warnings().stream().anyMatch(w -> w.contains("solved")));
    }

    @Test
    void depthGradientAddsItsIntegralToTheMasconMass() throws Exception {
        // ρ = ρ0 + k·depth in a sphere of radius R: extra mass k ∫(R − r) dV = k π R^4 / 3 (elementary integral).
        double r = 1000;
        double k = 1.0;
        TriangleMesh sphere = Shapes.icosphere(3, r);
        TestFiles.obj(dir, "s.obj", sphere);
        Path desc = TestFiles.json(dir, "body.json", "{\"regions\": [{\"name\": \"all\", \"shape\": \"s.obj\", "
            + "\"density_kg_m3\": 1000, \"density_gradient_kg_m3_per_m\": " + k + "}]}");
        BodyModel body = ModelLoader.load(desc, ModelRequest.DEFAULTS);
        MasconSet set = MasconGenerator.lattice(body.regions().densityModel(), 100, 2, 2, ProgressListener.NONE);
        double extra = set.totalMass() - 1000 * MassPropertiesCalculator.unitDensity(sphere).volume();
        double expected = k * Math.PI * Math.pow(r, 4) / 3;
        // Tolerance: the polyhedral sphere (0.86 % less volume, 4/3 of it weighted to depth) and the lattice.
        assertEquals(expected, extra, 0.03 * expected, "mass added by the depth gradient");
        org.junit.jupiter.api.Assertions.assertThrows(dev.cairn.io.InputException.class, body::fieldModel,
            "the polyhedron route refuses a gradient");
    }
}
