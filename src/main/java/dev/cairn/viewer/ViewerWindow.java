package dev.cairn.viewer;

import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.CountDownLatch;
import javafx.concurrent.Task;
import javafx.geometry.Insets;
import javafx.scene.Scene;
import javafx.scene.SceneAntialiasing;
import javafx.scene.control.Alert;
import javafx.scene.control.Button;
import javafx.scene.control.CheckMenuItem;
import javafx.scene.control.ChoiceBox;
import javafx.scene.control.Label;
import javafx.scene.control.MenuButton;
import javafx.scene.control.MenuItem;
import javafx.scene.control.ProgressIndicator;
import javafx.scene.control.Separator;
import javafx.scene.control.TextField;
import javafx.scene.control.ToolBar;
import javafx.scene.input.KeyCode;
import javafx.scene.input.MouseButton;
import javafx.scene.layout.Background;
import javafx.scene.layout.BackgroundFill;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.HBox;
import javafx.scene.layout.Pane;
import javafx.scene.layout.Priority;
import javafx.scene.layout.VBox;
import javafx.scene.paint.Color;
import javafx.scene.text.Font;
import javafx.stage.Stage;

/**
 * The interactive viewer window. Mouse: drag to orbit about the centre of mass, right-drag or shift-drag to pan,
 * wheel to zoom, click a facet to read its values. Keys: R resets the view. The survey (read or run) happens off the
 * JavaFX thread with a progress indicator.
 */
public final class ViewerWindow {
    /** Radians of orbit per pixel dragged. */
    private static final double ORBIT_RAD_PER_PX = 0.008;
    /** Zoom factor per wheel unit: distance × exp(−k·Δ). */
    private static final double ZOOM_PER_UNIT = 0.002;

    private final BodyScene body;
    private final Pane labels = new Pane();
    private final LegendView legend = new LegendView();
    private final Label pickInfo = new Label("Click a facet to read its values.");
    private final Label status = new Label();
    private final ProgressIndicator busy = new ProgressIndicator();
    private final ChoiceBox<Quantity> quantity = new ChoiceBox<>();
    private final TextField minField = new TextField();
    private final TextField maxField = new TextField();
    final BorderPane root;
    private SurveyData survey;
    private Runnable afterSurvey = () -> { };
    private double pressX;
    private double pressY;

    ViewerWindow(BodyGeometry geometry) {
        // no multisampling in the window: it costs about 40 % of the frame time on software OpenGL (measured)
        body = new BodyScene(geometry, 960, 720, SceneAntialiasing.DISABLED);
        labels.setMouseTransparent(true);
        Pane view3d = new Pane(body.node(), labels);
        view3d.setMinSize(200, 200);
        view3d.widthProperty().addListener((o, a, b) -> resized(view3d));
        view3d.heightProperty().addListener((o, a, b) -> resized(view3d));
        installMouse(view3d);

        legend.setPrefWidth(OffscreenRenderer.LEGEND_WIDTH);
        pickInfo.setFont(Font.font("Monospaced", 12));
        pickInfo.setTextFill(LegendView.TEXT);
        pickInfo.setWrapText(true);
        VBox right = new VBox(6, legend, new Separator(), LegendView.label("Picked facet", 14, true), pickInfo);
        right.setPadding(new Insets(0, 10, 10, 0));
        right.setPrefWidth(OffscreenRenderer.LEGEND_WIDTH + 40);
        right.setBackground(new Background(new BackgroundFill(OffscreenRenderer.PANEL, null, null)));

        busy.setPrefSize(18, 18);
        busy.setVisible(false);
        status.setTextFill(LegendView.TEXT);
        Label caution = LegendView.label(Caution.TEXT, 11, false);
        HBox.setHgrow(status, Priority.ALWAYS);
        status.setMaxWidth(Double.MAX_VALUE);
        HBox bottom = new HBox(10, busy, status, caution);
        bottom.setPadding(new Insets(5, 10, 5, 10));
        bottom.setBackground(right.getBackground());

        root = new BorderPane(view3d, toolbar(), right, bottom, null);
        root.setBackground(right.getBackground());
        recolour();
    }

