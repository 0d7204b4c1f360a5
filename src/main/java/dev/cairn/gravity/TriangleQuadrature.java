package dev.cairn.gravity;

import org.apache.commons.math3.analysis.integration.gauss.GaussIntegratorFactory;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegrator;

/**
 * A quadrature rule on the reference triangle that integrates every polynomial of total degree ≤ {@code degree}
 * exactly: the collapsed (Duffy) product of two Gauss–Legendre rules on [0, 1] (Stroud, A.H. (1971) Approximate
 * Calculation of Multiple Integrals, Prentice-Hall, §2.7, conical product rules; from memory). Point (u, v) of the
 * square maps to barycentric weights (1 − u, u(1 − v), u v) with Jacobian u; q = ⌈(degree + 2)/2⌉ points per
 * direction make the product exact to degree 2q − 1 ≥ degree + 1 in u (Jacobian included) and ≥ degree in v.
 * Weights sum to 1 (a fraction of the triangle's area).
 */
public final class TriangleQuadrature {
    private final double[] l1;
    private final double[] l2;
    private final double[] l3;
    private final double[] w;

    /** A rule exact to total degree {@code degree} (0 to 60). */
    public TriangleQuadrature(int degree) {
        if (degree < 0 || degree > 60) {
            throw new IllegalArgumentException("quadrature degree " + degree + " outside 0..60");
        }
        int q = (degree + 3) / 2;
        GaussIntegrator g = new GaussIntegratorFactory().legendreHighPrecision(q, 0, 1);
        int n = q * q;
        l1 = new double[n];
        l2 = new double[n];
        l3 = new double[n];
        w = new double[n];
        int k = 0;
        double sum = 0;
        for (int i = 0; i < q; i++) {
            double u = g.getPoint(i);
            double wu = g.getWeight(i);
            for (int j = 0; j < q; j++) {
                double v = g.getPoint(j);
                l1[k] = 1 - u;
                l2[k] = u * (1 - v);
                l3[k] = u * v;
                w[k] = 2 * wu * g.getWeight(j) * u; // reference triangle area 1/2 → weights sum to 1
                sum += w[k];
                k++;
            }
        }
        for (int i = 0; i < n; i++) {
            w[i] /= sum; // remove the last-bit drift of the sum
        }
    }

    public int size() {
        return w.length;
    }

    /** Barycentric weight of vertex 1 at point i. */
    public double l1(int i) {
        return l1[i];
    }

    public double l2(int i) {
        return l2[i];
    }

    public double l3(int i) {
        return l3[i];
    }

    /** Weight of point i as a fraction of the triangle's area. */
    public double weight(int i) {
        return w[i];
    }
}
