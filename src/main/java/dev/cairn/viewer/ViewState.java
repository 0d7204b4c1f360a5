package dev.cairn.viewer;

/**
 * Where the camera is: it orbits a target (the centre of mass, the origin of the viewer's scene coordinates) at a
 * distance, with an orientation and a pan offset. Plain Java, so that projections can be checked without a display.
 *
 * <p>Scene coordinates are the model frame shifted so that the centre of mass is at the origin, metres. The camera
 * frame follows JavaFX: local x to the right of the screen, local y down the screen, local z into the screen (the
 * viewing direction). {@link #orientation()} holds those three unit axes in scene coordinates as the columns of a
 * row-major 3×3 matrix. Projection is the pinhole model of a JavaFX {@code PerspectiveCamera} with a vertical field
 * of view of {@link #FOV_DEG}: screen x = W/2 + f·x_c/z_c, y = H/2 + f·y_c/z_c with f = (H/2)/tan(fov/2).
 */
public final class ViewState {
    /** Vertical field of view, degrees (the JavaFX default). */
    public static final double FOV_DEG = 30;
    /** The fitted view leaves this fraction of the half-height (or half-width) as margin around the body. */
    public static final double FIT_MARGIN = 1.15;

    private final double[] r = new double[9];
    private double distance;
    private double panX;
    private double panY;

    /** A view from {@code preset} at {@code distance} metres. */
    public ViewState(ViewPreset preset, double distance) {
        look(preset.from(), preset.up());
        this.distance = distance;
    }

    /** A copy of {@code other}. */
    public ViewState(ViewState other) {
        System.arraycopy(other.r, 0, r, 0, 9);
        distance = other.distance;
        panX = other.panX;
        panY = other.panY;
    }

    /**
     * Points the camera at the target from direction {@code from} (unit, scene frame) with {@code up} as screen up.
     * Resets the pan.
     */
    public void look(double[] from, double[] up) {
        double[] fwd = normalised(new double[] {-from[0], -from[1], -from[2]});
        double d = dot(up, fwd);
        double[] upOrth = {up[0] - d * fwd[0], up[1] - d * fwd[1], up[2] - d * fwd[2]};
        if (norm(upOrth) < 1e-9) { // up along the view: pick any perpendicular
            upOrth = Math.abs(fwd[0]) < 0.9 ? cross(fwd, new double[] {1, 0, 0}) : cross(fwd, new double[] {0, 1, 0});
        }
        double[] down = normalised(new double[] {-upOrth[0], -upOrth[1], -upOrth[2]});
        double[] right = cross(down, fwd);
        setColumns(right, down, fwd);
        panX = 0;
        panY = 0;
    }

    private void setColumns(double[] x, double[] y, double[] z) {
        for (int i = 0; i < 3; i++) {
            r[3 * i] = x[i];
            r[3 * i + 1] = y[i];
            r[3 * i + 2] = z[i];
        }
    }

    /** Row-major 3×3 matrix whose columns are the camera's right, down and forward axes (a copy). */
    public double[] orientation() {
        return r.clone();
    }

    /** Camera distance from the orbit centre, metres (before pan). */
    public double distance() {
        return distance;
    }

    public void setDistance(double d) {
        distance = d;
    }

    /** Multiplies the distance by {@code factor} (zoom). */
    public void zoom(double factor) {
        distance *= factor;
    }

    /** Shifts the view by (dx, dy) metres along the screen's right and down axes. */
    public void pan(double dx, double dy) {
        panX += dx;
        panY += dy;
    }

    /**
     * Orbits about the target: {@code yawRad} turns the camera about the screen's vertical axis, {@code pitchRad}
     * about the screen's horizontal axis (a trackball without roll).
     */
    public void orbit(double yawRad, double pitchRad) {
        rotateAbout(column(1), yawRad);
        rotateAbout(column(0), pitchRad);
        reorthonormalise();
    }

    private double[] column(int c) {
        return new double[] {r[c], r[3 + c], r[6 + c]};
    }

    /** Rotates all three camera axes about the unit scene-frame axis {@code a} by {@code angle} (Rodrigues). */
    private void rotateAbout(double[] a, double angle) {
        double c = Math.cos(angle);
        double s = Math.sin(angle);
        double[] out = new double[9];
        for (int col = 0; col < 3; col++) {
            double[] v = column(col);
            double[] axv = cross(a, v);
            double ad = dot(a, v) * (1 - c);
            for (int i = 0; i < 3; i++) {
                out[3 * i + col] = v[i] * c + axv[i] * s + a[i] * ad;
            }
        }
        System.arraycopy(out, 0, r, 0, 9);
    }

    private void reorthonormalise() {
        double[] z = normalised(column(2));
        double[] y = column(1);
        double d = dot(y, z);
        y = normalised(new double[] {y[0] - d * z[0], y[1] - d * z[1], y[2] - d * z[2]});
        setColumns(cross(y, z), y, z);
    }

    /** Camera position, scene frame, metres. */
    public double[] eye() {
        double[] e = new double[3];
        for (int i = 0; i < 3; i++) {
            e[i] = panX * r[3 * i] + panY * r[3 * i + 1] - distance * r[3 * i + 2];
        }
        return e;
    }

    /**
     * Projects a scene-frame point to pixel coordinates of a {@code width × height} viewport.
     *
     * @return {@code [x, y, depth]} with depth the camera-frame z (negative: behind the camera)
     */
    public double[] project(double[] p, double width, double height) {
        double[] e = eye();
        double dx = p[0] - e[0];
        double dy = p[1] - e[1];
        double dz = p[2] - e[2];
        double xc = r[0] * dx + r[3] * dy + r[6] * dz;
        double yc = r[1] * dx + r[4] * dy + r[7] * dz;
        double zc = r[2] * dx + r[5] * dy + r[8] * dz;
        double f = focalPixels(height);
        return new double[] {width / 2 + f * xc / zc, height / 2 + f * yc / zc, zc};
    }

    /** Focal length in pixels for a viewport of this height: (H/2)/tan(fov/2). */
    public static double focalPixels(double height) {
        return height / 2 / Math.tan(Math.toRadians(FOV_DEG / 2));
    }

    /**
     * Distance at which a sphere of {@code radius} about the target fits the viewport with {@link #FIT_MARGIN}:
     * the sphere's silhouette half-angle asin(R/d) equals the smaller half field of view divided by the margin.
     */
    public static double fitDistance(double radius, double width, double height) {
        double tanV = Math.tan(Math.toRadians(FOV_DEG / 2));
        double tanHalf = Math.min(tanV, tanV * width / height);
        double half = Math.atan(tanHalf) / FIT_MARGIN;
        return radius / Math.sin(half);
    }

    static double dot(double[] a, double[] b) {
        return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
    }

    static double norm(double[] a) {
        return Math.sqrt(dot(a, a));
    }

    static double[] cross(double[] a, double[] b) {
        return new double[] {a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]};
    }

    static double[] normalised(double[] a) {
        double n = norm(a);
        return new double[] {a[0] / n, a[1] / n, a[2] / n};
    }
}
