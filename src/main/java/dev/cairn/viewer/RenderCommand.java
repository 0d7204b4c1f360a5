package dev.cairn.viewer;

import dev.cairn.cli.ModelOptions;
import dev.cairn.cli.SpinOptions;
import dev.cairn.body.BodyModel;
import dev.cairn.io.InputException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.EnumSet;
import java.util.List;
import java.util.Set;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code cairn render}: writes a coloured view of the body with its legend to PNG without opening a window.
 * No JavaFX type appears in this class: the toolkit starts inside {@link #call()} (via {@link RenderJob}).
 */
@Command(name = "render", mixinStandardHelpOptions = true,
    header = "Render a coloured view of the body with its legend to PNG (no window).",
    description = {"Render the body coloured by a surveyed quantity, with legend, to a PNG image (no window).",
        "Needs a display server; on a machine without one run under xvfb-run -a -s '-screen 0 1280x1024x24'.",
        "Without --survey the survey is run first from the model's sidecar parameters (and the options given).",
        "Values: SI units, model frame, potential U > 0. Caution: results must be verified independently before",
        "operational use; mission rules and the responsible flight-dynamics authority decide."})
public final class RenderCommand implements Callable<Integer> {
    @Mixin
    ModelOptions model = new ModelOptions();

    @Mixin
    SpinOptions spin = new SpinOptions();

    @Option(names = "--survey", paramLabel = "DIR", description = "Survey directory (facets.csv, summary.json).")
    Path survey;

    @Option(names = "--quantity", paramLabel = "NAME", defaultValue = "slope",
        description = "slope, g-eff, g, g-eff-normal, g-eff-tangential, g-normal, g-tangential, potential-eff, "
            + "potential, dynamic-height, escape-speed, escape-speed-min, hover-accel, roughness, disc-max-slope, "
            + "area, lift-off, sites, zones or none (default: ${DEFAULT-VALUE}).")
    String quantity;

    @Option(names = "--view", paramLabel = "VIEW", defaultValue = "iso",
        description = "+x, -x, +y, -y, +z, -z (camera on that side of the body) or iso (default: ${DEFAULT-VALUE}).")
    String view;

    @Option(names = "--size", paramLabel = "WxH", defaultValue = "1600x1200",
        description = "Image size in pixels (default: ${DEFAULT-VALUE}).")
    String size;

    @Option(names = "--out", required = true, paramLabel = "FILE.png", description = "Output PNG file.")
    Path out;

    @Option(names = "--min", paramLabel = "VALUE", description = "Low end of the colour range (quantity's units).")
    Double min;

    @Option(names = "--max", paramLabel = "VALUE", description = "High end of the colour range; for slope, "
        + "effective gravity and potential, values above it show the warning colour (e.g. --max 30 for slope).")
    Double max;

    @Option(names = "--flat", description = "Ambient light only: every facet shows exactly its legend colour.")
    boolean flat;

    @Option(names = "--overlay", paramLabel = "NAME", split = ",", description = "Overlays: spin-axis, "
        + "principal-axes, body-axes, graticule, wireframe, zones, sites (comma-separated).")
    List<String> overlays;

    @Option(names = "--markers", paramLabel = "FILE.csv", description = "Mark points of a CSV with columns x_m,y_m,"
        + "z_m (model frame; with an outcome column only rows at rest), e.g. a deployment's landings.csv.")
    java.nio.file.Path markers;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        Quantity q = Quantity.parse(quantity);
        ViewPreset v = ViewPreset.parse(view);
        int[] wh = parseSize(size);
        Set<Overlay> ov = EnumSet.noneOf(Overlay.class);
        if (overlays != null) {
            for (String s : overlays) {
                ov.add(Overlay.parse(s));
            }
        }
        double[] marks = markers == null ? new double[0] : MarkerPoints.read(markers);
        long tLoad = System.nanoTime();
        BodyModel body = model.load(spin);
        for (String w : body.warnings()) {
            err.println("cairn: warning: " + w);
        }
        BodyGeometry geometry = BodyGeometry.of(body);
        int nf = body.mesh().facetCount();
        SurveyData data = null;
        if (survey != null) {
            data = SurveyData.read(survey, model.modelPath(), nf);
        } else if (q != Quantity.NONE || ov.contains(Overlay.ZONES) || ov.contains(Overlay.SITES)) {
            err.println("cairn: no --survey given: running the survey first ...");
            err.flush();
            data = SurveySource.run(model.modelPath(), ForwardedOptions.of(spec), nf);
        }
        if (Boolean.getBoolean("cairn.timing")) {
            err.printf(java.util.Locale.ROOT, "cairn: timing: model load + survey %.2f s%n",
                (System.nanoTime() - tLoad) / 1e9);
        }
        if (data != null && !q.availableIn(data)) {
            throw new InputException("--quantity " + q.cliName() + ": the survey has no column '" + q.column()
                + "' (written by a newer survey: run the survey again)");
        }
        RenderRequest req = new RenderRequest(geometry, data, q, new ColourLimits(min, max), v,
            flat ? Lighting.FLAT : Lighting.SHADED, ov, wh[0], wh[1], marks);
        long t0 = System.nanoTime();
        RenderJob.renderToFile(req, out);
        err.println(String.format(java.util.Locale.ROOT, "cairn: wrote %s (%dx%d, %s, view %s, %.1f s)", out, wh[0],
            wh[1], q.label(), v.cliName(), (System.nanoTime() - t0) / 1e9));
        err.flush();
        return 0;
    }

    /** Parses "1600x1200". */
    static int[] parseSize(String s) {
        String[] p = s.trim().toLowerCase(java.util.Locale.ROOT).split("x");
        try {
            if (p.length == 2) {
                int w = Integer.parseInt(p[0].trim());
                int h = Integer.parseInt(p[1].trim());
                if (w >= OffscreenRendererLimits.MIN_WIDTH && h >= OffscreenRendererLimits.MIN_HEIGHT
                    && w <= OffscreenRendererLimits.MAX_SIDE && h <= OffscreenRendererLimits.MAX_SIDE) {
                    return new int[] {w, h};
                }
            }
        } catch (NumberFormatException e) {
            // fall through to the message
        }
        throw new InputException("--size: '" + s + "' is not a size WxH between " + OffscreenRendererLimits.MIN_WIDTH
            + "x" + OffscreenRendererLimits.MIN_HEIGHT + " and " + OffscreenRendererLimits.MAX_SIDE + "x"
            + OffscreenRendererLimits.MAX_SIDE + " pixels");
    }

    /** Size limits without loading the JavaFX renderer class. */
    static final class OffscreenRendererLimits {
        static final int MIN_WIDTH = 480;
        static final int MIN_HEIGHT = 420;
        static final int MAX_SIDE = 8192;

        private OffscreenRendererLimits() {
        }
    }
}
