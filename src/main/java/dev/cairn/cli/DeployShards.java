package dev.cairn.cli;

import dev.cairn.body.BodyModel;
import dev.cairn.gravity.FieldModel;
import dev.cairn.io.InputException;
import dev.cairn.io.Messages;
import dev.cairn.io.StrictJson;
import dev.cairn.motion.DeploymentSettings;
import dev.cairn.motion.Landing;
import dev.cairn.tables.TableFiles;
import dev.cairn.tables.TableJob;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Shards of {@code cairn deploy}: {@code --shard I/N} computes the samples of index range I of N (the split rule of
 * table shards, {@link TableJob#shardRange}) and writes their {@code landings.csv} rows with {@code shard.json} (the
 * run's settings fingerprint and the range); {@code --merge-shards} reads the shards back, refusing any whose
 * fingerprint differs from the merge's own options or whose ranges do not tile {@code 0..count-1} exactly.
 * Samples are seeded by index ({@code Deployment.releaseState}), so the merged landings equal a single run's.
 */
final class DeployShards {
    /** Name of the shard description in a shard folder. */
    static final String SHARD_JSON = "shard.json";
    static final String FORMAT = "cairn deploy shard 1";

    private DeployShards() {
    }

    /** A parsed {@code --shard I/N}: index (1-based), count, and the sample range [first, end). */
    record Shard(int index, int count, int first, int end) {
    }

    /** Parses and checks {@code --shard I/N} against {@code samples} (one-line error otherwise). */
    static Shard parse(String text, int samples) {
        String t = text.strip();
        if (!t.matches("[0-9]{1,9}/[0-9]{1,9}")) {
            throw new InputException("--shard: expected I/N with 1 <= I <= N, got " + Messages.quote(text));
        }
        int i = Integer.parseInt(t.substring(0, t.indexOf('/')));
        int n = Integer.parseInt(t.substring(t.indexOf('/') + 1));
        if (n < 1 || i < 1 || i > n) {
            throw new InputException("--shard: expected I/N with 1 <= I <= N, got " + Messages.quote(text));
        }
        if (n > samples) {
            throw new InputException("--shard: " + n + " shards for " + samples + " samples (--count); give at most "
                + "one shard per sample");
        }
        int[] r = TableJob.shardRange(samples, i, n);
        return new Shard(i, n, r[0], r[1]);
    }

    /**
     * Everything that affects the landings: the model's content (SHA-256 of its files, length unit, density, GM),
     * the field (model, tolerance, table SHA-256), the spin, the integrator tolerance and every deployment setting.
     * File paths are left out (a shard computed elsewhere from the same files matches).
     */
    static Map<String, Object> fingerprint(BodyModel body, FieldModel field, Path table, double integratorTolerance,
                                           DeploymentSettings ds) {
        Map<String, Object> info = TableCommand.modelInfo(body, field);
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("model_sha256", info.get("sha256"));
        m.put("sidecar_sha256", info.get("sidecar_sha256"));
        m.put("files_sha256", new ArrayList<>(((Map<?, ?>) info.get("files_sha256")).values()));
        m.put("length_unit_of_file", body.lengthUnit());
        m.put("density_kg_m3", body.density());
        m.put("gm_m3_s2", body.gm());
        m.put("field", field.describe());
        m.put("field_tolerance", Double.isNaN(field.tolerance()) ? "exact" : field.tolerance());
        m.put("table_sha256", table == null ? null : TableFiles.sha256(table));
        m.put("spin_period_s", TrajectoryCommand.num(body.spin().periodSeconds()));
        m.put("spin_axis", body.spin().axis());
        m.put("integrator_tolerance", integratorTolerance);
        m.put("release_m", ds.release());
        m.put("velocity_m_s", ds.velocity());
        m.put("count", ds.count());
        m.put("position_sigma_m", ds.positionSigma());
        m.put("velocity_sigma_m_s", ds.velocitySigma());
        m.put("restitution_normal", ds.restitutionNormal());
        m.put("restitution_tangential", ds.restitutionTangential());
        m.put("seed", ds.seed());
        m.put("rest_speed_m_s", ds.restSpeed());
        m.put("rest_apex_m", ds.restApex());
        m.put("time_limit_s", ds.timeLimit());
        m.put("max_bounces", ds.maxBounces());
        return m;
    }

    /** Writes {@code shard.json} of a shard folder (atomically). */
    static void writeShardJson(Path dir, Map<String, Object> fingerprint, Shard s) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("format", FORMAT);
        m.put("caution", TrajectoryCommand.CAUTION);
        m.put("shard", s.index() + "/" + s.count());
        m.put("first_sample", s.first());
        m.put("end_sample", s.end());
        m.put("fingerprint_sha256", TableFiles.sha256(TableFiles.toJson(fingerprint)));
        m.put("fingerprint", fingerprint);
        dev.cairn.io.AtomicFiles.writeString(dir.resolve(SHARD_JSON), TableFiles.toJson(m));
    }

    /** One shard folder as read back. */
    private record Part(Path dir, int first, int end) {
    }

    /**
     * Reads the landings of every shard folder, checked against this run's {@code fingerprint} and {@code settings};
     * returns all landings in sample order.
     */
    static List<Landing> merge(List<Path> dirs, Map<String, Object> fingerprint, DeploymentSettings ds, int facets) {
        if (dirs.isEmpty() || dirs.size() > ds.count()) {
            throw new InputException("--merge-shards: expected 1 to " + ds.count() + " shard folders, got "
                + dirs.size());
        }
        Map<?, ?> want = normalised(fingerprint);
        List<Part> parts = new ArrayList<>();
        java.util.Set<Path> seen = new java.util.HashSet<>();
        for (Path d : dirs) {
            Path real;
            try {
                real = d.toRealPath();
            } catch (java.io.IOException e) {
                throw new InputException("--merge-shards: " + Messages.path(d) + ": no such shard folder");
            }
            if (!seen.add(real)) {
                throw new InputException("--merge-shards: " + Messages.path(d) + " is given twice");
            }
            Path js = d.resolve(SHARD_JSON);
            if (!Files.isRegularFile(js)) {
                throw new InputException("--merge-shards: " + Messages.path(d) + ": no " + SHARD_JSON + " (not a "
                    + "finished deploy shard)");
            }
            Map<String, Object> j = StrictJson.readObject(js, "bad shard description");
            StrictJson.Fields f = new StrictJson.Fields(j, js, "");
            if (!FORMAT.equals(f.string("format"))) {
                throw new InputException(Messages.path(js) + ": format " + Messages.quote(f.string("format"))
                    + " is not " + Messages.quote(FORMAT));
            }
            Object got = j.get("fingerprint");
            if (!(got instanceof Map<?, ?> gm)) {
                throw new InputException(Messages.path(js) + ": no fingerprint object");
            }
            for (Map.Entry<?, ?> e : want.entrySet()) {
                if (!java.util.Objects.equals(e.getValue(), gm.get(e.getKey()))) {
                    throw new InputException("--merge-shards: " + Messages.path(d) + " was computed with another "
                        + e.getKey() + " (" + Messages.line(String.valueOf(gm.get(e.getKey())), 80) + ", this merge: "
                        + Messages.line(String.valueOf(e.getValue()), 80) + "); merge with the options of the shards");
                }
            }
            if (!gm.keySet().equals(want.keySet())) {
                throw new InputException("--merge-shards: " + Messages.path(d) + ": its fingerprint has other keys "
                    + "than this version writes");
            }
            int first = f.integer("first_sample", 0, ds.count() - 1);
            int end = f.integer("end_sample", first + 1, ds.count());
            parts.add(new Part(d, first, end));
        }
        parts.sort(Comparator.comparingInt(Part::first));
        int next = 0;
        for (Part p : parts) {
            if (p.first() < next) {
                throw new InputException("--merge-shards: " + Messages.path(p.dir()) + " (samples " + p.first()
                    + " to " + (p.end() - 1) + ") overlaps another shard (samples below " + next + ")");
            }
            if (p.first() > next) {
                throw new InputException("--merge-shards: samples " + next + " to " + (p.first() - 1) + " are in no "
                    + "shard (missing shard folder?)");
            }
            next = p.end();
        }
        if (next != ds.count()) {
            throw new InputException("--merge-shards: samples " + next + " to " + (ds.count() - 1) + " are in no "
                + "shard (missing shard folder?)");
        }
        List<Landing> all = new ArrayList<>(ds.count());
        for (Part p : parts) {
            all.addAll(LandingsCsv.read(p.dir().resolve("landings.csv"), p.first(), p.end(), ds, facets));
        }
        return all;
    }

    /** The fingerprint as it reads back from JSON (numbers and lists in the types of the JSON reader). */
    private static Map<?, ?> normalised(Map<String, Object> fingerprint) {
        try {
            return StrictJson.MAPPER.readValue(TableFiles.toJson(fingerprint), Map.class);
        } catch (java.io.IOException e) {
            throw new IllegalStateException(e);
        }
    }
}