    /**
     * Opens the window and blocks until it is closed.
     *
     * @param geometry    the body
     * @param surveyDir   survey directory, or null to run the survey
     * @param model       the OBJ file (for the survey and its hash check)
     * @param forwarded   model/spin options to pass to the survey
     * @throws DisplayUnavailableException when no window can open
     */
    public static void open(BodyGeometry geometry, Path surveyDir, Path model, List<String> forwarded)
        throws InterruptedException {
        open(geometry, surveyDir, model, forwarded, 0, null);
    }

    /**
     * As {@link #open(BodyGeometry, Path, Path, List)}; with {@code measureFrames > 0} the window orbits the body by
     * itself for that many frames once the survey is in, prints frame-time and memory figures to {@code report}
     * and closes (a benchmark of interactive use).
     */
    public static void open(BodyGeometry geometry, Path surveyDir, Path model, List<String> forwarded,
                            int measureFrames, java.io.PrintWriter report) throws InterruptedException {
        FxRuntime.start();
        CountDownLatch closed = new CountDownLatch(1);
        FxRuntime.call(() -> {
            ViewerWindow w = new ViewerWindow(geometry);
            Stage stage = new Stage();
            stage.setTitle("Cairn viewer: " + geometry.name());
            Scene scene = new Scene(w.root, 1280, 860);
            scene.setOnKeyPressed(e -> {
                if (e.getCode() == KeyCode.R) {
                    w.body.resetView(ViewPreset.ISO);
                    w.refreshLabels();
                }
            });
            stage.setScene(scene);
            stage.setOnHidden(e -> closed.countDown());
            stage.show();
            if (measureFrames > 0) {
                w.afterSurvey = () -> w.measure(stage, measureFrames, report);
            }
            w.loadSurvey(surveyDir, model, forwarded, geometry.mesh().facetCount());
            return null;
        });
        closed.await();
        javafx.application.Platform.exit(); // the window was the process's only work: end the toolkit cleanly
    }

    private ToolBar toolbar() {
        quantity.getItems().addAll(Quantity.values());
        quantity.setValue(Quantity.NONE);
        quantity.setOnAction(e -> {
            minField.clear();
            maxField.clear();
            recolour();
        });
        minField.setPromptText("auto");
        maxField.setPromptText("auto");
        minField.setPrefColumnCount(6);
        maxField.setPrefColumnCount(6);
        minField.setOnAction(e -> recolour());
        maxField.setOnAction(e -> recolour());
        Button apply = new Button("Apply limits");
        apply.setOnAction(e -> recolour());
        Button auto = new Button("Auto");
        auto.setOnAction(e -> {
            minField.clear();
            maxField.clear();
            recolour();
        });
        ChoiceBox<Lighting> light = new ChoiceBox<>();
        light.getItems().addAll(Lighting.values());
        light.setValue(Lighting.SHADED);
        light.setOnAction(e -> body.setLighting(light.getValue()));

        MenuButton views = new MenuButton("View");
        for (ViewPreset p : ViewPreset.values()) {
            MenuItem m = new MenuItem("from " + p.cliName());
            m.setOnAction(e -> {
                body.resetView(p);
                refreshLabels();
            });
            views.getItems().add(m);
        }
        MenuItem spinView = new MenuItem("down the spin axis");
        spinView.setOnAction(e -> lookFrom(body.geometry().spinAxis()));
        views.getItems().add(spinView);
        String[] which = {"smallest", "middle", "largest"};
        for (int k = 0; k < 3; k++) {
            int kk = k;
            MenuItem m = new MenuItem("along principal axis " + (k + 1) + " (" + which[k] + " moment)");
            m.setOnAction(e -> {
                double[] a = body.geometry().principalAxes();
                lookFrom(new double[] {a[3 * kk], a[3 * kk + 1], a[3 * kk + 2]});
            });
            views.getItems().add(m);
        }
        Button reset = new Button("Reset view");
        reset.setOnAction(e -> {
            body.resetView(ViewPreset.ISO);
            refreshLabels();
        });

        MenuButton over = new MenuButton("Overlays");
        for (Overlay o : Overlay.values()) {
            CheckMenuItem c = new CheckMenuItem(o.toString());
            c.setOnAction(e -> {
                body.setOverlay(o, c.isSelected());
                refreshLabels();
            });
            over.getItems().add(c);
        }
        Button about = new Button("About");
        about.setOnAction(e -> about());
        return new ToolBar(new Label("Colour by"), quantity, new Label("min"), minField, new Label("max"), maxField,
            apply, auto, new Separator(), new Label("Light"), light, views, reset, over, new Separator(), about);
    }

