package dev.cairn.mascon;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.mass.MassProperties;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ProgressListener;
import org.junit.jupiter.api.Test;

/**
 * Mascon sets whose masses are adjusted ({@link MasconMatch}) to the body's mass, centre of mass and inertia tensor.
 *
 * <p>References: the box's mass ρabc and inertia M(b²+c²)/12 etc. about its centre (handbook formulas for a
 * homogeneous rectangular block, e.g. Goldstein, Classical Mechanics, 3rd ed., §5.3 exercises), the lumpy body's
 * from the polyhedron integrals (Dobrovolskis 1996, via {@link MassPropertiesCalculator}); the far field from the
 * exact polyhedron field (Werner &amp; Scheeres 1997), itself checked against the Nagy et al. (2000) prism closed form
 * in {@code PrismClosedFormTest}. Physics: once mass and centre of mass agree the far-field error is the quadrupole
 * mismatch, falling as (R/r)²·ΔJ relative to GM/r²; with the quadrupole (the inertia up to its trace, which does not
 * enter the exterior field) matched too, the octupole and higher (MacCullagh's formula; e.g. Murray &amp; Dermott
 * 1999, Solar System Dynamics, §4.2).
 */
class MasconMomentMatchTest {
    private static final double RHO = 2000;
    /** Moments after adjustment: rounding of sums over up to 1e5 mascons (common practice, no source). */
    private static final double ROUNDING = 1e-12;
    /** Issue requirement: 50-radius error of a 20k set with matched inertia. */
    private static final double FAR_50 = 1e-7;
    private static final int[] COUNTS = {2000, 20000, 100000};

    private static TriangleMesh box() {
        return Shapes.box(-500, -400, -300, 500, 400, 300);
    }

    private static TriangleMesh lumpy() {
        return TestShapes.lumpySphere(3, 0.25, 11).transformed(TestShapes.rotation(1, 2, 3, 0.4), 600.0,
            new double[] {30, -20, 10});
    }

    @Test
    void boxMomentsMatchTheHandbookValuesToRounding() {
        TriangleMesh m = box();
        double mass = RHO * 1000 * 800 * 600;
        double[] inertia = {mass * (800 * 800 + 600 * 600) / 12.0, 0, 0, 0, mass * (1000 * 1000 + 600 * 600) / 12.0, 0,
            0, 0, mass * (1000 * 1000 + 800 * 800) / 12.0};
        MassProperties mp = MassPropertiesCalculator.compute(m, RHO);
        for (MasconGenerator.Scheme s : MasconGenerator.Scheme.values()) {
            MasconSet raw = MasconGenerator.generate(s, DensityModel.uniform(m, RHO), 20000, 2, ProgressListener.NONE);
            MasconMatch.Result r = MasconMatch.match(raw, mp, MasconMatch.Moments.INERTIA);
            assertTrue(r.matchedInertia(), s + ": inertia matched");
            MasconSet set = r.set();
            assertEquals(mass, set.totalMass(), ROUNDING * mass, s + ": mass");
            double[] c = set.centerOfMass();
            for (int k = 0; k < 3; k++) {
                assertEquals(0, c[k], ROUNDING * 500, s + ": centre of mass");
            }
            double[] in = set.inertia();
            for (int k = 0; k < 9; k++) {
                assertEquals(inertia[k], in[k], ROUNDING * inertia[8], s + ": inertia " + k);
            }
            TestShapes.achieved("box mascons " + s + " 20k: max relative mass change of one mascon", r.maxChange());
            // The quadrupole match leaves only the trace: I − I_ref = c·1.
            double[] iq = MasconMatch.match(raw, mp, MasconMatch.Moments.QUADRUPOLE).set().inertia();
            double trace = iq[0] - inertia[0];
            for (int k = 0; k < 9; k++) {
                assertEquals(inertia[k] + (k % 4 == 0 ? trace : 0), iq[k], ROUNDING * inertia[8], s + ": quadrupole " + k);
            }
        }
    }

