package dev.cairn.mass;

import dev.cairn.mesh.TriangleMesh;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;

/**
 * Volume, centre of mass and inertia tensor of a closed, outward-oriented triangle mesh of constant density.
 *
 * <p>Method: the body is the signed sum of tetrahedra {@code (O, a, b, c)}, one per facet, with {@code O} a
 * reference point near the body (the bounding-box centre, to limit round-off). For each tetrahedron
 * {@code V_t = a·(b×c)/6}, its first moment {@code V_t (a+b+c)/4} and its second moment
 * {@code ∫x xᵀ dV = V_t/20 [aaᵀ + bbᵀ + ccᵀ + s sᵀ]}, {@code s = a+b+c} (Tonon 2005, J. Math. Stat. 1(1):8–11;
 * equivalently Mirtich 1996, J. Graphics Tools 1(2):31–50, and Dobrovolskis 1996, Icarus 124:698–704). Then
 * {@code I = ρ(tr(P)·1 − P)}, shifted to the centre of mass by the parallel-axis theorem. Principal moments and axes
 * come from EJML's symmetric eigen-decomposition.
 */
public final class MassPropertiesCalculator {
    private MassPropertiesCalculator() {
    }

    /** Geometry only, as if the density were 1 kg/m^3; see {@link #compute(TriangleMesh, double)}. */
    public static MassProperties unitDensity(TriangleMesh mesh) {
        return compute(mesh, 1.0);
    }

