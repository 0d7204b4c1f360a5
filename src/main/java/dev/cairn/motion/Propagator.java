package dev.cairn.motion;

import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.mascon.SurfaceQuery;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.RotatingFrame;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.apache.commons.math3.exception.MaxCountExceededException;
import org.apache.commons.math3.ode.FirstOrderDifferentialEquations;
import org.apache.commons.math3.ode.nonstiff.DormandPrince853Integrator;
import org.apache.commons.math3.ode.sampling.StepHandler;
import org.apache.commons.math3.ode.sampling.StepInterpolator;

/**
 * Propagates a point mass in the gravity field of a uniformly spinning body, with impact, escape and altitude events.
 *
 * <p><b>Equations of motion.</b> Body (rotating) frame, spin ω about the unit pole ω̂ through the centre of mass c,
 * p = r − c, p⊥ = p − ω̂(ω̂·p):
 * <pre>
 *   r̈ = g(r) + ω² p⊥ − 2ω ω̂ × ṙ + R(−ωt) a_ext(t)
 * </pre>
 * (gravity, centrifugal, Coriolis; framework: Scheeres, D.J. (2012) Orbital Motion in Strongly Perturbed
 * Environments, Springer; from memory), with R(θ) the rotation by θ about ω̂ that carries inertial vectors into the body
 * frame. Inertial frame (aligned with the body frame at t = 0, same origin): {@code r̈ = R(ωt) g(c + R(−ωt) p) + a_ext}.
 * Extra accelerations a_ext: a constant vector fixed in inertial space (solar radiation pressure) and the tidal pull of a
 * {@link ThirdBody}. Without them the Jacobi integral J = ½|ṙ|² − U − ½ω²|p⊥|² is conserved in the body frame (it
 * is the energy ½|v|² − U when ω = 0); its drift over the run is reported.
 *
 * <p><b>Integrator</b>: Dormand–Prince 8(5,3) with the tolerances of {@link MotionSettings} and its dense output.
 *
 * <p><b>Impact</b>: over each step the body-frame path is replaced by k straight chords through points of the dense
 * output, k chosen so that the chords' sagitta (estimated from the path's deviation from the step's chord at three
 * interior points) is below the chord tolerance; each chord is tested against the shape through a
 * {@link SegmentIndex} (exact segment–triangle crossings). The first crossing is refined to the time at which the
 * dense-output path crosses the facet's plane (Brent's method, Brent, R.P. (1973) Algorithms for Minimization without
 * Derivatives, ch. 4). Steps whose chord, widened by the sagitta estimate, stays outside the body's bounding sphere are
 * not tested. A dip into the body shallower than the chord tolerance can be missed; nothing deeper.
 *
 * <p><b>Escape</b>: the radius |p| passes the escape radius outward (refined by bisection) while the two-body energy
 * ½|v_inertial|² − GM/|p| is positive, or the run is beyond it with positive energy at a step end.
 * <b>Altitude</b>: the signed distance to the surface ({@link SurfaceQuery#signedDistance}) crosses a threshold between
 * step ends (refined by bisection on the dense output).
 *
 * <p><b>Trial points inside the body.</b> A trial step of the integrator that ends inside the body would see the
 * interior field, whose second derivatives jump at the surface: the step-size controller then rejects and shrinks
 * steps until one ends just short of the surface. Instead, a trial point that the field calls inside gets the
 * exterior field analytically continued across the facet that the segment from the step's start to the point
 * enters ({@link #continuedField}); the controller sees a smooth field and the impact is still found exactly by the
 * segment–mesh test on the accepted step and refined on its dense output. The last few evaluations are remembered,
 * so the Jacobi integral at a step end reuses the integrator's evaluation there. {@link #withStrict} gives the path
 * without these (reference and benchmark baseline).
 *
 * <p>Immutable and thread-safe: each {@link #propagate} call makes its own integrator (and, unless one is passed in,
 * its own field evaluator), so runs on different threads give the same results as runs on one.
 */
public final class Propagator {
    private static final int MAX_CHORDS = 4096;
    private final FieldModel field;
    private final TriangleMesh mesh;
    private final RotatingFrame frame;
    private final MotionSettings settings;
    private final SegmentIndex index;
    private final SurfaceQuery surface;
    private final double[] fn;
    private final double omega;
    private final double[] axis;
    private final double[] centre;
    private final double length;
    private final double speedScale;
    private final double escapeRadius;
    private final double[] srp0;
    private final boolean strict;

