package dev.cairn.tables;

import dev.cairn.io.InputException;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Spherical shells of nodes about a centre: radii {@code r_i} (ascending), latitudes
 * {@code φ_j = −90° + j·Δφ} from pole to pole and longitudes {@code λ_k = k·Δλ} over one full turn; node
 * {@code (i, j, k)} is row {@code (i·nlat + j)·nlon + k}, shape {@code (nr, nlat, nlon)}. Cartesian node position
 * {@code c + r (cos φ cos λ, cos φ sin λ, sin φ)}, metres, model frame (latitude and longitude are measured in the
 * model frame about the centre, not planetographic). Each pole row holds {@code nlon} copies of the same point.
 *
 * @param centre     {@code (cx, cy, cz)}, m
 * @param radii      radii, m, strictly ascending, positive
 * @param latStepDeg latitude spacing, degrees, dividing 180
 * @param lonStepDeg longitude spacing, degrees, dividing 360
 */
public record SphereGrid(double[] centre, double[] radii, double latStepDeg, double lonStepDeg) implements Grid {
    public SphereGrid {
        centre = centre.clone();
        radii = radii.clone();
        if (radii.length == 0) {
            throw new InputException("--radii: no radius given");
        }
        for (int i = 0; i < radii.length; i++) {
            if (!(radii[i] > 0) || !Double.isFinite(radii[i])) {
                throw new InputException("--radii: radius must be positive, got " + radii[i] + " m");
            }
            if (i > 0 && !(radii[i] > radii[i - 1])) {
                throw new InputException("--radii: radii must be strictly ascending, got " + radii[i - 1] + " then "
                    + radii[i]);
            }
        }
        steps(latStepDeg, 180, "--lat-step");
        steps(lonStepDeg, 360, "--lon-step");
        long n = (long) radii.length * (steps(latStepDeg, 180, "--lat-step") + 1) * steps(lonStepDeg, 360, "--lon-step");
        if (n > Integer.MAX_VALUE) {
            throw new InputException("sphere grid: " + n + " nodes is more than one table can hold");
        }
    }

    private static int steps(double step, double span, String what) {
        if (!(step > 0) || !Double.isFinite(step)) {
            throw new InputException(what + ": must be a positive number of degrees, got " + step);
        }
        double s = span / step;
        double whole = Math.rint(s);
        if (whole < 2 || Math.abs(s - whole) > BoxGrid.WHOLE_STEPS_SLACK * whole) {
            throw new InputException(what + ": " + step + " degrees must divide " + (int) span
                + " into at least 2 whole steps");
        }
        return (int) whole;
    }

    /**
     * Parses radii given as {@code r1,r2,...} or {@code from:to:step} (metres; the range includes {@code to} when it is
     * a whole number of steps from {@code from}).
     */
    public static double[] parseRadii(String text) {
        String t = text.trim();
        try {
            if (t.contains(":")) {
                String[] p = t.split(":", -1);
                if (p.length != 3) {
                    throw new InputException("--radii: expected from:to:step, got '" + text + "'");
                }
                double from = Double.parseDouble(p[0].trim());
                double to = Double.parseDouble(p[1].trim());
                double step = Double.parseDouble(p[2].trim());
                if (!(step > 0) || !Double.isFinite(step)) {
                    throw new InputException("--radii: step must be positive, got " + step);
                }
                if (!(from <= to)) {
                    throw new InputException("--radii: from " + from + " must not exceed to " + to);
                }
                double s = (to - from) / step;
                long n = (long) Math.floor(s + BoxGrid.WHOLE_STEPS_SLACK * Math.max(1, s)) + 1;
                if (n > 1_000_000) {
                    throw new InputException("--radii: " + n + " radii is too many");
                }
                List<Double> r = new ArrayList<>();
                for (long i = 0; i < n; i++) {
                    r.add(from + i * step);
                }
                return r.stream().mapToDouble(Double::doubleValue).toArray();
            }
            String[] p = t.split(",", -1);
            double[] r = new double[p.length];
            for (int i = 0; i < p.length; i++) {
                r[i] = Double.parseDouble(p[i].trim());
            }
            return r;
        } catch (NumberFormatException e) {
            throw new InputException("--radii: '" + text + "' is not a list r1,r2,... or a range from:to:step (metres)");
        }
    }

    /** Number of latitudes, poles included. */
    public int latCount() {
        return steps(latStepDeg, 180, "--lat-step") + 1;
    }

    /** Number of longitudes over one turn (360° not repeated). */
    public int lonCount() {
        return steps(lonStepDeg, 360, "--lon-step");
    }

    /** Latitude of row {@code j}, radians. */
    public double latitude(int j) {
        return Math.toRadians(-90 + j * latStepDeg);
    }

    /** Longitude of column {@code k}, radians. */
    public double longitude(int k) {
        return Math.toRadians(k * lonStepDeg);
    }

    @Override
    public int nodeCount() {
        return radii.length * latCount() * lonCount();
    }

    @Override
    public int[] shape() {
        return new int[] {radii.length, latCount(), lonCount()};
    }

    @Override
    public void node(int n, double[] out, int off) {
        int nlon = lonCount();
        int nlat = latCount();
        int k = n % nlon;
        int ij = n / nlon;
        int j = ij % nlat;
        int i = ij / nlat;
        double lat = latitude(j);
        double lon = longitude(k);
        double r = radii[i];
        double cl = Math.cos(lat);
        out[off] = centre[0] + r * cl * Math.cos(lon);
        out[off + 1] = centre[1] + r * cl * Math.sin(lon);
        out[off + 2] = centre[2] + r * Math.sin(lat);
    }

    @Override
    public String kind() {
        return "sphere";
    }

    @Override
    public Map<String, Object> toJson() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("kind", kind());
        m.put("centre_m", List.of(centre[0], centre[1], centre[2]));
        List<Double> r = new ArrayList<>();
        for (double v : radii) {
            r.add(v);
        }
        m.put("radii_m", r);
        m.put("lat_step_deg", latStepDeg);
        m.put("lon_step_deg", lonStepDeg);
        m.put("nodes", List.of(radii.length, latCount(), lonCount()));
        m.put("node_formula", "lat = -90 + j*lat_step, lon = k*lon_step (deg, model frame about centre); "
            + "x = centre + r*(cos lat cos lon, cos lat sin lon, sin lat); node (i,j,k) is row (i*nlat + j)*nlon + k");
        return m;
    }

    @Override
    public double[] centre() {
        return centre.clone();
    }

    @Override
    public double[] radii() {
        return radii.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof SphereGrid g && java.util.Arrays.equals(centre, g.centre)
            && java.util.Arrays.equals(radii, g.radii) && latStepDeg == g.latStepDeg && lonStepDeg == g.lonStepDeg;
    }

    @Override
    public int hashCode() {
        return java.util.Arrays.hashCode(radii);
    }
}
