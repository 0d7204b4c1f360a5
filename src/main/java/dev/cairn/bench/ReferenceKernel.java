package dev.cairn.bench;

import dev.cairn.gravity.Constants;
import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.Location;
import dev.cairn.mesh.EdgeTable;
import dev.cairn.mesh.TriangleMesh;

/**
 * Benchmark baseline, not used by the product: the Werner–Scheeres polyhedron field written straight from the paper.
 *
 * <p>Werner, R.A. &amp; Scheeres, D.J. (1997) "Exterior gravitation of a polyhedron derived and compared with
 * harmonic and mascon gravitation representations", Celest. Mech. Dyn. Astron. 65:313–344:
 * <pre>
 *   U   =  (Gρ/2) Σ_e r_e·E_e·r_e L_e − (Gρ/2) Σ_f r_f·F_f·r_f ω_f
 *   ∇U  = −Gρ Σ_e E_e·r_e L_e + Gρ Σ_f F_f·r_f ω_f,     ∇∇U = Gρ Σ_e E_e L_e − Gρ Σ_f F_f ω_f
 *   L_e = ln((a+b+e)/(a+b−e)),  ω_f = 2 atan2(r1·(r2×r3), R1R2R3 + R1 r2·r3 + R2 r3·r1 + R3 r1·r2)
 * </pre>
 * with the full 3×3 dyads {@code E_e = n_A n_ABᵀ + n_B n_BAᵀ} and {@code F_f = n_f n_fᵀ} stored per edge and facet,
 * the vertex offsets and distances computed in each edge and facet term, {@link Math#log} and {@link Math#atan2}.
 * This is the "straightforward scalar implementation" against which {@link KernelBench} reports the product kernel's
 * speed-up. Only the one singular case the formulas need is handled (an edge term with {@code a+b−e ≤ 0}, a point
 * on the edge, is dropped: its limit is 0); points on the surface are not classified. Conventions as
 * {@link FieldSample}: U &gt; 0, g = ∇U, SI units, model frame.
 */
public final class ReferenceKernel implements FieldModel {
    private final double density;
    private final double volume;
    private final int facetCount;
    private final int edgeCount;
    private final double[] xyz;
    private final int[] tri;
    private final int[] ev;
    private final double[] elen;
    /** Per edge the 9 components of E_e, row-major. */
    private final double[] edyad;
    /** Per facet the 9 components of F_f, row-major. */
    private final double[] fdyad;

    /** @param mesh closed, outward-oriented mesh, metres; {@code density} kg/m^3 */
    public ReferenceKernel(TriangleMesh mesh, double density) {
        this.density = density;
        EdgeTable edges = EdgeTable.of(mesh);
        xyz = mesh.xyz().clone();
        tri = mesh.tri().clone();
        facetCount = mesh.facetCount();
        edgeCount = edges.edgeCount();
        double[] normals = new double[3 * facetCount];
        fdyad = new double[9 * facetCount];
        double vol6 = 0;
        for (int f = 0; f < facetCount; f++) {
            int a = 3 * tri[3 * f];
            int b = 3 * tri[3 * f + 1];
            int c = 3 * tri[3 * f + 2];
            double ux = xyz[b] - xyz[a];
            double uy = xyz[b + 1] - xyz[a + 1];
            double uz = xyz[b + 2] - xyz[a + 2];
            double vx = xyz[c] - xyz[a];
            double vy = xyz[c + 1] - xyz[a + 1];
            double vz = xyz[c + 2] - xyz[a + 2];
            double nx = uy * vz - uz * vy;
            double ny = uz * vx - ux * vz;
            double nz = ux * vy - uy * vx;
            vol6 += xyz[a] * nx + xyz[a + 1] * ny + xyz[a + 2] * nz;
            double len = Math.sqrt(nx * nx + ny * ny + nz * nz);
            double[] n = {nx / len, ny / len, nz / len};
            System.arraycopy(n, 0, normals, 3 * f, 3);
            for (int i = 0; i < 3; i++) {
                for (int j = 0; j < 3; j++) {
                    fdyad[9 * f + 3 * i + j] = n[i] * n[j];
                }
            }
        }
        volume = vol6 / 6;
        ev = new int[2 * edgeCount];
        elen = new double[edgeCount];
        edyad = new double[9 * edgeCount];
        for (int e = 0; e < edgeCount; e++) {
            int i = edges.v0(e);
            int j = edges.v1(e);
            ev[2 * e] = i;
            ev[2 * e + 1] = j;
            double[] d = {xyz[3 * j] - xyz[3 * i], xyz[3 * j + 1] - xyz[3 * i + 1], xyz[3 * j + 2] - xyz[3 * i + 2]};
            elen[e] = Math.sqrt(d[0] * d[0] + d[1] * d[1] + d[2] * d[2]);
            // facet A runs i→j, its edge normal is unit(d × n_A); facet B runs j→i, unit(−d × n_B)
            addEdgeDyad(e, normals, edges.facetForward(e), d, 1);
            addEdgeDyad(e, normals, edges.facetBackward(e), d, -1);
        }
    }

