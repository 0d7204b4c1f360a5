package dev.cairn.cli;

import dev.cairn.gravity.HarmonicCoefficients;
import dev.cairn.gravity.SolidHarmonics;
import dev.cairn.harmonics.HarmonicsFile;
import dev.cairn.body.BodyModel;
import dev.cairn.io.InputException;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.regions.RegionBody;
import dev.cairn.util.ParallelChunks;
import java.io.IOException;
import java.io.InputStream;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code cairn harmonics}: fully normalised spherical-harmonic coefficients of the body's exterior potential. */
@Command(name = "harmonics", mixinStandardHelpOptions = true,
    header = "Spherical-harmonic coefficients (normalised Cnm, Snm) of the body's gravity field.",
    description = {"Fully normalised coefficients Cbar_nm, Sbar_nm (4pi normalisation, no Condon-Shortley phase) of the",
        "exterior potential of the constant-density polyhedron (a body description: its regions superposed), to degree",
        "and order N, exact up to rounding (cone formula over the facets, exact triangle rule). Default origin the centre",
        "of mass, default reference radius the Brillouin radius about the origin; axes of the model frame.",
        "The series converges only outside the Brillouin sphere. Output: JSON (or CSV by extension) with GM, reference",
        "radius, origin and the model's SHA-256. See docs/harmonics.md.",
        "Caution: results must be verified independently before operational use; mission rules and the",
        "responsible flight-dynamics authority decide."})
public final class HarmonicsCommand implements Callable<Integer> {
    @Mixin
    ModelOptions model = new ModelOptions();

    @Option(names = "--degree", required = true, paramLabel = "N", description = "Largest degree and order, 0 to "
        + HarmonicCoefficients.MAX_DEGREE + ".")
    int degree;

    @Option(names = "--reference-radius", paramLabel = "M", description = "Reference radius R, metres (default: the "
        + "Brillouin radius about the origin).")
    Double referenceRadius;

    @Option(names = "--origin", paramLabel = "com|model", description = "Origin of the expansion: the centre of mass "
        + "or the model frame's origin (default: ${DEFAULT-VALUE}).")
    String origin = "com";

    @Option(names = "--out", paramLabel = "FILE", description = "Write the coefficients: FILE.json, or FILE.csv "
        + "(n,m,c,s rows with the metadata as # lines).")
    Path out;

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads (default: all processors).")
    int threads = ParallelChunks.defaultThreads();

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    /** Bytes of scratch per thread and per block of the moment computation, for the memory check. */
    static long bytesNeeded(long facets, int degree, int threads) {
        long size = SolidHarmonics.size(degree);
        long blocks = (facets + 511) / 512;
        return 16L * size * (blocks + 2L * threads + 8);
    }

    @Override
    public Integer call() throws IOException {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        if (degree < 0) {
            throw new InputException("--degree must be 0 or more, got " + degree);
        }
        if (degree > HarmonicCoefficients.MAX_DEGREE) {
            throw new InputException("--degree " + degree + " is above the largest supported degree "
                + HarmonicCoefficients.MAX_DEGREE + " (the exact triangle rule's limit)");
        }
        if (referenceRadius != null && !(referenceRadius >= HarmonicCoefficients.MIN_RADIUS_M
            && referenceRadius <= HarmonicCoefficients.MAX_RADIUS_M)) {
            throw new InputException("--reference-radius must be between " + HarmonicCoefficients.MIN_RADIUS_M
                + " and " + HarmonicCoefficients.MAX_RADIUS_M + " m, got " + referenceRadius);
        }
        String o = origin.toLowerCase(Locale.ROOT);
        if (!o.equals("com") && !o.equals("model")) {
            throw new InputException("--origin: unknown origin '" + origin + "' (use com or model)");
        }
        int nThreads = Math.max(1, threads);
        BodyModel body = model.load(null);
        for (String w : body.warnings()) {
            err.println("cairn: warning: " + w);
        }
        double[] c = o.equals("com") ? body.massProperties().centerOfMass() : null;
        long t0 = System.nanoTime();
        Computed r = compute(body, degree, c, referenceRadius, nThreads);
        HarmonicCoefficients h = r.coefficients();
        double seconds = (System.nanoTime() - t0) * 1e-9;
        long facets = r.facets();
        List<Path> files = r.files();
        String originText = o.equals("com") ? "centre of mass" : "model frame origin";
        String sha = sha256(files);
        print(out, body, h, originText, referenceRadius == null, seconds, facets, nThreads);
        if (this.out != null) {
            HarmonicsFile.write(this.out, h, new HarmonicsFile.Source(body.source().toString(), sha, originText));
            err.println("cairn: wrote " + this.out);
        }
        err.flush();
        return 0;
    }

    /** Coefficients of a body with the files that define it and its facet count. */
    record Computed(HarmonicCoefficients coefficients, List<Path> files, long facets) {
    }

