package dev.cairn.viewer;

import dev.cairn.io.InputException;

/**
 * Preset views along the model axes: {@code +x} looks at the body from the +x side (camera on the +x axis, looking
 * towards −x), and so on; {@code iso} looks from the direction (1, −1, 0.8)
 * normalised, a three-quarter view. Screen up is model +z, except for the ±z views where it is model +y.
 */
public enum ViewPreset {
    PX("+x", 1, 0, 0), MX("-x", -1, 0, 0), PY("+y", 0, 1, 0), MY("-y", 0, -1, 0), PZ("+z", 0, 0, 1),
    MZ("-z", 0, 0, -1), ISO("iso", 1, -1, 0.8);

    private final String cliName;
    private final double[] from;

    ViewPreset(String cliName, double x, double y, double z) {
        this.cliName = cliName;
        double n = Math.sqrt(x * x + y * y + z * z);
        this.from = new double[] {x / n, y / n, z / n};
    }

    public String cliName() {
        return cliName;
    }

    /** Unit direction from the centre of mass to the camera, model frame. */
    public double[] from() {
        return from.clone();
    }

    /** Screen-up direction, model frame (+z, or +y for the ±z views). */
    public double[] up() {
        return this == PZ || this == MZ ? new double[] {0, 1, 0} : new double[] {0, 0, 1};
    }

    /** Parses {@code +x|-x|+y|-y|+z|-z|iso}; anything else gives a one-line {@link InputException}. */
    public static ViewPreset parse(String s) {
        for (ViewPreset p : values()) {
            if (p.cliName.equals(s.trim())) {
                return p;
            }
        }
        throw new InputException("--view: unknown view '" + s + "' (use +x, -x, +y, -y, +z, -z or iso)");
    }
}
