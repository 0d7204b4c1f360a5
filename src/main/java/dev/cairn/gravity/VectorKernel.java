package dev.cairn.gravity;

import jdk.incubator.vector.DoubleVector;
import jdk.incubator.vector.VectorMask;
import jdk.incubator.vector.VectorOperators;
import jdk.incubator.vector.VectorSpecies;

/**
 * Vector path of {@link PolyhedronField}: one pass over the vertex, edge and facet arrays evaluates {@link #LANES}
 * field points at once, one per lane of a {@code jdk.incubator.vector} register; facet and edge data are broadcast.
 *
 * <p>Each lane repeats the scalar evaluator's arithmetic operation for operation (same order, fma where it uses fma,
 * IEEE-exact lane-wise operations), so a point's result is bit-identical to the scalar path's and does not depend on
 * which other points share its pass. Where the scalar path branches per point, the vector path computes the common
 * branch in all lanes and replaces the other lanes: facets a point lies on get ω = 0 by a blend, and edges within
 * a few edge lengths of a point ({@code e/(a+b)} above {@link KernelMath#ATANH_LIMIT}) add nothing in the vector loop
 * and are added after it lane by lane by the scalar {@link PolyhedronField#addNearEdges}, in the order the scalar
 * path adds them (a call inside the vector loop, even one rarely taken, made the whole loop about twice as slow).
 *
 * <p>This class is loaded only when the module {@code jdk.incubator.vector} is present ({@code --add-modules
 * jdk.incubator.vector}); {@link PolyhedronField} falls back to its scalar evaluator otherwise. On Java 17 the compiler
 * keeps vectors in registers only while they do not cross a call that is not inlined, so each pass is one small
 * method with everything written out.
 */
final class VectorKernel {
    private static final VectorSpecies<Double> S = DoubleVector.SPECIES_PREFERRED;
    /** Field points per pass. */
    static final int LANES = S.length();
    /** Accumulated sums per lane between passes: u, gx, gy, gz, omegaSum, txx, txy, txz, tyy, tyz, tzz. */
    private static final int SUMS = 11;

    private VectorKernel() {
    }

    /** Whether the platform's preferred vector holds enough doubles for this path to pay (4 or more lanes). */
    static boolean usable() {
        return LANES >= 4;
    }

    static FieldEvaluator newEvaluator(PolyhedronField field, FieldEvaluator scalar) {
        return new Evaluator(field, scalar);
    }

    private static final class Evaluator implements FieldEvaluator {
        private final PolyhedronField f;
        private final FieldEvaluator scalar;
        /** Per vertex, its distance from each lane's point ({@code LANES} values per vertex). */
        private final double[] nrm;
        private final double[] px = new double[LANES];
        private final double[] py = new double[LANES];
        private final double[] pz = new double[LANES];
        private final double[] sums = new double[SUMS * LANES];
        /** Edges of the current pass within a few edge lengths of at least one lane's point, in edge order. */
        private final int[] nearEdges;
        private int nearCount;
        private long surface;

        Evaluator(PolyhedronField f, FieldEvaluator scalar) {
            this.f = f;
            this.scalar = scalar;
            this.nrm = new double[LANES * f.vertexCount];
            this.nearEdges = new int[f.edgeCount];
        }

        @Override
        public void evaluate(double x, double y, double z, boolean gradient, double[] out, int offset) {
            scalar.evaluate(x, y, z, gradient, out, offset); // one point: the scalar path, the same bits
        }

