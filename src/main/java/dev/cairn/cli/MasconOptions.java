package dev.cairn.cli;

import dev.cairn.gravity.FieldModel;
import dev.cairn.body.BodyModel;
import dev.cairn.io.InputException;
import dev.cairn.mascon.DensityModel;
import dev.cairn.mascon.MasconField;
import dev.cairn.mascon.MasconGenerator;
import dev.cairn.mascon.MasconMatch;
import dev.cairn.mascon.MasconReport;
import dev.cairn.mascon.MasconSet;
import java.io.PrintWriter;
import java.util.Locale;
import picocli.CommandLine.Option;

/**
 * Options choosing the field model of a body: the polyhedron (exact; a body description: the regions'
 * superposition) or a mascon set of a given size and scheme. Shared by {@code field} and {@code compare}.
 */
public final class MasconOptions {
    @Option(names = "--model", paramLabel = "polyhedron|mascon|harmonics", description = "Field model (default: "
        + "${DEFAULT-VALUE}); harmonics: the spherical-harmonic series of --degree N about the centre of mass "
        + "(or of --coefficients FILE.json), valid only outside the Brillouin sphere (docs/harmonics.md).")
    String model = "polyhedron";

    @Option(names = "--degree", paramLabel = "N", description = "Degree of --model harmonics (0 to 60; default: "
        + "that of --coefficients).")
    Integer degree;

    @Option(names = "--coefficients", paramLabel = "FILE", description = "Coefficient file (JSON of cairn "
        + "harmonics) for --model harmonics.")
    java.nio.file.Path coefficients;

    @Option(names = "--mascons", paramLabel = "N", description = "Target number of mascons for --model mascon "
        + "(default: ${DEFAULT-VALUE}).")
    int mascons = 10000;

    /**
     * Default mascon scheme: the cubic lattice, more accurate above the surface than the tetrahedral set of the same
     * count on both bodies measured in docs/mascons.md.
     */
    static final String DEFAULT_SCHEME = "lattice";

    @Option(names = "--mascon-scheme", paramLabel = "lattice|tetra", description = "Mascon generation: cubic "
        + "lattice or facet tetrahedra split in shells (default: ${DEFAULT-VALUE}, the more accurate above the "
        + "surface; tetra keeps mass and centre of mass exact; see docs/mascons.md).")
    String scheme = DEFAULT_SCHEME;

    @Option(names = "--match-inertia", negatable = true, description = "Adjust the mascon masses so that the set "
        + "has the body's quadrupole (inertia tensor up to its trace) too, not only its mass and centre of mass "
        + "(default: on for the lattice, off for tetra, where it would hurt the field near the surface; see "
        + "docs/mascons.md).")
    Boolean matchInertia;

    @Option(names = "--match-full-inertia", description = "Match the full inertia tensor, trace included (usually "
        + "worse far away: the trace does not enter the exterior field; see docs/mascons.md).")
    boolean matchFullInertia;

    /** Most mascons one run generates (generation and evaluation time grow with the count). */
    static final int MAX_MASCONS = 10_000_000;
    /** Bytes per mascon while a set is generated and held (positions, masses, lattice and shell scratch). */
    static final double BYTES_PER_MASCON = 160;

    /** Refuses a mascon count above {@link #MAX_MASCONS} or beyond the heap, before anything is allocated. */
    static void requireMasconCount(String option, long count, boolean zeroAllowed) {
        if (count < (zeroAllowed ? 0 : 1) || count > MAX_MASCONS) {
            throw new InputException(option + ": must be from " + (zeroAllowed ? 0 : 1) + " to " + MAX_MASCONS
                + ", got " + count);
        }
        dev.cairn.io.MemoryBudget.require(BYTES_PER_MASCON * count, option + " " + count);
    }

    /** The mascon set of {@code body} with these options' count and scheme, moments matched with the inertia. */
    static MasconSet generate(BodyModel body, String scheme, int count, int threads) {
        return generate(body, scheme, count, threads, null, null);
    }

    /** The moments to match: the option's choice, else the scheme's default. */
    static MasconMatch.Moments moments(String scheme, Boolean inertia, boolean full) {
        if (full) {
            return MasconMatch.Moments.INERTIA;
        }
        if (inertia != null) {
            return inertia ? MasconMatch.Moments.QUADRUPOLE : MasconMatch.Moments.CENTRE;
        }
        MasconGenerator.Scheme s;
        try {
            s = MasconGenerator.Scheme.parse(scheme);
        } catch (IllegalArgumentException e) {
            throw new InputException("--mascon-scheme: " + e.getMessage());
        }
        return MasconMatch.defaultMoments(s);
    }

    /**
     * The mascon set of {@code body} with the given count and scheme, its masses adjusted ({@link MasconMatch}) to
     * the body's mass and centre of mass and the chosen second moments (null: the scheme's default,
     * {@link MasconMatch#defaultMoments}). Not adjusted for a body
     * with a density gradient (the reference moments there know only the constant densities).
     *
     * @param notes receives one line about the adjustment (may be null)
     */
    static MasconSet generate(BodyModel body, String scheme, int count, int threads, MasconMatch.Moments moments,
                              java.util.List<String> notes) {
        if (count < 1) {
            throw new InputException("--mascons must be at least 1, got " + count);
        }
        requireMasconCount("--mascons", count, false);
        MasconGenerator.Scheme s;
        try {
            s = MasconGenerator.Scheme.parse(scheme);
        } catch (IllegalArgumentException e) {
            throw new InputException("--mascon-scheme: " + e.getMessage());
        }
        DensityModel density;
        if (body.regions() != null) {
            density = body.regions().densityModel();
        } else {
            body.requireFitForGravity();
            body.requireDensity();
            density = DensityModel.uniform(body.mesh(), body.density());
        }
        MasconSet raw;
        try (ProgressBar bar = new ProgressBar("mascons")) {
            raw = MasconGenerator.generate(s, density, count, threads, bar);
        }
        if (body.regions() != null && body.regions().hasGradient()) {
            if (notes != null) {
                notes.add("masses not adjusted: the body has a density gradient, its reference moments do not");
            }
            return raw;
        }
        MasconMatch.Result r = MasconMatch.match(raw, body.massProperties(),
            moments != null ? moments : MasconMatch.defaultMoments(s));
        if (notes != null) {
            notes.add(r.note());
        }
        return r.set();
    }

