package dev.cairn.surface;

import dev.cairn.gravity.BatchEvaluation;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.Location;
import dev.cairn.body.BodyModel;
import dev.cairn.mesh.EdgeTable;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.RotatingFrame;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;

/**
 * Surface survey of a uniformly spinning body: what a particle, lander or hovering spacecraft feels at every facet.
 *
 * <p>Per facet, at its centroid on the surface (the polyhedron field is exact and finite there):
 * <ul>
 * <li>gravity g = ∇U and effective acceleration a_eff = g + ω² r⊥, effective potential V = U + ½ω²|r⊥|²
 *     ({@link RotatingFrame}; framework of Scheeres 2012, from memory); normal components positive inward;</li>
 * <li>slope = angle between the inward normal −n and a_eff, computed as atan2(|n × a|, −n·a) (accurate near 0° and
 *     180°); above 90° the effective acceleration pulls away from the surface: <i>lift-off</i>;</li>
 * <li>dynamic height h = (V_ref − V)/ḡ, V_ref and ḡ the area-weighted means of V and |a_eff| over the surface:
 *     since V grows toward the body, h grows with altitude, and loose material tends to move from high h to low h;</li>
 * <li>escape speed for a launch along the outward normal, relative to the surface: the speed v such that the
 *     inertial energy ½|v n + ω×r|² − U is zero, v = −b + √(b² + 2U − ω²|r⊥|²), b = n·(ω×r), and the least speed
 *     over directions max(0, √(2U) − ω|r⊥|) (prograde horizontal launch). Approximation: the energy in the inertial
 *     frame is treated as conserved and U → 0 at infinity, which is exact for a sphere or a body spinning about a
 *     symmetry axis and an estimate otherwise (only the Jacobi integral is conserved in a rotating non-axisymmetric
 *     field); non-rotating sphere: √(2GM/R);</li>
 * <li>hover acceleration = |a_eff|, the thrust acceleration to stay at rest in the body frame.</li>
 * </ul>
 *
 * <p><b>Landing zones.</b> A facet is <i>safe</i> when its slope is below the limit (so it does not lift off). Its
 * <i>disc</i> is the set of facets with any point within the zone radius R of its centroid (exact point-to-triangle
 * distance, Ericson 2005 §5.1.5, from a grid of facet bounding boxes: complete, including ground that is not
 * connected to the facet inside the ball, such as the far wall of a crack or an overhang; O(facets near the ball) per
 * facet, never O(F²)). The disc's roughness is the area-weighted RMS angle between its facet normals and their
 * area-weighted mean normal. An <i>aim facet</i> is a safe facet whose whole disc is safe and whose roughness is at
 * most the limit: no facet at or above the slope limit has any point within R of its centroid. A zone is a connected
 * set (across shared edges) of aim facets; its footprint is the union of their discs. Zone score in [0, 1] (weights
 * chosen, no source):
 * <pre>
 *   score = 0.4 (1 − discSlope/θmax) + 0.3 (1 − roughness/ρmax) + 0.2 (1 − min(1, grade/tan θmax))
 *         + 0.1 min(1, aimArea/(πR²))
 * </pre>
 * where, as area-weighted means over the zone's aim facets, discSlope is the largest slope in the disc (slope margin
 * of a landing aimed there), roughness the disc roughness and grade (range of dynamic height in the disc)/(2R)
 * (flatness of the effective potential); the last term rewards room to aim. The facet with the best individual score
 * (same formula, disc values, without the area term) is the suggested aim point.
 *
 * <p><b>Landing sites.</b> Discrete candidates: the disc of the site radius R_s (default R) about an aim facet's
 * centroid, scored by the same weights on that disc, {@code 0.4 (1 − min(1, maxSlope/θmax)) + 0.3 (1 − min(1,
 * roughness/ρmax)) + 0.2 (1 − min(1, grade/tan θmax)) + 0.1 safeAreaFraction}, and chosen greedily (best score first,
 * ties by lower facet index) so that no two overlap: centres at least 2 R_s apart and no facet in two sites.
 *
 * <p><b>Hovering.</b> Up to {@link #HOVER_CANDIDATES} surface facets with the least |a_eff|, at least
 * max(R, 0.05·R_eq) apart, are re-evaluated at each hover altitude along their outward normal (points that fall
 * inside the body are skipped); the best {@link #HOVER_LISTED} per altitude are listed.
 *
 * <p>Results do not depend on the thread count. The field evaluation is O(F²) for the polyhedron (F points × F
 * facets); everything else is O(F·disc size). Library code: never prints.
 */
