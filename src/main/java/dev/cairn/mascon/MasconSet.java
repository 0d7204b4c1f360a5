package dev.cairn.mascon;

import dev.cairn.gravity.Constants;
import dev.cairn.mass.MassPropertiesCalculator;
import java.util.Arrays;

/**
 * A set of point masses (mascons), structure-of-arrays: positions in metres (model frame), masses in kg, and each
 * mascon's local spacing in metres (the size of the volume it stands for: closer than that, a point mass is a poor
 * model of that volume). Masses may be negative (the tetrahedral scheme on a body that is not star-shaped about
 * its centre of mass gives signed pieces). Immutable: accessors return the internal arrays, not to be modified.
 */
public final class MasconSet {
    private final double[] xyz;
    private final double[] mass;
    private final double[] spacing;
    private final String scheme;

    /**
     * @param xyz     positions, m, 3n values (taken, not copied)
     * @param mass    masses, kg, n values (taken)
     * @param spacing local spacing, m, n values (taken)
     * @param scheme  how the set was made, for reports (e.g. "cubic lattice, cell 12.5 m")
     */
    public MasconSet(double[] xyz, double[] mass, double[] spacing, String scheme) {
        if (xyz.length != 3 * mass.length || spacing.length != mass.length) {
            throw new IllegalArgumentException("array lengths disagree: " + xyz.length + " coordinates, "
                + mass.length + " masses, " + spacing.length + " spacings");
        }
        this.xyz = xyz;
        this.mass = mass;
        this.spacing = spacing;
        this.scheme = scheme;
    }

    public int count() {
        return mass.length;
    }

    /** Positions, m, shared: do not modify. */
    public double[] xyz() {
        return xyz;
    }

    /** Masses, kg, shared: do not modify. */
    public double[] mass() {
        return mass;
    }

    /** Local spacings, m, shared: do not modify. */
    public double[] spacing() {
        return spacing;
    }

    public String scheme() {
        return scheme;
    }

    /** Total mass, kg (compensated sum). */
    public double totalMass() {
        return kahan(mass);
    }

    /** {@code G·M}, m^3/s^2. */
    public double gm() {
        return Constants.G * totalMass();
    }

    /** Number of mascons with a negative mass. */
    public int negativeCount() {
        int n = 0;
        for (double m : mass) {
            if (m < 0) {
                n++;
            }
        }
        return n;
    }

    /** Centre of mass, m, model frame. */
    public double[] centerOfMass() {
        double[] s = new double[3];
        double[] c = new double[3];
        for (int i = 0; i < mass.length; i++) {
            for (int k = 0; k < 3; k++) {
                double y = mass[i] * xyz[3 * i + k] - c[k];
                double t = s[k] + y;
                c[k] = (t - s[k]) - y;
                s[k] = t;
            }
        }
        double m = totalMass();
        return new double[] {s[0] / m, s[1] / m, s[2] / m};
    }

    /** Inertia tensor about the centre of mass, model axes, kg·m^2, row-major 3×3: {@code Σ m(|r|²·1 − r rᵀ)}. */
    public double[] inertia() {
        double[] com = centerOfMass();
        double xx = 0;
        double yy = 0;
        double zz = 0;
        double xy = 0;
        double xz = 0;
        double yz = 0;
        for (int i = 0; i < mass.length; i++) {
            double x = xyz[3 * i] - com[0];
            double y = xyz[3 * i + 1] - com[1];
            double z = xyz[3 * i + 2] - com[2];
            double m = mass[i];
            xx += m * x * x;
            yy += m * y * y;
            zz += m * z * z;
            xy += m * x * y;
            xz += m * x * z;
            yz += m * y * z;
        }
        return new double[] {yy + zz, -xy, -xz, -xy, xx + zz, -yz, -xz, -yz, xx + yy};
    }

    /** Principal moments of {@link #inertia()}, ascending, kg·m^2. */
    public double[] principalMoments() {
        double[] m = new double[3];
        MassPropertiesCalculator.principal(inertia(), m, new double[9]);
        return m;
    }

    /** Smallest and largest spacing, m. */
    public double[] spacingRange() {
        double lo = Double.POSITIVE_INFINITY;
        double hi = 0;
        for (double s : spacing) {
            lo = Math.min(lo, s);
            hi = Math.max(hi, s);
        }
        return new double[] {lo, hi};
    }

    private static double kahan(double[] a) {
        double s = 0;
        double c = 0;
        for (double v : a) {
            double y = v - c;
            double t = s + y;
            c = (t - s) - y;
            s = t;
        }
        return s;
    }

    @Override
    public String toString() {
        return "MasconSet[" + count() + " mascons, " + scheme + ", " + Arrays.toString(spacingRange()) + " m]";
    }
}
