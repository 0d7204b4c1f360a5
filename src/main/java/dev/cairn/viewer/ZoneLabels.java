package dev.cairn.viewer;

import dev.cairn.surface.LabelPlacer;
import javafx.scene.layout.Pane;
import javafx.scene.paint.Color;
import javafx.scene.shape.Circle;
import javafx.scene.shape.Line;
import javafx.scene.text.Font;
import javafx.scene.text.FontWeight;
import javafx.scene.text.Text;
import javafx.scene.text.TextBoundsType;

/**
 * Site ("S1", "S2", ...) and zone ("Z1", ...) labels drawn flat over the 3D view, laid out by {@link LabelLayout}: a
 * small dot at the projected aim point, the label next to it without overlaps (a leader line when it had to move
 * further out), white text with a dark halo so it stays legible on any surface colour. Labels whose aim point is on
 * the far side or hidden behind the body are not drawn.
 */
final class ZoneLabels {
    /** Halo width around the letters, pixels. */
    private static final double HALO_PX = 3.5;
    private static final Color HALO = Color.rgb(0, 0, 0, 0.85);

    private ZoneLabels() {
    }

    /** A transparent pane of labels for the scene's current view; empty unless {@code zones} or {@code sites}. */
    static Pane pane(BodyScene body, double width, double height, boolean zones, boolean sites) {
        Pane p = new Pane();
        p.setMouseTransparent(true);
        p.setPrefSize(width, height);
        update(p, body, width, height, zones, sites);
        return p;
    }

    /** Repositions the labels after a view change. */
    static void update(Pane p, BodyScene body, double width, double height, boolean zones, boolean sites) {
        p.getChildren().clear();
        if (body.survey() == null || !(zones || sites)) {
            return;
        }
        Font font = Font.font("SansSerif", FontWeight.BOLD, LabelLayout.FONT_PX);
        for (LabelLayout.Item it : LabelLayout.layout(body.geometry(), body.view(), body.survey(), width, height,
            zones, sites)) {
            Circle dot = new Circle(it.x(), it.y(), 2.5, Color.WHITE);
            dot.setStroke(Color.BLACK);
            dot.setStrokeWidth(1);
            p.getChildren().add(dot);
            LabelPlacer.Placement b = it.box();
            if (!b.placed()) {
                continue; // no room: the dot alone
            }
            if (b.ring() > 1) {
                Line leader = new Line(it.x(), it.y(), b.x() + b.width() / 2, b.y() + b.height() / 2);
                leader.setStroke(Color.WHITE);
                leader.setStrokeWidth(1);
                p.getChildren().add(leader);
            }
            double tx = b.x() + 3;
            double ty = b.y() + 0.5 * b.height();
            Text halo = text(it.text(), font, tx, ty);
            halo.setFill(HALO);
            halo.setStroke(HALO);
            halo.setStrokeWidth(HALO_PX);
            Text front = text(it.text(), font, tx, ty);
            front.setFill(Color.WHITE);
            p.getChildren().addAll(halo, front);
        }
    }

    private static Text text(String s, Font font, double x, double y) {
        Text t = new Text(x, y, s);
        t.setFont(font);
        t.setBoundsType(TextBoundsType.VISUAL);
        t.setTextOrigin(javafx.geometry.VPos.CENTER);
        return t;
    }
}