public final class Survey {
    /** Hovering candidates re-evaluated above the surface. */
    public static final int HOVER_CANDIDATES = 256;
    /** Hovering points listed per altitude. */
    public static final int HOVER_LISTED = 5;
    /** Score weights (chosen, no source). */
    static final double W_SLOPE = 0.4;
    static final double W_ROUGH = 0.3;
    static final double W_GRADE = 0.2;
    static final double W_AREA = 0.1;

    private Survey() {
    }

    /**
     * Surveys a loaded model with its field ({@link BodyModel#fieldModel()}), spin and centre of mass.
     *
     * @throws dev.cairn.io.InputException when the field cannot be built (surface not fit, no density)
     */
    public static SurveyResult run(BodyModel body, SurveyParameters params, ProgressListener progress) {
        SurveyTarget t = new SurveyTarget(body.name(), body.source(), body.mesh(), body.edges(), body.surfaceFieldModel(),
            body.massProperties().centerOfMass(), body.spin(), body.density(), body.massProperties().volume());
        return run(t, params, progress);
    }

    /** Surveys {@code target}; {@code progress} receives work units done/total from worker threads. */
    public static SurveyResult run(SurveyTarget target, SurveyParameters params, ProgressListener progress) {
        long t0 = System.nanoTime();
        Work w = new Work(target, params);
        int nf = w.nf;
        int nCand = Math.min(HOVER_CANDIDATES, nf);
        double req = target.equivalentRadius();
        double[] alts = params.hoverAltitudesM();
        if (alts == null) {
            alts = new double[SurveyParameters.DEFAULT_HOVER_ALTITUDE_FRACTIONS.length];
            for (int i = 0; i < alts.length; i++) {
                alts[i] = SurveyParameters.DEFAULT_HOVER_ALTITUDE_FRACTIONS[i] * req;
            }
        }
        int positive = 0;
        for (double a : alts) {
            if (a > 0) {
                positive++;
            }
        }
        long discUnits = Math.max(1, nf / 8);
        long total = nf + (long) nCand * positive + discUnits;
        // Stage 1: the field at every centroid (dominant cost).
        double[] samples = BatchEvaluation.evaluate(target.field(), w.centroid, false, params.threads(),
            offset(progress, 0, total));
        w.derive(samples);
        // the measured accuracy of an approximate field (hierarchical) against the exact sum on sampled centroids
        w.fieldCheck = dev.cairn.gravity.FieldCheck.measure(target.field(), w.centroid,
            dev.cairn.gravity.FieldCheck.DEFAULT_SAMPLES, 20261202L, params.threads());
        long t1 = System.nanoTime();
        // Stage 2: discs, aim facets, zones, sites; which layer of the maps shows each facet.
        w.discs(offset(progress, nf, total), nf / (double) discUnits);
        List<LandingZone> zones = w.zones();
        List<LandingSite> sites = w.sites();
        w.mapLayers();
        long t2 = System.nanoTime();
        // Stage 3: hovering.
        List<HoverPoint> hover = w.hover(alts, nCand, req, offset(progress, nf + discUnits, total));
        progress.progress(total, total);
        long t3 = System.nanoTime();
        double[] stages = {(t1 - t0) / 1e9, (t2 - t1) / 1e9, (t3 - t2) / 1e9};
        return new SurveyResult(w, zones, sites, hover, alts, (t3 - t0) / 1e9, stages, w.notes());
    }

    private static ProgressListener offset(ProgressListener p, long base, long total) {
        return (done, n) -> p.progress(base + done, total);
    }

    private static ProgressListener scaled(ProgressListener p, double divisor) {
        return (done, n) -> p.progress((long) (done / divisor), (long) (n / divisor));
    }

