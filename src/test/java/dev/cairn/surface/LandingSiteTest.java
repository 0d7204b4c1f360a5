package dev.cairn.surface;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.SpinState;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.TreeSet;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Landing sites and zone footprints against brute force on the invented lumpy ellipsoid of {@link ExactDiscRuleTest}:
 * site discs, their separation, statistics and greedy choice recomputed in the test from the definitions in
 * docs/survey.md with the independent distance of {@link BruteGeometry} (common practice, no source: the score
 * weights are chosen); zones.csv reconstructs every footprint.
 */
class LandingSiteTest {
    private static final double DENSITY = 3000.0;
    private static final double MAX_SLOPE = 20;
    private static final double ZONE_R = 40;
    /** Facets this close to the radius may fall either way between two distance algorithms, m (round-off). */
    private static final double EDGE_TOL = 1e-7;
    /** Distances are exact up to this (above every radius used here), m. */
    private static final double FAR_M = 2 * ZONE_R + 1;
    /** Relative tolerance of statistics summed in another order (round-off; chosen, no source). */
    private static final double REL = 1e-9;

    private static TriangleMesh mesh;
    private static SurveyTarget target;
    private static SurveyResult res;
    /** Brute-force distance from each aim facet's centroid to every facet: [aim index][facet]. */
    private static double[][] dist;
    private static int[] aimList;

    @BeforeAll
    static void survey() {
        mesh = ExactDiscRuleTest.lumpyEllipsoid();
        target = SurveyTestBodies.target("lumpy", mesh, DENSITY,
            new SpinState(2.7 * 3600, new double[] {0.25, -0.15, 1}));
        res = SurveyTestBodies.survey(target, SurveyParameters.defaults().withMaxSlope(MAX_SLOPE)
            .withZoneRadius(ZONE_R).withHoverAltitudes(new double[] {0}).withThreads(2));
        boolean[] aim = res.aimFacets();
        List<Integer> a = new ArrayList<>();
        for (int f = 0; f < aim.length; f++) {
            if (aim[f]) {
                a.add(f);
            }
        }
        aimList = a.stream().mapToInt(Integer::intValue).toArray();
        dist = new double[aimList.length][];
        for (int i = 0; i < aimList.length; i++) {
            dist[i] = distances(BruteGeometry.centroid(mesh, aimList[i]));
        }
    }

    private static double[] distances(double[] p) {
        double[] d = new double[mesh.facetCount()];
        for (int g = 0; g < d.length; g++) {
            d[g] = BruteGeometry.distanceBelow(mesh, g, p, FAR_M); // exact up to FAR_M, a lower bound beyond
        }
        return d;
    }

    private static double[] distancesFrom(int f) {
        int i = java.util.Arrays.binarySearch(aimList, f);
        return i >= 0 ? dist[i] : distances(BruteGeometry.centroid(mesh, f));
    }

    /** Score of a disc by the documented formula, from brute-force statistics. */
    private static double score(double[] d, double rs) {
        double[] slope = res.slopeDeg();
        double[] area = res.areas();
        double[] h = res.dynamicHeight();
        double[] n = res.normals();
        double maxSlope = 0;
        double sa = 0;
        double safe = 0;
        double hMin = Double.POSITIVE_INFINITY;
        double hMax = Double.NEGATIVE_INFINITY;
        double[] m = new double[3];
        for (int g = 0; g < d.length; g++) {
            if (d[g] <= rs) {
                maxSlope = Math.max(maxSlope, slope[g]);
                sa += area[g];
                safe += slope[g] < MAX_SLOPE ? area[g] : 0;
                hMin = Math.min(hMin, h[g]);
                hMax = Math.max(hMax, h[g]);
                for (int k = 0; k < 3; k++) {
                    m[k] += area[g] * n[3 * g + k];
                }
            }
        }
        double rough = roughness(d, rs, m, sa);
        double grade = (hMax - hMin) / (2 * rs);
        return 0.4 * (1 - Math.min(1, maxSlope / MAX_SLOPE)) + 0.3 * (1 - Math.min(1, rough / 10))
            + 0.2 * (1 - Math.min(1, grade / Math.tan(Math.toRadians(MAX_SLOPE)))) + 0.1 * safe / sa;
    }