    /**
     * @param field    gravity field of the body (model frame)
     * @param mesh     shape model, metres, closed and outward-oriented
     * @param frame    rotating frame of the body (spin and centre of mass)
     * @param settings frame, tolerances, extra accelerations, event thresholds
     */
    public Propagator(FieldModel field, TriangleMesh mesh, RotatingFrame frame, MotionSettings settings) {
        this(field, mesh, frame, settings, new SegmentIndex(mesh), new SurfaceQuery(mesh), false);
    }

    private Propagator(FieldModel field, TriangleMesh mesh, RotatingFrame frame, MotionSettings settings,
                       SegmentIndex index, SurfaceQuery surface, boolean strict) {
        this.strict = strict;
        this.field = field;
        this.mesh = mesh;
        this.frame = frame;
        this.settings = settings;
        this.index = index;
        this.surface = surface;
        this.fn = mesh.facetNormals();
        this.omega = frame.omega();
        this.axis = frame.axis();
        this.centre = frame.centre();
        double[] xyz = mesh.xyz();
        double r2 = 0;
        for (int i = 0; i < xyz.length; i += 3) {
            double dx = xyz[i] - centre[0];
            double dy = xyz[i + 1] - centre[1];
            double dz = xyz[i + 2] - centre[2];
            r2 = Math.max(r2, dx * dx + dy * dy + dz * dz);
        }
        this.length = Math.sqrt(r2);
        this.speedScale = Math.sqrt(field.gm() / length);
        this.srp0 = settings.srpInertial();
        this.escapeRadius = Double.isNaN(settings.escapeRadius()) ? MotionSettings.DEFAULT_ESCAPE_RADII * length
            : settings.escapeRadius();
    }

    /** The same body with other settings (shares the spatial indexes). */
    public Propagator with(MotionSettings other) {
        return new Propagator(field, mesh, frame, other, index, surface, strict);
    }

    /**
     * The same body and settings on the strict path ({@code true}): the field is always the body's own field at
     * every trial point (inside points included, no continuation), no evaluation is reused, and the integrator picks
     * its own first step. It is the code path before the continuation was added, kept as the reference and the
     * benchmark baseline; results agree with the default path within the integrator tolerance (tested).
     */
    public Propagator withStrict(boolean strictPath) {
        return new Propagator(field, mesh, frame, settings, index, surface, strictPath);
    }

    /** Whether this propagator runs the strict path (see {@link #withStrict}). */
    public boolean isStrict() {
        return strict;
    }

    /** A new evaluator of the field, for one thread; pass it to {@link #propagate(double[], double, double,
     * FieldEvaluator, double)} to reuse it over many propagations. */
    public FieldEvaluator newEvaluator() {
        return field.newEvaluator();
    }

    /**
     * The body's exterior field analytically continued across facet f to the point (x, y, z), model frame: the
     * field is evaluated at the point and, when the model reports the point inside with a Laplacian λ = −4πGρ
     * (constant density near the facet), corrected by the part that jumps across f. In the Werner–Scheeres sums only
     * the solid angle ω_f of the crossed facet jumps (by 4π) when a point passes through the facet's interior, and it
     * enters U with the weight −(Gρ/2)(n_f·r_f)² (Werner, R.A. &amp; Scheeres, D.J. (1997) Celest. Mech. Dyn. Astron.
     * 65:313–344, eq. for U); with d = n_f·(x − v_f) the signed distance from the facet's plane (negative inside):
     * <pre>
     *   U_cont = U_in − (λ/2) d²,   g_cont = g_in − λ d n_f
     * </pre>
     * which is harmonic (∇²U_cont = λ − λ = 0) and joins the exterior field with its value and gradient on the
     * facet (the correction is O(d²)). Outside points, points the model does not call inside, and models with no
     * Laplacian are returned unchanged.
     *
     * @param out receives a {@link FieldSample} (modified); its LOCATION slot keeps the model's classification
     * @return whether the continuation was applied
     */
    public boolean continuedField(FieldEvaluator eval, double x, double y, double z, int f, double[] out, int o) {
        eval.evaluate(x, y, z, false, out, o);
        return continueAcross(x, y, z, f, out, o);
    }

    /** Applies the continuation of {@link #continuedField} to a sample already evaluated at (x, y, z). */
    private boolean continueAcross(double x, double y, double z, int f, double[] out, int o) {
        double lap = out[o + FieldSample.LAPLACIAN];
        if (f < 0 || out[o + FieldSample.LOCATION] != 1.0 || !(lap < 0) || !Double.isFinite(lap)) {
            return false;
        }
        double[] xyz = mesh.xyz();
        int v = 3 * mesh.tri()[3 * f];
        double nx = fn[3 * f];
        double ny = fn[3 * f + 1];
        double nz = fn[3 * f + 2];
        double d = (x - xyz[v]) * nx + (y - xyz[v + 1]) * ny + (z - xyz[v + 2]) * nz;
        out[o + FieldSample.U] -= 0.5 * lap * d * d;
        out[o + FieldSample.AX] -= lap * d * nx;
        out[o + FieldSample.AY] -= lap * d * ny;
        out[o + FieldSample.AZ] -= lap * d * nz;
        return true;
    }