    /** Working state of one survey; arrays become the result's. */
    static final class Work {
        final SurveyTarget target;
        final SurveyParameters params;
        final RotatingFrame frame;
        final TriangleMesh mesh;
        final int nf;
        final double[] centroid;
        final double[] normal;
        /** Measured accuracy of the field model on sampled centroids (set after stage 1). */
        dev.cairn.gravity.FieldCheck fieldCheck;
        final double[] area;
        final int[] neighbour;
        final double[] lat;
        final double[] lon;
        final double[] gVec;
        final double[] g;
        final double[] potential;
        final double[] aEffVec;
        final double[] gEff;
        final double[] potentialEff;
        final double[] gNormal;
        final double[] gTangential;
        final double[] gEffNormal;
        final double[] gEffTangential;
        final double[] slope;
        final boolean[] liftOff;
        final double[] dynamicHeight;
        final double[] escapeSpeed;
        final double[] escapeSpeedMin;
        final double[] roughness;
        final double[] discMaxSlope;
        final double[] discGrade;
        final boolean[] discAllSafe;
        final boolean[] safe;
        final boolean[] aim;
        final int[] zone;
        /** Rank of the zone of which the facet is an aim facet, 0 for none. */
        final int[] aimZone;
        /** Rank of the landing site whose disc holds the facet, 0 for none. */
        final int[] site;
        /** Layer of the latitude–longitude maps that shows the facet (1 = outermost), see {@link LatLonRaster}. */
        int[] mapLayer;
        /** Footprint facets of each ranked zone (index rank − 1), increasing facet order. */
        final List<int[]> zoneFootprints = new ArrayList<>();
        /** Facets with a point within a radius of a centroid: exact point-to-triangle distance, complete. */
        FacetGrid grid;
        double referenceV;
        double meanGEff;

        Work(SurveyTarget target, SurveyParameters params) {
            this.target = target;
            this.params = params;
            this.mesh = target.mesh();
            this.frame = new RotatingFrame(target.spin(), target.centreOfMass());
            nf = mesh.facetCount();
            centroid = mesh.facetCentroids();
            normal = mesh.facetNormals();
            area = mesh.facetAreas();
            neighbour = neighbours(mesh, target.edges());
            lat = new double[nf];
            lon = new double[nf];
            gVec = new double[3 * nf];
            g = new double[nf];
            potential = new double[nf];
            aEffVec = new double[3 * nf];
            gEff = new double[nf];
            potentialEff = new double[nf];
            gNormal = new double[nf];
            gTangential = new double[nf];
            gEffNormal = new double[nf];
            gEffTangential = new double[nf];
            slope = new double[nf];
            liftOff = new boolean[nf];
            dynamicHeight = new double[nf];
            escapeSpeed = new double[nf];
            escapeSpeedMin = new double[nf];
            roughness = new double[nf];
            discMaxSlope = new double[nf];
            discGrade = new double[nf];
            discAllSafe = new boolean[nf];
            safe = new boolean[nf];
            aim = new boolean[nf];
            zone = new int[nf];
            aimZone = new int[nf];
            site = new int[nf];
        }

        /** Remarks on how far the results can be trusted at this mesh resolution. */
        List<String> notes() {
            List<String> out = new ArrayList<>();
            double sa = 0;
            for (double a : area) {
                sa += a;
            }
            // Circumradius (= centroid-to-vertex distance) of an equilateral triangle of the mean facet area: below
            // it a disc holds only its own facet.
            double side = Math.sqrt(4 * (sa / nf) / Math.sqrt(3));
            double circum = side / Math.sqrt(3);
            if (params.zoneRadiusM() < circum) {
                out.add(String.format(java.util.Locale.ROOT, "zone radius %.4g m is below the typical facet "
                    + "circumradius %.4g m: each disc is a single facet, so landing zones are resolved only to whole "
                    + "facets", params.zoneRadiusM(), circum));
            }
            int boundary = 0;
            for (int nb : neighbour) {
                boundary += nb < 0 ? 1 : 0;
            }
            if (boundary > 0) {
                out.add(boundary + " facet sides have no single neighbour (open or non-manifold surface): zone "
                    + "discs stop there");
            }
            return out;
        }

        /** Facet across each half-edge {@code 3f+k}, or -1. */
        static int[] neighbours(TriangleMesh mesh, EdgeTable edges) {
            int nf = mesh.facetCount();
            int[] nb = new int[3 * nf];
            for (int h = 0; h < 3 * nf; h++) {
                nb[h] = edges.otherFacet(edges.edgeOfHalfEdge(h), h / 3);
            }
            return nb;
        }

