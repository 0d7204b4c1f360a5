package dev.cairn.cli;

import dev.cairn.body.BodyModel;
import dev.cairn.io.InputException;
import dev.cairn.surface.HoverPoint;
import dev.cairn.surface.LandingSite;
import dev.cairn.surface.LandingZone;
import dev.cairn.surface.Survey;
import dev.cairn.surface.SurveyOutputs;
import dev.cairn.surface.SurveyParameters;
import dev.cairn.surface.SurveyResult;
import dev.cairn.util.ParallelChunks;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code cairn survey}: surface survey of the spinning body (slope, effective gravity, dynamic height, lift-off,
 * escape speed, landing and hovering zones), written to an output directory, with a short report on the terminal.
 */
@Command(name = "survey", mixinStandardHelpOptions = true,
    header = "Survey the surface of the spinning body (slope, gravity, landing and hovering zones).",
    description = {"Survey the surface of the spinning body: slope, effective gravity,",
        "dynamic height, lift-off, escape speed, landing sites and zones, hovering points.",
        "Writes facets.csv (+ facets.csv.json metadata sidecar), zones.csv, summary.json,",
        "surface.vtk (VTK unstructured grid for VTK, ParaView, meshio; slope active, metadata",
        "as field data) and PNG maps to --out.",
        "SI units, model (body-fixed) frame, U > 0, g = grad U; see docs/survey.md.",
        "Caution: results must be verified independently before operational use;",
        "mission rules and the responsible flight-dynamics authority decide."})
public final class SurveyCommand implements Callable<Integer> {
    @Mixin
    ModelOptions model = new ModelOptions();

    @Mixin
    SpinOptions spinOptions = new SpinOptions();

    @Option(names = "--max-slope", paramLabel = "DEG", description = "Landing slope limit, degrees, 0-90 "
        + "(default ${DEFAULT-VALUE}; common practice, no source).")
    double maxSlope = SurveyParameters.DEFAULT_MAX_SLOPE_DEG;

    @Option(names = "--zone-radius", paramLabel = "M", description = "Radius that must be safe all round a landing "
        + "aim point, m (default ${DEFAULT-VALUE}).")
    double zoneRadius = SurveyParameters.DEFAULT_ZONE_RADIUS_M;

    @Option(names = "--site-radius", paramLabel = "M", description = "Radius of a landing site (landing dispersion): "
        + "sites are non-overlapping discs of this radius about aim points, m (default: the zone radius).")
    Double siteRadius;

    @Option(names = "--max-roughness", paramLabel = "DEG", description = "Largest RMS spread of facet normals inside "
        + "the zone radius, degrees (default ${DEFAULT-VALUE}).")
    double maxRoughness = SurveyParameters.DEFAULT_MAX_ROUGHNESS_DEG;

    @Option(names = "--hover-altitudes", paramLabel = "M", split = ",", description = "Altitudes above the "
        + "surface for the hovering search, m, comma-separated (default: 0, 2, 5, 10 and 20%% of the equivalent "
        + "radius).")
    double[] hoverAltitudes;

    @Option(names = "--out", paramLabel = "DIR", description = "Output directory (default: survey-out/ in the "
        + "current directory).")
    Path out = Paths.get("survey-out");

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads (default: all processors).")
    int threads = ParallelChunks.defaultThreads();

    @Option(names = "--map-size", paramLabel = "PX", description = "Width of the lat/lon map grid in pixels, "
        + "one pixel per cell over 360 deg of longitude (height half of it); even, 360 to 4320 (default: 720, "
        + "0.5 deg per pixel).")
    int mapSize = dev.cairn.surface.SurveyMaps.GRID_W;

