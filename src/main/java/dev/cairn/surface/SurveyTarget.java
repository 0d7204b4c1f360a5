package dev.cairn.surface;

import dev.cairn.gravity.FieldModel;
import dev.cairn.mesh.EdgeTable;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.SpinState;
import java.nio.file.Path;

/**
 * What a survey runs on: the closed outward-oriented surface (metres, model frame), its edge table, the body's
 * gravity field, its centre of mass (the spin axis passes through it), spin state, and descriptive data carried into
 * the outputs.
 *
 * @param name         display name
 * @param source       model file, or null for a body built in code
 * @param mesh         surface, metres
 * @param edges        edge table of {@code mesh}
 * @param field        gravity field (U &gt; 0, g = ∇U)
 * @param centreOfMass m, model frame
 * @param spin         spin state
 * @param density      bulk density, kg/m³ (NaN when not meaningful, e.g. a field that is not a uniform body)
 * @param volume       enclosed volume, m³
 */
public record SurveyTarget(String name, Path source, TriangleMesh mesh, EdgeTable edges, FieldModel field,
                           double[] centreOfMass, SpinState spin, double density, double volume) {
    public SurveyTarget {
        centreOfMass = centreOfMass.clone();
    }

    @Override
    public double[] centreOfMass() {
        return centreOfMass.clone();
    }

    /** Radius of the sphere of equal volume, m. */
    public double equivalentRadius() {
        return Math.cbrt(3 * volume / (4 * Math.PI));
    }
}
