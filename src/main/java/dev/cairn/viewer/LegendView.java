package dev.cairn.viewer;

import dev.cairn.util.ColourRamp;
import javafx.geometry.Insets;
import javafx.scene.control.Label;
import javafx.scene.image.ImageView;
import javafx.scene.image.WritableImage;
import javafx.scene.layout.HBox;
import javafx.scene.layout.Pane;
import javafx.scene.layout.VBox;
import javafx.scene.paint.Color;
import javafx.scene.shape.Rectangle;
import javafx.scene.text.Font;
import javafx.scene.text.FontWeight;

/** The legend panel: quantity name and units, the colour bar with its numeric range, or the category swatches. */
final class LegendView extends VBox {
    /** Height of the colour bar, pixels. */
    static final double BAR_HEIGHT = 280;
    static final double BAR_WIDTH = 26;
    static final Color TEXT = Color.rgb(230, 232, 235);

    LegendView() {
        setSpacing(8);
        setPadding(new Insets(14));
    }

    /** Shows {@code legend}. */
    void show(Legend legend) {
        getChildren().clear();
        Label title = label(legend.heading(), 15, true);
        title.setWrapText(true);
        getChildren().add(title);
        ColourRamp ramp = legend.ramp();
        if (ramp != null) {
            if (legend.warnAbove()) {
                getChildren().add(swatchRow(ColourRamp.WARNING, "above " + format(legend.max())));
            }
            getChildren().add(bar(ramp, legend.min(), legend.max()));
            if (legend.kind() == Quantity.Kind.DIVERGING) {
                getChildren().add(label("centred on zero", 12, false));
            }
            if (legend.liftOff()) {
                getChildren().add(swatchRow(ColourRamp.LIFT_OFF, "lift-off (above 90°)"));
            }
            getChildren().add(swatchRow(ColourRamp.NO_DATA, "no value"));
        } else if (!legend.categories().isEmpty()) {
            for (Legend.Swatch s : legend.categories()) {
                getChildren().add(swatchRow(s.argb(), s.label()));
            }
        } else {
            getChildren().add(label("plain surface", 12, false));
        }
    }

    private Pane bar(ColourRamp ramp, double min, double max) {
        int n = (int) BAR_HEIGHT;
        WritableImage img = new WritableImage(1, n);
        for (int y = 0; y < n; y++) {
            img.getPixelWriter().setArgb(0, y, ramp.argb(1 - y / (double) (n - 1))); // max at the top
        }
        ImageView iv = new ImageView(img);
        iv.setFitWidth(BAR_WIDTH);
        iv.setFitHeight(BAR_HEIGHT);
        iv.setSmooth(false);
        iv.setPreserveRatio(false);
        Pane p = new Pane(iv);
        Rectangle frame = new Rectangle(BAR_WIDTH, BAR_HEIGHT, Color.TRANSPARENT);
        frame.setStroke(Color.gray(0.7));
        p.getChildren().add(frame);
        for (double v : Legend.ticks(min, max)) {
            double t = max > min ? (v - min) / (max - min) : 0;
            double y = (1 - t) * BAR_HEIGHT;
            Rectangle tick = new Rectangle(BAR_WIDTH, y - 0.5, 6, 1);
            tick.setFill(Color.gray(0.7));
            Label l = label(format(v), 12, false);
            l.setLayoutX(BAR_WIDTH + 10);
            l.setLayoutY(y - 8);
            p.getChildren().addAll(tick, l);
        }
        p.setPrefHeight(BAR_HEIGHT + 10);
        p.setMinHeight(BAR_HEIGHT + 10);
        return p;
    }

    private static HBox swatchRow(int argb, String text) {
        Rectangle r = new Rectangle(18, 14, toColor(argb));
        r.setStroke(Color.gray(0.7));
        HBox h = new HBox(8, r, label(text, 12, false));
        return h;
    }

    static Label label(String text, double size, boolean bold) {
        Label l = new Label(text);
        l.setTextFill(TEXT);
        l.setFont(Font.font("SansSerif", bold ? FontWeight.BOLD : FontWeight.NORMAL, size));
        return l;
    }

    static Color toColor(int argb) {
        return Color.rgb((argb >> 16) & 0xFF, (argb >> 8) & 0xFF, argb & 0xFF);
    }

    /** The tick format of the maps ({@link dev.cairn.surface.ColourScale#format}). */
    static String format(double v) {
        return dev.cairn.surface.ColourScale.format(v);
    }
}
