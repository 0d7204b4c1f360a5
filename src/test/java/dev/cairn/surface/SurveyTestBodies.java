package dev.cairn.surface;

import dev.cairn.gravity.Constants;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.mass.MassProperties;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.EdgeTable;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.SpinState;
import dev.cairn.util.ProgressListener;

/** Builds survey targets from meshes made in code (uniform density polyhedron field). */
final class SurveyTestBodies {
    private SurveyTestBodies() {
    }

    static SurveyTarget target(String name, TriangleMesh mesh, double density, SpinState spin) {
        EdgeTable edges = EdgeTable.of(mesh);
        MassProperties mp = MassPropertiesCalculator.compute(mesh, density);
        return new SurveyTarget(name, null, mesh, edges, new PolyhedronField(mesh, edges, density),
            mp.centerOfMass(), spin, density, mp.volume());
    }

    static SurveyResult survey(SurveyTarget t, SurveyParameters p) {
        return Survey.run(t, p, ProgressListener.NONE);
    }

    /** Spin period giving ω²R³/GM = q for a body of GM {@code gm} and radius {@code r}. */
    static SpinState spinForRatio(double q, double gm, double r) {
        double omega = Math.sqrt(q * gm / (r * r * r));
        return new SpinState(2 * Math.PI / omega, new double[] {0, 0, 1});
    }

    static double gm(double density, double volume) {
        return Constants.G * density * volume;
    }
}
