package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.gravity.Constants;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.mascon.SurfaceQuery;
import dev.cairn.mass.MassProperties;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.SpinState;
import java.nio.file.Path;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegrator;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegratorFactory;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Equilibrium points of rotating bodies against Kepler's third law and the ellipsoid's exterior closed form. */
class EquilibriaTest {
    private static final double RHO = 2000;
    private static final double G = Constants.G;
    /** 60-point Gauss–Legendre rule on [0, 1], built once. */
    private static final GaussIntegrator GL60 = new GaussIntegratorFactory().legendreHighPrecision(60, 0, 1);

    @TempDir
    Path dir;

    private static EquilibriaCommand.Result search(TriangleMesh mesh, FieldModel field, double period, int grid) {
        MassProperties mp = MassPropertiesCalculator.compute(mesh, RHO);
        return EquilibriaCommand.search(field, mp.gm(), mp.centerOfMass(), mp.brillouinRadius(),
            new SpinState(period, new double[] {0, 0, 1}), new SurfaceQuery(mesh), grid, 2);
    }

    /**
     * A near-sphere has a near-degenerate ring of equilibria at the synchronous radius r = (GM/ω²)^{1/3} (Kepler's
     * third law with the spin period; shared references §8), plus the centre (inside).
     */
    @Test
    void nearSphereRingAtTheSynchronousRadius() {
        TriangleMesh s = Shapes.icosphere(3, 1000);
        double gm = MassPropertiesCalculator.compute(s, RHO).gm();
        double sync = 2500;
        double period = 2 * Math.PI * Math.sqrt(sync * sync * sync / gm);
        EquilibriaCommand.Result r = search(s, new PolyhedronField(s, RHO), period, 20);
        assertEquals(sync, r.syncRadius(), 1e-9 * sync);
        int ring = 0;
        double worst = 0;
        boolean centre = false;
        for (EquilibriaCommand.Point p : r.points()) {
            if (p.inside()) {
                centre |= p.distance() < 1e-6 * sync;
                continue;
            }
            ring++;
            worst = Math.max(worst, Math.abs(p.distance() / sync - 1));
            assertTrue(Math.abs(p.position()[2]) < 1e-6 * sync, "in the equatorial plane");
            assertTrue(p.nearDegenerate(), "ring points are near-degenerate");
        }
        assertTrue(ring >= 1, "found at least one ring point");
        assertTrue(centre, "the centre is an equilibrium inside");
        // The polyhedral sphere's non-spherical terms start at degree 6 (icosahedral symmetry): (R/r)^6 ~ 4e-3 times
        // a small coefficient, so the ring radius matches to well below 1e-4.
        assertTrue(worst < 1e-4, "ring radius relative error " + worst);
        TestShapes.achieved("equilibria near-sphere ring radius vs (GM/w^2)^(1/3), relative error", worst);
    }