    private static double roughness(double[] d, double rs, double[] m, double sa) {
        double[] area = res.areas();
        double[] n = res.normals();
        double l = Math.sqrt(m[0] * m[0] + m[1] * m[1] + m[2] * m[2]);
        double sq = 0;
        for (int g = 0; g < d.length; g++) {
            if (d[g] <= rs) {
                double c = (n[3 * g] * m[0] + n[3 * g + 1] * m[1] + n[3 * g + 2] * m[2]) / l;
                double ang = Math.acos(Math.max(-1, Math.min(1, c)));
                sq += area[g] * ang * ang;
            }
        }
        return Math.toDegrees(Math.sqrt(sq / sa));
    }

    private static double sep(LandingSite a, double[] q) {
        double[] p = a.position();
        return Math.sqrt((p[0] - q[0]) * (p[0] - q[0]) + (p[1] - q[1]) * (p[1] - q[1]) + (p[2] - q[2]) * (p[2] - q[2]));
    }

    @Test
    void sitesAreTheDocumentedDiscsDisjointAndGreedy() {
        List<LandingSite> sites = res.sites();
        double rs = ZONE_R;
        assertTrue(sites.size() >= 5, "sites found: " + sites.size());
        int[] siteOf = res.siteRank();
        double[] slope = res.slopeDeg();
        double[] area = res.areas();
        double[] ge = res.gravityEff();
        for (int k = 0; k < sites.size(); k++) {
            LandingSite s = sites.get(k);
            assertEquals(k + 1, s.rank());
            if (k > 0) {
                assertTrue(s.score() <= sites.get(k - 1).score(), "scores fall with rank");
            }
            assertTrue(res.aimFacets()[s.facet()], "a site is centred on an aim facet");
            assertEquals(res.aimZoneRank()[s.facet()], s.zone());
            double[] d = distancesFrom(s.facet());
            double maxSlope = 0;
            double sa = 0;
            double ms = 0;
            double mg = 0;
            int count = 0;
            for (int g = 0; g < d.length; g++) {
                if (Math.abs(d[g] - rs) > EDGE_TOL) {
                    assertEquals(d[g] < rs, siteOf[g] == s.rank(), "facet " + g + " at " + d[g] + " m of site "
                        + s.rank());
                }
                if (siteOf[g] == s.rank()) {
                    count++;
                    maxSlope = Math.max(maxSlope, slope[g]);
                    sa += area[g];
                    ms += area[g] * slope[g];
                    mg += area[g] * ge[g];
                }
            }
            assertEquals(count, s.facetCount());
            assertEquals(maxSlope, s.maxSlopeDeg(), 0.0);
            assertEquals(sa, s.areaM2(), REL * sa);
            assertEquals(ms / sa, s.meanSlopeDeg(), REL * 90);
            assertEquals(mg / sa, s.meanGravityEff(), REL * mg / sa);
            assertEquals(1.0, s.safeAreaFraction(), 0.0, "R_s = R: the disc of an aim facet is all safe");
            assertEquals(score(d, rs), s.score(), 1e-9, "documented score formula");
            assertTrue(s.maxSlopeDeg() < MAX_SLOPE);
            for (int j = 0; j < k; j++) {
                assertTrue(sep(sites.get(j), s.position()) >= 2 * rs, "centres at least 2 R apart");
            }
        }
        // Greedy: every aim facet that is not a site centre conflicts with a site of at least its score.
        for (int i = 0; i < aimList.length; i++) {
            int a = aimList[i];
            double sc = score(dist[i], rs);
            double[] p = BruteGeometry.centroid(mesh, a);
            boolean blocked = false;
            for (LandingSite s : sites) {
                if (s.facet() == a) {
                    blocked = true;
                    break;
                }
                if (s.score() < sc - 1e-9) {
                    break;
                }
                boolean shares = false;
                for (int g = 0; g < siteOf.length && !shares; g++) {
                    shares = siteOf[g] == s.rank() && dist[i][g] < rs + EDGE_TOL;
                }
                if (sep(s, p) < 2 * rs + EDGE_TOL || shares) {
                    blocked = true;
                    break;
                }
            }
            assertTrue(blocked, "aim facet " + a + " (score " + sc + ") would have made a site");
        }
        System.out.println("LandingSiteTest: " + sites.size() + " sites of radius " + rs + " m from "
            + aimList.length + " aim facets, best score " + sites.get(0).score());
    }