    @Option(names = "--views", description = "Also render 3D views (slope and landing zones, iso and spin-pole "
        + "views) to PNG with the 'render' command; needs a display (e.g. xvfb-run), skipped with a warning without.")
    boolean views;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        System.setProperty("java.awt.headless", "true");
        dev.cairn.surface.SurveyMaps.requireGridWidth(mapSize); // before the survey: fail fast on a bad size
        SurveyParameters params = parameters();
        BodyModel body = model.load(spinOptions);
        PrintWriter err = spec.commandLine().getErr();
        for (String w : body.warnings()) {
            err.println("cairn: warning: " + w);
        }
        body.surfaceFieldModel(); // fail early, with a one-line error, when the field cannot be built
        SurveyResult r;
        try (ProgressBar bar = new ProgressBar("survey")) {
            r = Survey.run(body, params, bar);
        }
        for (String n : r.notes()) {
            err.println("cairn: note: " + n);
        }
        boolean replacing = java.nio.file.Files.isDirectory(out);
        SurveyOutputs.writeAll(r, out, VersionProvider.version(), mapSize);
        if (replacing) {
            err.println("cairn: replaced the existing output directory " + dev.cairn.io.Messages.path(out));
        }
        report(spec.commandLine().getOut(), r);
        if (views) {
            renderViews(body, err);
        }
        return 0;
    }

    /** Views added by {@code --views}: quantity and view direction for the {@code render} command. */
    private static final String[][] VIEWS = {{"sites", "iso"}, {"slope", "iso"}, {"slope", "+z"}, {"zones", "iso"},
        {"g-eff", "iso"}};

    /**
     * Renders the survey's 3D views through the {@code render} subcommand (so that this package needs no JavaFX).
     * Without a display the first failure ends the attempt with one warning.
     */
    private void renderViews(BodyModel body, PrintWriter err) {
        for (String[] v : VIEWS) {
            List<String> args = new ArrayList<>(List.of("render", body.source().toString()));
            if (body.source().toString().endsWith(".obj")) {
                args.addAll(List.of("--units", body.lengthUnit()));
            }
            Path png = out.resolve("view-" + v[0] + "-" + v[1].replace("+", "plus") + ".png");
            args.addAll(List.of("--survey", out.toString(), "--quantity", v[0], "--view", v[1],
                "--out", png.toString()));
            if (v[0].equals("sites")) {
                args.addAll(List.of("--overlay", "sites"));
            }
            StringWriter renderErr = new StringWriter();
            int code = CairnMain.execute(new PrintWriter(new StringWriter()), new PrintWriter(renderErr),
                args.toArray(new String[0]));
            if (code != 0) {
                err.println("cairn: warning: 3D views skipped: " + renderErr.toString().strip().replaceFirst(
                    "^cairn: error: ", ""));
                return;
            }
            err.println("cairn: wrote " + png);
        }
    }

    /** Checks the options and builds the survey parameters; bad values give a one-line InputException. */
    SurveyParameters parameters() {
        if (!(maxSlope > 0 && maxSlope < 90)) {
            throw new InputException("--max-slope: must be between 0 and 90 degrees, got " + maxSlope);
        }
        if (!(zoneRadius > 0) || !Double.isFinite(zoneRadius)) {
            throw new InputException("--zone-radius: must be a positive number of metres, got " + zoneRadius);
        }
        if (!(maxRoughness > 0 && maxRoughness <= 90)) {
            throw new InputException("--max-roughness: must be in (0, 90] degrees, got " + maxRoughness);
        }
        if (hoverAltitudes != null) {
            for (double h : hoverAltitudes) {
                if (!(h >= 0) || !Double.isFinite(h)) {
                    throw new InputException("--hover-altitudes: altitudes must be finite and >= 0 m, got " + h);
                }
            }
        }
        if (threads < 1) {
            throw new InputException("--threads: must be at least 1, got " + threads);
        }
        if (siteRadius != null && !(siteRadius > 0 && Double.isFinite(siteRadius))) {
            throw new InputException("--site-radius: must be a positive number of metres, got " + siteRadius);
        }
        spinOptions.periodSeconds(); // validates --spin-period before the model is read
        spinOptions.axis();
        return new SurveyParameters(maxSlope, zoneRadius, maxRoughness, hoverAltitudes, threads,
            siteRadius == null ? Double.NaN : siteRadius);
    }

    private void report(PrintWriter o, SurveyResult r) {
        var t = r.target();
        double p = t.spin().periodSeconds();
        double[] ax = t.spin().axis();
        o.printf(Locale.ROOT, "Body         %s (%s), %d facets%n", t.name(), t.source(), r.facetCount());
        o.printf(Locale.ROOT, "Field        %s, GM %.6g m^3/s^2, equivalent radius %.6g m%n", t.field().describe(),
            t.field().gm(), t.equivalentRadius());
        if (r.fieldCheck() != null && r.fieldCheck().samples() > 0) {
            o.printf(Locale.ROOT, "Field check  max relative error against the exact sum on %d sampled facets: |g| %.2e, "
                + "U %.2e%n", r.fieldCheck().samples(), r.fieldCheck().maxRelG(), r.fieldCheck().maxRelU());
        } else {
            o.printf(Locale.ROOT, "Field check  exact direct sum (no approximation; --tolerance selects the hierarchical "
                + "model)%n");
        }
        o.printf(Locale.ROOT, "Spin         %s, pole [%.4f, %.4f, %.4f]%n", Double.isInfinite(p) ? "none"
            : String.format(Locale.ROOT, "period %.6g s (%.4g h)", p, p / 3600), ax[0], ax[1], ax[2]);
        range(o, "Slope", r.slopeDeg(), "deg");
        range(o, "Gravity", r.gravity(), "m/s^2");
        range(o, "Eff. gravity", r.gravityEff(), "m/s^2");
        range(o, "Dyn. height", r.dynamicHeight(), "m (0 = area-weighted mean level, positive = higher)");
        range(o, "Escape speed", r.escapeSpeed(), "m/s (normal launch)");
        double[] a = r.areas();
        boolean[] lift = r.liftOff();
        double[] s = r.slopeDeg();
        double tot = 0;
        double la = 0;
        double below = 0;
        for (int f = 0; f < a.length; f++) {
            tot += a[f];
            la += lift[f] ? a[f] : 0;
            below += s[f] < r.parameters().maxSlopeDeg() ? a[f] : 0;
        }
        o.printf(Locale.ROOT, "Area         %.1f%% below %.4g deg slope, %.2f%% lift-off%n", 100 * below / tot,
            r.parameters().maxSlopeDeg(), 100 * la / tot);
        double rs = r.parameters().siteRadius();
        o.printf(Locale.ROOT, "Sites        %d (non-overlapping discs of radius %.4g m about aim points, best first; "
            + "all in summary.json)%n", r.sites().size(), rs);
        for (LandingSite x : r.sites().subList(0, Math.min(10, r.sites().size()))) {
            o.printf(Locale.ROOT, "  #%-3d score %.3f  lat %6.1f lon %7.1f  slope max/mean %.1f/%.1f deg  rough %.1f deg"
                + "  dh %.3g m  g_eff %.4g m/s^2  esc %.3g m/s  safe %.0f%%  zone %d%s%n", x.rank(), x.score(),
                x.latDeg(), x.lonDeg(), x.maxSlopeDeg(), x.meanSlopeDeg(), x.roughnessDeg(),
                x.dynamicHeightRangeM(), x.meanGravityEff(), x.meanEscapeSpeed(), 100 * x.safeAreaFraction(),
                x.zone(), r.mapLayer()[x.facet()] > 1 ? "  (map layer " + r.mapLayer()[x.facet()] + ")" : "");
        }
        double hidden = r.hiddenAreaFraction();
        if (hidden > 0) {
            o.printf(Locale.ROOT, "Maps         %.1f%% of the area is hidden on the outer lat/lon maps (rays from the "
                + "centre of mass cross the surface more than once): see the map-*-layerN.png maps%n", 100 * hidden);
        }
        o.printf(Locale.ROOT, "Zones        %d (slope < %.4g deg and roughness <= %.4g deg over radius %.4g m)%n",
            r.zones().size(), r.parameters().maxSlopeDeg(), r.parameters().maxRoughnessDeg(),
            r.parameters().zoneRadiusM());
        for (LandingZone z : r.zones().subList(0, Math.min(5, r.zones().size()))) {
            o.printf(Locale.ROOT, "  #%d score %.3f  aim lat %6.1f lon %7.1f  area %.4g m^2  slope max %.1f mean %.1f"
                + " deg  g_eff %.4g m/s^2  escape %.3g m/s%n", z.rank(), z.score(), z.bestLatDeg(), z.bestLonDeg(),
                z.areaM2(),
                z.maxSlopeDeg(), z.meanSlopeDeg(), z.meanGravityEff(), z.meanEscapeSpeed());
        }
        double lastAlt = -1;
        for (HoverPoint h : r.hovering()) {
            if (h.altitudeM() != lastAlt && h.rank() == 1) {
                o.printf(Locale.ROOT, "Hover        %8.4g m altitude: least %.4g m/s^2 at lat %.1f lon %.1f%n",
                    h.altitudeM(), h.hoverAccel(), h.latDeg(), h.lonDeg());
                lastAlt = h.altitudeM();
            }
        }
        double[] st = r.stageSeconds();
        o.printf(Locale.ROOT, "Survey       %.2f s (field %.2f s, zones %.2f s, hovering %.2f s); outputs in %s%n",
            r.seconds(), st[0], st[1], st[2], out.toAbsolutePath());
        o.println("Caution: " + SurveyOutputs.CAUTION);
        o.flush();
    }

    private static void range(PrintWriter o, String what, double[] v, String unit) {
        double mn = Double.POSITIVE_INFINITY;
        double mx = Double.NEGATIVE_INFINITY;
        for (double x : v) {
            mn = Math.min(mn, x);
            mx = Math.max(mx, x);
        }
        o.printf(Locale.ROOT, "%-12s %.4g .. %.4g %s%n", what, mn, mx, unit);
    }
}
