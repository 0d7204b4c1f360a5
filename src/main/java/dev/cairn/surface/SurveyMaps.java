package dev.cairn.surface;

import dev.cairn.io.AtomicFiles;
import dev.cairn.rotation.RotatingFrame;
import dev.cairn.util.ColourRamp;
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
 * Colours come from {@link ColourScale} (ramps of {@link ColourRamp}), the same scale the 3D viewer and renderer
 * use, so a facet has the same colour on a map and in a 3D view; lift-off is {@link ColourRamp#LIFT_OFF} on both.
 * The map grid is {@link #GRID_W} × {@link #GRID_H} cells by default, or any even width from {@link #MIN_GRID_W} to
 * {@link #MAX_GRID_W} cells (option {@code survey --map-size}); one cell is one pixel.
 */
public final class SurveyMaps {
    public static final String SLOPE = "map-slope.png";
    public static final String G_EFF = "map-g-eff.png";
    public static final String DYNAMIC_HEIGHT = "map-dynamic-height.png";
    public static final String HISTOGRAM = "hist-slope.png";

    /** Default map grid cells (0.5° per cell). */
    public static final int GRID_W = 720;
    public static final int GRID_H = 360;
    /** Least and largest map grid widths (cells across 360° of longitude; the height is half). */
    public static final int MIN_GRID_W = 360;
    public static final int MAX_GRID_W = 4320;
    /** Left and top margins: the grid cell (i, j) is the image pixel (LEFT + i, TOP + j). */
    public static final int LEFT = 70;
    public static final int TOP = 44;
    private static final int RIGHT = 130;
    private static final int BOTTOM = 84;
    /** Size of a map image at the default grid, pixels. */
    public static final int MAP_WIDTH = LEFT + GRID_W + RIGHT;
    public static final int MAP_HEIGHT = TOP + GRID_H + BOTTOM;
    /** Size of the histogram image, pixels. */
    public static final int HIST_WIDTH = 900;
    public static final int HIST_HEIGHT = 500;

    private static final Color LIFT_OFF = new Color(ColourRamp.LIFT_OFF);
    /** Hatching of cells whose ray crosses the surface again below the layer shown. */
    private static final Color HIDDEN = new Color(0x10, 0x10, 0x10);
    private static final int HATCH = 6;
    /** Sites circled on the slope maps. */
    static final int MARKED_SITES = 10;

    private SurveyMaps() {
    }

    /**
     * Writes the maps and the histogram into {@code dir}; returns their paths. When rays from the centre of mass cross
     * the surface more than once, each map is also written for the inner layers ({@link #layerFile}), so that the
     * layers together show every facet (up to {@link LatLonRaster#MAX_LAYERS} layers).
     */
    public static List<Path> writeAll(SurveyResult r, Path dir) {
        return writeAll(r, dir, GRID_W);
    }

    /** As {@link #writeAll(SurveyResult, Path)} on a grid {@code gridWidth} cells wide (half as high). */
    public static List<Path> writeAll(SurveyResult r, Path dir, int gridWidth) {
        requireGridWidth(gridWidth);
        RotatingFrame frame = new RotatingFrame(r.target.spin(), r.target.centreOfMass());
        LatLonRaster raster = LatLonRaster.build(r.target.mesh(), frame, gridWidth, gridWidth / 2,
            r.parameters.threads());
        List<Path> out = new ArrayList<>();
        ColourScale slope = scale(r, ColourScale.SLOPE);
        ColourScale ge = scale(r, "g_eff_m_s2");
        ColourScale h = scale(r, "dynamic_height_m");
        for (int layer = 1; layer <= raster.layers(); layer++) {
            String tl = layer == 1 ? "" : ", layer " + layer;
            out.add(write(dir.resolve(layerFile(SLOPE, layer)), map(r, raster, layer, r.slope, slope,
                "Slope" + tl, "deg", true)));
            out.add(write(dir.resolve(layerFile(G_EFF, layer)), map(r, raster, layer, r.gEff, ge,
                "Effective gravity |g + centrifugal|" + tl, "m/s^2", false)));
            out.add(write(dir.resolve(layerFile(DYNAMIC_HEIGHT, layer)), map(r, raster, layer, r.dynamicHeight, h,
                "Dynamic height (0 = mean level)" + tl, "m", false)));
        }
        out.add(write(dir.resolve(HISTOGRAM), histogram(r)));
        return out;
    }

    /** Refuses a grid width outside [{@link #MIN_GRID_W}, {@link #MAX_GRID_W}] or odd (one-line message). */
    public static void requireGridWidth(int w) {
        if (w < MIN_GRID_W || w > MAX_GRID_W || w % 2 != 0) {
            throw new dev.cairn.io.InputException("--map-size: " + w + " is not an even map width from " + MIN_GRID_W
                + " to " + MAX_GRID_W + " pixels");
        }
    }

    /** Image width of a map on a grid {@code gridWidth} cells wide, pixels. */
    public static int mapWidth(int gridWidth) {
        return LEFT + gridWidth + RIGHT;
    }

    /** Image height of a map on a grid {@code gridWidth} cells wide, pixels. */
    public static int mapHeight(int gridWidth) {
        return TOP + gridWidth / 2 + BOTTOM;
    }

    /**
     * The colour scale of a per-facet column of the result, with default range (no user limits): the scale the
     * maps use, and that the 3D views build from {@code facets.csv} for the same column.
     */
    public static ColourScale scale(SurveyResult r, String column) {
        double[] v;
        switch (column) {
            case ColourScale.SLOPE: v = r.slope; break;
            case "g_eff_m_s2": v = r.gEff; break;
            case "dynamic_height_m": v = r.dynamicHeight; break;
            default: throw new IllegalArgumentException("no map of column " + column);
        }
        return ColourScale.of(column, v, null, null);
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
        return ColourScale.format(v);
    }

    private static String subtitle(SurveyResult r) {
        double p = r.target.spin().periodSeconds();
        String spin = Double.isInfinite(p) ? "no spin" : String.format(Locale.ROOT, "spin period %.4g h", p / 3600);
        return r.target.name() + ", " + r.facets + " facets, " + spin;
    }

    private static BufferedImage map(SurveyResult r, LatLonRaster raster, int layer, double[] v, ColourScale scale,
                                     String title, String unit, boolean slopeMap) {
        final int gridW = raster.width();
        final int gridH = raster.height();
        final int mapH = mapHeight(gridW);
        BufferedImage img = new BufferedImage(mapWidth(gridW), mapH, BufferedImage.TYPE_INT_RGB);
        Graphics2D g = graphics(img);
        double lo = scale.min();
        double hi = scale.max();
        double span = hi - lo;
        for (int j = 0; j < gridH; j++) {
            for (int i = 0; i < gridW; i++) {
                int f = raster.facet(i, j, layer);
                int c;
                if (raster.crossings(i, j) > layer && (i + j) % HATCH == 0) {
                    c = HIDDEN.getRGB(); // more surface lies below this layer here
                } else if (f < 0) {
                    c = ColourRamp.NO_DATA;
                } else {
                    c = scale.argb(v[f], r.liftOff[f]);
                }
                img.setRGB(LEFT + i, TOP + j, c);
            }
        }
        g.setColor(Color.BLACK);
        g.drawRect(LEFT - 1, TOP - 1, gridW + 1, gridH + 1); // frame outside the grid: every cell stays visible
        FontMetrics fm = g.getFontMetrics();
        for (int lon = -180; lon <= 180; lon += 30) {
            int x = LEFT + (int) Math.round((lon + 180) / 360.0 * gridW);
            g.drawLine(x, TOP + gridH, x, TOP + gridH + 5);
            String s = String.valueOf(lon);
            g.drawString(s, x - fm.stringWidth(s) / 2, TOP + gridH + 18);
        }
        for (int lat = -90; lat <= 90; lat += 30) {
            int y = TOP + (int) Math.round((90 - lat) / 180.0 * gridH);
            g.drawLine(LEFT - 6, y, LEFT - 2, y); // outside the grid and its frame
            String s = String.valueOf(lat);
            g.drawString(s, LEFT - 8 - fm.stringWidth(s), y + 4);
        }
        String xl = "East longitude (deg)";
        g.drawString(xl, LEFT + gridW / 2 - fm.stringWidth(xl) / 2, TOP + gridH + 36);
        AffineTransform keep = g.getTransform();
        g.rotate(-Math.PI / 2);
        String yl = "Latitude (deg)";
        g.drawString(yl, -(TOP + gridH / 2) - fm.stringWidth(yl) / 2, 22);
        g.setTransform(keep);
        Font bold = g.getFont().deriveFont(Font.BOLD, 14f);
        g.setFont(bold);
        g.drawString(title + " (" + unit + ")", LEFT, 18);
        g.setFont(g.getFont().deriveFont(Font.PLAIN, 11f));
        fitted(g, mapSubtitle(r, layer), LEFT, 36, mapWidth(gridW) - LEFT - 4);
        fitted(g, "Caution: " + SurveyOutputs.CAUTION, 10, mapH - 10, mapWidth(gridW) - 20);
        // Colour bar.
        int bx = LEFT + gridW + 30;
        int bw = 18;
        for (int y = 0; y < gridH; y++) {
            g.setColor(new Color(scale.ramp().argb(1 - (double) y / (gridH - 1))));
            g.fillRect(bx, TOP + y, bw, 1);
        }
        g.setColor(Color.BLACK);
        g.drawRect(bx, TOP, bw, gridH);
        g.setFont(g.getFont().deriveFont(Font.PLAIN, 11f));
        fm = g.getFontMetrics();
        // the same ticks and tick format as the viewer's legend (ColourScale)
        for (double tick : ColourScale.ticks(lo, hi)) {
            int y = TOP + gridH - (int) Math.round(gridH * (tick - lo) / span);
            g.drawLine(bx + bw, y, bx + bw + 4, y);
            g.drawString(fmt(tick), bx + bw + 6, y + 4);
        }
        g.drawString(unit, bx, TOP - 6);
        if (slopeMap) {
            g.setColor(LIFT_OFF);
            g.fillRect(bx, TOP + gridH + 8, bw, 10);
            g.setColor(Color.BLACK);
            g.drawString("lift-off (> 90)", bx + bw + 4, TOP + gridH + 17);
            int hidden = markSites(g, r, layer, gridW, gridH);
            g.setColor(Color.BLACK);
            g.drawString("O n = site n", bx - 8, TOP + gridH + 34);
            g.drawString(hidden == 0 ? "(aim point)" : hidden + (layer == 1 ? " on layer maps" : " on other layers"),
                bx - 8, TOP + gridH + 48);
        }
        hiddenLegend(g, r, raster, layer, bx, bw);
        g.dispose();
        return img;
    }

    /**
     * Circles the best {@value #MARKED_SITES} sites whose aim facet this layer shows (map layer of the facet, see
     * {@link LatLonRaster#facetLayers}); returns how many of them are shown on other layers instead.
     */
    private static int markSites(Graphics2D g, SurveyResult r, int layer, int gridW, int gridH) {
        g.setStroke(new BasicStroke(1.5f));
        int n = Math.min(MARKED_SITES, r.sites.size());
        int elsewhere = 0;
        FontMetrics fm = g.getFontMetrics();
        List<LabelPlacer.Label> labels = new ArrayList<>();
        List<LandingSite> shown = new ArrayList<>();
        for (int k = 0; k < n; k++) {
            LandingSite s = r.sites.get(k);
            if (r.mapLayer[s.facet()] != layer) {
                elsewhere++;
                continue;
            }
            // the circle stands at the aim point (grid coordinates relative to the grid's top-left corner)
            double x = (s.lonDeg() + 180) / 360 * gridW;
            double y = (90 - s.latDeg()) / 180 * gridH;
            labels.add(new LabelPlacer.Label(x, y, fm.stringWidth(String.valueOf(s.rank())) + 2, fm.getAscent()));
            shown.add(s);
        }
        LabelPlacer.Placement[] at = LabelPlacer.place(labels, gridW, gridH, SITE_MARK_RADIUS + 1,
            SITE_MARK_RADIUS + 1);
        for (int k = 0; k < shown.size(); k++) {
            int x = LEFT + (int) Math.round(labels.get(k).x());
            int y = TOP + (int) Math.round(labels.get(k).y());
            g.setColor(Color.WHITE);
            g.drawOval(x - 6, y - 6, 12, 12);
            g.setColor(Color.BLACK);
            g.drawOval(x - 7, y - 7, 14, 14);
            LabelPlacer.Placement p = at[k];
            if (!p.placed()) {
                continue; // no room: the circle alone
            }
            int lx = LEFT + (int) Math.round(p.x());
            int ly = TOP + (int) Math.round(p.y());
            if (p.ring() > 1) {
                g.drawLine(x, y, (int) Math.round(LEFT + p.x() + p.width() / 2), (int) Math.round(TOP + p.y()
                    + p.height() / 2));
            }
            haloText(g, String.valueOf(shown.get(k).rank()), lx + 1, ly + fm.getAscent());
        }
        return elsewhere;
    }

    /** Radius of the site circles on the slope maps, pixels. */
    private static final int SITE_MARK_RADIUS = 7;

    /** Draws a line of text, in a smaller font (down to 8 pt) when it would not fit in {@code width} pixels. */
    private static void fitted(Graphics2D g, String s, int x, int y, int width) {
        Font keep = g.getFont();
        float size = keep.getSize2D();
        while (size > 8 && g.getFontMetrics(keep.deriveFont(size)).stringWidth(s) > width) {
            size -= 0.5f;
        }
        g.setFont(keep.deriveFont(size));
        g.drawString(s, x, y);
        g.setFont(keep);
    }

    /** Black text with a white halo, legible on any map colour. */
    private static void haloText(Graphics2D g, String s, int x, int y) {
        g.setColor(Color.WHITE);
        for (int dx = -1; dx <= 1; dx++) {
            for (int dy = -1; dy <= 1; dy++) {
                if (dx != 0 || dy != 0) {
                    g.drawString(s, x + dx, y + dy);
                }
            }
        }
        g.setColor(Color.BLACK);
        g.drawString(s, x, y);
    }

    /** Legend entry for the hatching of cells with more surface below this layer (only when there are such). */
    private static void hiddenLegend(Graphics2D g, SurveyResult r, LatLonRaster raster, int layer, int bx, int bw) {
        int gridH = raster.height();
        if (raster.layers() <= layer) {
            return;
        }
        int y = TOP + gridH + 55;
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
        ColourScale slope = scale(r, ColourScale.SLOPE);
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
            // each bar in the slope map's colour of its bin centre; the lift-off bar in the lift-off colour
            g.setColor(new Color(b == bins ? ColourRamp.LIFT_OFF : slope.rampArgb((b + 0.5) * 2.5)));
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