    public MotionSettings settings() {
        return settings;
    }

    public FieldModel field() {
        return field;
    }

    public RotatingFrame frame() {
        return frame;
    }

    public TriangleMesh mesh() {
        return mesh;
    }

    /** Largest distance of a vertex from the centre of mass, m (the length scale L). */
    public double boundingRadius() {
        return length;
    }

    /** The escape radius in use, m. */
    public double escapeRadius() {
        return escapeRadius;
    }

    /** Signed distance of a body-frame point from the surface, m (negative inside). */
    public double altitude(double x, double y, double z) {
        return surface.signedDistance(x, y, z, new double[4]);
    }

    /** The exact surface queries of the shape (signed distance, inside test). */
    public SurfaceQuery surface() {
        return surface;
    }

    /**
     * Propagates one initial state.
     *
     * @param state0     position (m) and velocity (m/s) at t = 0 in the settings' frame (body frame: velocity relative
     *                   to the body; inertial: inertial velocity), 6 values
     * @param duration   time span, s, positive
     * @param outputStep spacing of output rows, s, positive (rows also at events and at the end)
     */
    public Trajectory propagate(double[] state0, double duration, double outputStep) {
        if (!(duration > 0) || !Double.isFinite(duration) || !(outputStep > 0) || !Double.isFinite(outputStep)) {
            throw new IllegalArgumentException("duration and output step must be positive and finite");
        }
        return new Run(duration, outputStep, field.newEvaluator(), Double.NaN).run(state0);
    }

    /**
     * Propagates one initial state with a caller's evaluator (reused across propagations of one thread: no
     * allocation per step or per run in the evaluator) and a first step.
     *
     * @param eval      an evaluator of {@link #field()} owned by the calling thread
     * @param firstStep size of the integrator's first step, s (NaN or ≤ 0: the integrator's own estimate, which
     *                  costs an extra field evaluation); ignored on the strict path
     */
    public Trajectory propagate(double[] state0, double duration, double outputStep, FieldEvaluator eval,
                                double firstStep) {
        if (!(duration > 0) || !Double.isFinite(duration) || !(outputStep > 0) || !Double.isFinite(outputStep)) {
            throw new IllegalArgumentException("duration and output step must be positive and finite");
        }
        return new Run(duration, outputStep, eval, strict ? Double.NaN : firstStep).run(state0);
    }

    /** Rotation of v by angle θ about the spin pole (Rodrigues' formula), into out[o..o+2]. */
    private void rotate(double[] v, int vo, double theta, double[] out, int o) {
        double c = Math.cos(theta);
        double s = Math.sin(theta);
        double vx = v[vo];
        double vy = v[vo + 1];
        double vz = v[vo + 2];
        double d = (axis[0] * vx + axis[1] * vy + axis[2] * vz) * (1 - c);
        double cx = axis[1] * vz - axis[2] * vy;
        double cy = axis[2] * vx - axis[0] * vz;
        double cz = axis[0] * vy - axis[1] * vx;
        out[o] = vx * c + cx * s + axis[0] * d;
        out[o + 1] = vy * c + cy * s + axis[1] * d;
        out[o + 2] = vz * c + cz * s + axis[2] * d;
    }

    /** Thrown by the step handler to end the integration at a terminal event. */
    private static final class Stop extends RuntimeException {
        Stop() {
            super(null, null, false, false);
        }
    }

    /** One propagation: evaluator, scratch, outputs. */
    private final class Run implements FirstOrderDifferentialEquations, StepHandler {
        private final double duration;
        private final double outputStep;
        private final FieldEvaluator eval;
        private final double firstStep;
        /** Last evaluated points (model frame) and their samples, a ring (reuse of the step-end evaluation). */
        private static final int MEMO = 8;
        private final double[] memoXyz = new double[3 * MEMO];
        private final double[] memoSample = new double[FieldSample.SIZE * MEMO];
        private int memoCount;
        private int memoNext;
        /** Model-frame position at the start of the current step (outside), for the continuation across facets. */
        private final double[] stepStart = new double[3];
        private final int[] contFacet = new int[1];
        private final double[] sample = new double[FieldSample.SIZE];
        private final double[] tmp = new double[6];
        private final double[] tmp2 = new double[6];
        private final double[] body = new double[6];
        private final double[] scratch4 = new double[4];
        private final int[] hitFacet = new int[1];
        private final double[] ext = new double[3];
        private final double[] extSp = new double[3];
        private final double[] alts;
        private final List<MotionEvent> events = new ArrayList<>();
        private double[] rows = new double[Trajectory.COLUMNS * 64];
        private int rowCount;
        private long evaluations;
        private long steps;
        private double jacobi0;
        private double maxDrift;
        private long nextOutput = 1;
        private double prevAlt;
        private double endTime;
        private Trajectory.Outcome outcome = Trajectory.Outcome.DURATION;
        private StepInterpolator interp;

