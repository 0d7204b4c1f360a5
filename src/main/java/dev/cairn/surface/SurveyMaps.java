package dev.cairn.surface;

import dev.cairn.io.AtomicFiles;
import dev.cairn.rotation.RotatingFrame;
import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.FontMetrics;
import java.awt.Graphics2D;
import java.awt.RenderingHints;
import java.awt.geom.AffineTransform;
import java.awt.image.BufferedImage;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import javax.imageio.ImageIO;

/**
 * PNG maps of a survey drawn with plain Java2D (no display needed; run the JVM with {@code java.awt.headless=true}
 * when there is no display): slope, effective gravity and dynamic height on a latitude–longitude grid (about the spin
 * pole, see {@link LatLonRaster}) with a colour bar, axis labels and units, and the area-weighted slope histogram.
 * Colour ramps are Cairn's own.
 */
public final class SurveyMaps {
    public static final String SLOPE = "map-slope.png";
    public static final String G_EFF = "map-g-eff.png";
    public static final String DYNAMIC_HEIGHT = "map-dynamic-height.png";
    public static final String HISTOGRAM = "hist-slope.png";

    /** Map grid cells (0.5° per cell). */
    public static final int GRID_W = 720;
    public static final int GRID_H = 360;
    private static final int LEFT = 70;
    private static final int TOP = 44;
    private static final int RIGHT = 130;
    private static final int BOTTOM = 84;
    /** Size of a map image, pixels. */
    public static final int MAP_WIDTH = LEFT + GRID_W + RIGHT;
    public static final int MAP_HEIGHT = TOP + GRID_H + BOTTOM;
    /** Size of the histogram image, pixels. */
    public static final int HIST_WIDTH = 900;
    public static final int HIST_HEIGHT = 500;

    private static final Color NO_DATA = new Color(0x80, 0x80, 0x80);
    private static final Color LIFT_OFF = new Color(0xE0, 0x2F, 0xC8);
    /** Hatching of cells whose ray crosses the surface again below the layer shown. */
    private static final Color HIDDEN = new Color(0x10, 0x10, 0x10);
    private static final int HATCH = 6;
    /** Sites circled on the slope maps. */
    static final int MARKED_SITES = 10;
    /** Sequential ramp: deep indigo, slate blue, sea green, straw, pale cream. */
    private static final int[] SEQUENTIAL = {0x201A40, 0x2F5A8C, 0x35967A, 0xC9B85A, 0xF6F0D6};
    /** Diverging ramp for signed values: blue, near-white, brick red. */
    private static final int[] DIVERGING = {0x23408E, 0x7C9BD0, 0xF1EFEA, 0xD7876E, 0x9E2A22};

    private SurveyMaps() {
    }

    /**
     * Writes the maps and the histogram into {@code dir}; returns their paths. When rays from the centre of mass cross
     * the surface more than once, each map is also written for the inner layers ({@link #layerFile}), so that the
     * layers together show every facet (up to {@link LatLonRaster#MAX_LAYERS} layers).
     */
    public static List<Path> writeAll(SurveyResult r, Path dir) {
        RotatingFrame frame = new RotatingFrame(r.target.spin(), r.target.centreOfMass());
        LatLonRaster raster = LatLonRaster.build(r.target.mesh(), frame, GRID_W, GRID_H, r.parameters.threads());
        List<Path> out = new ArrayList<>();
        double[] s = r.slope;
        double top = Math.min(90, Math.max(2 * r.parameters.maxSlopeDeg(), Math.ceil(percentile(r, s, 0.99) / 5) * 5));
        double[] ge = r.gEff;
        double[] h = r.dynamicHeight;
        double hm = Math.max(Math.abs(min(h)), Math.abs(max(h)));
        if (!(hm > 0)) {
            hm = 1;
        }
        for (int layer = 1; layer <= raster.layers(); layer++) {
            String tl = layer == 1 ? "" : ", layer " + layer;
            out.add(write(dir.resolve(layerFile(SLOPE, layer)), map(r, raster, layer, s, 0, top, SEQUENTIAL,
                "Slope" + tl, "deg", true)));
            out.add(write(dir.resolve(layerFile(G_EFF, layer)), map(r, raster, layer, ge, min(ge), max(ge),
                SEQUENTIAL, "Effective gravity |g + centrifugal|" + tl, "m/s^2", false)));
            out.add(write(dir.resolve(layerFile(DYNAMIC_HEIGHT, layer)), map(r, raster, layer, h, -hm, hm, DIVERGING,
                "Dynamic height (0 = mean level)" + tl, "m", false)));
        }
        out.add(write(dir.resolve(HISTOGRAM), histogram(r)));
        return out;
    }