        /** Per-facet quantities from the field samples (cheap, sequential). */
        void derive(double[] s) {
            double omega = frame.omega();
            double[] tmp = new double[4];
            double[] vel = new double[3];
            double sumA = 0;
            double sumV = 0;
            double sumG = 0;
            for (int f = 0; f < nf; f++) {
                int o = f * FieldSample.SIZE;
                double x = centroid[3 * f];
                double y = centroid[3 * f + 1];
                double z = centroid[3 * f + 2];
                double nx = normal[3 * f];
                double ny = normal[3 * f + 1];
                double nz = normal[3 * f + 2];
                double u = s[o + FieldSample.U];
                gVec[3 * f] = s[o + FieldSample.AX];
                gVec[3 * f + 1] = s[o + FieldSample.AY];
                gVec[3 * f + 2] = s[o + FieldSample.AZ];
                frame.effective(x, y, z, u, gVec, 3 * f, tmp, 0);
                aEffVec[3 * f] = tmp[1];
                aEffVec[3 * f + 1] = tmp[2];
                aEffVec[3 * f + 2] = tmp[3];
                potential[f] = u;
                potentialEff[f] = tmp[0];
                g[f] = norm(gVec, 3 * f);
                gEff[f] = norm(aEffVec, 3 * f);
                double gn = nx * gVec[3 * f] + ny * gVec[3 * f + 1] + nz * gVec[3 * f + 2];
                gNormal[f] = -gn;
                gTangential[f] = tangential(gVec, 3 * f, nx, ny, nz);
                double an = nx * tmp[1] + ny * tmp[2] + nz * tmp[3];
                gEffNormal[f] = -an;
                double at = tangential(aEffVec, 3 * f, nx, ny, nz);
                gEffTangential[f] = at;
                slope[f] = Math.toDegrees(Math.atan2(at, -an));
                liftOff[f] = an > 0;
                lat[f] = frame.latitudeDeg(x, y, z);
                lon[f] = frame.longitudeDeg(x, y, z);
                frame.frameVelocity(x, y, z, vel, 0);
                double b = nx * vel[0] + ny * vel[1] + nz * vel[2];
                double rp = frame.axisDistance(x, y, z);
                double disc = b * b + 2 * u - omega * omega * rp * rp;
                escapeSpeed[f] = disc > 0 ? Math.max(0.0, -b + Math.sqrt(disc)) : 0.0;
                escapeSpeedMin[f] = Math.max(0.0, Math.sqrt(2 * Math.max(u, 0)) - omega * rp);
                sumA += area[f];
                sumV += area[f] * potentialEff[f];
                sumG += area[f] * gEff[f];
                safe[f] = slope[f] < params.maxSlopeDeg() && !liftOff[f];
            }
            referenceV = sumV / sumA;
            meanGEff = sumG / sumA;
            for (int f = 0; f < nf; f++) {
                dynamicHeight[f] = (referenceV - potentialEff[f]) / meanGEff;
            }
        }

        private static double norm(double[] v, int o) {
            return Math.sqrt(v[o] * v[o] + v[o + 1] * v[o + 1] + v[o + 2] * v[o + 2]);
        }

        private static double tangential(double[] v, int o, double nx, double ny, double nz) {
            double cx = v[o + 1] * nz - v[o + 2] * ny;
            double cy = v[o + 2] * nx - v[o] * nz;
            double cz = v[o] * ny - v[o + 1] * nx;
            return Math.sqrt(cx * cx + cy * cy + cz * cz);
        }

        /** Per-thread scratch for disc gathering and statistics. */
        final class Scratch {
            final int[] stamp = new int[nf];
            final int[] queue = new int[nf];
            final double[] stats = new double[STATS];
            int generation;
            int size;
        }

        /**
         * Gathers the disc of {@code radius} about facet {@code f}'s centroid into {@code sc.queue[0..size)}: every
         * facet with a point within the radius (exact point-to-triangle distance, Ericson 2005 §5.1.5), whether or
         * not it is connected to {@code f} inside the ball (the far wall of a crack, the underside of a thin ridge),
         * in increasing facet order.
         */
        void gather(int f, double radius, Scratch sc) {
            int gen = ++sc.generation;
            if (gen == Integer.MAX_VALUE) {
                Arrays.fill(sc.stamp, 0);
                sc.generation = gen = 1;
            }
            sc.size = grid.within(centroid[3 * f], centroid[3 * f + 1], centroid[3 * f + 2], radius, sc.stamp, gen,
                sc.queue);
        }

        /** Statistics slots of {@link #stats}. */
        static final int S_AREA = 0;
        static final int S_MAX_SLOPE = 1;
        static final int S_MEAN_SLOPE = 2;
        static final int S_ROUGHNESS = 3;
        static final int S_H_MIN = 4;
        static final int S_H_MAX = 5;
        static final int S_SAFE_AREA = 6;
        static final int S_UNSAFE = 7;
        static final int S_G_EFF = 8;
        static final int S_G = 9;
        static final int S_ESCAPE = 10;
        static final int S_MIN_ESCAPE = 11;
        static final int STATS = 12;

