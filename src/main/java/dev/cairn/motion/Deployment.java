package dev.cairn.motion;

import dev.cairn.gravity.FieldSample;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;
import java.util.Arrays;
import java.util.List;
import java.util.Random;

/**
 * Seeded Monte Carlo of ballistic releases: each sample's release position and velocity are the nominal ones plus
 * independent Gaussian dispersions per component; the sample is propagated (body frame) to its first impact, bounced
 * on the impacted facet with normal and tangential coefficients of restitution, and propagated again, until it comes
 * to rest, escapes, passes the time limit or the bounce limit.
 *
 * <p><b>Bounce</b> (common practice, no source; shared references §9): with the facet's outward unit normal n and
 * the velocity relative to the body v = v_n n + v_t (v_n &lt; 0), the rebound is v' = −e_n v_n n + e_t v_t. The
 * lander is a point; there is no friction beyond e_t, no rolling or sliding phase, no spin of the lander. The rebound
 * starts 1e-9 body radii above the impact point along n. <b>Rest</b>: |v'| below the rest speed, or the apex of the
 * next hop in the local uniform-field approximation, v'_n²/(2 g_n) with g_n = −n·a_eff the inward effective gravity,
 * below the rest apex (not applied where g_n ≤ 0).
 *
 * <p>Sample i draws from its own {@link Random} seeded from the seed and i, so results do not depend on the thread
 * count or the order in which samples run.
 */
public final class Deployment {
    /**
     * First step of each arc as a fraction of its predicted uniform-field flight time: after a bounce the hop time
     * 2 v_n/g_n, for the release the fall time over the release altitude (chosen by measurement on the demo body, no
     * source: 1/4 to 1/32 cost within 5 % of each other; the step-size controller adapts it at once).
     */
    public static final double FIRST_STEP_FRACTION = 1.0 / 16;
    private Deployment() {
    }

    /** Rebound velocity v' = −e_n v_n n + e_t v_t of velocity v on a facet with outward unit normal n. */
    public static double[] rebound(double[] v, double[] n, double en, double et) {
        double vn = v[0] * n[0] + v[1] * n[1] + v[2] * n[2];
        double[] out = new double[3];
        for (int i = 0; i < 3; i++) {
            double t = v[i] - vn * n[i];
            out[i] = -en * vn * n[i] + et * t;
        }
        return out;
    }

    /** The seed of sample i's generator (SplitMix64 finaliser of seed and index; Steele et al. 2014). */
    static long sampleSeed(long seed, int i) {
        long z = seed + 0x9E3779B97F4A7C15L * (i + 1L);
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }

    /** Dispersed release state of sample i (6 values). */
    public static double[] releaseState(DeploymentSettings s, int i) {
        Random r = new Random(sampleSeed(s.seed(), i));
        double[] p = s.release();
        double[] v = s.velocity();
        double[] out = new double[6];
        for (int k = 0; k < 3; k++) {
            out[k] = p[k] + s.positionSigma() * r.nextGaussian();
        }
        for (int k = 0; k < 3; k++) {
            out[3 + k] = v[k] + s.velocitySigma() * r.nextGaussian();
        }
        return out;
    }

    /**
     * Runs every sample. The propagator must use the body frame.
     *
     * @param threads  worker threads (results do not depend on it)
     * @param progress receives progress (thread-safe)
     */
    public static List<Landing> run(Propagator propagator, DeploymentSettings s, int threads,
                                    ProgressListener progress) {
        return run(propagator, s, 0, s.count(), threads, progress);
    }

    /**
     * Runs samples {@code first} (inclusive) to {@code end} (exclusive) of the run, in index order: sample i is the
     * same as in a run of every sample (its generator is seeded from the seed and i), so a run split into index
     * ranges gives the same landings (a shard of a Slurm job array, docs/cluster.md).
     *
     * @param threads  worker threads (results do not depend on it)
     * @param progress receives progress (thread-safe)
     */
    public static List<Landing> run(Propagator propagator, DeploymentSettings s, int first, int end, int threads,
                                    ProgressListener progress) {
        if (propagator.settings().frame() != Frame.BODY) {
            throw new IllegalArgumentException("deployments run in the body frame");
        }
        if (first < 0 || end > s.count() || first >= end) {
            throw new IllegalArgumentException("sample range [" + first + ", " + end + ") outside [0, " + s.count()
                + ")");
        }
        Landing[] out = new Landing[end - first];
        // One sample per chunk: samples are long, so balance them one by one.
        int per = ParallelChunks.CHUNK;
        ParallelChunks.run(out.length * per, threads, () -> null, (ctx, from, to) -> {
            for (int i = (from + per - 1) / per; i * per < to; i++) {
                out[i] = sample(propagator, s, first + i);
            }
        }, progress);
        return List.of(out);
    }

