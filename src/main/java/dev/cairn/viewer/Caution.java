package dev.cairn.viewer;

/** The operational caution shown in the about box, on every rendered image and in the window's status line. */
final class Caution {
    private Caution() {
    }

    /** One line. */
    static final String TEXT = "Caution: results must be verified independently before operational use; mission "
        + "rules and the responsible flight-dynamics authority decide.";
}
