package dev.cairn.tables;

import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.Location;
import dev.cairn.mascon.SurfaceQuery;
import java.util.ArrayList;
import java.util.List;

/**
 * What a table holds per node and how one row is computed: the grid, the column list and the options
 * (gradient tensor, effective quantities of the rotating body, interior nodes left as NaN).
 *
 * <p>Columns, in this order (units in the names; conventions U &gt; 0, g = ∇U, model frame):
 * <ol start="0">
 * <li>{@code x_m, y_m, z_m}: node position;</li>
 * <li>{@code potential_m2_s2}, {@code ax_m_s2, ay_m_s2, az_m_s2}: gravitational potential and acceleration;</li>
 * <li>{@code location}: 1 inside the body, 0 outside, 0.5 on the surface ({@link Location#code()});</li>
 * <li>with the gradient: {@code gxx_s2, gxy_s2, gxz_s2, gyy_s2, gyz_s2, gzz_s2} (∂²U/∂x_i∂x_j);</li>
 * <li>with effective quantities: {@code eff_potential_m2_s2} {@code V = U + ½ω²|ω̂×(r−r_c)|²} and
 * {@code eff_ax_m_s2, eff_ay_m_s2, eff_az_m_s2} {@code a = g + ω² r⊥}, {@code r⊥} the part of
 * {@code r − r_c} perpendicular to the spin axis through the centre of mass {@code r_c} (the body-fixed frame
 * rotates uniformly; Coriolis terms depend on velocity and are not tabulated).</li>
 * <li>with a surface: {@code distance_to_surface_m}, the exact signed distance from the node to the body's surface
 * (negative inside; {@link SurfaceQuery#signedDistance}).</li>
 * </ol>
 * With {@code excludeInterior} every value column except the position and the location of an interior node is NaN.
 *
 * @param grid            the nodes
 * @param gradient        whether the 6 gradient-tensor columns are present
 * @param effective       whether the 4 effective-quantity columns are present
 * @param excludeInterior whether interior nodes hold NaN instead of the (valid) interior field
 * @param omega           spin rate ω, rad/s (0 when not spinning)
 * @param spinAxis        unit spin axis, model frame
 * @param centreOfMass    centre of mass r_c, m, model frame
 * @param surface         the body's surface for the distance column, or null for none
 */
public record TableLayout(Grid grid, boolean gradient, boolean effective, boolean excludeInterior, double omega,
                          double[] spinAxis, double[] centreOfMass, SurfaceQuery surface) {
    /** Column index of x. */
    public static final int X = 0;
    public static final int U = 3;
    public static final int AX = 4;
    public static final int LOCATION = 7;
    /** Number of always-present columns. */
    public static final int BASE_COLUMNS = 8;

    /** Name of the distance column. */
    public static final String DISTANCE = "distance_to_surface_m";

    public TableLayout {
        spinAxis = spinAxis.clone();
        centreOfMass = centreOfMass.clone();
    }

    /** A layout without the distance column. */
    public TableLayout(Grid grid, boolean gradient, boolean effective, boolean excludeInterior, double omega,
                       double[] spinAxis, double[] centreOfMass) {
        this(grid, gradient, effective, excludeInterior, omega, spinAxis, centreOfMass, null);
    }

    /** Whether the distance column is present. */
    public boolean distance() {
        return surface != null;
    }

    /** Column names in order. */
    public List<String> columns() {
        List<String> c = new ArrayList<>(List.of("x_m", "y_m", "z_m", "potential_m2_s2", "ax_m_s2", "ay_m_s2",
            "az_m_s2", "location"));
        if (gradient) {
            c.addAll(List.of("gxx_s2", "gxy_s2", "gxz_s2", "gyy_s2", "gyz_s2", "gzz_s2"));
        }
        if (effective) {
            c.addAll(List.of("eff_potential_m2_s2", "eff_ax_m_s2", "eff_ay_m_s2", "eff_az_m_s2"));
        }
        if (surface != null) {
            c.add(DISTANCE);
        }
        return c;
    }

    /** Number of columns. */
    public int columnCount() {
        return BASE_COLUMNS + (gradient ? 6 : 0) + (effective ? 4 : 0) + (surface != null ? 1 : 0);
    }

    /** First gradient column, or -1. */
    public int gradientColumn() {
        return gradient ? BASE_COLUMNS : -1;
    }

    /** First effective column, or -1. */
    public int effectiveColumn() {
        return effective ? BASE_COLUMNS + (gradient ? 6 : 0) : -1;
    }

    /** Shape of the data array: grid shape plus the column axis. */
    public long[] dataShape() {
        int[] s = grid.shape();
        long[] d = new long[s.length + 1];
        for (int i = 0; i < s.length; i++) {
            d[i] = s[i];
        }
        d[s.length] = columnCount();
        return d;
    }

    /**
     * Computes the row of node {@code node}.
     *
     * @param ev     evaluator of the exact field (this thread's)
     * @param sample scratch of {@link FieldSample#SIZE} values (modified)
     * @param row    receives {@link #columnCount()} values from {@code off} (modified)
     */
    public void computeRow(FieldEvaluator ev, int node, double[] sample, double[] row, int off) {
        grid.node(node, row, off);
        double x = row[off];
        double y = row[off + 1];
        double z = row[off + 2];
        ev.evaluate(x, y, z, gradient, sample, 0);
        double loc = sample[FieldSample.LOCATION];
        boolean blank = excludeInterior && loc == Location.INSIDE.code(); // exact code comparison: codes are exact
        row[off + U] = blank ? Double.NaN : sample[FieldSample.U];
        row[off + AX] = blank ? Double.NaN : sample[FieldSample.AX];
        row[off + AX + 1] = blank ? Double.NaN : sample[FieldSample.AY];
        row[off + AX + 2] = blank ? Double.NaN : sample[FieldSample.AZ];
        row[off + LOCATION] = loc;
        int c = off + BASE_COLUMNS;
        if (gradient) {
            for (int k = FieldSample.GXX; k <= FieldSample.GZZ; k++) {
                row[c++] = blank ? Double.NaN : sample[k];
            }
        }
        if (effective) {
            double rx = x - centreOfMass[0];
            double ry = y - centreOfMass[1];
            double rz = z - centreOfMass[2];
            double along = rx * spinAxis[0] + ry * spinAxis[1] + rz * spinAxis[2];
            double px = rx - along * spinAxis[0];
            double py = ry - along * spinAxis[1];
            double pz = rz - along * spinAxis[2];
            double w2 = omega * omega;
            row[c] = blank ? Double.NaN : sample[FieldSample.U] + 0.5 * w2 * (px * px + py * py + pz * pz);
            row[c + 1] = blank ? Double.NaN : sample[FieldSample.AX] + w2 * px;
            row[c + 2] = blank ? Double.NaN : sample[FieldSample.AY] + w2 * py;
            row[c + 3] = blank ? Double.NaN : sample[FieldSample.AZ] + w2 * pz;
            c += 4;
        }
        if (surface != null) {
            // Geometry, not field: kept for interior nodes too. The sample scratch is free again here.
            row[c] = surface.signedDistance(x, y, z, sample);
        }
    }
}