    private void lookFrom(double[] dir) {
        double[] up = Math.abs(dir[2]) < 0.9 ? new double[] {0, 0, 1} : new double[] {0, 1, 0};
        body.lookFrom(dir, up);
        refreshLabels();
    }

    private void installMouse(Pane view3d) {
        view3d.setOnMousePressed(e -> {
            pressX = e.getX();
            pressY = e.getY();
        });
        view3d.setOnMouseReleased(e -> body.setInteracting(false));
        javafx.animation.PauseTransition settle = new javafx.animation.PauseTransition(javafx.util.Duration.millis(400));
        settle.setOnFinished(e -> body.setInteracting(false));
        view3d.setOnMouseDragged(e -> {
            double dx = e.getX() - pressX;
            double dy = e.getY() - pressY;
            pressX = e.getX();
            pressY = e.getY();
            body.setInteracting(true);
            ViewState v = body.view();
            if (e.getButton() == MouseButton.SECONDARY || e.getButton() == MouseButton.MIDDLE || e.isShiftDown()) {
                double mPerPx = v.distance() / ViewState.focalPixels(body.node().getHeight());
                v.pan(-dx * mPerPx, -dy * mPerPx);
            } else {
                v.orbit(-dx * ORBIT_RAD_PER_PX, dy * ORBIT_RAD_PER_PX);
            }
            body.applyView();
            refreshLabels();
        });
        view3d.setOnScroll(e -> {
            body.setInteracting(true);
            settle.playFromStart();
            body.view().zoom(Math.exp(-ZOOM_PER_UNIT * e.getDeltaY()));
            body.applyView();
            refreshLabels();
        });
        body.setPickListener(this::showPick);
    }

    private void resized(Pane view3d) {
        body.resize(view3d.getWidth(), view3d.getHeight());
        body.applyView();
        refreshLabels();
    }

    private void refreshLabels() {
        ZoneLabels.update(labels, body, body.node().getWidth(), body.node().getHeight(),
            body.overlayShown(Overlay.ZONES), body.overlayShown(Overlay.SITES));
    }

    private void recolour() {
        Quantity q = quantity.getValue() == null ? Quantity.NONE : quantity.getValue();
        if (q != Quantity.NONE && survey == null) {
            status.setText("No survey yet: showing the plain surface.");
            q = Quantity.NONE;
        }
        Double lo = parse(minField);
        Double hi = parse(maxField);
        FacetColouring.Result c = FacetColouring.colour(survey, body.geometry().mesh().facetCount(), q,
            new ColourLimits(lo, hi));
        body.setColours(c.argb());
        legend.show(c.legend());
    }

    private Double parse(TextField f) {
        String s = f.getText().trim();
        if (s.isEmpty()) {
            return null;
        }
        try {
            return Double.parseDouble(s);
        } catch (NumberFormatException e) {
            status.setText("'" + s + "' is not a number: limit ignored.");
            return null;
        }
    }

