package dev.cairn.surface;

import java.util.List;

/**
 * Places text labels next to their anchor points (e.g. the projected aim points of landing sites and zones) so that
 * no two labels overlap, no label covers another label's anchor, and every label stays inside the drawing area. Used
 * by the PNG maps ({@link SurveyMaps}) and by the viewer's site and zone labels. Pure 2D geometry in pixels (x right,
 * y down); no display needed.
 *
 * <p>Method (greedy, in the order given, i.e. by priority: best rank first; common practice for map labelling, no
 * source): each label tries candidate boxes around its anchor, first the eight positions touching a ring of
 * {@link #GAP} pixels (right, left, above, below, then the diagonals), then the same eight on rings 2, 3, ...
 * {@link #RINGS} times as far; the first box that fits is taken. A label that finds no room is not placed (reported,
 * so the caller can say so); when the box is not on the first ring the caller should draw a leader line from the
 * anchor to the box.
 */
public final class LabelPlacer {
    /** Gap between an anchor and its label on the first ring, pixels. */
    public static final double GAP = 4;
    /** Rings tried before giving up. */
    public static final int RINGS = 6;
    /** Clearance kept around other anchors (marker radius), pixels. */
    public static final double ANCHOR_CLEARANCE = 3;

    private LabelPlacer() {
    }

    /**
     * A label to place.
     *
     * @param x      anchor x, pixels
     * @param y      anchor y, pixels
     * @param width  label box width, pixels
     * @param height label box height, pixels
     */
    public record Label(double x, double y, double width, double height) {
    }

    /**
     * Where a label went: its box's top-left corner, whether it was placed at all, and the ring it sits on (1 = next
     * to the anchor; larger rings want a leader line).
     */
    public record Placement(double x, double y, double width, double height, boolean placed, int ring) {
        /** True when the two boxes share interior area. */
        public boolean overlaps(Placement o) {
            return x < o.x + o.width && o.x < x + width && y < o.y + o.height && o.y < y + height;
        }

        /** True when the point lies inside the box grown by {@code pad}. */
        public boolean covers(double px, double py, double pad) {
            return px > x - pad && px < x + width + pad && py > y - pad && py < y + height + pad;
        }
    }

    /**
     * Places the labels in order of priority inside the area [0, areaWidth] × [0, areaHeight].
     *
     * @return one placement per label, same order
     */
    public static Placement[] place(List<Label> labels, double areaWidth, double areaHeight) {
        return place(labels, areaWidth, areaHeight, GAP, ANCHOR_CLEARANCE);
    }

    /**
     * As {@link #place(List, double, double)} with a first-ring gap and an anchor clearance of the caller's choosing
     * (e.g. the radius of the marker drawn at each anchor), pixels.
     */
    public static Placement[] place(List<Label> labels, double areaWidth, double areaHeight, double gap,
                                    double clearance) {
        int n = labels.size();
        Placement[] out = new Placement[n];
        // unit directions: right, left, up, down, then diagonals
        final double[][] dirs = {{1, 0}, {-1, 0}, {0, -1}, {0, 1}, {1, -1}, {-1, -1}, {1, 1}, {-1, 1}};
        for (int k = 0; k < n; k++) {
            Label l = labels.get(k);
            Placement found = null;
            for (int ring = 1; ring <= RINGS && found == null; ring++) {
                double d = gap * ring + (ring - 1) * 0.5 * Math.max(l.height(), 8);
                for (double[] u : dirs) {
                    // box touching the anchor's ring on side u: its near edge d away from the anchor
                    double bx = u[0] > 0 ? l.x() + d : u[0] < 0 ? l.x() - d - l.width() : l.x() - l.width() / 2;
                    double by = u[1] > 0 ? l.y() + d : u[1] < 0 ? l.y() - d - l.height() : l.y() - l.height() / 2;
                    Placement p = new Placement(bx, by, l.width(), l.height(), true, ring);
                    if (fits(p, k, labels, out, areaWidth, areaHeight, clearance)) {
                        found = p;
                        break;
                    }
                }
            }
            out[k] = found != null ? found : new Placement(l.x(), l.y(), l.width(), l.height(), false, 0);
        }
        return out;
    }

    private static boolean fits(Placement p, int self, List<Label> labels, Placement[] placed, double w, double h,
                                double clearance) {
        if (p.x() < 0 || p.y() < 0 || p.x() + p.width() > w || p.y() + p.height() > h) {
            return false;
        }
        for (int j = 0; j < labels.size(); j++) {
            if (j != self && p.covers(labels.get(j).x(), labels.get(j).y(), clearance)) {
                return false;
            }
            if (j < self && placed[j].placed() && p.overlaps(placed[j])) {
                return false;
            }
        }
        return true;
    }
}