        Run(double duration, double outputStep, FieldEvaluator eval, double firstStep) {
            this.eval = eval;
            this.firstStep = firstStep;
            this.duration = duration;
            this.outputStep = outputStep;
            this.alts = settings.altitudes();
            if (duration / outputStep > 50_000_000) {
                throw new IllegalArgumentException("more than 50,000,000 output rows: raise the output step");
            }
        }

        Trajectory run(double[] state0) {
            double[] y = state0.clone();
            toBody(0, y, body);
            stepStart[0] = body[0];
            stepStart[1] = body[1];
            stepStart[2] = body[2];
            jacobi0 = jacobi(body);
            addRow(0, y);
            if (alts.length > 0) {
                prevAlt = surface.signedDistance(body[0], body[1], body[2], scratch4);
            }
            double[] absTol = new double[6];
            double[] relTol = new double[6];
            for (int i = 0; i < 6; i++) {
                absTol[i] = settings.absoluteScale() * (i < 3 ? length : speedScale);
                relTol[i] = settings.relativeTolerance();
            }
            DormandPrince853Integrator dp = new DormandPrince853Integrator(0.0, duration, absTol, relTol);
            long maxEvals = Math.max(1, settings.maxEvaluations() - evaluations);
            dp.setMaxEvaluations((int) Math.min(Integer.MAX_VALUE, maxEvals));
            dp.addStepHandler(this);
            if (firstStep > 0 && firstStep < duration) {
                dp.setInitialStepSize(firstStep);
            }
            double[] yEnd = y.clone();
            endTime = duration;
            try {
                dp.integrate(this, 0.0, y, duration, yEnd);
                if (rowCount == 0 || rows[(rowCount - 1) * Trajectory.COLUMNS] < duration) {
                    addRow(duration, yEnd);
                }
            } catch (Stop stop) {
                // a terminal event: rows and events are complete
            } catch (MaxCountExceededException e) {
                outcome = Trajectory.Outcome.STEP_LIMIT;
                endTime = rowCount > 0 ? rows[(rowCount - 1) * Trajectory.COLUMNS] : 0;
            }
            return new Trajectory(outcome, java.util.Arrays.copyOf(rows, rowCount * Trajectory.COLUMNS),
                List.copyOf(events), endTime, jacobi0, maxDrift, steps, evaluations);
        }

        @Override
        public int getDimension() {
            return 6;
        }

        @Override
        public void computeDerivatives(double t, double[] y, double[] yDot) {
            yDot[0] = y[3];
            yDot[1] = y[4];
            yDot[2] = y[5];
            double ex = 0;
            double ey = 0;
            double ez = 0;
            double[] srp = srp0;
            ThirdBody tb = settings.thirdBody();
            if (settings.frame() == Frame.BODY) {
                fieldAt(y[0], y[1], y[2], true);
                double px = y[0] - centre[0];
                double py = y[1] - centre[1];
                double pz = y[2] - centre[2];
                double s = px * axis[0] + py * axis[1] + pz * axis[2];
                double w2 = omega * omega;
                // Coriolis −2ω ω̂ × v
                double cx = axis[1] * y[5] - axis[2] * y[4];
                double cy = axis[2] * y[3] - axis[0] * y[5];
                double cz = axis[0] * y[4] - axis[1] * y[3];
                if (srp != null || tb != null) {
                    externalInertial(t, px, py, pz, true, tmp);
                    ex = tmp[0];
                    ey = tmp[1];
                    ez = tmp[2];
                }
                yDot[3] = sample[FieldSample.AX] + w2 * (px - s * axis[0]) - 2 * omega * cx + ex;
                yDot[4] = sample[FieldSample.AY] + w2 * (py - s * axis[1]) - 2 * omega * cy + ey;
                yDot[5] = sample[FieldSample.AZ] + w2 * (pz - s * axis[2]) - 2 * omega * cz + ez;
            } else {
                tmp2[0] = y[0] - centre[0];
                tmp2[1] = y[1] - centre[1];
                tmp2[2] = y[2] - centre[2];
                rotate(tmp2, 0, -omega * t, tmp, 0);
                fieldAt(centre[0] + tmp[0], centre[1] + tmp[1], centre[2] + tmp[2], true);
                rotate(sample, FieldSample.AX, omega * t, tmp, 3);
                if (srp != null || tb != null) {
                    externalInertial(t, tmp2[0], tmp2[1], tmp2[2], false, tmp);
                    ex = tmp[0];
                    ey = tmp[1];
                    ez = tmp[2];
                }
                yDot[3] = tmp[3] + ex;
                yDot[4] = tmp[4] + ey;
                yDot[5] = tmp[5] + ez;
            }
        }

