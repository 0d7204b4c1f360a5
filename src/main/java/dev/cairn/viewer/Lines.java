package dev.cairn.viewer;

import javafx.scene.image.WritableImage;
import javafx.scene.paint.Color;
import javafx.scene.paint.PhongMaterial;
import javafx.scene.shape.CullFace;
import javafx.scene.shape.DrawMode;
import javafx.scene.shape.MeshView;
import javafx.scene.shape.TriangleMesh;

/**
 * Line overlays for JavaFX 3D, which has no line primitive: each segment becomes a sliver triangle drawn in
 * {@link DrawMode#LINE} (one pixel wide), coloured by self-illumination so that lights do not change it.
 */
final class Lines {
    private Lines() {
    }

    /** A node drawing segments {@code [x1, y1, z1, x2, y2, z2, ...]} (scene frame) in one colour. */
    static MeshView of(float[] seg, Color colour) {
        int ns = seg.length / 6;
        float[] pts = new float[9 * ns];
        int[] faces = new int[6 * ns];
        for (int s = 0; s < ns; s++) {
            int o = 6 * s;
            float dx = seg[o + 3] - seg[o];
            float dy = seg[o + 4] - seg[o + 1];
            float dz = seg[o + 5] - seg[o + 2];
            // third corner: the midpoint nudged sideways by 1e-4 of the length, so the triangle is not degenerate
            float ex = Math.abs(dx) < Math.abs(dy) ? 1 : 0;
            float ey = 1 - ex;
            float px = dy * 0 - dz * ey;
            float py = dz * ex - dx * 0;
            float pz = dx * ey - dy * ex;
            float k = 1e-4f;
            System.arraycopy(seg, o, pts, 9 * s, 6);
            pts[9 * s + 6] = seg[o] + dx / 2 + k * px;
            pts[9 * s + 7] = seg[o + 1] + dy / 2 + k * py;
            pts[9 * s + 8] = seg[o + 2] + dz / 2 + k * pz;
            for (int c = 0; c < 3; c++) {
                faces[6 * s + 2 * c] = 3 * s + c;
                faces[6 * s + 2 * c + 1] = 0;
            }
        }
        TriangleMesh m = new TriangleMesh();
        m.getPoints().setAll(pts);
        m.getTexCoords().setAll(0.5f, 0.5f);
        m.getFaces().setAll(faces);
        MeshView v = new MeshView(m);
        v.setDrawMode(DrawMode.LINE);
        v.setCullFace(CullFace.NONE);
        v.setMaterial(material(colour));
        v.setMouseTransparent(true);
        return v;
    }

    /** Unlit colour: black diffuse and specular, colour from a 1×1 self-illumination map. */
    static PhongMaterial material(Color colour) {
        PhongMaterial m = new PhongMaterial(Color.BLACK);
        m.setSpecularColor(Color.BLACK);
        WritableImage img = new WritableImage(1, 1);
        img.getPixelWriter().setColor(0, 0, colour);
        m.setSelfIlluminationMap(img);
        return m;
    }
}
