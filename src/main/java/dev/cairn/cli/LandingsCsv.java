package dev.cairn.cli;

import dev.cairn.io.AtomicFiles;
import dev.cairn.io.InputException;
import dev.cairn.io.Messages;
import dev.cairn.motion.Deployment;
import dev.cairn.motion.DeploymentSettings;
import dev.cairn.motion.Landing;
import java.io.BufferedReader;
import java.io.IOException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * {@code landings.csv} of {@code cairn deploy}: one row per sample, body frame, SI units, angles in degrees, "NaN"
 * where a value does not apply. Numbers are written with {@link Double#toString}, which round-trips (the shortest
 * decimal that reads back to the same double, Java SE 17 API of {@code Double.toString}), so a file read back with
 * {@link #read} and written again is byte-identical: the merge of deployment shards relies on it.
 */
public final class LandingsCsv {
    /** The header line (without newline). */
    public static final String HEADER = "sample,outcome,x_m,y_m,z_m,facet,lat_deg,lon_deg,time_s,bounces,"
        + "first_impact_speed_m_s,first_incidence_deg,slope_deg,start_x_m,start_y_m,start_z_m,start_vx_m_s,"
        + "start_vy_m_s,start_vz_m_s,max_jacobi_drift_rel,steps,field_evaluations";
    private static final int COLUMNS = 22;
    /** Longest line accepted when reading, characters. */
    private static final int MAX_LINE = 4096;

    private LandingsCsv() {
    }

    /** Writes the landings atomically. */
    public static void write(Path file, List<Landing> ls) {
        AtomicFiles.write(file, o -> {
            StringBuilder sb = new StringBuilder(1 << 16);
            sb.append(HEADER).append('\n');
            for (Landing l : ls) {
                double[] p = l.position();
                double[] s = l.start();
                sb.append(l.sample()).append(',').append(l.outcome().key());
                for (double x : new double[] {p[0], p[1], p[2]}) {
                    sb.append(',').append(x);
                }
                sb.append(',').append(l.facet());
                for (double x : new double[] {l.latDeg(), l.lonDeg(), l.time()}) {
                    sb.append(',').append(x);
                }
                sb.append(',').append(l.bounces());
                for (double x : new double[] {l.firstImpactSpeed(), l.firstIncidenceDeg(), l.slopeDeg(), s[0], s[1],
                    s[2], s[3], s[4], s[5], l.maxJacobiDrift()}) {
                    sb.append(',').append(x);
                }
                sb.append(',').append(l.steps()).append(',').append(l.fieldEvaluations()).append('\n');
                if (sb.length() > 1 << 20) {
                    o.write(sb.toString().getBytes(StandardCharsets.UTF_8));
                    sb.setLength(0);
                }
            }
            o.write(sb.toString().getBytes(StandardCharsets.UTF_8));
        });
    }

    /**
     * Reads the landings of samples {@code first..end-1} (in this order, one row each) strictly: the exact header,
     * 22 fields per row, every number in the form {@link #write} gives it (so it reads back bit for bit), values in
     * their ranges (facet below {@code facets}, latitude within ±90°, longitude within ±180°, angles within
     * [0°, 180°], times, counts and speeds not negative), and each row's release state equal to that of its sample
     * index under {@code settings} ({@link Deployment#releaseState}): a shard of another run is refused.
     */
    public static List<Landing> read(Path file, int first, int end, DeploymentSettings settings, int facets) {
        List<Landing> out = new ArrayList<>(end - first);
        var dec = StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPORT)
            .onUnmappableCharacter(CodingErrorAction.REPORT);
        try (BufferedReader r = new BufferedReader(new java.io.InputStreamReader(Files.newInputStream(file), dec))) {
            String head = r.readLine();
            if (!HEADER.equals(head)) {
                throw new InputException(Messages.path(file) + " line 1: not the header of a deploy landings.csv");
            }
            int lineNo = 1;
            for (int i = first; i < end; i++) {
                String line = r.readLine();
                lineNo++;
                if (line == null) {
                    throw new InputException(Messages.path(file) + " line " + lineNo + ": ends after " + (i - first)
                        + " of " + (end - first) + " samples");
                }
                out.add(row(file, lineNo, line, i, settings, facets));
            }
            if (r.readLine() != null) {
                throw new InputException(Messages.path(file) + " line " + (lineNo + 1) + ": more rows than the "
                    + (end - first) + " samples of its shard");
            }
        } catch (java.nio.charset.CharacterCodingException e) {
            throw new InputException(Messages.path(file) + ": not UTF-8 text");
        } catch (IOException e) {
            throw new InputException(Messages.path(file) + ": cannot read: " + e.getMessage());
        }
        return out;
    }

    private static Landing row(Path file, int lineNo, String line, int sample, DeploymentSettings settings,
                               int facets) {
        String at = Messages.path(file) + " line " + lineNo + ": ";
        if (line.length() > MAX_LINE) {
            throw new InputException(at + "longer than " + MAX_LINE + " characters");
        }
        String[] f = line.split(",", -1);
        if (f.length != COLUMNS) {
            throw new InputException(at + "expected " + COLUMNS + " fields, got " + f.length);
        }
        Cells c = new Cells(at, f);
        long idx = c.integer(0, "sample", 0, Integer.MAX_VALUE);
        if (idx != sample) {
            throw new InputException(at + "sample " + idx + " where sample " + sample + " was expected (rows in "
                + "sample order, one per sample of the shard)");
        }
        Landing.Outcome outcome = null;
        for (Landing.Outcome o : Landing.Outcome.values()) {
            if (o.key().equals(f[1])) {
                outcome = o;
            }
        }
        if (outcome == null) {
            throw new InputException(at + "outcome: unknown " + Messages.quote(f[1]));
        }
        double[] pos = {c.real(2, "x_m", false), c.real(3, "y_m", false), c.real(4, "z_m", false)};
        int facet = (int) c.integer(5, "facet", -1, facets - 1L);
        double lat = c.range(6, "lat_deg", -90, 90);
        double lon = c.range(7, "lon_deg", -180, 180);
        double time = c.range(8, "time_s", 0, Double.MAX_VALUE);
        int bounces = (int) c.integer(9, "bounces", 0, Integer.MAX_VALUE);
        double speed = c.range(10, "first_impact_speed_m_s", 0, Double.MAX_VALUE);
        double inc = c.range(11, "first_incidence_deg", 0, 180);
        double slope = c.range(12, "slope_deg", 0, 180);
        double[] start = new double[6];
        for (int k = 0; k < 6; k++) {
            start[k] = c.real(13 + k, HEADER.split(",")[13 + k], false);
        }
        double drift = c.range(19, "max_jacobi_drift_rel", 0, Double.MAX_VALUE);
        long steps = c.integer(20, "steps", 0, Long.MAX_VALUE);
        long evals = c.integer(21, "field_evaluations", 0, Long.MAX_VALUE);
        if (!java.util.Arrays.equals(start, Deployment.releaseState(settings, sample))) {
            throw new InputException(at + "the release state of sample " + sample + " is not the one of these "
                + "settings (a shard of another run?)");
        }
        if (Double.isNaN(time)) {
            throw new InputException(at + "time_s: NaN");
        }
        return new Landing(sample, outcome, start, pos, facet, lat, lon, time, bounces, speed, inc, slope, drift,
            steps, evals);
    }

    /** Typed, checked access to the fields of one row. */
    private record Cells(String at, String[] f) {
        long integer(int i, String name, long min, long max) {
            long v;
            try {
                v = Long.parseLong(f[i]);
            } catch (NumberFormatException e) {
                throw new InputException(at + name + ": " + Messages.quote(f[i]) + " is not a whole number");
            }
            if (!Long.toString(v).equals(f[i]) || v < min || v > max) {
                throw new InputException(at + name + ": " + Messages.quote(f[i]) + " is not a whole number in ["
                    + min + ", " + max + "]");
            }
            return v;
        }

        /** A double as {@link Double#toString} writes it; NaN only when {@code nanAllowed}; never infinite. */
        double real(int i, String name, boolean nanAllowed) {
            double v;
            try {
                v = Double.parseDouble(f[i]);
            } catch (NumberFormatException e) {
                throw new InputException(at + name + ": " + Messages.quote(f[i]) + " is not a number");
            }
            if (!Double.toString(v).equals(f[i])) {
                throw new InputException(at + name + ": " + Messages.quote(f[i]) + " is not written as this program "
                    + "writes numbers (changed by hand or by another program?)");
            }
            if (Double.isInfinite(v) || (Double.isNaN(v) && !nanAllowed)) {
                throw new InputException(at + name + ": " + f[i] + " where a finite number is required");
            }
            return v;
        }

        /** NaN (does not apply) or a number in [min, max]. */
        double range(int i, String name, double min, double max) {
            double v = real(i, name, true);
            if (!Double.isNaN(v) && !(v >= min && v <= max)) {
                throw new InputException(at + name + ": " + f[i] + " outside [" + min + ", " + max + "]");
            }
            return v;
        }
    }
}