        /**
         * Extra accelerations at p = r − c (in the body frame when {@code bodyFrame}, else inertial), written to
         * out[0..2] in the same frame.
         */
        private void externalInertial(double t, double px, double py, double pz, boolean bodyFrame, double[] out) {
            double ax = 0;
            double ay = 0;
            double az = 0;
            double[] srp = srp0;
            ThirdBody tb = settings.thirdBody();
            double[] v = ext;
            if (tb != null) {
                double nm = Math.sqrt((tb.gm() + field.gm()) / (tb.distance() * tb.distance() * tb.distance()));
                double c = Math.cos(nm * t) * tb.distance();
                double s = Math.sin(nm * t) * tb.distance();
                double[] u = tb.direction();
                double[] k = tb.pole();
                double wx = k[1] * u[2] - k[2] * u[1];
                double wy = k[2] * u[0] - k[0] * u[2];
                double wz = k[0] * u[1] - k[1] * u[0];
                double[] sp = extSp;
                sp[0] = c * u[0] + s * wx;
                sp[1] = c * u[1] + s * wy;
                sp[2] = c * u[2] + s * wz;
                if (bodyFrame) {
                    rotate(sp, 0, -omega * t, sp, 0);
                }
                double dx = sp[0] - px;
                double dy = sp[1] - py;
                double dz = sp[2] - pz;
                double d3 = Math.pow(dx * dx + dy * dy + dz * dz, 1.5);
                double s3 = Math.pow(sp[0] * sp[0] + sp[1] * sp[1] + sp[2] * sp[2], 1.5);
                ax += tb.gm() * (dx / d3 - sp[0] / s3);
                ay += tb.gm() * (dy / d3 - sp[1] / s3);
                az += tb.gm() * (dz / d3 - sp[2] / s3);
            }
            if (srp != null) {
                if (bodyFrame) {
                    rotate(srp, 0, -omega * t, v, 0);
                } else {
                    v[0] = srp[0];
                    v[1] = srp[1];
                    v[2] = srp[2];
                }
                ax += v[0];
                ay += v[1];
                az += v[2];
            }
            out[0] = ax;
            out[1] = ay;
            out[2] = az;
        }

        /** Converts an integration state at time t to the body frame (position, velocity relative to the body). */
        private void toBody(double t, double[] y, double[] out) {
            if (settings.frame() == Frame.BODY) {
                System.arraycopy(y, 0, out, 0, 6);
                return;
            }
            double[] p = {y[0] - centre[0], y[1] - centre[1], y[2] - centre[2]};
            double[] v = {y[3] - omega * (axis[1] * p[2] - axis[2] * p[1]),
                y[4] - omega * (axis[2] * p[0] - axis[0] * p[2]), y[5] - omega * (axis[0] * p[1] - axis[1] * p[0])};
            rotate(p, 0, -omega * t, out, 0);
            out[0] += centre[0];
            out[1] += centre[1];
            out[2] += centre[2];
            rotate(v, 0, -omega * t, out, 3);
        }

        /** Converts an integration state at time t to the inertial frame. */
        private void toInertial(double t, double[] y, double[] out, int o) {
            if (settings.frame() == Frame.INERTIAL) {
                System.arraycopy(y, 0, out, o, 6);
                return;
            }
            double[] p = {y[0] - centre[0], y[1] - centre[1], y[2] - centre[2]};
            double[] pi = new double[3];
            double[] vi = new double[3];
            rotate(p, 0, omega * t, pi, 0);
            rotate(y, 3, omega * t, vi, 0);
            out[o] = pi[0] + centre[0];
            out[o + 1] = pi[1] + centre[1];
            out[o + 2] = pi[2] + centre[2];
            out[o + 3] = vi[0] + omega * (axis[1] * pi[2] - axis[2] * pi[1]);
            out[o + 4] = vi[1] + omega * (axis[2] * pi[0] - axis[0] * pi[2]);
            out[o + 5] = vi[2] + omega * (axis[0] * pi[1] - axis[1] * pi[0]);
        }

