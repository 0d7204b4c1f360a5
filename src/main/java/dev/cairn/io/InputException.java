package dev.cairn.io;

/**
 * Bad user input: a file that cannot be read, a malformed line, an impossible parameter.
 *
 * <p>The message is one plain-English line that names the file, the line (when there is one) and the
 * problem. The command line turns it into exit code 2 without a stack trace.
 */
public class InputException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    /** @param message the complete one-line message shown to the user */
    public InputException(String message) {
        super(message);
    }

    /** @param message the complete one-line message; {@code cause} is kept for {@code --debug} */
    public InputException(String message, Throwable cause) {
        super(message, cause);
    }

    /** Message for a problem at {@code file:line}. Line numbers are 1-based; 0 or less omits the line. */
    public static InputException at(String file, long line, String problem) {
        return new InputException(line > 0 ? file + ":" + line + ": " + problem : file + ": " + problem);
    }

    /** As {@link #at(String, long, String)}, keeping {@code cause} for {@code --debug}. */
    public static InputException at(String file, long line, String problem, Throwable cause) {
        return new InputException(line > 0 ? file + ":" + line + ": " + problem : file + ": " + problem, cause);
    }
}
