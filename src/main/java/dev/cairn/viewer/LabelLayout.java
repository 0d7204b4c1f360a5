package dev.cairn.viewer;

import dev.cairn.surface.LabelPlacer;
import java.util.ArrayList;
import java.util.List;

/**
 * Where the site and zone labels go for a view (no JavaFX: testable without a display). Each label is anchored at the
 * projected <b>aim point</b> of its site or zone ({@link SurveyData.Zone#aim()}, a facet centroid on the surface, not
 * the footprint's mean centroid, which can lie inside a curved body), and is shown only when the aim point is on the
 * visible side: its facet faces the camera (outward normal · (eye − aim) &gt; 0), it is in front of the camera and
 * inside the viewport, and (for models up to {@link #OCCLUSION_TEST_MAX_FACETS} facets) no other facet lies between
 * the camera and it (ray–triangle test, Möller &amp; Trumbore 1997, J. Graphics Tools 2(1) 21–28). Boxes are then
 * placed by {@link LabelPlacer}: sites ("S1", "S2", ...) first by rank, then zones ("Z1", ...), so no two overlap;
 * at most {@link #MAX_PER_KIND} of each kind (the best-ranked visible ones).
 */
final class LabelLayout {
    /** Font size of the labels, pixels. */
    static final double FONT_PX = 15;
    /**
     * Most labels of each kind: the best-ranked visible sites and zones up to this many (as the maps circle the best
     * ten sites); more would bury the surface under text on bodies with hundreds of sites.
     */
    static final int MAX_PER_KIND = 20;
    /** Larger models skip the occlusion test (it costs one pass over the facets per label and view change). */
    static final int OCCLUSION_TEST_MAX_FACETS = 200_000;

    private LabelLayout() {
    }

    /**
     * One label: its text, the projected aim point (anchor, pixels), and its box from {@link LabelPlacer}.
     *
     * @param text  "S3" or "Z1"
     * @param facet the aim facet
     * @param x     anchor x, pixels
     * @param y     anchor y, pixels
     * @param box   placement of the text box (top-left, size; {@code placed() == false} when there was no room)
     */
    record Item(String text, int facet, double x, double y, LabelPlacer.Placement box) {
    }

    /** Estimated box of a bold sans-serif label of {@code text} at {@link #FONT_PX} (generous; with halo padding). */
    static double[] boxSize(String text) {
        return new double[] {0.68 * FONT_PX * text.length() + 6, 1.3 * FONT_PX};
    }

    /** The labels to show for the body's current view in a {@code width × height} viewport. */
    static List<Item> layout(BodyGeometry g, ViewState v, SurveyData s, double width, double height, boolean zones,
                             boolean sites) {
        List<String> texts = new ArrayList<>();
        List<Integer> facets = new ArrayList<>();
        List<LabelPlacer.Label> labels = new ArrayList<>();
        if (s == null) {
            return List.of();
        }
        double[] eye = v.eye();
        if (sites) {
            collect(g, v, eye, s.sites(), "S", width, height, texts, facets, labels);
        }
        if (zones) {
            collect(g, v, eye, s.zones(), "Z", width, height, texts, facets, labels);
        }
        LabelPlacer.Placement[] at = LabelPlacer.place(labels, width, height);
        List<Item> out = new ArrayList<>();
        for (int i = 0; i < labels.size(); i++) {
            out.add(new Item(texts.get(i), facets.get(i), labels.get(i).x(), labels.get(i).y(), at[i]));
        }
        return out;
    }