    /** File of a map for a layer: the name itself for layer 1, {@code map-slope-layer2.png} for layer 2, ... */
    public static String layerFile(String name, int layer) {
        return layer == 1 ? name : name.replace(".png", "-layer" + layer + ".png");
    }

    private static Path write(Path file, BufferedImage img) {
        AtomicFiles.write(file, os -> {
            if (!ImageIO.write(img, "png", os)) {
                throw new java.io.IOException("no PNG writer available");
            }
        });
        return file;
    }

    private static double min(double[] v) {
        double m = Double.POSITIVE_INFINITY;
        for (double x : v) {
            if (x < m) {
                m = x;
            }
        }
        return m;
    }

    private static double max(double[] v) {
        double m = Double.NEGATIVE_INFINITY;
        for (double x : v) {
            if (x > m) {
                m = x;
            }
        }
        return m;
    }

    /** Area-weighted percentile of the finite values below 90 (lift-off excluded). */
    private static double percentile(SurveyResult r, double[] v, double q) {
        Integer[] idx = new Integer[r.facets];
        int n = 0;
        double total = 0;
        for (int f = 0; f < r.facets; f++) {
            if (v[f] <= 90) {
                idx[n++] = f;
                total += r.area[f];
            }
        }
        if (n == 0) {
            return 90;
        }
        Integer[] sorted = Arrays.copyOf(idx, n);
        Arrays.sort(sorted, (a, b) -> Double.compare(v[a], v[b]));
        double acc = 0;
        for (Integer f : sorted) {
            acc += r.area[f];
            if (acc >= q * total) {
                return v[f];
            }
        }
        return v[sorted[n - 1]];
    }

    /** Colour of {@code t} in [0, 1] on a ramp of evenly spaced control colours. */
    static Color ramp(int[] stops, double t) {
        if (Double.isNaN(t)) {
            return NO_DATA;
        }
        double x = Math.max(0, Math.min(1, t)) * (stops.length - 1);
        int i = Math.min(stops.length - 2, (int) Math.floor(x));
        double u = x - i;
        int a = stops[i];
        int b = stops[i + 1];
        int rr = (int) Math.round(((a >> 16) & 255) * (1 - u) + ((b >> 16) & 255) * u);
        int gg = (int) Math.round(((a >> 8) & 255) * (1 - u) + ((b >> 8) & 255) * u);
        int bb = (int) Math.round((a & 255) * (1 - u) + (b & 255) * u);
        return new Color(rr, gg, bb);
    }

