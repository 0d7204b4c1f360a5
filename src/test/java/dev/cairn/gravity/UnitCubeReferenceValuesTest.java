package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.cairn.mesh.Shapes;
import org.junit.jupiter.api.Test;

/**
 * The unit cube [0,1]^3 with Gρ = 1 against the closed-form prism values tabulated in shared references
 * (Nagy, Papp &amp; Benedek 2000, J. Geodesy 74:552–560; values re-computed independently by quadrature).
 */
class UnitCubeReferenceValuesTest {
    /** Relative tolerance away from edges and vertices (issue requirement, Werner–Scheeres is exact). */
    private static final double REL_TOL = 1e-12;
    /** Relative tolerance on edges and vertices, where the edge log terms are dropped at their limit. */
    private static final double REL_TOL_EDGE = 1e-10;
    private static final double RHO = 1.0 / Constants.G; // so that Gρ = 1

    private final FieldEvaluator ev = new PolyhedronField(Shapes.unitCube(), RHO).newEvaluator();

    private double[] at(double x, double y, double z) {
        double[] out = new double[FieldSample.SIZE];
        ev.evaluate(x, y, z, false, out, 0);
        return out;
    }

    private static double worst;

    private static void close(double expected, double actual, double rel, String what) {
        assertEquals(expected, actual, rel * Math.max(1.0, Math.abs(expected)), what);
        worst = Math.max(worst, Math.abs(expected - actual) / Math.max(1.0, Math.abs(expected)));
    }

    @org.junit.jupiter.api.AfterAll
    static void report() {
        dev.cairn.TestShapes.achieved("unit cube table, max relative error (all points)", worst);
    }

    @Test
    void corner() {
        double[] s = at(0, 0, 0);
        close(1.190038681989777, s[FieldSample.U], REL_TOL_EDGE, "U at corner");
        for (int k = 0; k < 3; k++) {
            close(0.969388052712568, s[FieldSample.AX + k], REL_TOL_EDGE, "g at corner");
        }
        assertEquals(Location.SURFACE, Location.fromCode(s[FieldSample.LOCATION]));
    }

    @Test
    void centre() {
        double[] s = at(0.5, 0.5, 0.5);
        close(2.380077363979554, s[FieldSample.U], REL_TOL, "U at centre");
        for (int k = 0; k < 3; k++) {
            assertEquals(0.0, s[FieldSample.AX + k], 1e-14);
        }
        close(-4 * Math.PI, s[FieldSample.LAPLACIAN], REL_TOL, "Poisson inside");
        assertEquals(Location.INSIDE, Location.fromCode(s[FieldSample.LOCATION]));
    }

    @Test
    void faceCentre() {
        double[] s = at(0.5, 0.5, 0.0);
        close(1.792810243178775, s[FieldSample.U], REL_TOL, "U at face centre");
        close(2.596896578258365, s[FieldSample.AZ], REL_TOL, "g normal at face centre, inward");
        close(-2 * Math.PI, s[FieldSample.LAPLACIAN], REL_TOL, "Laplacian on a facet");
        assertEquals(Location.SURFACE, Location.fromCode(s[FieldSample.LOCATION]));
    }

    @Test
    void edgeMidpoint() {
        double[] s = at(0.5, 0.0, 0.0);
        close(1.427260179700358, s[FieldSample.U], REL_TOL_EDGE, "U at edge midpoint");
        assertEquals(0.0, s[FieldSample.AX], 1e-13);
        close(1.551694097314306, s[FieldSample.AY], REL_TOL_EDGE, "gy at edge midpoint");
        close(1.551694097314306, s[FieldSample.AZ], REL_TOL_EDGE, "gz at edge midpoint");
    }

    @Test
    void interiorAndExteriorPoints() {
        double[] s = at(0.2, 0.3, 0.4);
        close(2.091891625243910, s[FieldSample.U], REL_TOL, "U inside");
        close(1.275395167441784, s[FieldSample.AX], REL_TOL, "gx inside");
        close(0.745680592519306, s[FieldSample.AY], REL_TOL, "gy inside");
        close(0.345922139094193, s[FieldSample.AZ], REL_TOL, "gz inside");
        s = at(2, 0.3, -0.7);
        close(0.517880541626438, s[FieldSample.U], REL_TOL, "U outside");
        close(-0.208602877535082, s[FieldSample.AX], REL_TOL, "gx outside");
        close(0.027610977640465, s[FieldSample.AY], REL_TOL, "gy outside");
        close(0.166517539001699, s[FieldSample.AZ], REL_TOL, "gz outside");
        assertEquals(0.0, s[FieldSample.LAPLACIAN], 1e-13, "Laplace outside");
        assertEquals(Location.OUTSIDE, Location.fromCode(s[FieldSample.LOCATION]));
    }
}
