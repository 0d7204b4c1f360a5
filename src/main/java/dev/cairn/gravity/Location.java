package dev.cairn.gravity;

/** Where a field point lies relative to the body's surface. */
public enum Location {
    INSIDE, OUTSIDE, SURFACE, UNKNOWN;

    /** Lower-case word used in output files ({@code inside}, {@code outside}, {@code surface}, {@code unknown}). */
    public String word() {
        return name().toLowerCase(java.util.Locale.ROOT);
    }

    /** Numeric code stored in the {@link FieldSample#LOCATION} slot: 1 inside, 0 outside, 0.5 surface, NaN unknown. */
    public double code() {
        switch (this) {
            case INSIDE:
                return 1.0;
            case OUTSIDE:
                return 0.0;
            case SURFACE:
                return 0.5;
            default:
                return Double.NaN;
        }
    }

    /** Inverse of {@link #code()}. */
    public static Location fromCode(double code) {
        if (code == 1.0) {
            return INSIDE;
        }
        if (code == 0.0) {
            return OUTSIDE;
        }
        if (code == 0.5) {
            return SURFACE;
        }
        return UNKNOWN;
    }
}
