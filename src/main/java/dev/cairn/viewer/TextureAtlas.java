package dev.cairn.viewer;

/**
 * The facet-colour texture: one texel per facet, row-major, {@link #width()} texels per row. Facet {@code f} sits at
 * texel {@code (f mod width, f div width)}; all three corners of the facet get the texture coordinate of that texel's
 * centre, {@code u = (x + 0.5)/width, v = (y + 0.5)/height}, so that the facet shows exactly one colour whatever the
 * texture filtering (sampling at a texel centre returns that texel under nearest and bilinear filtering).
 */
public final class TextureAtlas {
    /** Widest row used: 2048 texels, within the texture size every OpenGL 2.1 / ES 2 device we target supports. */
    public static final int MAX_WIDTH = 2048;

    private final int facets;
    private final int width;
    private final int height;

    /** Atlas for {@code facets >= 1} facets. */
    public TextureAtlas(int facets) {
        if (facets < 1) {
            throw new IllegalArgumentException("need at least one facet");
        }
        this.facets = facets;
        this.width = Math.min(facets, MAX_WIDTH);
        this.height = (facets + width - 1) / width;
    }

    public int facets() {
        return facets;
    }

    /** Texels per row. */
    public int width() {
        return width;
    }

    /** Rows. */
    public int height() {
        return height;
    }

    /** Column of facet {@code f}'s texel. */
    public int texelX(int f) {
        return f % width;
    }

    /** Row of facet {@code f}'s texel. */
    public int texelY(int f) {
        return f / width;
    }

    /** Texture coordinate u of facet {@code f} (texel centre). */
    public float u(int f) {
        return (float) ((texelX(f) + 0.5) / width);
    }

    /** Texture coordinate v of facet {@code f} (texel centre, v grows downwards as in JavaFX images). */
    public float v(int f) {
        return (float) ((texelY(f) + 0.5) / height);
    }

    /** The facet whose texel contains the texture coordinate (u, v), or -1 outside the used texels. */
    public int facetAt(double u, double v) {
        int x = (int) Math.floor(u * width);
        int y = (int) Math.floor(v * height);
        if (x < 0 || x >= width || y < 0 || y >= height) {
            return -1;
        }
        int f = y * width + x;
        return f < facets ? f : -1;
    }

    /** Texture coordinates of all facets, {@code [u0, v0, u1, v1, ...]} (for a JavaFX TriangleMesh). */
    public float[] texCoords() {
        float[] t = new float[2 * facets];
        for (int f = 0; f < facets; f++) {
            t[2 * f] = u(f);
            t[2 * f + 1] = v(f);
        }
        return t;
    }

    /** The colours laid out as the atlas image, row-major {@code width × height}, unused texels opaque black. */
    public int[] pixels(int[] facetArgb) {
        int[] px = new int[width * height];
        System.arraycopy(facetArgb, 0, px, 0, facets);
        for (int i = facets; i < px.length; i++) {
            px[i] = 0xFF000000;
        }
        return px;
    }
}