    /**
     * @param mesh    closed, outward-oriented mesh, metres
     * @param density kg/m^3
     */
    public static MassProperties compute(TriangleMesh mesh, double density) {
        double[] xyz = mesh.xyz();
        int[] tri = mesh.tri();
        double[] bbox = mesh.boundingBox();
        double ox = 0.5 * (bbox[0] + bbox[3]);
        double oy = 0.5 * (bbox[1] + bbox[4]);
        double oz = 0.5 * (bbox[2] + bbox[5]);
        // Scale-free sums: coordinates relative to the box centre in units of the largest half-side L, so that no
        // power of the body size (up to L^5 for the second moments) overflows or underflows inside the loop.
        double half = 0.5 * Math.max(bbox[3] - bbox[0], Math.max(bbox[4] - bbox[1], bbox[5] - bbox[2]));
        double len = half > 0 && Double.isFinite(half) ? half : 1.0;
        double inv = 1.0 / len;
        double vol = 0;
        double area = 0;
        double mx = 0;
        double my = 0;
        double mz = 0;
        double pxx = 0;
        double pyy = 0;
        double pzz = 0;
        double pxy = 0;
        double pxz = 0;
        double pyz = 0;
        for (int f = 0; f < tri.length; f += 3) {
            int ia = 3 * tri[f];
            int ib = 3 * tri[f + 1];
            int ic = 3 * tri[f + 2];
            double ax = (xyz[ia] - ox) * inv;
            double ay = (xyz[ia + 1] - oy) * inv;
            double az = (xyz[ia + 2] - oz) * inv;
            double bx = (xyz[ib] - ox) * inv;
            double by = (xyz[ib + 1] - oy) * inv;
            double bz = (xyz[ib + 2] - oz) * inv;
            double cx = (xyz[ic] - ox) * inv;
            double cy = (xyz[ic + 1] - oy) * inv;
            double cz = (xyz[ic + 2] - oz) * inv;
            double v = (ax * (by * cz - bz * cy) + ay * (bz * cx - bx * cz) + az * (bx * cy - by * cx)) / 6.0;
            double nx = (by - ay) * (cz - az) - (bz - az) * (cy - ay);
            double ny = (bz - az) * (cx - ax) - (bx - ax) * (cz - az);
            double nz = (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
            area += 0.5 * Math.sqrt(nx * nx + ny * ny + nz * nz);
            vol += v;
            double sx = ax + bx + cx;
            double sy = ay + by + cy;
            double sz = az + bz + cz;
            mx += v * sx / 4.0;
            my += v * sy / 4.0;
            mz += v * sz / 4.0;
            double w = v / 20.0;
            pxx += w * (ax * ax + bx * bx + cx * cx + sx * sx);
            pyy += w * (ay * ay + by * by + cy * cy + sy * sy);
            pzz += w * (az * az + bz * bz + cz * cz + sz * sz);
            pxy += w * (ax * ay + bx * by + cx * cy + sx * sy);
            pxz += w * (ax * az + bx * bz + cx * cz + sx * sz);
            pyz += w * (ay * az + by * bz + cy * cz + sy * sz);
        }
        double gx = mx / vol;
        double gy = my / vol;
        double gz = mz / vol;
        // Second moment about the centre of mass (parallel-axis theorem), then I = ρ(tr P·1 − P), in units of L^5.
        double cxx = pxx - vol * gx * gx;
        double cyy = pyy - vol * gy * gy;
        double czz = pzz - vol * gz * gz;
        double cxy = pxy - vol * gx * gy;
        double cxz = pxz - vol * gx * gz;
        double cyz = pyz - vol * gy * gz;
        double tr = cxx + cyy + czz;
        double l2 = len * len;
        double rl5 = density * l2 * l2 * len;
        double[] inertia = {
            rl5 * (tr - cxx), -rl5 * cxy, -rl5 * cxz,
            -rl5 * cxy, rl5 * (tr - cyy), -rl5 * cyz,
            -rl5 * cxz, -rl5 * cyz, rl5 * (tr - czz)};
        double[] com = {gx * len + ox, gy * len + oy, gz * len + oz};
        vol *= l2 * len;
        area *= l2;
        double[] moments = new double[3];
        double[] axes = new double[9];
        principal(inertia, moments, axes);
        double brillouin = 0;
        for (int i = 0; i < xyz.length; i += 3) {
            double dx = xyz[i] - com[0];
            double dy = xyz[i + 1] - com[1];
            double dz = xyz[i + 2] - com[2];
            brillouin = Math.max(brillouin, dx * dx + dy * dy + dz * dz);
        }
        double eqRadius = Math.cbrt(3.0 * vol / (4.0 * Math.PI));
        return new MassProperties(vol, area, density, density * vol, com, inertia, moments, axes, eqRadius,
            Math.sqrt(brillouin));
    }

    /**
     * Eigen-decomposition of a symmetric 3×3 matrix (EJML), moments ascending, axes as rows, right-handed.
     *
     * @param sym     row-major symmetric matrix (read)
     * @param moments receives the three eigenvalues, ascending (written)
     * @param axes    receives the unit eigenvectors as rows (written)
     */
    public static void principal(double[] sym, double[] moments, double[] axes) {
        double scale = 0;
        for (double v : sym) {
            if (!Double.isFinite(v)) {
                throw new ArithmeticException("inertia tensor is not finite");
            }
            scale = Math.max(scale, Math.abs(v));
        }
        if (scale == 0) { // exact: a zero tensor has no principal axes; report the model frame
            java.util.Arrays.fill(moments, 0);
            java.util.Arrays.fill(axes, 0);
            axes[0] = 1;
            axes[4] = 1;
            axes[8] = 1;
            return;
        }
        double[] scaled = new double[9];
        for (int i = 0; i < 9; i++) {
            scaled[i] = sym[i] / scale; // eigenvectors are scale-free; eigenvalues scaled back below
        }
        DMatrixRMaj m = new DMatrixRMaj(3, 3, true, scaled);
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(3, true, true);
        if (!eig.decompose(m)) {
            throw new ArithmeticException("eigen-decomposition of the inertia tensor failed");
        }
        Integer[] order = {0, 1, 2};
        double[] val = new double[3];
        for (int k = 0; k < 3; k++) {
            val[k] = eig.getEigenvalue(k).getReal() * scale;
        }
        java.util.Arrays.sort(order, (i, j) -> Double.compare(val[i], val[j]));
        for (int k = 0; k < 3; k++) {
            moments[k] = val[order[k]];
            DMatrixRMaj v = eig.getEigenVector(order[k]);
            double n = Math.sqrt(v.get(0) * v.get(0) + v.get(1) * v.get(1) + v.get(2) * v.get(2));
            int big = 0;
            for (int i = 1; i < 3; i++) {
                if (Math.abs(v.get(i)) > Math.abs(v.get(big))) {
                    big = i;
                }
            }
            double s = v.get(big) < 0 ? -1 : 1;
            for (int i = 0; i < 3; i++) {
                axes[3 * k + i] = s * v.get(i) / n;
            }
        }
        // Right-handed: third axis = first × second.
        axes[6] = axes[1] * axes[5] - axes[2] * axes[4];
        axes[7] = axes[2] * axes[3] - axes[0] * axes[5];
        axes[8] = axes[0] * axes[4] - axes[1] * axes[3];
    }
}