    private void addEdgeDyad(int e, double[] normals, int f, double[] d, double sign) {
        double nx = normals[3 * f];
        double ny = normals[3 * f + 1];
        double nz = normals[3 * f + 2];
        double[] m = {sign * (d[1] * nz - d[2] * ny), sign * (d[2] * nx - d[0] * nz), sign * (d[0] * ny - d[1] * nx)};
        double ml = Math.sqrt(m[0] * m[0] + m[1] * m[1] + m[2] * m[2]);
        double[] n = {nx, ny, nz};
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                edyad[9 * e + 3 * i + j] += n[i] * m[j] / ml;
            }
        }
    }

    public int facetCount() {
        return facetCount;
    }

    @Override
    public double gm() {
        return Constants.G * density * volume;
    }

    @Override
    public String describe() {
        return "reference polyhedron kernel (benchmark baseline), " + facetCount + " facets";
    }

    @Override
    public FieldEvaluator newEvaluator() {
        double[] t = new double[9]; // per-evaluator scratch: the gradient tensor sums
        return (x, y, z, gradient, out, o) -> evaluate(x, y, z, gradient, out, o, t);
    }

    private static final int[] TENSOR_SLOTS = {FieldSample.GXX, FieldSample.GXY, FieldSample.GXZ, FieldSample.GYY,
        FieldSample.GYZ, FieldSample.GZZ};
    private static final int[] TENSOR_COMPONENTS = {0, 1, 2, 4, 5, 8};

    private void evaluate(double x, double y, double z, boolean gradient, double[] out, int o, double[] t) {
        double u = 0;
        double gx = 0;
        double gy = 0;
        double gz = 0;
        java.util.Arrays.fill(t, 0.0);
        for (int e = 0; e < edgeCount; e++) {
            int i = 3 * ev[2 * e];
            int j = 3 * ev[2 * e + 1];
            double rix = xyz[i] - x;
            double riy = xyz[i + 1] - y;
            double riz = xyz[i + 2] - z;
            double rjx = xyz[j] - x;
            double rjy = xyz[j + 1] - y;
            double rjz = xyz[j + 2] - z;
            double a = Math.sqrt(rix * rix + riy * riy + riz * riz);
            double b = Math.sqrt(rjx * rjx + rjy * rjy + rjz * rjz);
            double len = elen[e];
            if (!(a + b - len > 0)) {
                continue; // on the edge: E_e·r_e = 0 there, the term's limit is 0
            }
            double le = Math.log((a + b + len) / (a + b - len));
            int q = 9 * e;
            double erx = edyad[q] * rix + edyad[q + 1] * riy + edyad[q + 2] * riz;
            double ery = edyad[q + 3] * rix + edyad[q + 4] * riy + edyad[q + 5] * riz;
            double erz = edyad[q + 6] * rix + edyad[q + 7] * riy + edyad[q + 8] * riz;
            u += (rix * erx + riy * ery + riz * erz) * le;
            gx -= erx * le;
            gy -= ery * le;
            gz -= erz * le;
            if (gradient) {
                for (int k = 0; k < 9; k++) {
                    t[k] += edyad[q + k] * le;
                }
            }
        }
        double omegaSum = 0;
        for (int f = 0; f < facetCount; f++) {
            int i1 = 3 * tri[3 * f];
            int i2 = 3 * tri[3 * f + 1];
            int i3 = 3 * tri[3 * f + 2];
            double r1x = xyz[i1] - x;
            double r1y = xyz[i1 + 1] - y;
            double r1z = xyz[i1 + 2] - z;
            double r2x = xyz[i2] - x;
            double r2y = xyz[i2 + 1] - y;
            double r2z = xyz[i2 + 2] - z;
            double r3x = xyz[i3] - x;
            double r3y = xyz[i3 + 1] - y;
            double r3z = xyz[i3 + 2] - z;
            double n1 = Math.sqrt(r1x * r1x + r1y * r1y + r1z * r1z);
            double n2 = Math.sqrt(r2x * r2x + r2y * r2y + r2z * r2z);
            double n3 = Math.sqrt(r3x * r3x + r3y * r3y + r3z * r3z);
            double triple = r1x * (r2y * r3z - r2z * r3y) + r1y * (r2z * r3x - r2x * r3z)
                + r1z * (r2x * r3y - r2y * r3x);
            double den = n1 * n2 * n3 + n1 * (r2x * r3x + r2y * r3y + r2z * r3z)
                + n2 * (r3x * r1x + r3y * r1y + r3z * r1z) + n3 * (r1x * r2x + r1y * r2y + r1z * r2z);
            double omega = 2 * Math.atan2(triple, den);
            int q = 9 * f;
            double frx = fdyad[q] * r1x + fdyad[q + 1] * r1y + fdyad[q + 2] * r1z;
            double fry = fdyad[q + 3] * r1x + fdyad[q + 4] * r1y + fdyad[q + 5] * r1z;
            double frz = fdyad[q + 6] * r1x + fdyad[q + 7] * r1y + fdyad[q + 8] * r1z;
            u -= (r1x * frx + r1y * fry + r1z * frz) * omega;
            gx += frx * omega;
            gy += fry * omega;
            gz += frz * omega;
            omegaSum += omega;
            if (gradient) {
                for (int k = 0; k < 9; k++) {
                    t[k] -= fdyad[q + k] * omega;
                }
            }
        }
        double gr = Constants.G * density;
        out[o + FieldSample.U] = 0.5 * gr * u;
        out[o + FieldSample.AX] = gr * gx;
        out[o + FieldSample.AY] = gr * gy;
        out[o + FieldSample.AZ] = gr * gz;
        out[o + FieldSample.LAPLACIAN] = -gr * omegaSum;
        for (int k = 0; k < 6; k++) {
            out[o + TENSOR_SLOTS[k]] = gradient ? gr * t[TENSOR_COMPONENTS[k]] : Double.NaN;
        }
        out[o + FieldSample.LOCATION] = (omegaSum > 2 * Math.PI ? Location.INSIDE : Location.OUTSIDE).code();
    }
}
