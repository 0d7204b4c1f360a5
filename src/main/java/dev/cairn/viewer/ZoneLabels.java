package dev.cairn.viewer;

import javafx.scene.control.Label;
import javafx.scene.layout.Pane;
import javafx.scene.paint.Color;
import javafx.scene.text.Font;
import javafx.scene.text.FontWeight;

/**
 * Rank numbers of the landing sites and zones, drawn flat over the 3D view at each one's projected centre (sites
 * "S1", "S2", ... first; zones by plain number); a number whose site or zone faces away from the camera (its centre
 * lies behind the body's centre as seen from the camera) is hidden.
 */
final class ZoneLabels {
    private ZoneLabels() {
    }

    /** A transparent pane of labels for the scene's current view; empty unless {@code show}. */
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
        SurveyData s = body.survey();
        if (s == null) {
            return;
        }
        if (sites) {
            add(p, body, width, height, s.sites(), "S");
        }
        if (zones) {
            add(p, body, width, height, s.zones(), "");
        }
    }

    private static void add(Pane p, BodyScene body, double width, double height, java.util.List<SurveyData.Zone> list,
                            String prefix) {
        ViewState v = body.view();
        double[] eye = v.eye();
        for (SurveyData.Zone z : list) {
            double[] c = body.geometry().toScene(z.centroid());
            // visible side: the centre points towards the camera (c · (eye - c) > 0)
            double facing = c[0] * (eye[0] - c[0]) + c[1] * (eye[1] - c[1]) + c[2] * (eye[2] - c[2]);
            double[] px = v.project(c, width, height);
            if (facing <= 0 || px[2] <= 0) {
                continue;
            }
            Label l = new Label(prefix + z.rank());
            l.setFont(Font.font("SansSerif", FontWeight.BOLD, 16));
            l.setTextFill(Color.WHITE);
            l.setStyle("-fx-background-color: rgba(0,0,0,0.65); -fx-padding: 0 5 0 5; -fx-background-radius: 4;");
            l.setLayoutX(px[0] - 6);
            l.setLayoutY(px[1] - 10);
            p.getChildren().add(l);
        }
    }
}
