package dev.cairn.gravity;

/** Physical constants used throughout Cairn. */
public final class Constants {
    /** Newtonian constant of gravitation, m^3 kg^-1 s^-2 (CODATA 2018; Tiesinga et al. 2021, Rev. Mod. Phys. 93:025010). */
    public static final double G = 6.67430e-11;

    private Constants() {
    }
}
