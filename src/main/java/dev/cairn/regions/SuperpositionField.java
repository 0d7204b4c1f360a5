package dev.cairn.regions;

import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import java.util.List;

/**
 * The field of a body of several constant-density regions as a sum of constant-density polyhedra: the outer shape at
 * its density and each inner region at its density minus that of the region containing it. Gravity is linear in the
 * density, so the sum is exact (superposition; e.g. Werner &amp; Scheeres 1997, Celest. Mech. Dyn. Astron.
 * 65:313–344, for each term). U, g, the gradient tensor and the Laplacian add; the location slot is the first
 * part's (the outer shape's). Conventions of {@link FieldSample}: SI, model frame, U &gt; 0, g = ∇U.
 */
public final class SuperpositionField implements FieldModel {
    private final FieldModel[] parts;
    private final String description;

    /** @param parts the terms; the first one decides the location slot */
    public SuperpositionField(List<? extends FieldModel> parts, String description) {
        if (parts.isEmpty()) {
            throw new IllegalArgumentException("no parts");
        }
        this.parts = parts.toArray(new FieldModel[0]);
        this.description = description;
    }

    /** Term {@code i} (0 = the outer shape). */
    public FieldModel part(int i) {
        return parts[i];
    }

    @Override
    public double gm() {
        double s = 0;
        for (FieldModel p : parts) {
            s += p.gm();
        }
        return s;
    }

    @Override
    public String describe() {
        return description;
    }

    /** The sum of the parts' exact models (itself when every part is exact). */
    @Override
    public FieldModel exactModel() {
        java.util.List<FieldModel> exact = new java.util.ArrayList<>();
        boolean same = true;
        for (FieldModel p : parts) {
            exact.add(p.exactModel());
            same &= p.exactModel() == p;
        }
        return same ? this : new SuperpositionField(exact, description + " [exact parts]");
    }

    /** The largest tolerance of the parts (NaN when all are exact). */
    @Override
    public double tolerance() {
        double t = Double.NaN;
        for (FieldModel p : parts) {
            if (!Double.isNaN(p.tolerance())) {
                t = Double.isNaN(t) ? p.tolerance() : Math.max(t, p.tolerance());
            }
        }
        return t;
    }

    @Override
    public FieldEvaluator newEvaluator() {
        FieldEvaluator[] evs = new FieldEvaluator[parts.length];
        for (int i = 0; i < parts.length; i++) {
            evs[i] = parts[i].newEvaluator();
        }
        double[] tmp = new double[FieldSample.SIZE];
        return (x, y, z, gradient, out, o) -> {
            evs[0].evaluate(x, y, z, gradient, out, o);
            for (int i = 1; i < evs.length; i++) {
                evs[i].evaluate(x, y, z, gradient, tmp, 0);
                for (int k = FieldSample.U; k <= FieldSample.GZZ; k++) {
                    out[o + k] += tmp[k];
                }
            }
        };
    }
}