        /**
         * Statistics of the facets {@code sc.queue[0..size)} into {@code sc.stats}: area, largest and area-weighted
         * mean slope, roughness (area-weighted RMS angle between the facet normals and their area-weighted mean
         * normal, degrees; 180 when the normals cancel), dynamic-height range, safe area and unsafe count, area-weighted
         * mean g_eff, g and escape speed, least escape speed.
         */
        void stats(Scratch sc) {
            double[] st = sc.stats;
            double mx = 0;
            double my = 0;
            double mz = 0;
            double sa = 0;
            double maxSlope = 0;
            double meanSlope = 0;
            double hMin = Double.POSITIVE_INFINITY;
            double hMax = Double.NEGATIVE_INFINITY;
            double safeArea = 0;
            int unsafe = 0;
            double ge = 0;
            double gg = 0;
            double esc = 0;
            double minEsc = Double.POSITIVE_INFINITY;
            for (int i = 0; i < sc.size; i++) {
                int q = sc.queue[i];
                double a = area[q];
                mx += a * normal[3 * q];
                my += a * normal[3 * q + 1];
                mz += a * normal[3 * q + 2];
                sa += a;
                maxSlope = Math.max(maxSlope, slope[q]);
                meanSlope += a * slope[q];
                hMin = Math.min(hMin, dynamicHeight[q]);
                hMax = Math.max(hMax, dynamicHeight[q]);
                if (safe[q]) {
                    safeArea += a;
                } else {
                    unsafe++;
                }
                ge += a * gEff[q];
                gg += a * g[q];
                esc += a * escapeSpeed[q];
                minEsc = Math.min(minEsc, escapeSpeed[q]);
            }
            double ml = Math.sqrt(mx * mx + my * my + mz * mz);
            double rough = 180; // normals cancel: the disc wraps round the body
            if (ml > 0) {
                mx /= ml;
                my /= ml;
                mz /= ml;
                double sq = 0;
                for (int i = 0; i < sc.size; i++) {
                    int q = sc.queue[i];
                    double angle = angle(normal, 3 * q, mx, my, mz);
                    sq += area[q] * angle * angle;
                }
                rough = Math.toDegrees(Math.sqrt(sq / sa));
            }
            st[S_AREA] = sa;
            st[S_MAX_SLOPE] = maxSlope;
            st[S_MEAN_SLOPE] = meanSlope / sa;
            st[S_ROUGHNESS] = rough;
            st[S_H_MIN] = hMin;
            st[S_H_MAX] = hMax;
            st[S_SAFE_AREA] = safeArea;
            st[S_UNSAFE] = unsafe;
            st[S_G_EFF] = ge / sa;
            st[S_G] = gg / sa;
            st[S_ESCAPE] = esc / sa;
            st[S_MIN_ESCAPE] = minEsc;
        }

        /** Disc statistics of every safe facet (parallel), then aim facets. */
        void discs(ProgressListener progress, double divisor) {
            double r = params.zoneRadiusM();
            grid = new FacetGrid(mesh, Math.max(r, params.siteRadius()));
            ParallelChunks.run(nf, params.threads(), Scratch::new, (sc, from, to) -> {
                for (int f = from; f < to; f++) {
                    if (!safe[f]) {
                        roughness[f] = Double.NaN;
                        discMaxSlope[f] = Double.NaN;
                        discGrade[f] = Double.NaN;
                        continue;
                    }
                    gather(f, r, sc);
                    stats(sc);
                    double[] st = sc.stats;
                    roughness[f] = st[S_ROUGHNESS];
                    discMaxSlope[f] = st[S_MAX_SLOPE];
                    discGrade[f] = (st[S_H_MAX] - st[S_H_MIN]) / (2 * r);
                    discAllSafe[f] = st[S_UNSAFE] == 0;
                }
            }, scaled(progress, divisor));
            for (int f = 0; f < nf; f++) {
                aim[f] = safe[f] && discAllSafe[f] && roughness[f] <= params.maxRoughnessDeg();
            }
        }

        private static double angle(double[] n, int o, double mx, double my, double mz) {
            double cx = n[o + 1] * mz - n[o + 2] * my;
            double cy = n[o + 2] * mx - n[o] * mz;
            double cz = n[o] * my - n[o + 1] * mx;
            return Math.atan2(Math.sqrt(cx * cx + cy * cy + cz * cz), n[o] * mx + n[o + 1] * my + n[o + 2] * mz);
        }

        double facetScore(int f) {
            double th = params.maxSlopeDeg();
            return W_SLOPE * (1 - discMaxSlope[f] / th)
                + W_ROUGH * (1 - roughness[f] / params.maxRoughnessDeg())
                + W_GRADE * (1 - Math.min(1, discGrade[f] / Math.tan(Math.toRadians(th))));
        }