        @Override
        public void evaluateBatch(double[] xyz, int from, int to, boolean gradient, double[] out) {
            for (int i = from; i < to; i += LANES) {
                int n = Math.min(LANES, to - i);
                if (4 * n <= LANES) {
                    for (int k = i; k < i + n; k++) {
                        scalar.evaluate(xyz[3 * k], xyz[3 * k + 1], xyz[3 * k + 2], gradient, out, k * FieldSample.SIZE);
                    }
                    continue;
                }
                for (int l = 0; l < LANES; l++) {
                    int k = i + Math.min(l, n - 1); // spare lanes repeat the last point; their results are dropped
                    px[l] = xyz[3 * k] - f.ox;
                    py[l] = xyz[3 * k + 1] - f.oy;
                    pz[l] = xyz[3 * k + 2] - f.oz;
                }
                vertexPass();
                // Separate methods with and without the tensor: one method for both, its branch profile mixed,
                // compiled on Java 17 to code 2-4 times slower for both.
                if (gradient) {
                    edgePassGradient();
                    nearEdges(true);
                    facetPassGradient();
                } else {
                    edgePassPotential();
                    nearEdges(false);
                    facetPassPotential();
                }
                for (int l = 0; l < n; l++) {
                    double[] s = sums;
                    f.writeSample(s[l], s[LANES + l], s[2 * LANES + l], s[3 * LANES + l], s[4 * LANES + l],
                        (surface >>> l & 1) != 0, gradient, s[5 * LANES + l], s[6 * LANES + l], s[7 * LANES + l],
                        s[8 * LANES + l], s[9 * LANES + l], s[10 * LANES + l], out, (i + l) * FieldSample.SIZE);
                }
            }
        }

        private void vertexPass() {
            final double[] pv = f.pv;
            final double[] nrm = this.nrm;
            final DoubleVector qx = DoubleVector.fromArray(S, px, 0);
            final DoubleVector qy = DoubleVector.fromArray(S, py, 0);
            final DoubleVector qz = DoubleVector.fromArray(S, pz, 0);
            final int nv = f.vertexCount;
            for (int v = 0; v < nv; v++) {
                DoubleVector rx = DoubleVector.broadcast(S, pv[3 * v]).sub(qx);
                DoubleVector ry = DoubleVector.broadcast(S, pv[3 * v + 1]).sub(qy);
                DoubleVector rz = DoubleVector.broadcast(S, pv[3 * v + 2]).sub(qz);
                rz.fma(rz, ry.fma(ry, rx.mul(rx))).lanewise(VectorOperators.SQRT).intoArray(nrm, LANES * v);
            }
        }

