package dev.cairn.util;

/**
 * Cairn's colour ramps, designed for this project, as tables of packed sRGB colours ({@code 0xAARRGGBB}).
 *
 * <p><b>Sequential ramp</b> ({@link #SEQUENTIAL}) for magnitudes: a spiral in the OKLab colour space (Ottosson, B.
 * 2020, "A perceptual color space for image processing", bottosson.github.io/posts/oklab) whose lightness rises
 * linearly from {@link #SEQ_L_LOW} (deep blue-violet) to {@link #SEQ_L_HIGH} (pale straw) while the hue turns
 * through teal and green. Lightness alone orders the ramp, so it stays readable in greyscale and for readers with any
 * form of colour-vision deficiency (the hue path runs along the blue–yellow axis that dichromats keep, and avoids
 * a red–green contrast carrying information). Colours outside the sRGB gamut are brought in by lowering chroma at
 * constant lightness and hue, so lightness stays exactly as designed.
 *
 * <p><b>Diverging ramp</b> ({@link #DIVERGING}) for signed quantities: blue for negative, a near-white neutral at
 * zero (t = 0.5), brown-orange for positive; lightness falls symmetrically and linearly with |2t − 1|, so in
 * greyscale it reads as magnitude, and the sign is carried by the blue–orange hue pair.
 *
 * <p>This is the one colour definition of the project: the PNG maps of the survey and the 3D views of the viewer and
 * renderer both take their colours from here, through {@code dev.cairn.surface.ColourScale}, so the same value has the
 * same colour in both.
 *
 * <p>{@link #LIFT_OFF} marks facets where loose material lifts off (effective gravity pointing away from the surface,
 * slope above 90°): a saturated magenta, a hue no ramp uses.
 *
 * <p>{@link #WARNING} marks values beyond a user-set upper limit (e.g. slopes steeper than the landing threshold): a
 * dark red darker than every ramp colour, so it stands apart even in greyscale.
 */
public final class ColourRamp {
    /** OKLab lightness of the low end of the sequential ramp. */
    public static final double SEQ_L_LOW = 0.42;
    /** OKLab lightness of the high end of the sequential ramp. */
    public static final double SEQ_L_HIGH = 0.95;
    /** OKLab lightness at the two ends of the diverging ramp. */
    public static final double DIV_L_END = 0.45;
    /** OKLab lightness of the diverging ramp's neutral centre. */
    public static final double DIV_L_MID = 0.96;

    private static final int SIZE = 1024;

    /** The sequential ramp. */
    public static final ColourRamp SEQUENTIAL = new ColourRamp(true);
    /** The diverging ramp (centre t = 0.5 is zero). */
    public static final ColourRamp DIVERGING = new ColourRamp(false);

    /** Values above a user-set upper limit: dark red (OKLab L 0.30). */
    public static final int WARNING = oklch(0.30, 0.11, 25);
    /** Lift-off (slope above 90°): saturated magenta (OKLCh 0.60, 0.25, 340°), a hue outside both ramps. */
    public static final int LIFT_OFF = oklch(0.60, 0.25, 340);
    /** Facets without a value (NaN): neutral mid grey. */
    public static final int NO_DATA = oklch(0.62, 0.0, 0);
    /** Facets outside every category (not in a zone, no lift-off): light neutral grey. */
    public static final int NEUTRAL = oklch(0.86, 0.0, 0);
    /** Plain surface colour for the quantity "none". */
    public static final int PLAIN = oklch(0.78, 0.015, 80);

    private final int[] table = new int[SIZE];

    private ColourRamp(boolean sequential) {
        for (int i = 0; i < SIZE; i++) {
            double t = i / (double) (SIZE - 1);
            table[i] = sequential ? sequentialColour(t) : divergingColour(t);
        }
    }

    private static int sequentialColour(double t) {
        double lightness = SEQ_L_LOW + (SEQ_L_HIGH - SEQ_L_LOW) * t;
        double chroma = 0.085 + 0.075 * Math.sin(Math.PI * Math.pow(t, 0.8));
        double hue = 268 - 172 * t; // degrees: blue-violet, teal, green, straw
        return oklch(lightness, chroma, hue);
    }

    private static int divergingColour(double t) {
        double s = 2 * t - 1;
        double a = Math.abs(s);
        double lightness = DIV_L_MID - (DIV_L_MID - DIV_L_END) * a;
        double chroma = 0.01 + 0.12 * a;
        double hue = s < 0 ? 250 : 55;
        return oklch(lightness, chroma, hue);
    }

    /** The colour at {@code t} in [0, 1] (clamped); NaN gives {@link #NO_DATA}. */
    public int argb(double t) {
        if (Double.isNaN(t)) {
            return NO_DATA;
        }
        double c = t < 0 ? 0 : t > 1 ? 1 : t;
        return table[(int) Math.round(c * (SIZE - 1))];
    }

    /**
     * An sRGB colour from OKLCh (lightness 0..1, chroma, hue in degrees), brought into gamut by lowering chroma at
     * constant lightness and hue (bisection).
     */
    public static int oklch(double lightness, double chroma, double hueDeg) {
        double h = Math.toRadians(hueDeg);
        double ca = Math.cos(h);
        double sa = Math.sin(h);
        double[] rgb = new double[3];
        if (!oklabToLinear(lightness, chroma * ca, chroma * sa, rgb)) {
            double lo = 0;
            double hi = chroma;
            for (int k = 0; k < 40; k++) {
                double mid = 0.5 * (lo + hi);
                if (oklabToLinear(lightness, mid * ca, mid * sa, rgb)) {
                    lo = mid;
                } else {
                    hi = mid;
                }
            }
            oklabToLinear(lightness, lo * ca, lo * sa, rgb);
        }
        int r = encode(rgb[0]);
        int g = encode(rgb[1]);
        int b = encode(rgb[2]);
        return 0xFF000000 | (r << 16) | (g << 8) | b;
    }

    /** OKLab to linear sRGB (Ottosson 2020); returns whether the colour is inside the gamut. */
    private static boolean oklabToLinear(double lightness, double a, double b, double[] out) {
        double l = lightness + 0.3963377774 * a + 0.2158037573 * b;
        double m = lightness - 0.1055613458 * a - 0.0638541728 * b;
        double s = lightness - 0.0894841775 * a - 1.2914855480 * b;
        l = l * l * l;
        m = m * m * m;
        s = s * s * s;
        out[0] = 4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s;
        out[1] = -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s;
        out[2] = -0.0041960863 * l - 0.7034186147 * m + 1.7076147010 * s;
        final double eps = 1e-9;
        for (double v : out) {
            if (v < -eps || v > 1 + eps) {
                return false;
            }
        }
        return true;
    }

    /** Linear light to an 8-bit sRGB code (IEC 61966-2-1 transfer function). */
    private static int encode(double linear) {
        double c = linear <= 0 ? 0 : linear >= 1 ? 1 : linear;
        double v = c <= 0.0031308 ? 12.92 * c : 1.055 * Math.pow(c, 1 / 2.4) - 0.055;
        return (int) Math.round(v * 255);
    }

    /** A colour of the categorical palette for category {@code k >= 1} (landing-zone ranks), repeating after 8. */
    public static int category(int k) {
        int i = Math.floorMod(k - 1, 8);
        // Hues a golden angle apart; lightness alternates so neighbours in rank differ in greyscale too.
        double hue = (35 + 137.5 * i) % 360;
        double lightness = i % 2 == 0 ? 0.58 : 0.74;
        return oklch(lightness, 0.13, hue);
    }
}