    /** One sample, start to end. */
    public static Landing sample(Propagator p, DeploymentSettings s, int i) {
        double[] start = releaseState(s, i);
        double[] state = start.clone();
        double altitude0 = p.altitude(state[0], state[1], state[2]);
        if (altitude0 <= 0) {
            return new Landing(i, Landing.Outcome.START_INSIDE, start, Arrays.copyOf(start, 3), -1, Double.NaN,
                Double.NaN, 0, 0, Double.NaN, Double.NaN, Double.NaN, 0, 0, 0);
        }
        double t = 0;
        int bounces = 0;
        double firstSpeed = Double.NaN;
        double firstInc = Double.NaN;
        double drift = 0;
        long steps = 0;
        long evals = 0;
        double offset = 1e-9 * p.boundingRadius();
        var eval = p.newEvaluator();
        double[] g = new double[FieldSample.SIZE];
        double[] eff = new double[4];
        double firstStep = Double.NaN;
        if (!p.isStrict()) {
            // first arc: a fraction of the uniform-field fall time over the release altitude h, t = (v_d + √(v_d² +
            // 2 g h))/g with g = |a_eff| and v_d the speed along a_eff (one field evaluation, counted)
            evals++;
            eval.evaluate(state[0], state[1], state[2], false, g, 0);
            p.frame().effective(state[0], state[1], state[2], g[FieldSample.U], g, FieldSample.AX, eff, 0);
            double ge = Math.sqrt(eff[1] * eff[1] + eff[2] * eff[2] + eff[3] * eff[3]);
            if (ge > 0) {
                double vd = (state[3] * eff[1] + state[4] * eff[2] + state[5] * eff[3]) / ge;
                firstStep = FIRST_STEP_FRACTION * (vd + Math.sqrt(Math.max(0, vd * vd + 2 * ge * altitude0))) / ge;
            }
        }
        while (true) {
            double remaining = s.timeLimit() - t;
            if (!(remaining > 0)) {
                return ended(i, Landing.Outcome.TIMED_OUT, start, state, t, bounces, firstSpeed, firstInc, drift,
                    steps, evals);
            }
            Trajectory tr = p.isStrict() ? p.propagate(state, remaining, remaining)
                : p.propagate(state, remaining, remaining, eval, firstStep);
            steps += tr.steps();
            evals += tr.fieldEvaluations();
            if (Math.abs(tr.jacobi0()) > 0) {
                drift = Math.max(drift, tr.maxJacobiDriftRelative());
            }
            double[] last = tr.finalState();
            switch (tr.outcome()) {
                case ESCAPE:
                    return ended(i, Landing.Outcome.ESCAPED, start, last, t + tr.endTime(), bounces, firstSpeed,
                        firstInc, drift, steps, evals);
                case DURATION:
                case STEP_LIMIT:
                    return ended(i, Landing.Outcome.TIMED_OUT, start, last, t + tr.endTime(), bounces, firstSpeed,
                        firstInc, drift, steps, evals);
                default:
                    break;
            }
            MotionEvent imp = tr.terminal();
            bounces++;
            if (bounces == 1) {
                firstSpeed = imp.speed();
                firstInc = imp.incidenceDeg();
            }
            t += imp.t();
            double[] b = imp.state();
            double[] n = imp.normal();
            double[] v = rebound(new double[] {b[3], b[4], b[5]}, n, s.restitutionNormal(),
                s.restitutionTangential());
            evals++;
            eval.evaluate(b[0], b[1], b[2], false, g, 0);
            p.frame().effective(b[0], b[1], b[2], g[FieldSample.U], g, FieldSample.AX, eff, 0);
            double gn = -(n[0] * eff[1] + n[1] * eff[2] + n[2] * eff[3]);
            double vOut = Math.sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]);
            double vnOut = v[0] * n[0] + v[1] * n[1] + v[2] * n[2];
            boolean rest = vOut < s.restSpeed() || (gn > 0 && vnOut * vnOut / (2 * gn) < s.restApex());
            if (rest) {
                double cx = n[1] * eff[3] - n[2] * eff[2];
                double cy = n[2] * eff[1] - n[0] * eff[3];
                double cz = n[0] * eff[2] - n[1] * eff[1];
                double slope = Math.toDegrees(Math.atan2(Math.sqrt(cx * cx + cy * cy + cz * cz), gn));
                return new Landing(i, Landing.Outcome.REST, start, new double[] {b[0], b[1], b[2]}, imp.facet(),
                    imp.latDeg(), imp.lonDeg(), t, bounces, firstSpeed, firstInc, slope, drift, steps, evals);
            }
            if (bounces >= s.maxBounces()) {
                return ended(i, Landing.Outcome.BOUNCE_LIMIT, start, b, t, bounces, firstSpeed, firstInc, drift,
                    steps, evals);
            }
            // first step of the next hop: a fraction of its uniform-field flight time 2 v_n / g_n
            firstStep = gn > 0 && vnOut > 0 ? FIRST_STEP_FRACTION * 2 * vnOut / gn : Double.NaN;
            state = new double[] {b[0] + offset * n[0], b[1] + offset * n[1], b[2] + offset * n[2], v[0], v[1], v[2]};
        }
    }

    private static Landing ended(int i, Landing.Outcome o, double[] start, double[] last, double t, int bounces,
                                 double firstSpeed, double firstInc, double drift, long steps, long evals) {
        return new Landing(i, o, start, new double[] {last[0], last[1], last[2]}, -1, Double.NaN, Double.NaN, t,
            bounces, firstSpeed, firstInc, Double.NaN, drift, steps, evals);
    }
}