        /**
         * The field at a model-frame point into {@link #sample}: the memo of the last evaluations first (not on the
         * strict path); then one evaluation, continued across the facet entered since the step start when the point
         * is inside and {@code trial} (a trial point of the integrator).
         */
        private void fieldAt(double x, double y, double z, boolean trial) {
            if (!strict) {
                for (int k = 0; k < memoCount; k++) {
                    if (memoXyz[3 * k] == x && memoXyz[3 * k + 1] == y && memoXyz[3 * k + 2] == z) {
                        System.arraycopy(memoSample, FieldSample.SIZE * k, sample, 0, FieldSample.SIZE);
                        return;
                    }
                }
            }
            evaluations++;
            eval.evaluate(x, y, z, false, sample, 0);
            if (strict) {
                return;
            }
            if (trial && sample[FieldSample.LOCATION] == 1.0) {
                double s = index.firstHit(stepStart[0], stepStart[1], stepStart[2], x, y, z, contFacet);
                if (!Double.isNaN(s)) {
                    continueAcross(x, y, z, contFacet[0], sample, 0);
                }
            }
            int k = memoNext;
            memoXyz[3 * k] = x;
            memoXyz[3 * k + 1] = y;
            memoXyz[3 * k + 2] = z;
            System.arraycopy(sample, 0, memoSample, FieldSample.SIZE * k, FieldSample.SIZE);
            memoNext = (k + 1) % MEMO;
            memoCount = Math.min(MEMO, memoCount + 1);
        }

        /** Jacobi integral of a body-frame state (at most one field evaluation; the step end's is reused). */
        private double jacobi(double[] b) {
            fieldAt(b[0], b[1], b[2], false);
            double v2 = b[3] * b[3] + b[4] * b[4] + b[5] * b[5];
            return 0.5 * v2 - sample[FieldSample.U] - frame.centrifugalPotential(b[0], b[1], b[2]);
        }

        /** Two-body energy ½|v_inertial|² − GM/|p| of a body-frame state. */
        private double twoBodyEnergy(double[] b) {
            double px = b[0] - centre[0];
            double py = b[1] - centre[1];
            double pz = b[2] - centre[2];
            double vx = b[3] + omega * (axis[1] * pz - axis[2] * py);
            double vy = b[4] + omega * (axis[2] * px - axis[0] * pz);
            double vz = b[5] + omega * (axis[0] * py - axis[1] * px);
            return 0.5 * (vx * vx + vy * vy + vz * vz) - field.gm() / Math.sqrt(px * px + py * py + pz * pz);
        }

        private void addRow(double t, double[] y) {
            int c = Trajectory.COLUMNS;
            if ((rowCount + 1) * c > rows.length) {
                rows = java.util.Arrays.copyOf(rows, rows.length * 2);
            }
            int o = rowCount * c;
            toBody(t, y, body);
            rows[o] = t;
            System.arraycopy(body, 0, rows, o + 1, 6);
            double j = jacobi(body);
            rows[o + 7] = j;
            maxDrift = Math.max(maxDrift, Math.abs(j - jacobi0));
            toInertial(t, y, rows, o + 8);
            rowCount++;
        }

        /** Body-frame position at time t from the dense output, into out[o..o+2]. */
        private void bodyPositionAt(double t, double[] out, int o) {
            interp.setInterpolatedTime(t);
            toBody(t, interp.getInterpolatedState(), body);
            out[o] = body[0];
            out[o + 1] = body[1];
            out[o + 2] = body[2];
        }

        /** Integration state at time t (a copy). */
        private double[] stateAt(double t) {
            interp.setInterpolatedTime(t);
            return interp.getInterpolatedState().clone();
        }

        @Override
        public void init(double t0, double[] y0, double t) {
        }

