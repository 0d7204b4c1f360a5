package dev.cairn.mascon;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.gravity.BatchEvaluation;
import dev.cairn.gravity.Constants;
import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldSample;
import dev.cairn.util.ProgressListener;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/** The point-mass field against Newton's law of gravitation and its derivatives (closed forms). */
class MasconFieldTest {
    /** "Exactly" means to rounding: a few units in the last place of a handful of operations. */
    private static final double ROUNDING = 4e-16;
    /** Trace of the tensor of a point mass: 0 (Laplace's equation outside the mass), relative to its norm. */
    private static final double TRACE_TOL = 1e-14;

    @Test
    void singlePointMassIsNewtonsLaw() {
        // Newton: U = GM/r, g = −GM d/r^3, d from the mass to the point; r = 13 for d = (3, 4, 12).
        double mass = 5.0e12;
        double gm = Constants.G * mass;
        MasconField f = new MasconField(new MasconSet(new double[] {1, -2, 3}, new double[] {mass},
            new double[] {0.5}, "one"));
        double[] out = new double[FieldSample.SIZE];
        f.newEvaluator().evaluate(4, 2, 15, true, out, 0);
        double r = 13;
        assertEquals(gm / r, out[FieldSample.U], ROUNDING * gm / r, "U = GM/r");
        double g3 = gm / (r * r * r);
        assertEquals(-g3 * 3, out[FieldSample.AX], ROUNDING * g3 * 3);
        assertEquals(-g3 * 4, out[FieldSample.AY], ROUNDING * g3 * 4);
        assertEquals(-g3 * 12, out[FieldSample.AZ], ROUNDING * g3 * 12);
        // Second derivatives of GM/r: GM (3 d_i d_j − r^2 δ_ij) / r^5.
        double g5 = gm / Math.pow(r, 5);
        double[] d = {3, 4, 12};
        int[][] slot = {{FieldSample.GXX, FieldSample.GXY, FieldSample.GXZ},
            {FieldSample.GXY, FieldSample.GYY, FieldSample.GYZ}, {FieldSample.GXZ, FieldSample.GYZ, FieldSample.GZZ}};
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                double expected = g5 * (3 * d[i] * d[j] - (i == j ? r * r : 0));
                assertEquals(expected, out[slot[i][j]], 1e-15 * g5 * r * r, "tensor " + i + j);
            }
        }
        double trace = out[FieldSample.GXX] + out[FieldSample.GYY] + out[FieldSample.GZZ];
        assertEquals(0, trace, TRACE_TOL * g5 * r * r, "Laplace: trace of the tensor vanishes outside the mass");
        assertEquals(gm, f.gm(), ROUNDING * gm);
    }

    @Test
    void warnsOnlyCloserThanTheLocalSpacing() {
        MasconField f = new MasconField(new MasconSet(new double[] {0, 0, 0, 10, 0, 0}, new double[] {1e9, 1e9},
            new double[] {2, 2}, "two"));
        FieldEvaluator ev = f.newEvaluator();
        double[] out = new double[FieldSample.SIZE];
        ev.evaluate(0, 0, 5, false, out, 0);
        assertEquals(0, f.tooCloseCount(), "5 m from both, spacing 2 m: no warning");
        ev.evaluate(9, 0, 1, false, out, 0);
        assertEquals(1, f.tooCloseCount(), "1.4 m from the second mascon, spacing 2 m: warning");
        f.resetTooCloseCount();
        assertEquals(0, f.tooCloseCount());
    }

    @Test
    void resultsDoNotDependOnThreadCount() {
        // Requirement of the project brief: results bit-identical for any thread count.
        SplittableRandom rnd = new SplittableRandom(3);
        int n = 500;
        double[] xyz = new double[3 * n];
        double[] m = new double[n];
        double[] s = new double[n];
        for (int i = 0; i < n; i++) {
            for (int k = 0; k < 3; k++) {
                xyz[3 * i + k] = rnd.nextDouble(-1, 1);
            }
            m[i] = rnd.nextDouble(1, 2) * 1e10;
            s[i] = 0.1;
        }
        MasconField f = new MasconField(new MasconSet(xyz, m, s, "random"));
        double[] pts = new double[3 * 300];
        for (int i = 0; i < pts.length; i++) {
            pts[i] = rnd.nextDouble(-3, 3);
        }
        double[] one = BatchEvaluation.evaluate(f, pts, true, 1, ProgressListener.NONE);
        double[] two = BatchEvaluation.evaluate(f, pts, true, 3, ProgressListener.NONE);
        assertArrayEquals(one, two);
        assertTrue(one[FieldSample.U] > 0, "U > 0 convention");
    }
}