        private void edgePassPotential() {
            final double[] pv = f.pv;
            final double[] nrm = this.nrm;
            final int[] ev = f.ev;
            final double[] edy = f.edy;
            final double[] elen = f.elen;
            final DoubleVector qx = DoubleVector.fromArray(S, px, 0);
            final DoubleVector qy = DoubleVector.fromArray(S, py, 0);
            final DoubleVector qz = DoubleVector.fromArray(S, pz, 0);
            DoubleVector u = DoubleVector.zero(S);
            DoubleVector gx = u;
            DoubleVector gy = u;
            DoubleVector gz = u;
            final int ne = f.edgeCount;
            int nearCount = 0;
            for (int e = 0; e < ne; e++) {
                int i = ev[2 * e];
                int j = ev[2 * e + 1];
                DoubleVector rix = DoubleVector.broadcast(S, pv[3 * i]).sub(qx);
                DoubleVector riy = DoubleVector.broadcast(S, pv[3 * i + 1]).sub(qy);
                DoubleVector riz = DoubleVector.broadcast(S, pv[3 * i + 2]).sub(qz);
                DoubleVector a = DoubleVector.fromArray(S, nrm, LANES * i);
                DoubleVector b = DoubleVector.fromArray(S, nrm, LANES * j);
                double len = elen[e];
                DoubleVector s = a.add(b);
                DoubleVector t = DoubleVector.broadcast(S, len).div(s);
                VectorMask<Double> near = t.compare(VectorOperators.GT, KernelMath.ATANH_LIMIT);
                // KernelMath.twoAtanhSmall, lane-wise
                DoubleVector z = t.mul(t);
                DoubleVector z2 = z.mul(z);
                DoubleVector z4 = z2.mul(z2);
                DoubleVector z8 = z4.mul(z4);
                DoubleVector q01 = DoubleVector.broadcast(S, KernelMath.AH1).fma(z, DoubleVector.broadcast(S, KernelMath.AH0));
                DoubleVector q23 = DoubleVector.broadcast(S, KernelMath.AH3).fma(z, DoubleVector.broadcast(S, KernelMath.AH2));
                DoubleVector q45 = DoubleVector.broadcast(S, KernelMath.AH5).fma(z, DoubleVector.broadcast(S, KernelMath.AH4));
                DoubleVector q67 = DoubleVector.broadcast(S, KernelMath.AH7).fma(z, DoubleVector.broadcast(S, KernelMath.AH6));
                DoubleVector q03 = q23.fma(z2, q01);
                DoubleVector q47 = q67.fma(z2, q45);
                DoubleVector q07 = q47.fma(z4, q03);
                DoubleVector q = DoubleVector.broadcast(S, KernelMath.AH8).fma(z8, q07);
                DoubleVector hh = t.mul(z).fma(q, t);
                DoubleVector le = hh.add(hh);
                if (near.anyTrue()) {
                    nearEdges[nearCount++] = e; // its near lanes' terms are added after the loop, as the scalar path does
                    le = le.blend(0.0, near); // adds nothing to those lanes (exactly: the sums are never −0)
                }
                int k = 6 * e;
                DoubleVector exx = DoubleVector.broadcast(S, edy[k]);
                DoubleVector exy = DoubleVector.broadcast(S, edy[k + 1]);
                DoubleVector exz = DoubleVector.broadcast(S, edy[k + 2]);
                DoubleVector eyy = DoubleVector.broadcast(S, edy[k + 3]);
                DoubleVector eyz = DoubleVector.broadcast(S, edy[k + 4]);
                DoubleVector ezz = DoubleVector.broadcast(S, edy[k + 5]);
                DoubleVector erx = exz.fma(riz, exy.fma(riy, exx.mul(rix)));
                DoubleVector ery = eyz.fma(riz, eyy.fma(riy, exy.mul(rix)));
                DoubleVector erz = ezz.fma(riz, eyz.fma(riy, exz.mul(rix)));
                DoubleVector rer = riz.fma(erz, riy.fma(ery, rix.mul(erx)));
                u = rer.fma(le, u);
                gx = erx.neg().fma(le, gx);
                gy = ery.neg().fma(le, gy);
                gz = erz.neg().fma(le, gz);
            }
            u.intoArray(sums, 0);
            gx.intoArray(sums, LANES);
            gy.intoArray(sums, 2 * LANES);
            gz.intoArray(sums, 3 * LANES);
            this.nearCount = nearCount;
        }