    /** True when the options leave the default, the body's own polyhedron field. */
    boolean polyhedron() {
        return model.toLowerCase(Locale.ROOT).equals("polyhedron") && degree == null && coefficients == null;
    }

    /** Builds the chosen field model; for mascons, prints the mass-property report to {@code err}. */
    FieldModel build(BodyModel body, int threads, PrintWriter err) {
        if (model.toLowerCase(Locale.ROOT).equals("harmonics")) {
            return harmonics(body, degree, coefficients, threads);
        }
        if (degree != null || coefficients != null) {
            throw new InputException("--degree and --coefficients need --model harmonics");
        }
        return build(body, model, mascons, scheme, moments(scheme, matchInertia, matchFullInertia), threads, err);
    }

    /**
     * The spherical-harmonic field: of the coefficient file (truncated to {@code degree} when given), else of the
     * body to {@code degree} about its centre of mass with the Brillouin radius as reference radius.
     */
    static FieldModel harmonics(BodyModel body, Integer degree, java.nio.file.Path file, int threads) {
        if (degree != null && (degree < 0 || degree > dev.cairn.gravity.HarmonicCoefficients.MAX_DEGREE)) {
            throw new InputException("--degree must be 0 to " + dev.cairn.gravity.HarmonicCoefficients.MAX_DEGREE
                + ", got " + degree);
        }
        if (file != null) {
            dev.cairn.gravity.HarmonicCoefficients h = dev.cairn.harmonics.HarmonicsFile.read(file);
            if (degree != null && degree > h.degree()) {
                throw new InputException("--degree " + degree + " is above the degree " + h.degree() + " of " + file);
            }
            return new dev.cairn.gravity.HarmonicField(degree == null ? h : h.truncated(degree));
        }
        if (degree == null) {
            throw new InputException("--model harmonics needs --degree N or --coefficients FILE.json");
        }
        return new dev.cairn.gravity.HarmonicField(HarmonicsCommand.compute(body, degree,
            body.massProperties().centerOfMass(), null, threads).coefficients());
    }

    /** As {@link #build(BodyModel, int, PrintWriter)} for a job of about {@code points} field points. */
    FieldModel build(BodyModel body, long points, int threads, PrintWriter err) {
        return model.toLowerCase(Locale.ROOT).equals("polyhedron") && degree == null && coefficients == null
            ? body.fieldModel(points) : build(body, threads, err);
    }

    static FieldModel build(BodyModel body, String model, int mascons, String scheme, MasconMatch.Moments moments,
                            int threads,
                            PrintWriter err) {
        switch (model.toLowerCase(Locale.ROOT)) {
            case "polyhedron":
                return body.fieldModel();
            case "mascon":
            case "mascons":
                java.util.List<String> notes = new java.util.ArrayList<>();
                MasconSet set = generate(body, scheme, mascons, threads, moments, notes);
                err.print(indent(set.scheme() + "\n" + String.join("\n", notes) + "\n"
                    + MasconReport.of(set, body.massProperties()).text()));
                err.flush();
                return new MasconField(set);
            default:
                String lower = model.toLowerCase(Locale.ROOT);
                if (lower.startsWith("harmonics:")) { // harmonics:N or harmonics:FILE.json (compare's --test, --reference)
                    String arg = model.substring("harmonics:".length());
                    if (arg.matches("[0-9]{1,4}")) {
                        return harmonics(body, Integer.parseInt(arg), null, threads);
                    }
                    return harmonics(body, null, java.nio.file.Path.of(arg), threads);
                }
                if (lower.equals("harmonics")) {
                    throw new InputException("--model harmonics: give the degree, e.g. harmonics:20, or a "
                        + "coefficient file, harmonics:FILE.json");
                }
                throw new InputException("--model: unknown field model '" + model + "' (use polyhedron, mascon or "
                    + "harmonics:N)");
        }
    }

    /** Warns on {@code err} when evaluations came closer to a mascon than its local spacing. */
    static void warnTooClose(FieldModel field, int points, PrintWriter err) {
        if (field instanceof dev.cairn.gravity.HarmonicField h && h.insideCount() > 0) {
            err.println(String.format(Locale.ROOT, "cairn: warning: %d of %d point(s) lie inside the Brillouin "
                + "sphere (radius %.6g m) of the spherical-harmonic model, where the series diverges: its values "
                + "there are not valid", h.insideCount(), points, h.convergenceRadius()));
            err.flush();
        }
        if (field instanceof MasconField) {
            long close = ((MasconField) field).tooCloseCount();
            if (close > 0) {
                err.println("cairn: warning: " + ((MasconField) field).count() + " mascons: " + close + " of "
                    + points + " point(s) lie closer to a mascon than its local spacing: point masses model the field poorly there (use the polyhedron)");
                err.flush();
            }
        }
    }

    private static String indent(String s) {
        StringBuilder b = new StringBuilder();
        for (String line : s.split("\n")) {
            b.append("cairn: ").append(line).append('\n');
        }
        return b.toString();
    }
}
