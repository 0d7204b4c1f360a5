package dev.cairn.mascon;

import dev.cairn.mass.MassProperties;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;

/**
 * How well a mascon set reproduces a body's mass properties: count, total mass, centre of mass and inertia tensor
 * (about the centre of mass, model axes) of the set against the reference (the polyhedron's, or the combined
 * regions'). SI units, model frame.
 *
 * @param count             mascons
 * @param negative          mascons with negative mass
 * @param mass              set's total mass, kg
 * @param referenceMass     reference mass, kg
 * @param centerOfMass      set's centre of mass, m
 * @param referenceCenter   reference centre of mass, m
 * @param inertia           set's inertia tensor, kg·m^2, row-major 3×3
 * @param referenceInertia  reference inertia tensor, kg·m^2
 * @param referenceSize     length scale for the centre-of-mass error (the reference's equivalent radius), m
 */
public record MasconReport(int count, int negative, double mass, double referenceMass, double[] centerOfMass,
                           double[] referenceCenter, double[] inertia, double[] referenceInertia,
                           double referenceSize) {

    /** Compares {@code set} with the reference mass properties. */
    public static MasconReport of(MasconSet set, MassProperties reference) {
        return new MasconReport(set.count(), set.negativeCount(), set.totalMass(), reference.mass(),
            set.centerOfMass(), reference.centerOfMass(), set.inertia(), reference.inertia(),
            reference.equivalentRadius());
    }

    /** (mass − reference)/reference. */
    public double massError() {
        return (mass - referenceMass) / referenceMass;
    }

    /** Distance between the centres of mass, m. */
    public double centerOffset() {
        double dx = centerOfMass[0] - referenceCenter[0];
        double dy = centerOfMass[1] - referenceCenter[1];
        double dz = centerOfMass[2] - referenceCenter[2];
        return Math.sqrt(dx * dx + dy * dy + dz * dz);
    }

    /** Frobenius norm of the inertia difference over that of the reference inertia. */
    public double inertiaError() {
        double d = 0;
        double r = 0;
        for (int k = 0; k < 9; k++) {
            d += (inertia[k] - referenceInertia[k]) * (inertia[k] - referenceInertia[k]);
            r += referenceInertia[k] * referenceInertia[k];
        }
        return Math.sqrt(d / r);
    }

    /** Plain-text lines for a terminal. */
    public String text() {
        return String.format(Locale.ROOT, "mascons: %d (%d negative)%n"
                + "mass: %.9e kg (reference %.9e kg, relative error %.2e)%n"
                + "centre of mass: [%.6g, %.6g, %.6g] m (reference [%.6g, %.6g, %.6g] m, offset %.3e m = %.2e of the "
                + "equivalent radius)%n"
                + "inertia about the centre of mass: relative error %.2e (Frobenius norm)%n",
            count, negative, mass, referenceMass, massError(), centerOfMass[0], centerOfMass[1], centerOfMass[2],
            referenceCenter[0], referenceCenter[1], referenceCenter[2], centerOffset(), centerOffset() / referenceSize,
            inertiaError());
    }

    /** A JSON-ready map (SI units). */
    public Map<String, Object> toMap() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("count", count);
        m.put("negative_count", negative);
        m.put("mass_kg", mass);
        m.put("reference_mass_kg", referenceMass);
        m.put("mass_relative_error", massError());
        m.put("center_of_mass_m", centerOfMass);
        m.put("reference_center_of_mass_m", referenceCenter);
        m.put("center_of_mass_offset_m", centerOffset());
        m.put("inertia_kg_m2", inertia);
        m.put("reference_inertia_kg_m2", referenceInertia);
        m.put("inertia_relative_error", inertiaError());
        return m;
    }
}
