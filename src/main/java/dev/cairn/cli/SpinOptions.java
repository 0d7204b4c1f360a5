package dev.cairn.cli;

import dev.cairn.io.InputException;
import picocli.CommandLine.Option;

/** Spin-state options: period with a unit suffix and pole direction; they override the model sidecar. */
public final class SpinOptions {
    @Option(names = "--spin-period", paramLabel = "PERIOD",
        description = "Sidereal spin period, with unit suffix s, min or h (e.g. 4.3h); plain numbers are seconds.")
    String period;

    @Option(names = "--spin-axis", paramLabel = "X,Y,Z", split = ",",
        description = "Spin pole in the model frame (default: sidecar, else +z).")
    double[] axis;

    /** Period in seconds, or null when not given. */
    public Double periodSeconds() {
        return period == null ? null : parsePeriod(period);
    }

    /** Axis as given, or null. */
    public double[] axis() {
        if (axis != null && axis.length != 3) {
            throw new InputException("--spin-axis: expected 3 comma-separated numbers, got " + axis.length);
        }
        return axis;
    }

    /** Parses "4.3h", "90min", "3600s" or "3600" into seconds. */
    public static double parsePeriod(String text) {
        String t = text.trim().toLowerCase(java.util.Locale.ROOT);
        double factor = 1;
        if (t.endsWith("min")) {
            factor = 60;
            t = t.substring(0, t.length() - 3);
        } else if (t.endsWith("h")) {
            factor = 3600;
            t = t.substring(0, t.length() - 1);
        } else if (t.endsWith("s")) {
            t = t.substring(0, t.length() - 1);
        }
        try {
            if (!dev.cairn.io.Numbers.isDecimal(t.trim())) {
                throw new NumberFormatException();
            }
            double v = Double.parseDouble(t.trim()) * factor;
            if (!(v > 0) || Double.isInfinite(v)) {
                throw new InputException("--spin-period: must be positive and finite, got "
                    + dev.cairn.io.Messages.quote(text));
            }
            return v;
        } catch (NumberFormatException e) {
            throw new InputException("--spin-period: " + dev.cairn.io.Messages.quote(text)
                + " is not a period (e.g. 4.3h, 90min, 3600s)");
        }
    }
}
