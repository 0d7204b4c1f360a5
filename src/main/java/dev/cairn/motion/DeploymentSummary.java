package dev.cairn.motion;

import dev.cairn.rotation.RotatingFrame;
import java.util.List;

/**
 * Statistics of a deployment: fractions by outcome and the dispersion ellipse of the rest points.
 *
 * <p>Dispersion ellipse: the rest points' offsets from their mean are projected on the plane perpendicular to the
 * mean direction m of (rest point − centre of mass), with local east e = ω̂ × m / |ω̂ × m| and north n = m × e; the
 * 2×2 sample covariance (divisor N − 1) gives the 1σ semi-axes (square roots of its eigenvalues) and the azimuth of
 * the major axis, degrees east of north in [0, 180). For Gaussian scatter the 95 % ellipse is 2.4477 times the 1σ
 * ellipse (χ² with 2 degrees of freedom; any statistics text). A straight-line projection: on a strongly curved or
 * concave surface the ellipse is only a summary.
 *
 * @param count               samples
 * @param rest                samples at rest
 * @param escaped             samples that escaped
 * @param timedOut            samples still moving at the time limit
 * @param bounceLimit         samples still bouncing at the bounce limit
 * @param startInside         samples whose dispersed release point lay inside the body
 * @param meanRest            mean rest point, m (NaN without rest points)
 * @param meanLatDeg          latitude of the mean rest direction
 * @param meanLonDeg          longitude of the mean rest direction
 * @param sigmaMajor          1σ semi-major axis, m
 * @param sigmaMinor          1σ semi-minor axis, m
 * @param azimuthDeg          azimuth of the major axis, degrees east of north
 * @param meanTime            mean time to rest, s
 * @param maxTime             largest time to rest, s
 * @param meanBounces         mean bounces of the samples at rest
 * @param maxBounces          largest bounce count at rest
 * @param meanFirstSpeed      mean first-impact speed over all samples that hit, m/s
 * @param maxFirstSpeed       largest first-impact speed, m/s
 * @param meanSlopeDeg        mean slope at rest
 * @param maxSlopeDeg         largest slope at rest
 * @param maxJacobiDrift      largest relative Jacobi drift over all ballistic arcs
 * @param totalSteps          integrator steps over all samples
 * @param totalEvaluations    field evaluations over all samples
 */
public record DeploymentSummary(int count, int rest, int escaped, int timedOut, int bounceLimit, int startInside,
                                double[] meanRest, double meanLatDeg, double meanLonDeg, double sigmaMajor,
                                double sigmaMinor, double azimuthDeg, double meanTime, double maxTime,
                                double meanBounces, int maxBounces, double meanFirstSpeed, double maxFirstSpeed,
                                double meanSlopeDeg, double maxSlopeDeg, double maxJacobiDrift, long totalSteps,
                                long totalEvaluations) {

    /** Summarises landings (in sample order, so the sums do not depend on the thread count). */
    public static DeploymentSummary of(List<Landing> landings, RotatingFrame frame) {
        int rest = 0;
        int esc = 0;
        int tout = 0;
        int bl = 0;
        int in = 0;
        double[] mean = new double[3];
        double sumT = 0;
        double maxT = 0;
        double sumB = 0;
        int maxB = 0;
        double sumV = 0;
        double maxV = 0;
        int hits = 0;
        double sumS = 0;
        double maxS = 0;
        double drift = 0;
        long steps = 0;
        long evals = 0;
        for (Landing l : landings) {
            steps += l.steps();
            evals += l.fieldEvaluations();
            drift = Math.max(drift, l.maxJacobiDrift());
            if (!Double.isNaN(l.firstImpactSpeed())) {
                hits++;
                sumV += l.firstImpactSpeed();
                maxV = Math.max(maxV, l.firstImpactSpeed());
            }
            switch (l.outcome()) {
                case REST -> {
                    rest++;
                    for (int k = 0; k < 3; k++) {
                        mean[k] += l.position()[k];
                    }
                    sumT += l.time();
                    maxT = Math.max(maxT, l.time());
                    sumB += l.bounces();
                    maxB = Math.max(maxB, l.bounces());
                    sumS += l.slopeDeg();
                    maxS = Math.max(maxS, l.slopeDeg());
                }
                case ESCAPED -> esc++;
                case TIMED_OUT -> tout++;
                case BOUNCE_LIMIT -> bl++;
                case START_INSIDE -> in++;
                default -> throw new IllegalStateException();
            }
        }
        double nan = Double.NaN;
        if (rest == 0) {
            return new DeploymentSummary(landings.size(), 0, esc, tout, bl, in, new double[] {nan, nan, nan}, nan,
                nan, nan, nan, nan, nan, nan, nan, 0, hits > 0 ? sumV / hits : nan, hits > 0 ? maxV : nan, nan, nan,
                drift, steps, evals);
        }
        for (int k = 0; k < 3; k++) {
            mean[k] /= rest;
        }
        double[] c = frame.centre();
        double[] m = {mean[0] - c[0], mean[1] - c[1], mean[2] - c[2]};
        double mn = Math.sqrt(m[0] * m[0] + m[1] * m[1] + m[2] * m[2]);
        double[] pole = frame.axis();
        double[] east;
        if (mn > 0) {
            for (int k = 0; k < 3; k++) {
                m[k] /= mn;
            }
            east = cross(pole, m);
        } else {
            m = pole;
            east = new double[] {0, 0, 0};
        }
        double en = Math.sqrt(east[0] * east[0] + east[1] * east[1] + east[2] * east[2]);
        if (en < 1e-12) {
            double[] d = new double[3];
            frame.direction(0, 90, d, 0); // mean direction along the pole: east := longitude 90° direction
            east = d;
        } else {
            for (int k = 0; k < 3; k++) {
                east[k] /= en;
            }
        }
        double[] north = cross(m, east);
        double see = 0;
        double snn = 0;
        double sen = 0;
        for (Landing l : landings) {
            if (l.outcome() != Landing.Outcome.REST) {
                continue;
            }
            double[] d = {l.position()[0] - mean[0], l.position()[1] - mean[1], l.position()[2] - mean[2]};
            double pe = d[0] * east[0] + d[1] * east[1] + d[2] * east[2];
            double pn = d[0] * north[0] + d[1] * north[1] + d[2] * north[2];
            see += pe * pe;
            snn += pn * pn;
            sen += pe * pn;
        }
        double div = Math.max(1, rest - 1);
        see /= div;
        snn /= div;
        sen /= div;
        double tr = 0.5 * (see + snn);
        double disc = Math.sqrt(Math.max(0, 0.25 * (see - snn) * (see - snn) + sen * sen));
        double l1 = tr + disc;
        double l2 = Math.max(0, tr - disc);
        // Major-axis direction (east, north components) → azimuth from north toward east.
        double az = Math.toDegrees(0.5 * Math.atan2(2 * sen, snn - see));
        az = ((az % 180) + 180) % 180;
        return new DeploymentSummary(landings.size(), rest, esc, tout, bl, in, mean,
            frame.latitudeDeg(mean[0], mean[1], mean[2]), frame.longitudeDeg(mean[0], mean[1], mean[2]),
            Math.sqrt(l1), Math.sqrt(l2), az, sumT / rest, maxT, sumB / rest, maxB, hits > 0 ? sumV / hits : nan,
            hits > 0 ? maxV : nan, sumS / rest, maxS, drift, steps, evals);
    }

    private static double[] cross(double[] a, double[] b) {
        return new double[] {a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]};
    }

    @Override
    public double[] meanRest() {
        return meanRest.clone();
    }
}
