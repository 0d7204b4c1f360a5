package dev.cairn.mesh;

import dev.cairn.io.InputException;
import dev.cairn.io.Messages;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Streaming reader for plain Wavefront OBJ triangle and polygon meshes into {@link TriangleMesh} arrays.
 *
 * <p>Understood: {@code v x y z [w]} (a fourth coordinate or per-vertex colour is ignored), {@code f} with
 * {@code i}, {@code i/t}, {@code i//n} and {@code i/t/n} references, negative (relative) indices, polygons of more
 * than three vertices (fan-triangulated from their first vertex, with a warning when a polygon is not planar to
 * 1e-6 of its size), {@code #} comments, blank lines, CRLF line ends and scientific notation. Every other
 * statement ({@code vt}, {@code vn}, {@code o}, {@code g}, {@code s}, {@code usemtl}, {@code mtllib}, ...) is
 * ignored. Coordinates are multiplied by the model's length unit in metres (1 for m, 1000 for km).
 *
 * <p>Errors are {@link InputException}s naming the file, the line and the problem. Warnings (non-planar polygons)
 * are collected in the returned {@link Result}; this class never prints.
 */
public final class ObjReader {
    /** Relative out-of-plane tolerance above which a polygon is reported as non-planar. */
    public static final double NON_PLANAR_TOLERANCE = 1e-6;

    private ObjReader() {
    }

    /** A loaded mesh and the warnings met while reading it. */
    public record Result(TriangleMesh mesh, List<String> warnings) {
    }

    /**
     * Reads an OBJ file.
     *
     * @param file          the file
     * @param metresPerUnit length of one model unit in metres (1 for m, 1000 for km)
     */
    public static Result read(Path file, double metresPerUnit) {
        if (!Files.exists(file)) {
            throw new InputException(file + ": no such file");
        }
        if (!Files.isRegularFile(file)) {
            throw new InputException(file + ": not a regular file (a directory, device or pipe cannot be a model)");
        }
        try (InputStream in = Files.newInputStream(file)) {
            return read(in, file.toString(), metresPerUnit);
        } catch (NoSuchFileException e) {
            throw new InputException(file + ": no such file", e);
        } catch (IOException e) {
            throw new InputException(file + ": cannot read: " + e.getMessage(), e);
        }
    }

    /** Reads OBJ text from a stream; {@code name} is used in messages. */
    public static Result read(InputStream in, String name, double metresPerUnit) throws IOException {
        BufferedReader reader = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8), 1 << 16);
        double[] xyz = new double[3 * 1024];
        int nv = 0;
        int[] tri = new int[3 * 2048];
        int nt = 0;
        int[] poly = new int[16];
        List<String> warnings = new ArrayList<>();
        int nonPlanar = 0;
        int firstNonPlanarLine = 0;
        int unknown = 0;
        long firstUnknownLine = 0;
        String firstUnknown = null;
        long lineNo = 0;
        String line;
        while ((line = reader.readLine()) != null) {
            lineNo++;
            if (lineNo == 1 && line.startsWith("\uFEFF")) {
                line = line.substring(1); // UTF-8 byte-order mark
            }
            int len = line.length();
            int p = skipSpace(line, 0);
            if (p >= len) {
                continue;
            }
            char c0 = line.charAt(p);
            if (c0 == '#') {
                continue;
            }
            int end = tokenEnd(line, p);
            if (end - p != 1 || (c0 != 'v' && c0 != 'f')) {
                String kw = line.substring(p, end);
                if (!IGNORED.contains(kw)) {
                    if (c0 == 'v' || c0 == 'f' || c0 == 'V' || c0 == 'F') {
                        throw InputException.at(name, lineNo, "unknown statement " + Messages.quote(kw)
                            + " (vertices are 'v x y z', facets 'f i j k', lower case, separated by spaces)");
                    }
                    if (unknown++ == 0) {
                        firstUnknownLine = lineNo;
                        firstUnknown = kw;
                    }
                }
                continue; // vt, vn, o, g, s, usemtl, mtllib, l, p, ... ignored
            }
            if (c0 == 'v') {
                if (3 * nv + 3 > xyz.length) {
                    xyz = Arrays.copyOf(xyz, xyz.length * 2);
                }
                int q = end;
                for (int k = 0; k < 3; k++) {
                    q = skipSpace(line, q);
                    if (q >= len || line.charAt(q) == '#') {
                        throw InputException.at(name, lineNo, "vertex has " + k + " coordinates, expected 3");
                    }
                    int e = tokenEnd(line, q);
                    double v = parseCoordinate(line, q, e, name, lineNo) * metresPerUnit;
                    if (!(Math.abs(v) <= MeshInspector.MAX_COORDINATE_M)) {
                        throw InputException.at(name, lineNo, "coordinate " + Messages.quote(line.substring(q, e))
                            + " is beyond " + MeshInspector.MAX_COORDINATE_M + " m (check the units)");
                    }
                    xyz[3 * nv + k] = v;
                    q = e;
                }
                nv++;
            } else {
                int n = 0;
                int q = end;
                while (true) {
                    q = skipSpace(line, q);
                    if (q >= len || line.charAt(q) == '#') {
                        break;
                    }
                    int e = tokenEnd(line, q);
                    int idx = parseIndex(line, q, e, nv, name, lineNo);
                    if (n == poly.length) {
                        poly = Arrays.copyOf(poly, n * 2);
                    }
                    poly[n++] = idx;
                    q = e;
                }
                if (n < 3) {
                    throw InputException.at(name, lineNo, "facet has " + n + " vertices, at least 3 are needed");
                }
                if (nt + 3 * (n - 2) > tri.length) {
                    tri = Arrays.copyOf(tri, Math.max(tri.length * 2, nt + 3 * (n - 2)));
                }
                for (int k = 1; k + 1 < n; k++) {
                    tri[nt++] = poly[0];
                    tri[nt++] = poly[k];
                    tri[nt++] = poly[k + 1];
                }
                if (n > 3 && !isPlanar(xyz, poly, n)) {
                    if (nonPlanar++ == 0) {
                        firstNonPlanarLine = (int) lineNo;
                    }
                }
            }
        }
        if (nv == 0) {
            throw new InputException(name + ": empty model: no vertices ('v' lines) found");
        }
        if (nt == 0) {
            throw new InputException(name + ": empty model: no facets ('f' lines) found");
        }
        if (unknown > 0) {
            warnings.add(name + ":" + firstUnknownLine + ": " + unknown + " line(s) with unknown statements ignored "
                + "(first: " + Messages.quote(firstUnknown) + ")");
        }
        if (nonPlanar > 0) {
            warnings.add(name + ":" + firstNonPlanarLine + ": " + nonPlanar
                + " polygon(s) are not planar (out of plane by more than " + NON_PLANAR_TOLERANCE
                + " of their size); fan-triangulated from their first vertex");
        }
        return new Result(new TriangleMesh(Arrays.copyOf(xyz, 3 * nv), Arrays.copyOf(tri, nt)), warnings);
    }

    private static int skipSpace(String s, int p) {
        int n = s.length();
        while (p < n) {
            char c = s.charAt(p);
            if (c != ' ' && c != '\t' && c != '\r' && c != '\f') {
                break;
            }
            p++;
        }
        return p;
    }

    private static int tokenEnd(String s, int p) {
        int n = s.length();
        while (p < n) {
            char c = s.charAt(p);
            if (c == ' ' || c == '\t' || c == '\r' || c == '\f') {
                break;
            }
            p++;
        }
        return p;
    }

    private static double parseCoordinate(String s, int from, int to, String name, long lineNo) {
        if (!dev.cairn.io.Numbers.isDecimal(s, from, to)) {
            throw InputException.at(name, lineNo, "coordinate " + Messages.quote(s.substring(from, to))
                + " is not a number");
        }
        String tok = s.substring(from, to);
        double v = Double.parseDouble(tok);
        if (!Double.isFinite(v)) {
            throw InputException.at(name, lineNo, "coordinate " + Messages.quote(tok) + " is not a finite number");
        }
        return v;
    }

    /** Statements of the OBJ format that carry nothing the gravity model needs. */
    private static final java.util.Set<String> IGNORED = java.util.Set.of("vt", "vn", "vp", "o", "g", "s", "usemtl",
        "mtllib", "l", "p", "cstype", "deg", "bmat", "step", "curv", "curv2", "surf", "parm", "trim", "hole",
        "scrv", "sp", "end", "con", "mg", "bevel", "c_interp", "d_interp", "lod", "shadow_obj", "trace_obj",
        "ctech", "stech", "maplib", "usemap");

    /** Parses the vertex part of {@code i}, {@code i/t}, {@code i//n}, {@code i/t/n}; returns a 0-based index. */
    private static int parseIndex(String s, int from, int to, int nv, String name, long lineNo) {
        int slash = from;
        while (slash < to && s.charAt(slash) != '/') {
            slash++;
        }
        if (slash < to && !validRefTail(s, slash, to)) {
            throw InputException.at(name, lineNo, "facet vertex reference " + Messages.quote(s.substring(from, to))
                + " is not of the form i, i/t, i//n or i/t/n with integer indices");
        }
        long v = 0;
        boolean neg = false;
        int p = from;
        if (p < slash && (s.charAt(p) == '-' || s.charAt(p) == '+')) {
            neg = s.charAt(p) == '-';
            p++;
        }
        if (p == slash) {
            throw InputException.at(name, lineNo, "facet vertex reference " + Messages.quote(s.substring(from, to))
                + " is not an integer");
        }
        for (; p < slash; p++) {
            char c = s.charAt(p);
            if (c < '0' || c > '9' || v > Integer.MAX_VALUE) {
                throw InputException.at(name, lineNo,
                    "facet vertex reference " + Messages.quote(s.substring(from, to)) + " is not an integer");
            }
            v = v * 10 + (c - '0');
        }
        if (v == 0) {
            throw InputException.at(name, lineNo, "facet vertex index 0 is invalid (OBJ indices start at 1)");
        }
        long idx = neg ? nv - v : v - 1;
        if (idx < 0 || idx >= nv) {
            throw InputException.at(name, lineNo, "facet vertex index " + (neg ? -v : v) + " out of range ("
                + nv + " vertices defined so far)");
        }
        return (int) idx;
    }

    /** The part {@code /t}, {@code //n} or {@code /t/n} after the vertex index: optional signed integers. */
    private static boolean validRefTail(String s, int slash, int to) {
        int parts = 0;
        int p = slash;
        boolean emptyTexture = false;
        while (p < to) {
            if (s.charAt(p) != '/' || ++parts > 2) {
                return false;
            }
            p++;
            int q = p;
            if (q < to && (s.charAt(q) == '-' || s.charAt(q) == '+')) {
                q++;
            }
            int d = q;
            while (q < to && s.charAt(q) >= '0' && s.charAt(q) <= '9') {
                q++;
            }
            if (q == d) {
                if (q != p || parts == 2) {
                    return false; // a lone sign, or an empty normal index
                }
                emptyTexture = true;
            }
            p = q;
        }
        return !(emptyTexture && parts == 1);
    }

    /** Newell normal of the polygon and the largest distance of a vertex from its mean plane, relative to size. */
    private static boolean isPlanar(double[] xyz, int[] poly, int n) {
        double nx = 0;
        double ny = 0;
        double nz = 0;
        double cx = 0;
        double cy = 0;
        double cz = 0;
        for (int i = 0; i < n; i++) {
            int a = 3 * poly[i];
            int b = 3 * poly[(i + 1) % n];
            nx += (xyz[a + 1] - xyz[b + 1]) * (xyz[a + 2] + xyz[b + 2]);
            ny += (xyz[a + 2] - xyz[b + 2]) * (xyz[a] + xyz[b]);
            nz += (xyz[a] - xyz[b]) * (xyz[a + 1] + xyz[b + 1]);
            cx += xyz[a];
            cy += xyz[a + 1];
            cz += xyz[a + 2];
        }
        cx /= n;
        cy /= n;
        cz /= n;
        double nl = Math.sqrt(nx * nx + ny * ny + nz * nz);
        double size = 0;
        for (int i = 0; i < n; i++) {
            int a = 3 * poly[i];
            size = Math.max(size, Math.abs(xyz[a] - cx) + Math.abs(xyz[a + 1] - cy) + Math.abs(xyz[a + 2] - cz));
        }
        if (nl == 0 || size == 0) {
            return false;
        }
        double dev = 0;
        for (int i = 0; i < n; i++) {
            int a = 3 * poly[i];
            double d = ((xyz[a] - cx) * nx + (xyz[a + 1] - cy) * ny + (xyz[a + 2] - cz) * nz) / nl;
            dev = Math.max(dev, Math.abs(d));
        }
        return dev <= NON_PLANAR_TOLERANCE * size;
    }
}
