package dev.cairn.tables;

/** A field point outside the region a table covers, asked of a {@link TableField} without a fallback model. */
public final class OutsideTableException extends IllegalArgumentException {
    private static final long serialVersionUID = 1L;

    OutsideTableException(String message) {
        super(message);
    }
}