        /** Connected components of aim facets, their footprints, statistics and ranks. */
        List<LandingZone> zones() {
            int[] comp = new int[nf];
            Arrays.fill(comp, -1);
            int[] queue = new int[nf];
            List<int[]> cores = new ArrayList<>();
            for (int f = 0; f < nf; f++) {
                if (!aim[f] || comp[f] >= 0) {
                    continue;
                }
                int id = cores.size();
                int head = 0;
                int tail = 0;
                queue[tail++] = f;
                comp[f] = id;
                while (head < tail) {
                    int c = queue[head++];
                    for (int k = 0; k < 3; k++) {
                        int nb = neighbour[3 * c + k];
                        if (nb >= 0 && aim[nb] && comp[nb] < 0) {
                            comp[nb] = id;
                            queue[tail++] = nb;
                        }
                    }
                }
                int[] members = Arrays.copyOf(queue, tail);
                Arrays.sort(members);
                cores.add(members);
            }
            Scratch sc = new Scratch();
            int[] mark = new int[nf];
            Arrays.fill(mark, -1);
            int[] foot = new int[nf];
            double th = params.maxSlopeDeg();
            double r = params.zoneRadiusM();
            List<Candidate> unranked = new ArrayList<>();
            for (int id = 0; id < cores.size(); id++) {
                int[] core = cores.get(id);
                int nFoot = 0;
                for (int f : core) {
                    gather(f, r, sc);
                    for (int i = 0; i < sc.size; i++) {
                        int q = sc.queue[i];
                        if (mark[q] != id) {
                            mark[q] = id;
                            foot[nFoot++] = q;
                        }
                    }
                }
                int[] footprint = Arrays.copyOf(foot, nFoot);
                Arrays.sort(footprint);
                double sa = 0;
                double cx = 0;
                double cy = 0;
                double cz = 0;
                double maxSlope = 0;
                double meanSlope = 0;
                double hMin = Double.POSITIVE_INFINITY;
                double hMax = Double.NEGATIVE_INFINITY;
                double mg = 0;
                double mge = 0;
                double mesc = 0;
                double minEsc = Double.POSITIVE_INFINITY;
                for (int q : footprint) {
                    double a = area[q];
                    sa += a;
                    cx += a * centroid[3 * q];
                    cy += a * centroid[3 * q + 1];
                    cz += a * centroid[3 * q + 2];
                    maxSlope = Math.max(maxSlope, slope[q]);
                    meanSlope += a * slope[q];
                    hMin = Math.min(hMin, dynamicHeight[q]);
                    hMax = Math.max(hMax, dynamicHeight[q]);
                    mg += a * g[q];
                    mge += a * gEff[q];
                    mesc += a * escapeSpeed[q];
                    minEsc = Math.min(minEsc, escapeSpeed[q]);
                }
                double aimArea = 0;
                double rough = 0;
                double grade = 0;
                double discSlope = 0;
                int best = core[0];
                double bestScore = Double.NEGATIVE_INFINITY;
                for (int f : core) {
                    aimArea += area[f];
                    rough += area[f] * roughness[f];
                    grade += area[f] * discGrade[f];
                    discSlope += area[f] * discMaxSlope[f];
                    double s = facetScore(f);
                    if (s > bestScore) { // strict: ties keep the lowest facet index
                        bestScore = s;
                        best = f;
                    }
                }
                rough /= aimArea;
                grade /= aimArea;
                discSlope /= aimArea;
                double score = W_SLOPE * (1 - discSlope / th) + W_ROUGH * (1 - rough / params.maxRoughnessDeg())
                    + W_GRADE * (1 - Math.min(1, grade / Math.tan(Math.toRadians(th))))
                    + W_AREA * Math.min(1, aimArea / (Math.PI * r * r));
                double[] c = {cx / sa, cy / sa, cz / sa};
                double[] bp = {centroid[3 * best], centroid[3 * best + 1], centroid[3 * best + 2]};
                LandingZone z = new LandingZone(0, score, footprint.length, core.length, sa, aimArea, c,
                    frame.latitudeDeg(c[0], c[1], c[2]), frame.longitudeDeg(c[0], c[1], c[2]), best, bp, lat[best],
                    lon[best], maxSlope,
                    meanSlope / sa, rough, hMax - hMin, mge / sa, mg / sa, mesc / sa, minEsc);
                unranked.add(new Candidate(z, footprint, core));
            }
            unranked.sort(Comparator.<Candidate>comparingDouble(c -> -c.zone().score())
                .thenComparingDouble(c -> -c.zone().areaM2())
                .thenComparingInt(c -> c.core()[0]));
            List<LandingZone> out = new ArrayList<>();
            for (int i = 0; i < unranked.size(); i++) {
                LandingZone z = unranked.get(i).zone();
                int rank = i + 1;
                for (int q : unranked.get(i).footprint()) {
                    if (zone[q] == 0) {
                        zone[q] = rank;
                    }
                }
                for (int q : unranked.get(i).core()) {
                    aimZone[q] = rank;
                }
                zoneFootprints.add(unranked.get(i).footprint());
                out.add(new LandingZone(rank, z.score(), z.facetCount(), z.aimFacetCount(), z.areaM2(),
                    z.aimAreaM2(), z.centroid(), z.latDeg(), z.lonDeg(), z.bestFacet(), z.bestPoint(), z.bestLatDeg(),
                    z.bestLonDeg(),
                    z.maxSlopeDeg(), z.meanSlopeDeg(), z.roughnessDeg(), z.dynamicHeightRangeM(), z.meanGravityEff(),
                    z.meanGravity(), z.meanEscapeSpeed(), z.minEscapeSpeed()));
            }
            return out;
        }