    /**
     * Coefficients of {@code body} (its polyhedron, or its regions superposed with their density contrasts) to
     * {@code degree}, about {@code origin} (null: the model frame's origin) with reference radius {@code ref} (null:
     * the Brillouin radius about the origin); checks the memory needed first.
     */
    static Computed compute(BodyModel body, int degree, double[] origin, Double ref, int threads) {
        if (degree < 0) {
            throw new InputException("--degree must be 0 or more, got " + degree);
        }
        if (degree > HarmonicCoefficients.MAX_DEGREE) {
            throw new InputException("--degree " + degree + " is above the largest supported degree "
                + HarmonicCoefficients.MAX_DEGREE + " (the exact triangle rule's limit)");
        }
        List<TriangleMesh> meshes = new ArrayList<>();
        List<Double> dens = new ArrayList<>();
        List<Path> files = new ArrayList<>();
        files.add(body.source());
        RegionBody regions = body.regions();
        if (regions != null) {
            if (regions.hasGradient()) {
                throw new InputException(body.source() + ": a region has a density gradient; coefficients need "
                    + "constant region densities");
            }
            List<RegionBody.Region> list = regions.regions();
            for (RegionBody.Region r : list) {
                meshes.add(r.mesh());
                dens.add(r.parent() < 0 ? r.density() : r.density() - list.get(r.parent()).density());
                files.add(r.shape());
            }
        } else {
            body.requireFitForGravity();
            body.requireDensity();
            meshes.add(body.mesh());
            dens.add(body.density());
        }
        long facets = 0;
        for (TriangleMesh m : meshes) {
            facets += m.facetCount();
        }
        long need = bytesNeeded(facets, degree, threads);
        Runtime rt = Runtime.getRuntime();
        long free = rt.maxMemory() - (rt.totalMemory() - rt.freeMemory());
        if (need > free) {
            throw new InputException(String.format(Locale.ROOT, "--degree %d on %d facets needs about %d MB, only %d "
                + "MB free (lower --degree or raise the heap)", degree, facets, need >> 20, free >> 20));
        }
        double[] c = origin != null ? origin.clone() : new double[3];
        double rb = 0;
        for (TriangleMesh m : meshes) {
            rb = Math.max(rb, HarmonicCoefficients.maxDistance(m, c));
        }
        double r = ref != null ? ref : rb;
        double[] d = new double[dens.size()];
        for (int i = 0; i < d.length; i++) {
            d[i] = dens.get(i);
        }
        return new Computed(HarmonicCoefficients.ofPolyhedra(meshes, d, c, r, degree, threads), files, facets);
    }

    private static void print(PrintWriter out, BodyModel body, HarmonicCoefficients h, String originText,
                              boolean defaultRadius, double seconds, long facets, int threads) {
        double[] c = h.origin();
        out.println("Body: " + body.source() + " (" + body.name() + ")");
        out.printf(Locale.ROOT, "GM: %.9e m^3/s^2%n", h.gm());
        out.printf(Locale.ROOT, "Origin: %s (%.6f, %.6f, %.6f) m; axes of the model frame%n", originText, c[0], c[1],
            c[2]);
        out.printf(Locale.ROOT, "Brillouin radius about the origin: %.6f m (the series converges only outside it)%n",
            h.brillouinRadius());
        out.printf(Locale.ROOT, "Reference radius: %.6f m%s%n", h.referenceRadius(),
            defaultRadius ? " (the Brillouin radius)" : "");
        out.println("Normalisation: 4pi full normalisation, no Condon-Shortley phase");
        out.printf(Locale.ROOT, "Degree and order: %d (%d coefficient pairs), computed in %.3f s on %d facets, %d "
            + "thread(s)%n", h.degree(), SolidHarmonics.size(h.degree()), seconds, facets, threads);
        out.printf(Locale.ROOT, "Method: exact triangle rule on meshes under %d facets, clustered facet moments "
            + "above (docs/harmonics.md); bound on each coefficient's truncation error %.1e (rounding excluded)%n",
            HarmonicCoefficients.CLUSTERED_MIN_FACETS, h.truncationBound());
        if (h.degree() >= 1) {
            out.printf(Locale.ROOT, "  Cbar10 = %+.12e  Cbar11 = %+.12e  Sbar11 = %+.12e%n", h.c(1, 0), h.c(1, 1),
                h.s(1, 1));
        }
        if (h.degree() >= 2) {
            out.printf(Locale.ROOT, "  Cbar20 = %+.12e%n", h.c(2, 0));
            out.printf(Locale.ROOT, "  Cbar21 = %+.12e  Sbar21 = %+.12e%n", h.c(2, 1), h.s(2, 1));
            out.printf(Locale.ROOT, "  Cbar22 = %+.12e  Sbar22 = %+.12e%n", h.c(2, 2), h.s(2, 2));
            out.printf(Locale.ROOT, "  J2 = -C20 = %+.12e  C22 = %+.12e  S22 = %+.12e (unnormalised)%n",
                -h.cUnnormalised(2, 0), h.cUnnormalised(2, 2), h.sUnnormalised(2, 2));
        }
        out.println(HarmonicsFile.CAUTION);
        out.flush();
    }

    /** SHA-256 (hex) of the model file, followed by the region shape files of a body description. */
    static String sha256(List<Path> files) {
        try {
            MessageDigest md = MessageDigest.getInstance("SHA-256");
            byte[] buf = new byte[1 << 16];
            for (Path p : files) {
                if (p == null || !Files.isRegularFile(p)) {
                    continue;
                }
                try (InputStream in = Files.newInputStream(p)) {
                    int k;
                    while ((k = in.read(buf)) > 0) {
                        md.update(buf, 0, k);
                    }
                }
            }
            return HexFormat.of().formatHex(md.digest());
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        } catch (IOException e) {
            throw new InputException("cannot read " + files.get(0) + " for its SHA-256: " + e.getMessage(), e);
        }
    }
}