    void loadSurvey(Path dir, Path model, List<String> forwarded, int facets) {
        Task<SurveyData> t = new Task<>() {
            @Override
            protected SurveyData call() {
                return dir != null ? SurveyData.read(dir, model, facets) : SurveySource.run(model, forwarded, facets);
            }
        };
        busy.setVisible(true);
        status.setText(dir != null ? "Reading survey " + dir + " ..." : "Running the survey ...");
        t.setOnSucceeded(e -> {
            busy.setVisible(false);
            survey = t.getValue();
            body.setSurvey(survey);
            status.setText("Survey: " + (dir != null ? dir : "computed") + ", " + survey.sites().size()
                + " sites, " + survey.zones().size() + " zones  ·  " + survey.parametersLine());
            status.setTooltip(new javafx.scene.control.Tooltip(String.join("\n", survey.parameterLines())));
            Quantity keep = quantity.getValue();
            java.util.List<Quantity> offered = new java.util.ArrayList<>();
            for (Quantity q : Quantity.values()) {
                if (q.availableIn(survey)) {
                    offered.add(q); // only what this survey has (older surveys lack some columns)
                }
            }
            quantity.getItems().setAll(offered);
            quantity.setValue(offered.contains(keep) ? keep : Quantity.NONE);
            if (quantity.getValue() == Quantity.NONE) {
                quantity.setValue(Quantity.SLOPE);
            }
            recolour();
            refreshLabels();
            afterSurvey.run();
        });
        t.setOnFailed(e -> {
            afterSurvey.run();
            busy.setVisible(false);
            status.setTextFill(Color.rgb(255, 140, 120));
            status.setText("No survey: " + t.getException().getMessage());
        });
        Thread th = new Thread(t, "cairn-survey");
        th.setDaemon(true);
        th.start();
    }

    /**
     * Orbits 1° per frame for {@code frames} frames with the full mesh, then (on large models) as many with the
     * drag proxy, reporting frame times and heap use after each; then closes.
     */
    private void measure(Stage stage, int frames, java.io.PrintWriter report) {
        measure(frames, report, false, () -> {
            if (body.proxyFacets() > 0) {
                measure(frames, report, true, stage::hide);
            } else {
                stage.hide();
            }
        });
    }

    private void measure(int frames, java.io.PrintWriter report, boolean proxy, Runnable then) {
        body.setInteracting(proxy);
        long[] t = new long[frames + 1];
        int[] k = {0};
        new javafx.animation.AnimationTimer() {
            @Override
            public void handle(long now) {
                t[k[0]++] = now;
                if (k[0] > frames) {
                    stop();
                    long[] d = new long[frames];
                    for (int i = 0; i < frames; i++) {
                        d[i] = t[i + 1] - t[i];
                    }
                    java.util.Arrays.sort(d);
                    double mean = (t[frames] - t[0]) / 1e6 / frames;
                    Runtime rt = Runtime.getRuntime();
                    System.gc();
                    report.printf(Locale.ROOT, "cairn: view: %d facets%s, %d frames while orbiting: mean %.1f ms, "
                            + "median %.1f ms, 90th percentile %.1f ms per frame; Java heap in use %.0f MB%n",
                        body.geometry().mesh().facetCount(),
                        proxy ? " (drag proxy of " + body.proxyFacets() + " facets shown)" : "", frames, mean,
                        d[frames / 2] / 1e6,
                        d[(int) (0.9 * (frames - 1))] / 1e6, (rt.totalMemory() - rt.freeMemory()) / 1048576.0);
                    report.flush();
                    body.setInteracting(false);
                    then.run();
                    return;
                }
                body.view().orbit(Math.toRadians(1), 0);
                body.applyView();
            }
        }.start();
    }

    private void showPick(int f) {
        if (survey == null) {
            double[] c = body.geometry().facetCentroidScene(f);
            double[] com = body.geometry().centreOfMass();
            pickInfo.setText(String.format(Locale.ROOT, "facet %d%ncentroid (%.1f, %.1f, %.1f) m%n(no survey: no values)",
                f, c[0] + com[0], c[1] + com[1], c[2] + com[2]));
        } else {
            pickInfo.setText(PickReport.text(survey, f));
        }
    }

    private void about() {
        Alert a = new Alert(Alert.AlertType.INFORMATION);
        a.setTitle("About the Cairn viewer");
        a.setHeaderText("Cairn viewer " + dev.cairn.cli.VersionProvider.version());
        String params = survey == null ? "No survey loaded." : "Survey parameters:\n  "
            + String.join("\n  ", survey.parameterLines());
        a.setContentText("Shape model coloured by surveyed surface quantities.\n"
            + "Units SI, model (body-fixed) frame; potential U > 0, acceleration = grad U.\n"
            + "Effective values include the centrifugal term of the body's spin.\n\n" + params + "\n\n"
            + Caution.TEXT);
        a.showAndWait();
    }
}
