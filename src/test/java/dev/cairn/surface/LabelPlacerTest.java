package dev.cairn.surface;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * Label placement: the conditions a legible map label set must meet (common cartographic practice, no source): no two
 * labels overlap, no label covers another label's anchor, every label inside the drawing area, and a label sits next
 * to its own anchor (distance bounded by the ring construction) — at its aim point, not somewhere else.
 */
class LabelPlacerTest {
    private static final double W = 400;
    private static final double H = 300;

    @Test
    void aLoneLabelSitsJustRightOfItsAnchor() {
        LabelPlacer.Placement[] p = LabelPlacer.place(List.of(new LabelPlacer.Label(100, 100, 30, 16)), W, H);
        assertTrue(p[0].placed());
        assertEquals(1, p[0].ring());
        assertEquals(100 + LabelPlacer.GAP, p[0].x(), 0.0, "left edge one gap right of the anchor");
        assertEquals(100 - 8, p[0].y(), 0.0, "vertically centred on the anchor");
    }

    @Test
    void aLabelAtTheRightEdgeGoesLeftInsideTheArea() {
        LabelPlacer.Placement[] p = LabelPlacer.place(List.of(new LabelPlacer.Label(W - 5, 100, 30, 16)), W, H);
        assertTrue(p[0].placed());
        assertEquals(W - 5 - LabelPlacer.GAP - 30, p[0].x(), 0.0);
    }

    @Test
    void crowdedLabelsNeverOverlapNorCoverAnchorsAndStayNearTheirOwn() {
        Random rnd = new Random(7);
        int placedTotal = 0;
        int total = 0;
        for (int trial = 0; trial < 200; trial++) {
            List<LabelPlacer.Label> labels = new ArrayList<>();
            int n = 2 + rnd.nextInt(30);
            // clustered anchors (sites crowd together on the best terrain)
            double cx = 40 + rnd.nextDouble() * (W - 80);
            double cy = 40 + rnd.nextDouble() * (H - 80);
            for (int i = 0; i < n; i++) {
                labels.add(new LabelPlacer.Label(cx + rnd.nextGaussian() * 30, cy + rnd.nextGaussian() * 30,
                    12 + rnd.nextInt(30), 12 + rnd.nextInt(6)));
            }
            LabelPlacer.Placement[] p = LabelPlacer.place(labels, W, H);
            assertEquals(n, p.length);
            for (int i = 0; i < n; i++) {
                total++;
                if (!p[i].placed()) {
                    continue;
                }
                placedTotal++;
                LabelPlacer.Label l = labels.get(i);
                assertTrue(p[i].x() >= 0 && p[i].y() >= 0 && p[i].x() + p[i].width() <= W
                    && p[i].y() + p[i].height() <= H, "inside the area");
                for (int j = 0; j < n; j++) {
                    if (j != i) {
                        assertFalse(p[j].placed() && p[i].overlaps(p[j]), "labels " + i + " and " + j + " overlap");
                        assertFalse(p[i].covers(labels.get(j).x(), labels.get(j).y(), LabelPlacer.ANCHOR_CLEARANCE),
                            "label " + i + " covers anchor " + j);
                    }
                }
                assertFalse(p[i].covers(l.x(), l.y(), 0), "a label does not hide its own anchor");
                // nearest point of the box to its anchor: within the outermost ring
                double dx = Math.max(0, Math.max(p[i].x() - l.x(), l.x() - p[i].x() - p[i].width()));
                double dy = Math.max(0, Math.max(p[i].y() - l.y(), l.y() - p[i].y() - p[i].height()));
                double maxRing = LabelPlacer.GAP * LabelPlacer.RINGS
                    + (LabelPlacer.RINGS - 1) * 0.5 * Math.max(l.height(), 8);
                assertTrue(Math.hypot(dx, dy) <= Math.sqrt(2) * maxRing + 1e-9, "label " + i + " near its anchor");
            }
        }
        assertTrue(placedTotal > 0.8 * total, "most labels find room: " + placedTotal + " of " + total);
        System.out.println("LabelPlacerTest: " + placedTotal + " of " + total + " crowded labels placed");
    }

    @Test
    void priorityOrderDecidesWhoKeepsTheBestPlace() {
        // two anchors 10 px apart horizontally: the first keeps the right-hand place, the second must move
        List<LabelPlacer.Label> l = List.of(new LabelPlacer.Label(100, 100, 40, 14),
            new LabelPlacer.Label(110, 100, 40, 14));
        LabelPlacer.Placement[] p = LabelPlacer.place(l, W, H);
        assertTrue(p[0].placed() && p[1].placed());
        assertFalse(p[0].overlaps(p[1]));
    }
}