        private void edgePassGradient() {
            final double[] pv = f.pv;
            final double[] nrm = this.nrm;
            final int[] ev = f.ev;
            final double[] edy = f.edy;
            final double[] elen = f.elen;
            final DoubleVector qx = DoubleVector.fromArray(S, px, 0);
            final DoubleVector qy = DoubleVector.fromArray(S, py, 0);
            final DoubleVector qz = DoubleVector.fromArray(S, pz, 0);
            DoubleVector u = DoubleVector.zero(S);
            DoubleVector gx = u;
            DoubleVector gy = u;
            DoubleVector gz = u;
            DoubleVector txx = u;
            DoubleVector txy = u;
            DoubleVector txz = u;
            DoubleVector tyy = u;
            DoubleVector tyz = u;
            DoubleVector tzz = u;
            final int ne = f.edgeCount;
            int nearCount = 0;
            for (int e = 0; e < ne; e++) {
                int i = ev[2 * e];
                int j = ev[2 * e + 1];
                DoubleVector rix = DoubleVector.broadcast(S, pv[3 * i]).sub(qx);
                DoubleVector riy = DoubleVector.broadcast(S, pv[3 * i + 1]).sub(qy);
                DoubleVector riz = DoubleVector.broadcast(S, pv[3 * i + 2]).sub(qz);
                DoubleVector a = DoubleVector.fromArray(S, nrm, LANES * i);
                DoubleVector b = DoubleVector.fromArray(S, nrm, LANES * j);
                double len = elen[e];
                DoubleVector s = a.add(b);
                DoubleVector t = DoubleVector.broadcast(S, len).div(s);
                VectorMask<Double> near = t.compare(VectorOperators.GT, KernelMath.ATANH_LIMIT);
                // KernelMath.twoAtanhSmall, lane-wise
                DoubleVector z = t.mul(t);
                DoubleVector z2 = z.mul(z);
                DoubleVector z4 = z2.mul(z2);
                DoubleVector z8 = z4.mul(z4);
                DoubleVector q01 = DoubleVector.broadcast(S, KernelMath.AH1).fma(z, DoubleVector.broadcast(S, KernelMath.AH0));
                DoubleVector q23 = DoubleVector.broadcast(S, KernelMath.AH3).fma(z, DoubleVector.broadcast(S, KernelMath.AH2));
                DoubleVector q45 = DoubleVector.broadcast(S, KernelMath.AH5).fma(z, DoubleVector.broadcast(S, KernelMath.AH4));
                DoubleVector q67 = DoubleVector.broadcast(S, KernelMath.AH7).fma(z, DoubleVector.broadcast(S, KernelMath.AH6));
                DoubleVector q03 = q23.fma(z2, q01);
                DoubleVector q47 = q67.fma(z2, q45);
                DoubleVector q07 = q47.fma(z4, q03);
                DoubleVector q = DoubleVector.broadcast(S, KernelMath.AH8).fma(z8, q07);
                DoubleVector hh = t.mul(z).fma(q, t);
                DoubleVector le = hh.add(hh);
                if (near.anyTrue()) {
                    nearEdges[nearCount++] = e; // its near lanes' terms are added after the loop, as the scalar path does
                    le = le.blend(0.0, near); // adds nothing to those lanes (exactly: the sums are never −0)
                }
                int k = 6 * e;
                DoubleVector exx = DoubleVector.broadcast(S, edy[k]);
                DoubleVector exy = DoubleVector.broadcast(S, edy[k + 1]);
                DoubleVector exz = DoubleVector.broadcast(S, edy[k + 2]);
                DoubleVector eyy = DoubleVector.broadcast(S, edy[k + 3]);
                DoubleVector eyz = DoubleVector.broadcast(S, edy[k + 4]);
                DoubleVector ezz = DoubleVector.broadcast(S, edy[k + 5]);
                DoubleVector erx = exz.fma(riz, exy.fma(riy, exx.mul(rix)));
                DoubleVector ery = eyz.fma(riz, eyy.fma(riy, exy.mul(rix)));
                DoubleVector erz = ezz.fma(riz, eyz.fma(riy, exz.mul(rix)));
                DoubleVector rer = riz.fma(erz, riy.fma(ery, rix.mul(erx)));
                u = rer.fma(le, u);
                gx = erx.neg().fma(le, gx);
                gy = ery.neg().fma(le, gy);
                gz = erz.neg().fma(le, gz);
                txx = exx.fma(le, txx);
                txy = exy.fma(le, txy);
                txz = exz.fma(le, txz);
                tyy = eyy.fma(le, tyy);
                tyz = eyz.fma(le, tyz);
                tzz = ezz.fma(le, tzz);
            }
            u.intoArray(sums, 0);
            gx.intoArray(sums, LANES);
            gy.intoArray(sums, 2 * LANES);
            gz.intoArray(sums, 3 * LANES);
            txx.intoArray(sums, 5 * LANES);
            txy.intoArray(sums, 6 * LANES);
            txz.intoArray(sums, 7 * LANES);
            tyy.intoArray(sums, 8 * LANES);
            tyz.intoArray(sums, 9 * LANES);
            tzz.intoArray(sums, 10 * LANES);
            this.nearCount = nearCount;
        }

        /**
         * Adds the terms of the edges recorded in the edge pass to the lanes that were within a few edge lengths of
         * them, lane by lane in edge order with the scalar {@link PolyhedronField#addNearEdges} arithmetic.
         */
        private void nearEdges(boolean gradient) {
            for (int l = 0; l < LANES; l++) {
                f.addNearEdges(nearEdges, nearCount, px[l], py[l], pz[l], nrm, LANES, l, sums, LANES,
                    gradient);
            }
        }