    /**
     * Rotating triaxial ellipsoid 3, 2, 1 km: the long-axis equilibrium against an independent root of
     * g_x(x, 0, 0) + ω² x = 0 with the exterior closed form g_x = −2πGρabc A_x(λ) x, λ = x² − a² (shared references
     * §3, §8), A_x by Gauss–Legendre after the substitution a² + u = (a² + λ)/τ²; converging with refinement; the
     * long-axis point is unstable of saddle type (Scheeres 1994, references §8).
     */
    @Test
    void ellipsoidLongAxisEquilibrium() {
        double a = 3000;
        double b = 2000;
        double c = 1000;
        double period = 9 * 3600.0;
        double w = 2 * Math.PI / period;
        // sanity check of the independent A_x against references §3: abc·A_x(0) = 0.3126014 for 3, 2, 1
        assertEquals(0.3126014, 6 * ax(3, 2, 1, 0), 1e-7);
        double x0 = new BrentSolver(1e-12, 1e-14).solve(200, x -> -2 * Math.PI * G * RHO * a * b * c
            * ax(a, b, c, x * x - a * a) * x + w * w * x, a * 1.0001, 20 * a);
        // intermediate axis: g_y(0, y, 0) + ω² y = 0, g_y = −2πGρabc A_y(λ) y, λ = y² − b² (A_y: a and b swapped)
        double y0 = new BrentSolver(1e-12, 1e-14).solve(200, y -> -2 * Math.PI * G * RHO * a * b * c
            * ax(b, a, c, y * y - b * b) * y + w * w * y, b * 1.0001, 20 * a);
        double prev = Double.NaN;
        for (int level = 4; level <= 5; level++) {
            TriangleMesh e = Shapes.ellipsoid(level, a, b, c);
            PolyhedronField exact = new PolyhedronField(e, RHO);
            EquilibriaCommand.Result r = search(e, exact, period, 12);
            EquilibriaCommand.Point px = null;
            for (EquilibriaCommand.Point p : r.points()) {
                if (p.position()[0] > a && Math.abs(p.position()[1]) < 1e-3 * a) {
                    px = p;
                }
            }
            assertTrue(px != null, "long-axis equilibrium found at level " + level);
            double err = Math.abs(px.position()[0] / x0 - 1);
            EquilibriaCommand.Point py = null;
            for (EquilibriaCommand.Point p : r.points()) {
                if (p.position()[1] > b && Math.abs(p.position()[0]) < 1e-3 * a) {
                    py = p;
                }
            }
            assertTrue(py != null, "intermediate-axis equilibrium found at level " + level);
            if (level == 5) {
                double ey = Math.abs(py.position()[1] / y0 - 1);
                assertTrue(ey < 1e-3, "intermediate axis relative error " + ey);
                TestShapes.achieved("equilibria ellipsoid 3,2,1 km intermediate-axis point vs closed-form root, "
                    + "relative error", ey);
                assertTrue(err < 0.5 * prev, "converges with refinement: " + err + " after " + prev);
                assertTrue(err < 1e-3, "relative error " + err);
                assertFalse(px.stable(), "long-axis point is unstable");
                assertTrue(px.type().startsWith("unstable") && px.type().contains("saddle"), px.type());
                assertFalse(px.inside());
                assertTrue(px.altitude() > 0);
                TestShapes.achieved("equilibria ellipsoid 3,2,1 km long-axis point (20480 facets) vs closed-form "
                    + "root, relative error", err);
                System.out.println("[info] ellipsoid equilibria: " + r.points().stream().map(p -> String.format(
                    java.util.Locale.ROOT, "(%.1f, %.1f, %.1f) %s", p.position()[0], p.position()[1], p.position()[2],
                    p.type())).toList());
            }
            prev = err;
        }
    }

    /** A_x(λ) = ∫_λ^∞ du/((a²+u)Δ(u)) (references §3) by 60-point Gauss–Legendre in τ, a² + u = (a² + λ)/τ². */
    private static double ax(double a, double b, double c, double lambda) {
        double s = a * a + lambda;
        return GL60.integrate(t -> {
            double u = s / (t * t) - a * a;
            return t == 0 ? 0 : 2 / Math.sqrt(s) / Math.sqrt((b * b + u) * (c * c + u));
        });
    }

    /** A body without spin has no equilibria: one-line error, exit 2. */
    @Test
    void zeroSpinIsOneLineError() throws Exception {
        Path box = TestShapes.writeObj(Shapes.box(0, 0, 0, 2, 1, 1), dir.resolve("box.obj"));
        CliRun r = CliRun.of("equilibria", box.toString(), "--density", "2000");
        assertEquals(2, r.exit(), r.err());
        assertTrue(r.oneLineError() && r.err().contains("does not spin"), r.err());
        CliRun ok = CliRun.of("equilibria", box.toString(), "--density", "2000", "--spin-period", "3h", "--json",
            "--grid", "16");
        assertEquals(0, ok.exit(), ok.err());
        Path out = dir.resolve("maps");
        CliRun maps = CliRun.of("equilibria", box.toString(), "--density", "2000", "--spin-period", "3h", "--grid",
            "16", "--out", out.toString(), "--jacobi", "-1e-4", "--map-size", "120");
        assertEquals(0, maps.exit(), maps.err());
        for (String f : new String[] {"equilibria.json", "map-equatorial.png", "map-meridian-1.png",
            "map-meridian-2.png"}) {
            assertTrue(java.nio.file.Files.size(out.resolve(f)) > 0, f);
        }
        java.awt.image.BufferedImage img = javax.imageio.ImageIO.read(out.resolve("map-equatorial.png").toFile());
        assertTrue(img.getWidth() > 120 && img.getHeight() > 120, "a readable PNG with the map and its margins");
        CliRun bad = CliRun.of("equilibria", box.toString(), "--density", "2000", "--spin-period", "3h",
            "--map-size", "5");
        assertEquals(2, bad.exit());
        assertTrue(bad.oneLineError(), bad.err());
        assertTrue(ok.out().contains("\"points\"") && ok.out().contains("\"jacobi_m2_s2\"")
            && ok.out().contains("\"eigenvalues\"") && ok.out().contains("\"stable\"")
            && ok.out().contains("\"inside\""), ok.out());
    }
}
