package dev.cairn.cli;

import dev.cairn.gravity.HarmonicCoefficients;
import dev.cairn.mass.MassProperties;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import java.io.PrintWriter;
import java.util.List;
import java.util.Locale;

/**
 * {@code bench --harmonics}: time to compute fully normalised coefficients of a constant-density polyhedron to
 * degree N about its centre of mass (reference radius: the Brillouin radius), by the default method (clustered
 * moments from {@link HarmonicCoefficients#CLUSTERED_MIN_FACETS} facets) and, side by side in the same run, by the
 * direct exact triangle rule over every facet (the baseline), with the largest coefficient difference between them
 * and the stated truncation bound.
 */
final class HarmonicsBench {
    private HarmonicsBench() {
    }

    static void run(PrintWriter out, TriangleMesh demo, String demoName, double density, int[] degrees, int level,
                    boolean baselineOnLarge, int threads) {
        out.printf(Locale.ROOT, "%nSpherical-harmonic coefficients (threads %d; best of 2 runs after one warm-up)%n",
            threads);
        body(out, demoName, demo, density, degrees, true, threads);
        if (level > 0) {
            TriangleMesh big = Shapes.lumpyIcosphere(level, 1000.0, 0.25, 11);
            body(out, "lumpy icosphere level " + level, big, density, degrees, baselineOnLarge, threads);
        }
    }

    private static void body(PrintWriter out, String name, TriangleMesh mesh, double density, int[] degrees,
                             boolean baseline, int threads) {
        MassProperties mp = MassPropertiesCalculator.compute(mesh, density);
        double[] com = mp.centerOfMass();
        double ref = HarmonicCoefficients.maxDistance(mesh, com);
        out.printf(Locale.ROOT, "%s: %d facets%n", name, mesh.facetCount());
        for (int n : degrees) {
            HarmonicCoefficients fast = null;
            double tFast = Double.POSITIVE_INFINITY;
            for (int k = 0; k < 3; k++) {
                long t0 = System.nanoTime();
                fast = HarmonicCoefficients.ofPolyhedra(List.of(mesh), new double[] {density}, com, ref, n, threads);
                if (k > 0) {
                    tFast = Math.min(tFast, (System.nanoTime() - t0) / 1e9);
                }
            }
            if (!baseline) {
                out.printf(Locale.ROOT, "  degree %2d: default %.2f s (truncation bound %.1e); direct baseline not "
                    + "run (add --harmonics-baseline)%n", n, tFast, fast.truncationBound());
                continue;
            }
            long t0 = System.nanoTime();
            HarmonicCoefficients direct = HarmonicCoefficients.ofPolyhedraDirect(List.of(mesh),
                new double[] {density}, com, ref, n, threads);
            double tDirect = (System.nanoTime() - t0) / 1e9;
            double diff = 0;
            for (int d = 0; d <= n; d++) {
                for (int m = 0; m <= d; m++) {
                    diff = Math.max(diff, Math.abs(fast.c(d, m) - direct.c(d, m)));
                    diff = Math.max(diff, Math.abs(fast.s(d, m) - direct.s(d, m)));
                }
            }
            out.printf(Locale.ROOT, "  degree %2d: default %.2f s, direct %.2f s (x%.1f); max |dC|, |dS| %.1e, "
                + "truncation bound %.1e%n", n, tFast, tDirect, tDirect / tFast, diff, fast.truncationBound());
        }
    }
}
