package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * The clustered moments (groups of facets, truncated local moments shifted by the addition theorem) against the
 * direct exact rule on the same polyhedron: the difference must stay within the stated truncation bound plus
 * round-off, and the bound must really bound the error when the truncation is forced to be coarse.
 */
class ClusteredMomentsTest {
    private static final double RHO = 1900;
    /** Round-off of sums over ~2e4 facets at unit scale (common practice, no source). */
    private static final double ROUND_OFF = 1e-14;

    private static HarmonicCoefficients direct(TriangleMesh mesh, double[] o, double ref, int degree) {
        return HarmonicCoefficients.ofPolyhedra(List.of(mesh), new double[] {RHO}, o, ref, degree, 2,
            Integer.MAX_VALUE, 1);
    }

    private static HarmonicCoefficients clustered(TriangleMesh mesh, double[] o, double ref, int degree, double eps,
                                                  int threads) {
        return HarmonicCoefficients.ofPolyhedra(List.of(mesh), new double[] {RHO}, o, ref, degree, threads, 0, eps);
    }

    private static double maxDifference(HarmonicCoefficients a, HarmonicCoefficients b) {
        double worst = 0;
        for (int n = 0; n <= a.degree(); n++) {
            for (int m = 0; m <= n; m++) {
                worst = Math.max(worst, Math.abs(a.c(n, m) - b.c(n, m)));
                worst = Math.max(worst, Math.abs(a.s(n, m) - b.s(n, m)));
            }
        }
        return worst;
    }

    /**
     * Default target: agrees with the exact rule to round-off at degree 20 on a lumpy 20,480-facet body and at
     * degree 40 on a 5,120-facet one.
     */
    @Test
    void agreesWithDirectRuleWithinBound() {
        double[] o = {12, -30, 8};
        for (int degree : new int[] {20, 40}) {
            TriangleMesh body = Shapes.lumpyIcosphere(degree == 20 ? 5 : 4, 1500, 0.25, 7);
            HarmonicCoefficients d = direct(body, o, 1700, degree);
            HarmonicCoefficients c = clustered(body, o, 1700, degree, HarmonicCoefficients.CLUSTERED_EPSILON, 2);
            double diff = maxDifference(d, c);
            System.out.printf("achieved: clustered vs direct moments, degree %d: max |dC| %.2e (bound %.2e)%n",
                degree, diff, c.truncationBound());
            assertTrue(c.truncationBound() < 1e-15, "bound " + c.truncationBound());
            assertTrue(diff <= c.truncationBound() + ROUND_OFF, "difference " + diff);
            assertEquals(d.gm(), c.gm(), 1e-13 * d.gm());
        }
    }

    /** A coarse target (1e-4, 1e-6): the measured error must not exceed the bound (the bound is an upper bound). */
    @Test
    void boundHoldsWhenTruncationIsCoarse() {
        TriangleMesh body = Shapes.lumpyIcosphere(4, 800, 0.3, 3);
        double[] o = {0, 0, 0};
        HarmonicCoefficients d = direct(body, o, 900, 24);
        for (double eps : new double[] {1e-4, 1e-6}) {
            HarmonicCoefficients c = clustered(body, o, 900, 24, eps, 2);
            double diff = maxDifference(d, c);
            System.out.printf("achieved: coarse clustered target %.0e: max |dC| %.2e, bound %.2e%n", eps, diff,
                c.truncationBound());
            assertTrue(diff > ROUND_OFF, "the coarse target should truncate visibly: " + diff);
            assertTrue(diff <= c.truncationBound(), "error " + diff + " above bound " + c.truncationBound());
        }
    }

    /** Fixed-order block sums: bit-identical for any thread count. */
    @Test
    void independentOfThreadCount() {
        TriangleMesh body = Shapes.lumpyIcosphere(4, 800, 0.3, 5);
        double[] o = {3, 1, -2};
        HarmonicCoefficients one = clustered(body, o, 850, 16, 1e-16, 1);
        HarmonicCoefficients three = clustered(body, o, 850, 16, 1e-16, 3);
        for (int n = 0; n <= 16; n++) {
            for (int m = 0; m <= n; m++) {
                assertEquals(one.c(n, m), three.c(n, m), 0.0);
                assertEquals(one.s(n, m), three.s(n, m), 0.0);
            }
        }
    }
}