    private static void collect(BodyGeometry g, ViewState v, double[] eye, List<SurveyData.Zone> list, String prefix,
                                double width, double height, List<String> texts, List<Integer> facets,
                                List<LabelPlacer.Label> labels) {
        int shown = 0;
        for (SurveyData.Zone z : list) {
            if (z.aim() == null || shown >= MAX_PER_KIND) {
                continue;
            }
            double[] a = g.toScene(z.aim());
            int f = z.aimFacet();
            double[] n = normal(g, f);
            double facing = n[0] * (eye[0] - a[0]) + n[1] * (eye[1] - a[1]) + n[2] * (eye[2] - a[2]);
            double[] px = v.project(a, width, height);
            if (facing <= 0 || px[2] <= 0 || px[0] < 0 || px[1] < 0 || px[0] > width || px[1] > height) {
                continue;
            }
            if (g.mesh().facetCount() <= OCCLUSION_TEST_MAX_FACETS && occluded(g, eye, a, f)) {
                continue;
            }
            String text = prefix + z.rank();
            double[] wh = boxSize(text);
            texts.add(text);
            facets.add(f);
            labels.add(new LabelPlacer.Label(px[0], px[1], wh[0], wh[1]));
            shown++;
        }
    }

    /** Outward (unnormalised) normal of facet f: (v1 − v0) × (v2 − v0) for counter-clockwise facets. */
    static double[] normal(BodyGeometry g, int f) {
        double[] xyz = g.mesh().xyz();
        int[] tri = g.mesh().tri();
        int i0 = 3 * tri[3 * f];
        int i1 = 3 * tri[3 * f + 1];
        int i2 = 3 * tri[3 * f + 2];
        double ax = xyz[i1] - xyz[i0];
        double ay = xyz[i1 + 1] - xyz[i0 + 1];
        double az = xyz[i1 + 2] - xyz[i0 + 2];
        double bx = xyz[i2] - xyz[i0];
        double by = xyz[i2 + 1] - xyz[i0 + 1];
        double bz = xyz[i2 + 2] - xyz[i0 + 2];
        return new double[] {ay * bz - az * by, az * bx - ax * bz, ax * by - ay * bx};
    }

    /** True when a facet other than {@code self} crosses the segment from the eye to {@code p} (scene frame). */
    static boolean occluded(BodyGeometry g, double[] eye, double[] p, int self) {
        double[] xyz = g.mesh().xyz();
        int[] tri = g.mesh().tri();
        double[] c = g.centreOfMass();
        double dx = p[0] - eye[0];
        double dy = p[1] - eye[1];
        double dz = p[2] - eye[2];
        // shift the eye into the model frame once, so the vertices need no shift
        double ox = eye[0] + c[0];
        double oy = eye[1] + c[1];
        double oz = eye[2] + c[2];
        final double tMax = 1 - 1e-9;
        for (int f = 0; f < tri.length / 3; f++) {
            if (f == self) {
                continue;
            }
            int i0 = 3 * tri[3 * f];
            int i1 = 3 * tri[3 * f + 1];
            int i2 = 3 * tri[3 * f + 2];
            double e1x = xyz[i1] - xyz[i0];
            double e1y = xyz[i1 + 1] - xyz[i0 + 1];
            double e1z = xyz[i1 + 2] - xyz[i0 + 2];
            double e2x = xyz[i2] - xyz[i0];
            double e2y = xyz[i2 + 1] - xyz[i0 + 1];
            double e2z = xyz[i2 + 2] - xyz[i0 + 2];
            double px = dy * e2z - dz * e2y;
            double py = dz * e2x - dx * e2z;
            double pz = dx * e2y - dy * e2x;
            double det = e1x * px + e1y * py + e1z * pz;
            if (Math.abs(det) < 1e-300) {
                continue;
            }
            double inv = 1 / det;
            double tx = ox - xyz[i0];
            double ty = oy - xyz[i0 + 1];
            double tz = oz - xyz[i0 + 2];
            double u = (tx * px + ty * py + tz * pz) * inv;
            if (u < 0 || u > 1) {
                continue;
            }
            double qx = ty * e1z - tz * e1y;
            double qy = tz * e1x - tx * e1z;
            double qz = tx * e1y - ty * e1x;
            double w = (dx * qx + dy * qy + dz * qz) * inv;
            if (w < 0 || u + w > 1) {
                continue;
            }
            double t = (e2x * qx + e2y * qy + e2z * qz) * inv;
            if (t > 0 && t < tMax) {
                return true;
            }
        }
        return false;
    }
}