        /** A zone before ranking: its statistics, footprint facets and aim facets (sorted; the first breaks ties). */
        private record Candidate(LandingZone zone, int[] footprint, int[] core) {
        }

        /**
         * Site score in [0, 1] from the statistics of a site disc (weights of the zone score, chosen, no source):
         * 0.4 (1 − min(1, maxSlope/θmax)) + 0.3 (1 − min(1, roughness/ρmax)) + 0.2 (1 − min(1, grade/tan θmax))
         * + 0.1 safeAreaFraction, grade = (dynamic-height range)/(2 R_site).
         */
        double siteScore(double[] st, double rs) {
            double th = params.maxSlopeDeg();
            double grade = (st[S_H_MAX] - st[S_H_MIN]) / (2 * rs);
            return W_SLOPE * (1 - Math.min(1, st[S_MAX_SLOPE] / th))
                + W_ROUGH * (1 - Math.min(1, st[S_ROUGHNESS] / params.maxRoughnessDeg()))
                + W_GRADE * (1 - Math.min(1, grade / Math.tan(Math.toRadians(th))))
                + W_AREA * st[S_SAFE_AREA] / st[S_AREA];
        }

        /**
         * Landing sites: discs of the site radius R_s about aim-facet centroids, chosen greedily by site score (ties:
         * lower facet index) so that no two overlap: a candidate is taken only when its centre is at least 2 R_s from
         * every chosen centre (the balls of radius R_s are disjoint) and none of its facets lies in a chosen site's
         * disc. O(aim facets × disc size).
         */
        List<LandingSite> sites() {
            double rs = params.siteRadius();
            double[] score = new double[nf];
            Arrays.fill(score, Double.NaN);
            ParallelChunks.run(nf, params.threads(), Scratch::new, (sc, from, to) -> {
                for (int f = from; f < to; f++) {
                    if (aim[f]) {
                        gather(f, rs, sc);
                        stats(sc);
                        score[f] = siteScore(sc.stats, rs);
                    }
                }
            }, ProgressListener.NONE);
            int n = 0;
            for (boolean a : aim) {
                n += a ? 1 : 0;
            }
            Integer[] order = new Integer[n];
            n = 0;
            for (int f = 0; f < nf; f++) {
                if (aim[f]) {
                    order[n++] = f;
                }
            }
            Arrays.sort(order, Comparator.<Integer>comparingDouble(f -> -score[f]).thenComparingInt(f -> f));
            PointGrid centres = new PointGrid(2 * rs);
            Scratch sc = new Scratch();
            List<LandingSite> out = new ArrayList<>();
            for (int f : order) {
                double x = centroid[3 * f];
                double y = centroid[3 * f + 1];
                double z = centroid[3 * f + 2];
                if (centres.anyWithin(x, y, z, 2 * rs)) {
                    continue;
                }
                gather(f, rs, sc);
                boolean free = true;
                for (int i = 0; i < sc.size && free; i++) {
                    free = site[sc.queue[i]] == 0;
                }
                if (!free) {
                    continue;
                }
                int rank = out.size() + 1;
                for (int i = 0; i < sc.size; i++) {
                    site[sc.queue[i]] = rank;
                }
                centres.add(x, y, z);
                stats(sc);
                double[] st = sc.stats;
                out.add(new LandingSite(rank, score[f], f, new double[] {x, y, z}, lat[f], lon[f], aimZone[f],
                    sc.size, st[S_AREA], st[S_MAX_SLOPE], st[S_MEAN_SLOPE], st[S_ROUGHNESS],
                    st[S_H_MAX] - st[S_H_MIN], st[S_G_EFF], st[S_G], st[S_ESCAPE], st[S_MIN_ESCAPE],
                    st[S_SAFE_AREA] / st[S_AREA]));
            }
            return out;
        }

