package dev.cairn.viewer;

/**
 * Lighting of the 3D view. {@link #SHADED}: dim ambient light plus a key light from over the viewer's shoulder, so
 * relief reads. {@link #FLAT}: full white ambient light only, under which every facet shows exactly its legend colour.
 */
public enum Lighting {
    SHADED("shaded"), FLAT("flat (exact legend colours)");

    private final String label;

    Lighting(String label) {
        this.label = label;
    }

    @Override
    public String toString() {
        return label;
    }
}