        @Override
        public void handleStep(StepInterpolator si, boolean isLast) {
            interp = si;
            steps++;
            double t0 = si.getPreviousTime();
            double t1 = si.getCurrentTime();
            double tImpact = impactTime(t0, t1);
            double tEnd = Double.isNaN(tImpact) ? t1 : tImpact;
            // Altitude crossings and escape before the end of this (part of the) step.
            List<double[]> pending = new ArrayList<>(); // {time, kind (0 altitude, 1 escape), threshold, direction}
            if (alts.length > 0) {
                double[] bEnd = new double[3];
                bodyPositionAt(tEnd, bEnd, 0);
                double altEnd = surface.signedDistance(bEnd[0], bEnd[1], bEnd[2], scratch4);
                for (double h : alts) {
                    if ((prevAlt - h) * (altEnd - h) < 0 || (altEnd == h && prevAlt != h)) {
                        double tc = bisect(t0, tEnd, h, prevAlt < h, true);
                        pending.add(new double[] {tc, 0, h, prevAlt < h ? 1 : -1});
                    }
                }
                prevAlt = altEnd;
            }
            double[] pe = new double[3];
            bodyPositionAt(t0, pe, 0);
            double r0 = radius(pe);
            bodyPositionAt(tEnd, pe, 0);
            double r1 = radius(pe);
            double tEscape = Double.NaN;
            if (r1 > escapeRadius) {
                double te = r0 <= escapeRadius ? bisect(t0, tEnd, escapeRadius, true, false) : tEnd;
                toBody(te, stateAt(te), body);
                if (twoBodyEnergy(body) > 0) {
                    tEscape = te;
                    pending.add(new double[] {te, 1, escapeRadius, 1});
                }
            }
            pending.sort((a, b) -> Double.compare(a[0], b[0]));
            double stopAt = !Double.isNaN(tEscape) ? tEscape : tImpact;
            for (double[] ev : pending) {
                if (!Double.isNaN(stopAt) && ev[0] > stopAt) {
                    continue;
                }
                emitOutputsUpTo(ev[0], false);
                double[] y = stateAt(ev[0]);
                toBody(ev[0], y, body);
                double[] b = body.clone();
                events.add(new MotionEvent(ev[1] == 0 ? MotionEvent.Kind.ALTITUDE : MotionEvent.Kind.ESCAPE, ev[0], b,
                    -1, frame.latitudeDeg(b[0], b[1], b[2]), frame.longitudeDeg(b[0], b[1], b[2]), speed(b),
                    Double.NaN, Double.NaN, Double.NaN, null, ev[2], (int) ev[3], twoBodyEnergy(b)));
                addRow(ev[0], y);
                if (ev[1] == 1) {
                    outcome = Trajectory.Outcome.ESCAPE;
                    endTime = ev[0];
                    throw new Stop();
                }
            }
            if (!Double.isNaN(tImpact)) {
                emitOutputsUpTo(tImpact, false);
                double[] y = stateAt(tImpact);
                toBody(tImpact, y, body);
                double[] b = body.clone();
                int f = hitFacet[0];
                double nx = fn[3 * f];
                double ny = fn[3 * f + 1];
                double nz = fn[3 * f + 2];
                double vn = b[3] * nx + b[4] * ny + b[5] * nz;
                double sp = speed(b);
                double tx = b[3] - vn * nx;
                double ty = b[4] - vn * ny;
                double tz = b[5] - vn * nz;
                double vt = Math.sqrt(tx * tx + ty * ty + tz * tz);
                events.add(new MotionEvent(MotionEvent.Kind.IMPACT, tImpact, b, f,
                    frame.latitudeDeg(b[0], b[1], b[2]), frame.longitudeDeg(b[0], b[1], b[2]), sp, -vn, vt,
                    Math.toDegrees(Math.atan2(vt, -vn)), new double[] {nx, ny, nz}, Double.NaN, 0,
                    twoBodyEnergy(b)));
                addRow(tImpact, y);
                outcome = Trajectory.Outcome.IMPACT;
                endTime = tImpact;
                throw new Stop();
            }
            emitOutputsUpTo(t1, true);
            // Jacobi at the step end (drift tracking).
            bodyStateAt(t1);
            maxDrift = Math.max(maxDrift, Math.abs(jacobi(body) - jacobi0));
            stepStart[0] = body[0];
            stepStart[1] = body[1];
            stepStart[2] = body[2];
        }

        private void bodyStateAt(double t) {
            toBody(t, stateAt(t), body);
        }

        /** Rows at multiples of the output step up to t (inclusive when {@code inclusive}). */
        private void emitOutputsUpTo(double t, boolean inclusive) {
            while (true) {
                double to = nextOutput * outputStep;
                if (to > duration || to > t || (!inclusive && to == t)) {
                    return;
                }
                addRow(to, stateAt(to));
                nextOutput++;
            }
        }

        private double radius(double[] p) {
            double dx = p[0] - centre[0];
            double dy = p[1] - centre[1];
            double dz = p[2] - centre[2];
            return Math.sqrt(dx * dx + dy * dy + dz * dz);
        }

        private double speed(double[] b) {
            return Math.sqrt(b[3] * b[3] + b[4] * b[4] + b[5] * b[5]);
        }

