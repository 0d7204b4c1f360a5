package dev.cairn.regions;

import dev.cairn.mesh.TriangleMesh;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

/** Writes test meshes as OBJ files and small JSON files. */
final class TestFiles {
    private TestFiles() {
    }

    static Path obj(Path dir, String name, TriangleMesh mesh) throws IOException {
        return dev.cairn.TestShapes.writeObj(mesh, dir.resolve(name));
    }

    static Path json(Path dir, String name, String content) throws IOException {
        Path p = dir.resolve(name);
        Files.writeString(p, content);
        return p;
    }

    /** The mesh moved by {@code (dx, dy, dz)}. */
    static TriangleMesh shifted(TriangleMesh m, double dx, double dy, double dz) {
        return m.transformed(new double[] {1, 0, 0, 0, 1, 0, 0, 0, 1}, 1.0, new double[] {dx, dy, dz});
    }

    /** One mesh holding both surfaces as they are (e.g. an outer surface and an inward-facing cavity). */
    static TriangleMesh union(TriangleMesh a, TriangleMesh b) {
        double[] v = new double[a.xyz().length + b.xyz().length];
        System.arraycopy(a.xyz(), 0, v, 0, a.xyz().length);
        System.arraycopy(b.xyz(), 0, v, a.xyz().length, b.xyz().length);
        int[] t = new int[a.tri().length + b.tri().length];
        System.arraycopy(a.tri(), 0, t, 0, a.tri().length);
        int off = a.vertexCount();
        for (int i = 0; i < b.tri().length; i++) {
            t[a.tri().length + i] = b.tri()[i] + off;
        }
        return new TriangleMesh(v, t);
    }
}
