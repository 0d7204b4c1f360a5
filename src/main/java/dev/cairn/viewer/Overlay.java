package dev.cairn.viewer;

import dev.cairn.io.InputException;

/** Optional overlays of the 3D view, with their command-line names. */
public enum Overlay {
    SPIN_AXIS("spin-axis", "spin axis"),
    PRINCIPAL_AXES("principal-axes", "principal axes"),
    BODY_AXES("body-axes", "body axes (model x red, y green, z blue)"),
    GRATICULE("graticule", "latitude/longitude lines"),
    WIREFRAME("wireframe", "mesh edges"),
    ZONES("zones", "landing zones, outlined and numbered"),
    SITES("sites", "landing sites, outlined and numbered");

    private final String cliName;
    private final String label;

    Overlay(String cliName, String label) {
        this.cliName = cliName;
        this.label = label;
    }

    public String cliName() {
        return cliName;
    }

    @Override
    public String toString() {
        return label;
    }

    /** Parses a command-line name; unknown names give a one-line {@link InputException}. */
    public static Overlay parse(String s) {
        for (Overlay o : values()) {
            if (o.cliName.equals(s.trim())) {
                return o;
            }
        }
        throw new InputException("--overlay: unknown overlay '" + s + "' (use spin-axis, principal-axes, body-axes, "
            + "graticule, wireframe, zones or sites)");
    }
}
