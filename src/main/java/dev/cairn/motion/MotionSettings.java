package dev.cairn.motion;

/**
 * Settings of a propagation: frame, integrator tolerances, extra accelerations and event thresholds.
 *
 * <p>The integrator is the Dormand–Prince 8(5,3) embedded Runge–Kutta pair with dense output (Dormand, J.R. &amp;
 * Prince, P.J. (1981) "High order embedded Runge–Kutta formulae", J. Comput. Appl. Math. 7:67–75; Hairer, Nørsett
 * &amp; Wanner (1993) Solving Ordinary Differential Equations I, §II.5 and the DOP853 code), from Commons Math 3.6.1.
 * Each step's local error estimate is kept below {@code abs_i + rel·|y_i|} per component, with
 * {@code abs = absoluteScale·L} for positions and {@code absoluteScale·√(GM/L)} for velocities, L the body's bounding
 * radius about its centre of mass.
 *
 * @param frame                frame of the equations of motion and of the initial state
 * @param relativeTolerance    relative local error per step (default 1e-12)
 * @param absoluteScale        absolute local error as a fraction of the body's length and speed scales (default 1e-12)
 * @param srpInertial          constant extra acceleration (e.g. solar radiation pressure), m/s², fixed in the inertial
 *                             frame; null for none
 * @param thirdBody            third-body point mass on a circular orbit, or null
 * @param escapeRadius         radius about the centre of mass beyond which a positive two-body energy ends the run as
 *                             an escape, m; NaN for 10 body bounding radii
 * @param altitudes            altitude thresholds above the surface (signed distance), m, whose crossings are events;
 *                             empty for none
 * @param chordTolerance       largest sagitta of the straight chords that stand for the path in the impact test, as a
 *                             fraction of the body's bounding radius (default 1e-6)
 * @param maxEvaluations       bound on field evaluations per propagation (the run ends "step_limit" when reached)
 */
public record MotionSettings(Frame frame, double relativeTolerance, double absoluteScale, double[] srpInertial,
                             ThirdBody thirdBody, double escapeRadius, double[] altitudes, double chordTolerance,
                             long maxEvaluations) {
    /** Default relative tolerance of the integrator. */
    public static final double DEFAULT_RELATIVE_TOLERANCE = 1e-12;
    /** Default absolute tolerance scale (of L and √(GM/L)). */
    public static final double DEFAULT_ABSOLUTE_SCALE = 1e-12;
    /** Default chord sagitta bound, fraction of L. */
    public static final double DEFAULT_CHORD_TOLERANCE = 1e-6;
    /** Default escape radius, in body bounding radii. */
    public static final double DEFAULT_ESCAPE_RADII = 10;
    /** Default bound on field evaluations per propagation. */
    public static final long DEFAULT_MAX_EVALUATIONS = 20_000_000L;

    public MotionSettings {
        if (frame == null) {
            throw new IllegalArgumentException("frame is required");
        }
        if (!(relativeTolerance >= 1e-15 && relativeTolerance <= 1e-3)) {
            throw new IllegalArgumentException("relative tolerance must be in [1e-15, 1e-3], got " + relativeTolerance);
        }
        if (!(absoluteScale >= 1e-16 && absoluteScale <= 1e-3)) {
            throw new IllegalArgumentException("absolute tolerance scale must be in [1e-16, 1e-3], got " + absoluteScale);
        }
        if (srpInertial != null) {
            if (srpInertial.length != 3 || !(Double.isFinite(srpInertial[0]) && Double.isFinite(srpInertial[1])
                && Double.isFinite(srpInertial[2]))) {
                throw new IllegalArgumentException("SRP acceleration must be 3 finite numbers");
            }
            srpInertial = srpInertial.clone();
        }
        if (!Double.isNaN(escapeRadius) && !(escapeRadius > 0 && Double.isFinite(escapeRadius))) {
            throw new IllegalArgumentException("escape radius must be positive, got " + escapeRadius);
        }
        altitudes = altitudes == null ? new double[0] : altitudes.clone();
        for (double h : altitudes) {
            if (!Double.isFinite(h)) {
                throw new IllegalArgumentException("altitude thresholds must be finite");
            }
        }
        if (!(chordTolerance >= 1e-12 && chordTolerance <= 1e-2)) {
            throw new IllegalArgumentException("chord tolerance must be in [1e-12, 1e-2], got " + chordTolerance);
        }
        if (maxEvaluations < 1000) {
            throw new IllegalArgumentException("evaluation bound must be at least 1000");
        }
    }

    /** Defaults in the given frame: tolerances 1e-12, no extra accelerations, escape at 10 radii, no altitudes. */
    public static MotionSettings defaults(Frame frame) {
        return new MotionSettings(frame, DEFAULT_RELATIVE_TOLERANCE, DEFAULT_ABSOLUTE_SCALE, null, null, Double.NaN,
            null, DEFAULT_CHORD_TOLERANCE, DEFAULT_MAX_EVALUATIONS);
    }

    public MotionSettings withTolerances(double rel, double absScale) {
        return new MotionSettings(frame, rel, absScale, srpInertial, thirdBody, escapeRadius, altitudes,
            chordTolerance, maxEvaluations);
    }

    public MotionSettings withSrp(double[] srp) {
        return new MotionSettings(frame, relativeTolerance, absoluteScale, srp, thirdBody, escapeRadius, altitudes,
            chordTolerance, maxEvaluations);
    }

    public MotionSettings withThirdBody(ThirdBody third) {
        return new MotionSettings(frame, relativeTolerance, absoluteScale, srpInertial, third, escapeRadius, altitudes,
            chordTolerance, maxEvaluations);
    }

    public MotionSettings withEscapeRadius(double r) {
        return new MotionSettings(frame, relativeTolerance, absoluteScale, srpInertial, thirdBody, r, altitudes,
            chordTolerance, maxEvaluations);
    }

    public MotionSettings withAltitudes(double[] h) {
        return new MotionSettings(frame, relativeTolerance, absoluteScale, srpInertial, thirdBody, escapeRadius, h,
            chordTolerance, maxEvaluations);
    }

    public MotionSettings withMaxEvaluations(long max) {
        return new MotionSettings(frame, relativeTolerance, absoluteScale, srpInertial, thirdBody, escapeRadius,
            altitudes, chordTolerance, max);
    }

    @Override
    public double[] srpInertial() {
        return srpInertial == null ? null : srpInertial.clone();
    }

    @Override
    public double[] altitudes() {
        return altitudes.clone();
    }
}
