package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

/** Facet to texel mapping of the colour atlas: one texel per facet, coordinates at texel centres. */
class TextureAtlasTest {
    /** Float texture coordinates: the centre must be within a hundredth of a texel (float has 24 bits). */
    private static final double CENTRE_TOL_TEXELS = 0.01;

    @Test
    void everyFacetHasItsOwnTexelAndCoordinatesAtItsCentre() {
        for (int n : new int[] {1, 7, TextureAtlas.MAX_WIDTH, TextureAtlas.MAX_WIDTH + 1, 1_310_720}) {
            TextureAtlas a = new TextureAtlas(n);
            assertEquals(Math.min(n, TextureAtlas.MAX_WIDTH), a.width());
            assertEquals((n + a.width() - 1) / a.width(), a.height());
            int step = Math.max(1, n / 5000);
            for (int f = 0; f < n; f += step) {
                assertEquals(f, a.facetAt(a.u(f), a.v(f)), "round trip of facet " + f + " of " + n);
                assertEquals(a.texelX(f) + 0.5, a.u(f) * a.width(), CENTRE_TOL_TEXELS);
                assertEquals(a.texelY(f) + 0.5, a.v(f) * a.height(), CENTRE_TOL_TEXELS);
                assertEquals(f, a.texelY(f) * a.width() + a.texelX(f));
            }
            assertEquals(n - 1, a.facetAt(a.u(n - 1), a.v(n - 1)));
        }
    }

    @Test
    void pixelsPutEachColourAtItsFacetsTexelAndPadTheLastRow() {
        int n = TextureAtlas.MAX_WIDTH + 3;
        TextureAtlas a = new TextureAtlas(n);
        int[] argb = new int[n];
        for (int f = 0; f < n; f++) {
            argb[f] = 0xFF000000 | f;
        }
        int[] px = a.pixels(argb);
        assertEquals(a.width() * a.height(), px.length);
        for (int f = 0; f < n; f++) {
            assertEquals(argb[f], px[a.texelY(f) * a.width() + a.texelX(f)]);
        }
        assertEquals(0xFF000000, px[px.length - 1]);
        float[] t = a.texCoords();
        assertEquals(a.u(n - 1), t[2 * (n - 1)]);
        assertEquals(a.v(n - 1), t[2 * (n - 1) + 1]);
    }
}