    /**
     * A torus about its centre of mass (which lies outside the solid) gives tetrahedral pieces of both signs; the
     * match still reaches the polyhedron's moments (Dobrovolskis 1996 via {@link MassPropertiesCalculator}).
     */
    @Test
    void signedSetsAreMatchedToo() {
        TriangleMesh torus = TestShapes.torus(48, 24, 500, 150);
        MassProperties mp = MassPropertiesCalculator.compute(torus, RHO);
        MasconSet raw = MasconGenerator.generate(MasconGenerator.Scheme.TETRA, DensityModel.uniform(torus, RHO), 5000,
            2, ProgressListener.NONE);
        assertTrue(raw.negativeCount() > 0, "signed pieces");
        MasconMatch.Result r = MasconMatch.match(raw, mp, MasconMatch.Moments.QUADRUPOLE);
        assertTrue(r.matchedInertia());
        double[] in = r.set().inertia();
        double[] ref = mp.inertia();
        double trace = in[0] - ref[0];
        for (int k = 0; k < 9; k++) {
            assertEquals(ref[k] + (k % 4 == 0 ? trace : 0), in[k], ROUNDING * ref[8], "quadrupole " + k);
        }
        assertEquals(mp.mass(), r.set().totalMass(), ROUNDING * mp.mass());
    }

    @Test
    void farFieldErrorFallsWithCountOnABoxAndALumpyBody() {
        for (TriangleMesh m : new TriangleMesh[] {box(), lumpy()}) {
            MassProperties mp = MassPropertiesCalculator.compute(m, RHO);
            PolyhedronField poly = new PolyhedronField(m, RHO);
            for (MasconGenerator.Scheme s : MasconGenerator.Scheme.values()) {
                double[] prevCentre = {Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY};
                double[] prevInertia = {Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY};
                for (int n : COUNTS) {
                    MasconSet raw = MasconGenerator.generate(s, DensityModel.uniform(m, RHO), n, 2,
                        ProgressListener.NONE);
                    MasconSet centre = MasconMatch.match(raw, mp, false).set();
                    MasconMatch.Result ri = MasconMatch.match(raw, mp, MasconMatch.Moments.QUADRUPOLE);
                    assertTrue(ri.matchedInertia());
                    MasconReport rep = MasconReport.of(ri.set(), mp);
                    assertTrue(Math.abs(rep.massError()) < ROUNDING, "mass after adjustment");
                    assertTrue(rep.centerOffset() / mp.equivalentRadius() < ROUNDING, "centre of mass");
                    String what = m.facetCount() + " facets, " + s + ", N = " + raw.count();
                    for (int d = 0; d < 2; d++) {
                        double radii = d == 0 ? 10 : 50;
                        double ec = maxError(poly, new MasconField(centre), mp, radii);
                        double ei = maxError(poly, new MasconField(ri.set()), mp, radii);
                        TestShapes.achieved(what + ", " + radii + " radii, mass+COM matched", ec);
                        TestShapes.achieved(what + ", " + radii + " radii, quadrupole matched", ei);
                        assertTrue(ec < prevCentre[d], what + ": mass+COM error falls with N at " + radii + " radii");
                        assertTrue(ei < ec, what + ": matching the quadrupole lowers the error at " + radii + " radii");
                        assertTrue(ei < prevInertia[d], what + ": quadrupole-matched error falls with N at " + radii
                            + " radii");
                        if (d == 1 && n == 20000) {
                            assertTrue(ei < FAR_50, what + ": 50-radius error below 1e-7");
                        }
                        prevCentre[d] = ec;
                        prevInertia[d] = ei;
                    }
                }
            }
        }
    }

    /** Largest |Δg|/|g| over 100 Fibonacci directions at {@code radii} equivalent radii from the centre of mass. */
    static double maxError(PolyhedronField poly, MasconField mf, MassProperties mp, double radii) {
        FieldEvaluator a = poly.newEvaluator();
        FieldEvaluator b = mf.newEvaluator();
        double[] sa = new double[FieldSample.SIZE];
        double[] sb = new double[FieldSample.SIZE];
        double[] c = mp.centerOfMass();
        int n = 100;
        double r = radii * mp.equivalentRadius();
        double max = 0;
        for (int i = 0; i < n; i++) {
            double z = 1 - (2 * i + 1.0) / n;
            double q = Math.sqrt(1 - z * z);
            double phi = i * Math.PI * (3 - Math.sqrt(5));
            double x = c[0] + r * q * Math.cos(phi);
            double y = c[1] + r * q * Math.sin(phi);
            double zz = c[2] + r * z;
            a.evaluate(x, y, zz, false, sa, 0);
            b.evaluate(x, y, zz, false, sb, 0);
            double ex = sa[1] - sb[1];
            double ey = sa[2] - sb[2];
            double ez = sa[3] - sb[3];
            max = Math.max(max, Math.sqrt(ex * ex + ey * ey + ez * ez) / FieldSample.accelerationNorm(sa, 0));
        }
        return max;
    }
}