        /**
         * Time in [a, b] at which the altitude (or the radius) crosses the level, by bisection (the quantity is below
         * the level at a when {@code rising}).
         */
        private double bisect(double a, double b, double level, boolean rising, boolean altitude) {
            double[] p = new double[3];
            for (int it = 0; it < 200 && b - a > 1e-13 * Math.max(Math.abs(b), 1e-300); it++) {
                double m = 0.5 * (a + b);
                if (m <= a || m >= b) {
                    break;
                }
                bodyPositionAt(m, p, 0);
                double q = altitude ? surface.signedDistance(p[0], p[1], p[2], scratch4) : radius(p);
                if ((q < level) == rising) {
                    a = m;
                } else {
                    b = m;
                }
            }
            return b;
        }

        /** Time of the first crossing of the surface in [t0, t1], or NaN; sets hitFacet. */
        private double impactTime(double t0, double t1) {
            double[] q = new double[15];
            double[] fr = {0, 0.25, 0.5, 0.75, 1};
            for (int i = 0; i < 5; i++) {
                bodyPositionAt(t0 + fr[i] * (t1 - t0), q, 3 * i);
            }
            double dev = 0;
            for (int i = 1; i < 4; i++) {
                dev = Math.max(dev, segmentDistance(q, 3 * i, q, 0, q, 12));
            }
            // Skip steps whose widened chord stays outside the bounding sphere.
            double cd = pointSegmentDistance(centre[0], centre[1], centre[2], q, 0, q, 12);
            if (cd > length * (1 + 1e-9) + 2 * dev + 1e-9 * length) {
                return Double.NaN;
            }
            double eps = settings.chordTolerance() * length;
            int k = (int) Math.min(MAX_CHORDS, Math.max(1, Math.ceil(Math.sqrt(2 * dev / eps))));
            double[] a = {q[0], q[1], q[2]};
            double[] b = new double[3];
            for (int j = 1; j <= k; j++) {
                double ta = t0 + (j - 1) * (t1 - t0) / k;
                double tb = j == k ? t1 : t0 + j * (t1 - t0) / k;
                if (j == k) {
                    b[0] = q[12];
                    b[1] = q[13];
                    b[2] = q[14];
                } else {
                    bodyPositionAt(tb, b, 0);
                }
                double s = index.firstHit(a[0], a[1], a[2], b[0], b[1], b[2], hitFacet);
                if (!Double.isNaN(s)) {
                    return refine(ta, tb, s, hitFacet[0]);
                }
                a[0] = b[0];
                a[1] = b[1];
                a[2] = b[2];
            }
            return Double.NaN;
        }

        /** Time in [ta, tb] at which the path crosses the plane of facet f (Brent), else the chord's estimate. */
        private double refine(double ta, double tb, double s, int f) {
            double[] xyz = mesh.xyz();
            int v = 3 * mesh.tri()[3 * f];
            double[] p = new double[3];
            org.apache.commons.math3.analysis.UnivariateFunction phi = t -> {
                bodyPositionAt(t, p, 0);
                return (p[0] - xyz[v]) * fn[3 * f] + (p[1] - xyz[v + 1]) * fn[3 * f + 1]
                    + (p[2] - xyz[v + 2]) * fn[3 * f + 2];
            };
            double fa = phi.value(ta);
            double fb = phi.value(tb);
            if (fa > 0 && fb <= 0) {
                if (fb == 0) {
                    return tb;
                }
                BrentSolver brent = new BrentSolver(1e-15, Math.ulp(Math.abs(tb)) * 4 + 1e-300);
                try {
                    return brent.solve(200, phi, ta, tb);
                } catch (RuntimeException e) {
                    return ta + s * (tb - ta);
                }
            }
            return ta + s * (tb - ta);
        }

        /** Distance from point p (at pa) to the segment [a, b]. */
        private double segmentDistance(double[] pa, int po, double[] aa, int ao, double[] ba, int bo) {
            return pointSegmentDistance(pa[po], pa[po + 1], pa[po + 2], aa, ao, ba, bo);
        }

        private double pointSegmentDistance(double x, double y, double z, double[] aa, int ao, double[] ba, int bo) {
            double dx = ba[bo] - aa[ao];
            double dy = ba[bo + 1] - aa[ao + 1];
            double dz = ba[bo + 2] - aa[ao + 2];
            double wx = x - aa[ao];
            double wy = y - aa[ao + 1];
            double wz = z - aa[ao + 2];
            double dd = dx * dx + dy * dy + dz * dz;
            double u = dd > 0 ? Math.max(0, Math.min(1, (wx * dx + wy * dy + wz * dz) / dd)) : 0;
            double ex = wx - u * dx;
            double ey = wy - u * dy;
            double ez = wz - u * dz;
            return Math.sqrt(ex * ex + ey * ey + ez * ez);
        }
    }
}