    @Test
    void sitesAndLayersDoNotDependOnTheThreadCount() {
        SurveyResult one = SurveyTestBodies.survey(target, res.parameters().withThreads(1));
        SurveyResult two = res; // run with 2 threads
        assertEquals(java.util.Arrays.toString(one.siteRank()), java.util.Arrays.toString(two.siteRank()));
        assertEquals(java.util.Arrays.toString(one.mapLayer()), java.util.Arrays.toString(two.mapLayer()));
        assertEquals(one.sites().size(), two.sites().size());
        for (int k = 0; k < one.sites().size(); k++) {
            assertEquals(one.sites().get(k).score(), two.sites().get(k).score(), 0.0, "bit-identical scores");
            assertEquals(one.sites().get(k).roughnessDeg(), two.sites().get(k).roughnessDeg(), 0.0);
        }
    }

    @Test
    void largerSiteRadiusReportsItsSafeFraction() {
        double rs = 2 * ZONE_R;
        SurveyResult r2 = SurveyTestBodies.survey(target, res.parameters().withSiteRadius(rs));
        double[] slope = r2.slopeDeg();
        double[] area = r2.areas();
        assertTrue(r2.sites().size() >= 2);
        int partial = 0;
        for (LandingSite s : r2.sites()) {
            assertTrue(r2.aimFacets()[s.facet()]);
            double[] d = distancesFrom(s.facet());
            double sa = 0;
            double safe = 0;
            for (int g = 0; g < d.length; g++) {
                if (d[g] <= rs) {
                    sa += area[g];
                    safe += slope[g] < MAX_SLOPE ? area[g] : 0;
                }
            }
            assertEquals(safe / sa, s.safeAreaFraction(), 1e-9);
            partial += s.safeAreaFraction() < 1 ? 1 : 0;
            for (LandingSite o : r2.sites()) {
                if (o.rank() < s.rank()) {
                    assertTrue(sep(o, s.position()) >= 2 * rs);
                }
            }
        }
        System.out.println("LandingSiteTest: R_s = " + rs + " m: " + r2.sites().size() + " sites, " + partial
            + " with unsafe ground inside");
    }

    @Test
    void zonesCsvHoldsEveryFootprint(@TempDir Path dir) throws IOException {
        Path file = SurveyOutputs.writeZonesCsv(res, dir.resolve("zones.csv"));
        List<String> lines = Files.readAllLines(file);
        assertEquals("zone,facet,aim", lines.get(0));
        int nz = res.zones().size();
        List<TreeSet<Integer>> read = new ArrayList<>();
        List<TreeSet<Integer>> aims = new ArrayList<>();
        for (int k = 0; k < nz; k++) {
            read.add(new TreeSet<>());
            aims.add(new TreeSet<>());
        }
        for (String l : lines.subList(1, lines.size())) {
            String[] p = l.split(",");
            int z = Integer.parseInt(p[0]);
            read.get(z - 1).add(Integer.parseInt(p[1]));
            if (p[2].equals("1")) {
                aims.get(z - 1).add(Integer.parseInt(p[1]));
            }
        }
        int[] aimZone = res.aimZoneRank();
        int[] zoneCol = res.zoneRank();
        int overlaps = 0;
        for (int k = 0; k < nz; k++) {
            LandingZone z = res.zones().get(k);
            assertEquals(z.facetCount(), read.get(k).size(), "zone " + (k + 1) + " footprint size");
            assertEquals(z.aimFacetCount(), aims.get(k).size(), "zone " + (k + 1) + " aim facets");
            // brute force: the footprint is the union of the aim facets' discs of radius R
            TreeSet<Integer> expect = new TreeSet<>();
            TreeSet<Integer> unsure = new TreeSet<>();
            for (int i = 0; i < aimList.length; i++) {
                if (aimZone[aimList[i]] != k + 1) {
                    continue;
                }
                assertTrue(aims.get(k).contains(aimList[i]));
                for (int g = 0; g < dist[i].length; g++) {
                    if (dist[i][g] < ZONE_R - EDGE_TOL) {
                        expect.add(g);
                    } else if (dist[i][g] <= ZONE_R + EDGE_TOL) {
                        unsure.add(g);
                    }
                }
            }
            TreeSet<Integer> got = new TreeSet<>(read.get(k));
            got.removeAll(unsure);
            expect.removeAll(unsure);
            assertEquals(expect, got, "zone " + (k + 1) + " footprint");
            for (int g : read.get(k)) {
                assertTrue(zoneCol[g] >= 1 && zoneCol[g] <= k + 1, "facets.csv zone = best rank holding the facet");
                overlaps += zoneCol[g] < k + 1 ? 1 : 0;
            }
        }
        System.out.println("LandingSiteTest: " + nz + " zones, " + overlaps + " footprint facets shared with a "
            + "better zone");
    }
}
