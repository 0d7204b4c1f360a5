package dev.cairn.viewer;

import dev.cairn.io.InputException;

/** No window or offscreen surface can be had: no display server, or no usable graphics libraries. */
public final class DisplayUnavailableException extends InputException {
    private static final long serialVersionUID = 1L;

    public DisplayUnavailableException(String message, Throwable cause) {
        super(message, cause);
    }
}