    private static Graphics2D graphics(BufferedImage img) {
        Graphics2D g = img.createGraphics();
        g.setRenderingHint(RenderingHints.KEY_ANTIALIASING, RenderingHints.VALUE_ANTIALIAS_ON);
        g.setRenderingHint(RenderingHints.KEY_TEXT_ANTIALIASING, RenderingHints.VALUE_TEXT_ANTIALIAS_ON);
        g.setColor(Color.WHITE);
        g.fillRect(0, 0, img.getWidth(), img.getHeight());
        g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 12));
        return g;
    }

    private static String fmt(double v) {
        double a = Math.abs(v);
        if (v == 0) { // exact zero prints as 0
            return "0";
        }
        if (a >= 1e4 || a < 1e-3) {
            return String.format(Locale.ROOT, "%.2e", v);
        }
        return String.format(Locale.ROOT, a >= 100 ? "%.0f" : a >= 10 ? "%.1f" : a >= 1 ? "%.2f" : "%.4f", v);
    }

    private static String subtitle(SurveyResult r) {
        double p = r.target.spin().periodSeconds();
        String spin = Double.isInfinite(p) ? "no spin" : String.format(Locale.ROOT, "spin period %.4g h", p / 3600);
        return r.target.name() + ", " + r.facets + " facets, " + spin;
    }

    private static BufferedImage map(SurveyResult r, LatLonRaster raster, int layer, double[] v, double lo, double hi,
                                     int[] stops, String title, String unit, boolean slopeMap) {
        BufferedImage img = new BufferedImage(MAP_WIDTH, MAP_HEIGHT, BufferedImage.TYPE_INT_RGB);
        Graphics2D g = graphics(img);
        double span = hi > lo ? hi - lo : 1;
        for (int j = 0; j < raster.height(); j++) {
            for (int i = 0; i < raster.width(); i++) {
                int f = raster.facet(i, j, layer);
                Color c;
                if (raster.crossings(i, j) > layer && (i + j) % HATCH == 0) {
                    c = HIDDEN; // more surface lies below this layer here
                } else if (f < 0) {
                    c = NO_DATA;
                } else if (slopeMap && r.liftOff[f]) {
                    c = LIFT_OFF;
                } else {
                    c = ramp(stops, (v[f] - lo) / span);
                }
                img.setRGB(LEFT + i, TOP + j, c.getRGB());
            }
        }
        g.setColor(Color.BLACK);
        g.drawRect(LEFT, TOP, GRID_W, GRID_H);
        FontMetrics fm = g.getFontMetrics();
        for (int lon = -180; lon <= 180; lon += 30) {
            int x = LEFT + (int) Math.round((lon + 180) / 360.0 * GRID_W);
            g.drawLine(x, TOP + GRID_H, x, TOP + GRID_H + 5);
            String s = String.valueOf(lon);
            g.drawString(s, x - fm.stringWidth(s) / 2, TOP + GRID_H + 18);
        }
        for (int lat = -90; lat <= 90; lat += 30) {
            int y = TOP + (int) Math.round((90 - lat) / 180.0 * GRID_H);
            g.drawLine(LEFT - 5, y, LEFT, y);
            String s = String.valueOf(lat);
            g.drawString(s, LEFT - 8 - fm.stringWidth(s), y + 4);
        }
        String xl = "East longitude (deg)";
        g.drawString(xl, LEFT + GRID_W / 2 - fm.stringWidth(xl) / 2, TOP + GRID_H + 36);
        AffineTransform keep = g.getTransform();
        g.rotate(-Math.PI / 2);
        String yl = "Latitude (deg)";
        g.drawString(yl, -(TOP + GRID_H / 2) - fm.stringWidth(yl) / 2, 22);
        g.setTransform(keep);
        Font bold = g.getFont().deriveFont(Font.BOLD, 14f);
        g.setFont(bold);
        g.drawString(title + " (" + unit + ")", LEFT, 18);
        g.setFont(g.getFont().deriveFont(Font.PLAIN, 11f));
        g.drawString(mapSubtitle(r, layer), LEFT, 36);
        g.drawString("Caution: " + SurveyOutputs.CAUTION, LEFT - 60, MAP_HEIGHT - 10);
        // Colour bar.
        int bx = LEFT + GRID_W + 30;
        int bw = 18;
        for (int y = 0; y < GRID_H; y++) {
            g.setColor(ramp(stops, 1 - (double) y / (GRID_H - 1)));
            g.fillRect(bx, TOP + y, bw, 1);
        }
        g.setColor(Color.BLACK);
        g.drawRect(bx, TOP, bw, GRID_H);
        g.setFont(g.getFont().deriveFont(Font.PLAIN, 11f));
        fm = g.getFontMetrics();
        double step = niceCeil(span / 6);
        // Ticks by an integer count, never by floating-point progress (a step below one ulp of lo would never end).
        double k0 = Math.ceil(lo / step);
        double k1 = Math.floor((hi + 1e-9 * span) / step);
        long nTicks = k1 >= k0 && k1 - k0 < MAX_TICKS ? (long) (k1 - k0) + 1 : 0;
        for (long i = 0; i < nTicks; i++) {
            double val = (k0 + i) * step;
            double tick = Math.abs(val) < 1e-9 * step ? 0 : val; // print -0 as 0
            int y = TOP + GRID_H - (int) Math.round(GRID_H * (tick - lo) / span);
            g.drawLine(bx + bw, y, bx + bw + 4, y);
            boolean top = tick + step > hi + 1e-9 * span;
            g.drawString(fmt(tick) + (top && slopeMap && hi < 90 ? "+" : ""), bx + bw + 6, y + 4);
        }
        g.drawString(unit, bx, TOP - 6);
        if (slopeMap) {
            g.setColor(LIFT_OFF);
            g.fillRect(bx, TOP + GRID_H + 8, bw, 10);
            g.setColor(Color.BLACK);
            g.drawString("lift-off", bx + bw + 4, TOP + GRID_H + 17);
            int hidden = markSites(g, r, layer);
            g.setColor(Color.BLACK);
            g.drawString("O n = site n", bx - 8, TOP + GRID_H + 34);
            g.drawString(hidden == 0 ? "(aim point)" : hidden + (layer == 1 ? " on layer maps" : " on other layers"),
                bx - 8, TOP + GRID_H + 48);
        }
        hiddenLegend(g, r, raster, layer, bx, bw);
        g.dispose();
        return img;
    }

    /**
     * Circles the best {@value #MARKED_SITES} sites whose aim facet this layer shows (map layer of the facet, see
     * {@link LatLonRaster#facetLayers}); returns how many of them are shown on other layers instead.
     */
    private static int markSites(Graphics2D g, SurveyResult r, int layer) {
        g.setStroke(new BasicStroke(1.5f));
        int n = Math.min(MARKED_SITES, r.sites.size());
        int elsewhere = 0;
        for (int k = 0; k < n; k++) {
            LandingSite s = r.sites.get(k);
            if (r.mapLayer[s.facet()] != layer) {
                elsewhere++;
                continue;
            }
            int x = LEFT + (int) Math.round((s.lonDeg() + 180) / 360 * GRID_W);
            int y = TOP + (int) Math.round((90 - s.latDeg()) / 180 * GRID_H);
            g.setColor(Color.WHITE);
            g.drawOval(x - 6, y - 6, 12, 12);
            g.setColor(Color.BLACK);
            g.drawOval(x - 7, y - 7, 14, 14);
            g.drawString(String.valueOf(s.rank()), x + 9, y + 4);
        }
        return elsewhere;
    }

    /** Legend entry for the hatching of cells with more surface below this layer (only when there are such). */
    private static void hiddenLegend(Graphics2D g, SurveyResult r, LatLonRaster raster, int layer, int bx, int bw) {
        if (raster.layers() <= layer) {
            return;
        }
        int y = TOP + GRID_H + 55;
        g.setColor(Color.WHITE);
        g.fillRect(bx, y, bw, 10);
        g.setColor(HIDDEN);
        g.drawRect(bx, y, bw, 10);
        for (int d = 0; d < bw + 10; d += HATCH) {
            g.drawLine(bx + Math.max(0, d - 10), y + Math.min(10, d), bx + Math.min(bw, d), y + Math.max(0, d - bw));
        }
        g.setColor(Color.BLACK);
        g.drawString("hidden below", bx + bw + 4, y + 9);
    }

    /**
     * The second title line: body, spin, what the layer is, and the area fraction it hides (facets on deeper layers)
     * or leaves unmapped.
     */
    static String mapSubtitle(SurveyResult r, int layer) {
        double total = 0;
        double below = 0;
        double here = 0;
        for (int f = 0; f < r.facets; f++) {
            total += r.area[f];
            below += r.mapLayer[f] > layer ? r.area[f] : 0;
            here += r.mapLayer[f] == layer ? r.area[f] : 0;
        }
        String s = subtitle(r);
        if (layer > 1) {
            s += "; layer " + layer + " from outside (" + pct(here / total) + " of area)";
        } else if (below == 0) {
            return s + "; lat/lon about the spin pole from the centre of mass";
        } else {
            s += "; outermost surface";
        }
        return s + (below > 0 ? "; " + pct(below / total) + " of area hidden below (hatched)" : "");
    }

    private static String pct(double f) {
        return String.format(Locale.ROOT, f < 0.001 && f > 0 ? "%.3f%%" : "%.1f%%", 100 * f);
    }

    /** Area-weighted slope histogram: 2.5° bins 0–90° plus one bar for &gt; 90° (lift-off). */
    private static BufferedImage histogram(SurveyResult r) {
        int bins = 36;
        double[] h = new double[bins + 1];
        double total = 0;
        for (int f = 0; f < r.facets; f++) {
            double s = r.slope[f];
            int b = s > 90 || Double.isNaN(s) ? bins : Math.min(bins - 1, (int) (s / 2.5));
            h[b] += r.area[f];
            total += r.area[f];
        }
        double ymax = 0;
        for (int b = 0; b <= bins; b++) {
            h[b] = 100 * h[b] / total;
            ymax = Math.max(ymax, h[b]);
        }
        ymax = niceCeil(ymax);
        BufferedImage img = new BufferedImage(HIST_WIDTH, HIST_HEIGHT, BufferedImage.TYPE_INT_RGB);
        Graphics2D g = graphics(img);
        int l = 70;
        int t = 50;
        int w = HIST_WIDTH - l - 40;
        int hh = HIST_HEIGHT - t - 80;
        double bw = (double) w / (bins + 1);
        for (int b = 0; b <= bins; b++) {
            int x0 = l + (int) Math.round(b * bw);
            int x1 = l + (int) Math.round((b + 1) * bw);
            int y = t + hh - (int) Math.round(h[b] / ymax * hh);
            g.setColor(b == bins ? LIFT_OFF : ramp(SEQUENTIAL, 0.25 + 0.5 * b / bins));
            g.fillRect(x0, y, Math.max(1, x1 - x0 - 1), t + hh - y);
        }
        g.setColor(Color.BLACK);
        g.drawRect(l, t, w, hh);
        FontMetrics fm = g.getFontMetrics();
        for (int d = 0; d <= 90; d += 15) {
            int x = l + (int) Math.round(d / 2.5 * bw);
            g.drawLine(x, t + hh, x, t + hh + 5);
            String s = d == 90 ? "" : String.valueOf(d); // the lift-off bar's label stands at 90
            g.drawString(s, x - fm.stringWidth(s) / 2, t + hh + 18);
        }
        String over = ">90";
        g.drawString(over, l + (int) Math.round((bins + 0.5) * bw) - fm.stringWidth(over) / 2, t + hh + 18);
        for (int k = 0; k <= 5; k++) {
            double v = ymax * k / 5;
            int y = t + hh - (int) Math.round(hh * k / 5.0);
            g.drawLine(l - 5, y, l, y);
            String s = fmt(v);
            g.drawString(s, l - 8 - fm.stringWidth(s), y + 4);
        }
        String xl = "Slope (deg), 2.5 deg bins; last bar: lift-off (> 90 deg)";
        g.drawString(xl, l + w / 2 - fm.stringWidth(xl) / 2, t + hh + 38);
        AffineTransform keep = g.getTransform();
        g.rotate(-Math.PI / 2);
        String yl = "Share of surface area (%)";
        g.drawString(yl, -(t + hh / 2) - fm.stringWidth(yl) / 2, 22);
        g.setTransform(keep);
        double th = r.parameters.maxSlopeDeg();
        int xt = l + (int) Math.round(th / 2.5 * bw);
        g.setColor(new Color(0xB0, 0x20, 0x20));
        g.setStroke(new BasicStroke(1.5f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10, new float[] {6, 4}, 0));
        g.drawLine(xt, t, xt, t + hh);
        g.drawString(String.format(Locale.ROOT, "limit %.4g deg", th), xt + 4, t + 14);
        g.setColor(Color.BLACK);
        g.setFont(g.getFont().deriveFont(Font.BOLD, 14f));
        g.drawString("Slope distribution, area-weighted", l, 20);
        g.setFont(g.getFont().deriveFont(Font.PLAIN, 11f));
        g.drawString(subtitle(r), l, 38);
        g.drawString("Caution: " + SurveyOutputs.CAUTION, 20, HIST_HEIGHT - 10);
        g.dispose();
        return img;
    }

    /** Most colour-bar ticks drawn (about six are asked for). */
    private static final int MAX_TICKS = 50;

    private static double niceCeil(double v) {
        if (!(v > 0)) {
            return 1;
        }
        double p = Math.pow(10, Math.floor(Math.log10(v)));
        for (double m : new double[] {1, 2, 2.5, 5, 10}) {
            if (m * p >= v) {
                return m * p;
            }
        }
        return 10 * p;
    }
}