        private void facetPassPotential() {
            final double[] pv = f.pv;
            final double[] nrm = this.nrm;
            final int[] fv = f.fv;
            final double[] fn = f.fn;
            final DoubleVector qx = DoubleVector.fromArray(S, px, 0);
            final DoubleVector qy = DoubleVector.fromArray(S, py, 0);
            final DoubleVector qz = DoubleVector.fromArray(S, pz, 0);
            DoubleVector u = DoubleVector.fromArray(S, sums, 0);
            DoubleVector gx = DoubleVector.fromArray(S, sums, LANES);
            DoubleVector gy = DoubleVector.fromArray(S, sums, 2 * LANES);
            DoubleVector gz = DoubleVector.fromArray(S, sums, 3 * LANES);
            DoubleVector os = DoubleVector.zero(S);
            VectorMask<Double> onSurface = S.maskAll(false);
            final DoubleVector zero = DoubleVector.zero(S);
            final int nf = f.facetCount;
            for (int t = 0; t < nf; t++) {
                int i1 = fv[3 * t];
                int i2 = fv[3 * t + 1];
                int i3 = fv[3 * t + 2];
                DoubleVector r1x = DoubleVector.broadcast(S, pv[3 * i1]).sub(qx);
                DoubleVector r1y = DoubleVector.broadcast(S, pv[3 * i1 + 1]).sub(qy);
                DoubleVector r1z = DoubleVector.broadcast(S, pv[3 * i1 + 2]).sub(qz);
                DoubleVector r2x = DoubleVector.broadcast(S, pv[3 * i2]).sub(qx);
                DoubleVector r2y = DoubleVector.broadcast(S, pv[3 * i2 + 1]).sub(qy);
                DoubleVector r2z = DoubleVector.broadcast(S, pv[3 * i2 + 2]).sub(qz);
                DoubleVector r3x = DoubleVector.broadcast(S, pv[3 * i3]).sub(qx);
                DoubleVector r3y = DoubleVector.broadcast(S, pv[3 * i3 + 1]).sub(qy);
                DoubleVector r3z = DoubleVector.broadcast(S, pv[3 * i3 + 2]).sub(qz);
                DoubleVector n1 = DoubleVector.fromArray(S, nrm, LANES * i1);
                DoubleVector n2 = DoubleVector.fromArray(S, nrm, LANES * i2);
                DoubleVector n3 = DoubleVector.fromArray(S, nrm, LANES * i3);
                int k = 4 * t;
                DoubleVector nx = DoubleVector.broadcast(S, fn[k]);
                DoubleVector ny = DoubleVector.broadcast(S, fn[k + 1]);
                DoubleVector nz = DoubleVector.broadcast(S, fn[k + 2]);
                DoubleVector h = nz.fma(r1z, ny.fma(r1y, nx.mul(r1x)));
                DoubleVector num = DoubleVector.broadcast(S, fn[k + 3]).mul(h);
                DoubleVector prod = n1.mul(n2).mul(n3);
                DoubleVector d23 = r2z.fma(r3z, r2y.fma(r3y, r2x.mul(r3x)));
                DoubleVector d31 = r3z.fma(r1z, r3y.fma(r1y, r3x.mul(r1x)));
                DoubleVector d12 = r1z.fma(r2z, r1y.fma(r2y, r1x.mul(r2x)));
                DoubleVector den = n3.fma(d12, n2.fma(d31, n1.fma(d23, prod)));
                // PolyhedronField.onFacet, lane-wise
                DoubleVector tp = prod.mul(PolyhedronField.ON_FACET_TOLERANCE);
                VectorMask<Double> special = prod.compare(VectorOperators.GT, 0.0).not()
                    .or(num.abs().compare(VectorOperators.LE, tp).and(den.compare(VectorOperators.LE, tp)));
                onSurface = onSurface.or(special);
                // KernelMath.atan2Fast(num, den), lane-wise
                DoubleVector ay = num.abs();
                DoubleVector ax = den.abs();
                VectorMask<Double> swap = ay.compare(VectorOperators.GT, ax);
                DoubleVector mn = ay.blend(ax, swap);
                DoubleVector mx = ax.blend(ay, swap);
                VectorMask<Double> m1 = mn.compare(VectorOperators.GT, mx.mul(0.125));
                VectorMask<Double> m2 = mn.compare(VectorOperators.GT, mx.mul(0.375));
                VectorMask<Double> m3 = mn.compare(VectorOperators.GT, mx.mul(0.625));
                VectorMask<Double> m4 = mn.compare(VectorOperators.GT, mx.mul(0.875));
                DoubleVector c = zero.blend(0.25, m1).blend(0.5, m2).blend(0.75, m3).blend(1.0, m4);
                DoubleVector ac = zero.blend(KernelMath.ATAN_QUARTER, m1).blend(KernelMath.ATAN_HALF, m2)
                    .blend(KernelMath.ATAN_THREE_QUARTERS, m3).blend(KernelMath.ATAN_ONE, m4);
                DoubleVector w = c.neg().fma(mx, mn).div(c.fma(mn, mx));
                DoubleVector z = w.mul(w);
                DoubleVector z2 = z.mul(z);
                DoubleVector z4 = z2.mul(z2);
                DoubleVector z8 = z4.mul(z4);
                DoubleVector p01 = DoubleVector.broadcast(S, KernelMath.AT1).fma(z, DoubleVector.broadcast(S, KernelMath.AT0));
                DoubleVector p23 = DoubleVector.broadcast(S, KernelMath.AT3).fma(z, DoubleVector.broadcast(S, KernelMath.AT2));
                DoubleVector p45 = DoubleVector.broadcast(S, KernelMath.AT5).fma(z, DoubleVector.broadcast(S, KernelMath.AT4));
                DoubleVector p67 = DoubleVector.broadcast(S, KernelMath.AT7).fma(z, DoubleVector.broadcast(S, KernelMath.AT6));
                DoubleVector p03 = p23.fma(z2, p01);
                DoubleVector p47 = p67.fma(z2, p45);
                DoubleVector p07 = p47.fma(z4, p03);
                DoubleVector p = DoubleVector.broadcast(S, KernelMath.AT8).fma(z8, p07);
                DoubleVector ang = ac.add(w.mul(z).fma(p, w));
                ang = ang.blend(DoubleVector.broadcast(S, KernelMath.HALF_PI).sub(ang), swap);
                ang = ang.blend(DoubleVector.broadcast(S, Math.PI).sub(ang), den.compare(VectorOperators.LT, 0.0));
                ang = ang.blend(ang.neg(), num.compare(VectorOperators.LT, 0.0));
                DoubleVector omega = ang.mul(2.0).blend(0.0, special);
                DoubleVector ho = h.mul(omega);
                u = h.neg().fma(ho, u);
                gx = nx.fma(ho, gx);
                gy = ny.fma(ho, gy);
                gz = nz.fma(ho, gz);
                os = os.add(omega);
            }
            u.intoArray(sums, 0);
            gx.intoArray(sums, LANES);
            gy.intoArray(sums, 2 * LANES);
            gz.intoArray(sums, 3 * LANES);
            os.intoArray(sums, 4 * LANES);
            surface = onSurface.toLong();
        }

