package dev.cairn.io;

/**
 * Bad user input: a file that cannot be read, a malformed line, an impossible parameter.
 *
 * <p>The message is one plain-English line that names the file, the line (when there is one) and the
 * problem. The command line turns it into exit code 2 without a stack trace.
 */
public class InputException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    /** @param message the complete message shown to the user (made one safe line by {@link Messages#line}) */
    public InputException(String message) {
        super(Messages.line(message, Messages.MAX_LINE - PREFIX));
    }

    /** @param message the complete message; {@code cause} is kept for {@code --debug} */
    public InputException(String message, Throwable cause) {
        super(Messages.line(message, Messages.MAX_LINE - PREFIX), cause);
    }

    /** Length of the command line's {@code "cairn: error: "} prefix. */
    private static final int PREFIX = "cairn: error: ".length();

    /** Message for a problem at {@code file:line}. Line numbers are 1-based; 0 or less omits the line. */
    public static InputException at(String file, long line, String problem) {
        String f = Messages.path(file);
        return new InputException(line > 0 ? f + ":" + line + ": " + problem : f + ": " + problem);
    }

    /** As {@link #at(String, long, String)}, keeping {@code cause} for {@code --debug}. */
    public static InputException at(String file, long line, String problem, Throwable cause) {
        String f = Messages.path(file);
        return new InputException(line > 0 ? f + ":" + line + ": " + problem : f + ": " + problem, cause);
    }

    /**
     * One-line error for a JSON file that Jackson could not read: {@code file:line: what: first line of Jackson's
     * message}. An unknown key is named without Jackson's class details and points to {@code keysDoc}.
     *
     * @param what    e.g. "bad model sidecar"
     * @param keysDoc document listing the allowed keys (e.g. "docs/model-sidecar.md"), or null
     */
    public static InputException json(java.nio.file.Path file, com.fasterxml.jackson.core.JsonProcessingException e,
                                      String what, String keysDoc) {
        long line = e.getLocation() == null ? 0 : e.getLocation().getLineNr();
        String msg = e.getOriginalMessage();
        int nl = msg.indexOf('\n');
        if (nl > 0) {
            msg = msg.substring(0, nl);
        }
        if (msg.length() > 160) {
            msg = msg.substring(0, 160) + "...";
        }
        msg = msg.replace(" (but might if coercion using `CoercionConfig` was enabled)", "");
        if (e instanceof com.fasterxml.jackson.databind.JsonMappingException jm && !jm.getPath().isEmpty()
            && !msg.startsWith("Unrecognized field")) {
            StringBuilder key = new StringBuilder();
            for (com.fasterxml.jackson.databind.JsonMappingException.Reference r : jm.getPath()) {
                if (r.getFieldName() != null) {
                    key.append(key.length() > 0 ? "." : "").append(r.getFieldName());
                } else if (r.getIndex() >= 0) {
                    key.append('[').append(r.getIndex() + 1).append(']');
                }
            }
            if (key.length() > 0) {
                msg = "key " + Messages.quote(key.toString()) + ": " + msg;
            }
        }
        if (msg.startsWith("Unrecognized field")) {
            msg = msg.replaceFirst("\\s*\\(class [^)]*\\).*", "")
                + (keysDoc == null ? "" : " (see " + keysDoc + " for the keys)");
        }
        return at(file.toString(), line, what + ": " + msg, e);
    }
}