        /** Which map layer shows each facet (the maps' ray casting from the centre of mass). */
        void mapLayers() {
            mapLayer = LatLonRaster.facetLayers(mesh, frame, params.threads());
        }

        /** Hovering: distinct low-|a_eff| facets, re-evaluated at each altitude. */
        List<HoverPoint> hover(double[] alts, int nCand, double req, ProgressListener progress) {
            Integer[] order = new Integer[nf];
            for (int i = 0; i < nf; i++) {
                order[i] = i;
            }
            Arrays.sort(order, Comparator.<Integer>comparingDouble(i -> gEff[i]).thenComparingInt(i -> i));
            double sep = Math.max(params.zoneRadiusM(), 0.05 * req);
            PointGrid grid = new PointGrid(sep);
            int[] cand = new int[nCand];
            int n = 0;
            for (int k = 0; k < nf && n < nCand; k++) {
                int f = order[k];
                double x = centroid[3 * f];
                double y = centroid[3 * f + 1];
                double z = centroid[3 * f + 2];
                if (!grid.anyWithin(x, y, z, sep)) {
                    grid.add(x, y, z);
                    cand[n++] = f;
                }
            }
            List<Double> above = new ArrayList<>();
            for (double a : alts) {
                if (a > 0) {
                    above.add(a);
                }
            }
            double[] pts = new double[3 * n * above.size()];
            for (int j = 0; j < above.size(); j++) {
                double h = above.get(j);
                for (int i = 0; i < n; i++) {
                    int f = cand[i];
                    int o = 3 * (j * n + i);
                    for (int k = 0; k < 3; k++) {
                        pts[o + k] = centroid[3 * f + k] + h * normal[3 * f + k];
                    }
                }
            }
            double[] s = BatchEvaluation.evaluate(target.field(), pts, false, params.threads(), progress);
            List<HoverPoint> out = new ArrayList<>();
            double[] tmp = new double[4];
            double[] gv = new double[3];
            int j = 0;
            for (double h : alts) {
                double[] acc = new double[n];
                double[] grav = new double[n];
                double[][] pos = new double[n][];
                for (int i = 0; i < n; i++) {
                    int f = cand[i];
                    if (h > 0) {
                        int o = (j * n + i) * FieldSample.SIZE;
                        int po = 3 * (j * n + i);
                        Location loc = Location.fromCode(s[o + FieldSample.LOCATION]);
                        if (loc == Location.INSIDE || loc == Location.SURFACE) {
                            acc[i] = Double.NaN;
                            continue;
                        }
                        gv[0] = s[o + FieldSample.AX];
                        gv[1] = s[o + FieldSample.AY];
                        gv[2] = s[o + FieldSample.AZ];
                        frame.effective(pts[po], pts[po + 1], pts[po + 2], s[o + FieldSample.U], gv, 0, tmp, 0);
                        acc[i] = Math.sqrt(tmp[1] * tmp[1] + tmp[2] * tmp[2] + tmp[3] * tmp[3]);
                        grav[i] = norm(gv, 0);
                        pos[i] = new double[] {pts[po], pts[po + 1], pts[po + 2]};
                    } else {
                        acc[i] = gEff[f];
                        grav[i] = g[f];
                        pos[i] = new double[] {centroid[3 * f], centroid[3 * f + 1], centroid[3 * f + 2]};
                    }
                }
                Integer[] idx = new Integer[n];
                for (int i = 0; i < n; i++) {
                    idx[i] = i;
                }
                Arrays.sort(idx, Comparator.<Integer>comparingDouble(i -> Double.isNaN(acc[i])
                    ? Double.POSITIVE_INFINITY : acc[i]).thenComparingInt(i -> cand[i]));
                int rank = 0;
                for (int k = 0; k < n && rank < HOVER_LISTED; k++) {
                    int i = idx[k];
                    if (Double.isNaN(acc[i])) {
                        break;
                    }
                    double[] p = pos[i];
                    out.add(new HoverPoint(h, ++rank, cand[i], p, frame.latitudeDeg(p[0], p[1], p[2]),
                        frame.longitudeDeg(p[0], p[1], p[2]), acc[i], grav[i]));
                }
                if (h > 0) {
                    j++;
                }
            }
            return out;
        }
    }
}