        private void facetPassGradient() {
            final double[] pv = f.pv;
            final double[] nrm = this.nrm;
            final int[] fv = f.fv;
            final double[] fn = f.fn;
            final DoubleVector qx = DoubleVector.fromArray(S, px, 0);
            final DoubleVector qy = DoubleVector.fromArray(S, py, 0);
            final DoubleVector qz = DoubleVector.fromArray(S, pz, 0);
            DoubleVector u = DoubleVector.fromArray(S, sums, 0);
            DoubleVector gx = DoubleVector.fromArray(S, sums, LANES);
            DoubleVector gy = DoubleVector.fromArray(S, sums, 2 * LANES);
            DoubleVector gz = DoubleVector.fromArray(S, sums, 3 * LANES);
            DoubleVector os = DoubleVector.zero(S);
            DoubleVector txx = DoubleVector.fromArray(S, sums, 5 * LANES);
            DoubleVector txy = DoubleVector.fromArray(S, sums, 6 * LANES);
            DoubleVector txz = DoubleVector.fromArray(S, sums, 7 * LANES);
            DoubleVector tyy = DoubleVector.fromArray(S, sums, 8 * LANES);
            DoubleVector tyz = DoubleVector.fromArray(S, sums, 9 * LANES);
            DoubleVector tzz = DoubleVector.fromArray(S, sums, 10 * LANES);
            VectorMask<Double> onSurface = S.maskAll(false);
            final DoubleVector zero = DoubleVector.zero(S);
            final int nf = f.facetCount;
            for (int t = 0; t < nf; t++) {
                int i1 = fv[3 * t];
                int i2 = fv[3 * t + 1];
                int i3 = fv[3 * t + 2];
                DoubleVector r1x = DoubleVector.broadcast(S, pv[3 * i1]).sub(qx);
                DoubleVector r1y = DoubleVector.broadcast(S, pv[3 * i1 + 1]).sub(qy);
                DoubleVector r1z = DoubleVector.broadcast(S, pv[3 * i1 + 2]).sub(qz);
                DoubleVector r2x = DoubleVector.broadcast(S, pv[3 * i2]).sub(qx);
                DoubleVector r2y = DoubleVector.broadcast(S, pv[3 * i2 + 1]).sub(qy);
                DoubleVector r2z = DoubleVector.broadcast(S, pv[3 * i2 + 2]).sub(qz);
                DoubleVector r3x = DoubleVector.broadcast(S, pv[3 * i3]).sub(qx);
                DoubleVector r3y = DoubleVector.broadcast(S, pv[3 * i3 + 1]).sub(qy);
                DoubleVector r3z = DoubleVector.broadcast(S, pv[3 * i3 + 2]).sub(qz);
                DoubleVector n1 = DoubleVector.fromArray(S, nrm, LANES * i1);
                DoubleVector n2 = DoubleVector.fromArray(S, nrm, LANES * i2);
                DoubleVector n3 = DoubleVector.fromArray(S, nrm, LANES * i3);
                int k = 4 * t;
                DoubleVector nx = DoubleVector.broadcast(S, fn[k]);
                DoubleVector ny = DoubleVector.broadcast(S, fn[k + 1]);
                DoubleVector nz = DoubleVector.broadcast(S, fn[k + 2]);
                DoubleVector h = nz.fma(r1z, ny.fma(r1y, nx.mul(r1x)));
                DoubleVector num = DoubleVector.broadcast(S, fn[k + 3]).mul(h);
                DoubleVector prod = n1.mul(n2).mul(n3);
                DoubleVector d23 = r2z.fma(r3z, r2y.fma(r3y, r2x.mul(r3x)));
                DoubleVector d31 = r3z.fma(r1z, r3y.fma(r1y, r3x.mul(r1x)));
                DoubleVector d12 = r1z.fma(r2z, r1y.fma(r2y, r1x.mul(r2x)));
                DoubleVector den = n3.fma(d12, n2.fma(d31, n1.fma(d23, prod)));
                // PolyhedronField.onFacet, lane-wise
                DoubleVector tp = prod.mul(PolyhedronField.ON_FACET_TOLERANCE);
                VectorMask<Double> special = prod.compare(VectorOperators.GT, 0.0).not()
                    .or(num.abs().compare(VectorOperators.LE, tp).and(den.compare(VectorOperators.LE, tp)));
                onSurface = onSurface.or(special);
                // KernelMath.atan2Fast(num, den), lane-wise
                DoubleVector ay = num.abs();
                DoubleVector ax = den.abs();
                VectorMask<Double> swap = ay.compare(VectorOperators.GT, ax);
                DoubleVector mn = ay.blend(ax, swap);
                DoubleVector mx = ax.blend(ay, swap);
                VectorMask<Double> m1 = mn.compare(VectorOperators.GT, mx.mul(0.125));
                VectorMask<Double> m2 = mn.compare(VectorOperators.GT, mx.mul(0.375));
                VectorMask<Double> m3 = mn.compare(VectorOperators.GT, mx.mul(0.625));
                VectorMask<Double> m4 = mn.compare(VectorOperators.GT, mx.mul(0.875));
                DoubleVector c = zero.blend(0.25, m1).blend(0.5, m2).blend(0.75, m3).blend(1.0, m4);
                DoubleVector ac = zero.blend(KernelMath.ATAN_QUARTER, m1).blend(KernelMath.ATAN_HALF, m2)
                    .blend(KernelMath.ATAN_THREE_QUARTERS, m3).blend(KernelMath.ATAN_ONE, m4);
                DoubleVector w = c.neg().fma(mx, mn).div(c.fma(mn, mx));
                DoubleVector z = w.mul(w);
                DoubleVector z2 = z.mul(z);
                DoubleVector z4 = z2.mul(z2);
                DoubleVector z8 = z4.mul(z4);
                DoubleVector p01 = DoubleVector.broadcast(S, KernelMath.AT1).fma(z, DoubleVector.broadcast(S, KernelMath.AT0));
                DoubleVector p23 = DoubleVector.broadcast(S, KernelMath.AT3).fma(z, DoubleVector.broadcast(S, KernelMath.AT2));
                DoubleVector p45 = DoubleVector.broadcast(S, KernelMath.AT5).fma(z, DoubleVector.broadcast(S, KernelMath.AT4));
                DoubleVector p67 = DoubleVector.broadcast(S, KernelMath.AT7).fma(z, DoubleVector.broadcast(S, KernelMath.AT6));
                DoubleVector p03 = p23.fma(z2, p01);
                DoubleVector p47 = p67.fma(z2, p45);
                DoubleVector p07 = p47.fma(z4, p03);
                DoubleVector p = DoubleVector.broadcast(S, KernelMath.AT8).fma(z8, p07);
                DoubleVector ang = ac.add(w.mul(z).fma(p, w));
                ang = ang.blend(DoubleVector.broadcast(S, KernelMath.HALF_PI).sub(ang), swap);
                ang = ang.blend(DoubleVector.broadcast(S, Math.PI).sub(ang), den.compare(VectorOperators.LT, 0.0));
                ang = ang.blend(ang.neg(), num.compare(VectorOperators.LT, 0.0));
                DoubleVector omega = ang.mul(2.0).blend(0.0, special);
                DoubleVector ho = h.mul(omega);
                u = h.neg().fma(ho, u);
                gx = nx.fma(ho, gx);
                gy = ny.fma(ho, gy);
                gz = nz.fma(ho, gz);
                os = os.add(omega);
                DoubleVector nxo = nx.mul(omega);
                DoubleVector nyo = ny.mul(omega);
                DoubleVector nzo = nz.mul(omega);
                txx = nx.neg().fma(nxo, txx);
                txy = ny.neg().fma(nxo, txy);
                txz = nz.neg().fma(nxo, txz);
                tyy = ny.neg().fma(nyo, tyy);
                tyz = nz.neg().fma(nyo, tyz);
                tzz = nz.neg().fma(nzo, tzz);
            }
            u.intoArray(sums, 0);
            gx.intoArray(sums, LANES);
            gy.intoArray(sums, 2 * LANES);
            gz.intoArray(sums, 3 * LANES);
            os.intoArray(sums, 4 * LANES);
            txx.intoArray(sums, 5 * LANES);
            txy.intoArray(sums, 6 * LANES);
            txz.intoArray(sums, 7 * LANES);
            tyy.intoArray(sums, 8 * LANES);
            tyz.intoArray(sums, 9 * LANES);
            tzz.intoArray(sums, 10 * LANES);
            surface = onSurface.toLong();
        }
    }
}
