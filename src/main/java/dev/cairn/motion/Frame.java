package dev.cairn.motion;

/** Frame of a propagation's equations of motion and of its initial state. */
public enum Frame {
    /** The rotating body-fixed (model) frame: gravity, centrifugal and Coriolis terms. */
    BODY,
    /**
     * The inertial frame aligned with the body frame at t = 0, same origin; the body turns about its spin axis
     * through the centre of mass.
     */
    INERTIAL
}
