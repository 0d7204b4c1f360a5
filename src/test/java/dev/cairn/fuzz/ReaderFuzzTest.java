package dev.cairn.fuzz;

import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.cli.CairnMain;
import dev.cairn.io.InputException;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;
import java.util.concurrent.Callable;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Seeded fuzz tests of every reader, run in-process through the command line ({@link CairnMain#execute}) with
 * captured output. Each case must end with exit code 0 or 2, within a time limit; its standard error must be lines
 * of at most 300 characters starting with {@code cairn: }, free of control characters, with exactly one error line
 * on exit 2 and no stack trace; an exit-0 run on finite input must not write NaN or infinity, and a resumed or
 * merged table made from damaged state must never silently differ from the reference (project rule: bad input is
 * one line and exit 2; common practice for fuzzing, no source).
 *
 * <p>Short by default (a few hundred cases per reader, well within a minute for all of them). The long campaign:
 * {@code mvn -o -B test -Dtest=ReaderFuzzTest -Dcairn.fuzz.long=true} (thousands of cases per reader; the count can
 * be set with {@code -Dcairn.fuzz.cases=N}, the seed with {@code -Dcairn.fuzz.seed=S}). Summary lines
 * {@code fuzz: reader ...} report the counts of each failure kind.
 */
class ReaderFuzzTest {
    static final boolean LONG = Boolean.getBoolean("cairn.fuzz.long");
    static final long SEED = Long.getLong("cairn.fuzz.seed", 20261202L);
    /** Time limit of one case, ms: generous, for a loaded shared machine; a hang is far beyond it. */
    static final long CASE_LIMIT_MS = LONG ? 30_000 : 15_000;
    static final int MAX_LINE = 300;

    @TempDir
    Path dir;

    static int cases(int shortCount) {
        return LONG ? Integer.getInteger("cairn.fuzz.cases", 2000) : shortCount;
    }

    // ---------------------------------------------------------------- fixtures

    /** A box of 1000 x 800 x 600 m with one corner pulled out (no symmetry), 12 facets, outward. */
    static final String BOX_OBJ = "# fuzz fixture\n"
        + "v -500 -400 -300\nv 500 -400 -300\nv 500 400 -300\nv -500 400 -300\n"
        + "v -500 -400 300\nv 500 -400 300\nv 650 520 380\nv -500 400 300\n"
        + "f 1 3 2\nf 1 4 3\nf 5 6 7\nf 5 7 8\nf 1 2 6\nf 1 6 5\nf 2 3 7\nf 2 7 6\nf 3 4 8\nf 3 8 7\n"
        + "f 4 1 5\nf 4 5 8\n";
    static final String CORE_OBJ = "v -100 -100 -100\nv 100 -100 -100\nv 100 100 -100\nv -100 100 -100\n"
        + "v -100 -100 100\nv 100 -100 100\nv 100 100 100\nv -100 100 100\n"
        + "f 1 3 2\nf 1 4 3\nf 5 6 7\nf 5 7 8\nf 1 2 6\nf 1 6 5\nf 2 3 7\nf 2 7 6\nf 3 4 8\nf 3 8 7\n"
        + "f 4 1 5\nf 4 5 8\n";
    static final String SIDECAR = "{\n  \"name\": \"fuzz box\",\n  \"length_unit\": \"m\",\n  \"density_kg_m3\": 2000,\n"
        + "  \"spin_period_s\": 16000,\n  \"spin_axis\": [0.1, 0, 1]\n}\n";
    static final String POINTS = "x_m,y_m,z_m\n2000,0,0\n0,-1500,300\n# comment\n100,200,2500\n-3000,-3000,-3000\n";
    static final String DESCRIPTION = "{\n  \"name\": \"fuzz body\",\n  \"length_unit\": \"m\",\n"
        + "  \"spin_period_s\": 20000,\n  \"regions\": [\n"
        + "    {\"name\": \"mantle\", \"shape\": \"outer.obj\", \"density_kg_m3\": 1800},\n"
        + "    {\"name\": \"core\", \"shape\": \"core.obj\", \"density_kg_m3\": 3200}\n  ]\n}\n";
    static final String[] OBJ_LINES = {"v1 2 3", "V 1 2 3", "\uFEFFv 0 0 0", "f 1/a/b 2 3", "f 1 2", "f 1 1 1",
        "v 0x1p3 0 0", "v 1f 2d 3", "f 0 1 2", "f 1 2 99", "f -1 -2 -3", "v 1e400 0 0", "v 0 0 0", "f 1 2 3",
        "f 1 3 2", "vt 0 0", "o x", "v 1e100 1e100 1e100", "v 1e-150 0 0", "f 1 2 3 4 5 6 7 8", "v 0 0", "f 2 3 2"};

    static Path write(Path file, String text) {
        return write(file, text.getBytes(StandardCharsets.UTF_8));
    }

    static Path write(Path file, byte[] bytes) {
        try {
            Files.createDirectories(file.toAbsolutePath().getParent());
            Files.write(file, bytes);
            return file;
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    // ---------------------------------------------------------------- one case

    /** Counts of one reader's campaign. */
    static final class Stats {
        final String reader;
        int cases;
        int exit0;
        int exit2;
        int exit1;
        int thrown;
        int hang;
        int nan;
        int longLine;
        int control;
        int badLines;
        int wrong;
        final List<String> examples = new ArrayList<>();

        Stats(String reader) {
            this.reader = reader;
        }

        int failures() {
            return exit1 + thrown + hang + nan + longLine + control + badLines + wrong;
        }

        void example(String kind, String what) {
            if (examples.size() < 12) {
                examples.add(kind + ": " + (what.length() > 400 ? what.substring(0, 400) + "..." : what));
            }
        }

        String summary() {
            return "fuzz: reader " + reader + ": cases " + cases + ", exit0 " + exit0 + ", exit2 " + exit2
                + ", exit1 " + exit1 + ", uncaught " + thrown + ", hangs " + hang + ", nan " + nan + ", long lines "
                + longLine + ", control chars " + control + ", bad stderr " + badLines + ", silently wrong " + wrong;
        }

        void finish() {
            System.out.println(summary());
            for (String e : examples) {
                System.out.println("fuzz:   " + e.replaceAll("[\\p{Cntrl}\\u202e\\u2028\\uFEFF]", "?"));
            }
            assertTrue(failures() == 0, summary() + "\n" + String.join("\n", examples));
        }
    }

    /** What a case produced. */
    record Outcome(int exit, String out, String err) {
    }

    /** Runs {@code body} in its own thread with the time limit; a timed-out case is stopped and counted. */
    @SuppressWarnings({"deprecation", "removal"})
    static Outcome limited(Stats st, String label, Callable<Outcome> body) {
        Outcome[] box = new Outcome[1];
        Throwable[] fail = new Throwable[1];
        Thread t = new Thread(() -> {
            try {
                box[0] = body.call();
            } catch (Throwable e) {
                fail[0] = e;
            }
        }, "fuzz-case");
        t.setDaemon(true);
        t.start();
        try {
            t.join(CASE_LIMIT_MS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        if (t.isAlive()) {
            st.hang++;
            st.example("hang", label);
            t.interrupt();
            try {
                Thread.class.getMethod("stop").invoke(t);
                t.join(5000);
            } catch (ReflectiveOperationException | InterruptedException | UnsupportedOperationException ignored) {
                // the thread keeps running as a daemon; the case is already counted
            }
            return null;
        }
        if (fail[0] != null) {
            st.thrown++;
            st.example("uncaught " + fail[0], label);
            return null;
        }
        return box[0];
    }

    /** One CLI case: runs, checks exit code and stderr, returns the outcome (null when it hung or threw). */
    static Outcome cli(Stats st, String... args) {
        st.cases++;
        String label = String.join(" ", args);
        Outcome o = limited(st, label, () -> {
            StringWriter out = new StringWriter();
            StringWriter err = new StringWriter();
            int code = CairnMain.execute(new PrintWriter(out), new PrintWriter(err), args);
            return new Outcome(code, out.toString(), err.toString());
        });
        if (o != null) {
            check(st, o, label);
        }
        return o;
    }

    /** A library-level case (a reader called directly): InputException counts as exit 2. */
    static Outcome direct(Stats st, String label, Runnable body) {
        st.cases++;
        Outcome o = limited(st, label, () -> {
            try {
                body.run();
                return new Outcome(0, "", "");
            } catch (InputException e) {
                return new Outcome(2, "", "cairn: error: " + e.getMessage() + "\n");
            } catch (RuntimeException e) {
                return new Outcome(1, "", "cairn: internal error: " + e + "\n");
            }
        });
        if (o != null) {
            check(st, o, label);
        }
        return o;
    }

    static void check(Stats st, Outcome o, String label) {
        String ex = label + " -> exit " + o.exit + ": " + o.err.strip();
        if (o.exit == 0) {
            st.exit0++;
        } else if (o.exit == 2) {
            st.exit2++;
        } else {
            st.exit1++;
            st.example("exit " + o.exit, ex);
        }
        String[] lines = o.err.isEmpty() ? new String[0] : o.err.split("\n", -1);
        int errorLines = 0;
        boolean longL = false;
        boolean ctrl = false;
        boolean bad = false;
        for (int i = 0; i < lines.length; i++) {
            String l = lines[i];
            if (i == lines.length - 1 && l.isEmpty()) {
                continue;
            }
            if (l.length() > MAX_LINE) {
                longL = true;
            }
            if (hasControl(l)) {
                ctrl = true;
            }
            if (!l.startsWith("cairn: ") || l.contains("Exception") && l.contains("\tat ")) {
                bad = true;
            }
            if (l.startsWith("cairn: error: ") || l.startsWith("cairn: internal error: ")) {
                errorLines++;
            }
        }
        if (o.exit == 2 && errorLines != 1) {
            bad = true;
        }
        if (longL) {
            st.longLine++;
            st.example("long line", label + " -> " + o.err.length() + " chars");
        }
        if (ctrl) {
            st.control++;
            st.example("control char", ex);
        }
        if (bad) {
            st.badLines++;
            st.example("bad stderr", ex);
        }
    }

    static boolean hasControl(String l) {
        for (int i = 0; i < l.length(); i++) {
            char c = l.charAt(i);
            if (c < 0x20 || c == 0x7f || (c >= 0x80 && c < 0xa0) || c == '\u202e' || c == '\u202d' || c == '\u2028'
                || c == '\u2029' || c == '\uFEFF' || (c >= '\u2066' && c <= '\u2069') || (c >= '\u202a' && c <= '\u202c')) {
                return true;
            }
        }
        return false;
    }

    static void noNanText(Stats st, Outcome o, String label) {
        if (o != null && o.exit == 0 && (o.out.contains("NaN") || o.out.contains("Infinity"))) {
            st.nan++;
            st.example("nan", label + " -> " + o.out.substring(0, Math.min(300, o.out.length())));
        }
    }

    /** True when a written .npy (or raw .f64) holds a NaN or infinity. */
    static boolean npyHasNonFinite(Path file) throws IOException {
        byte[] b = Files.readAllBytes(file);
        int start = 0;
        if (b.length > 10 && b[0] == (byte) 0x93) {
            start = 10 + ((b[8] & 0xff) | (b[9] & 0xff) << 8);
        }
        ByteBuffer bb = ByteBuffer.wrap(b).order(ByteOrder.LITTLE_ENDIAN);
        for (int i = start; i + 8 <= b.length; i += 8) {
            if (!Double.isFinite(bb.getDouble(i))) {
                return true;
            }
        }
        return false;
    }

    static void deleteTree(Path p) {
        if (!Files.exists(p)) {
            return;
        }
        try (Stream<Path> s = Files.walk(p)) {
            s.sorted(Comparator.reverseOrder()).forEach(q -> q.toFile().delete());
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    static void copyTree(Path from, Path to) throws IOException {
        try (Stream<Path> s = Files.walk(from)) {
            for (Path p : (Iterable<Path>) s::iterator) {
                Path q = to.resolve(from.relativize(p).toString());
                if (Files.isDirectory(p)) {
                    Files.createDirectories(q);
                } else {
                    Files.copy(p, q);
                }
            }
        }
    }

    // ---------------------------------------------------------------- readers

    @Test
    void objReader() {
        Stats st = new Stats("obj");
        Mutator m = new Mutator(SEED);
        byte[] base = BOX_OBJ.getBytes(StandardCharsets.UTF_8);
        Path pts = write(dir.resolve("pts.csv"), POINTS);
        int n = cases(260);
        for (int i = 0; i < n; i++) {
            Path c = dir.resolve("case" + (i % 4));
            Path obj = write(c.resolve("body.obj"), m.mutateText(base, OBJ_LINES));
            int kind = i % 10;
            if (kind < 4) {
                cli(st, "inspect", obj.toString(), "--density", "2000");
            } else if (kind < 9) {
                noNanText(st, cli(st, "field", obj.toString(), "--density", "2000", "--points", pts.toString(),
                    "--gradient", "--threads", "1"), "field " + obj);
            } else {
                Path out = c.resolve("survey");
                Outcome o = cli(st, "survey", obj.toString(), "--density", "2000", "--threads", "1", "--out",
                    out.toString());
                deleteTree(out);
            }
        }
        st.finish();
    }

    @Test
    void sidecarReader() {
        Stats st = new Stats("sidecar");
        Mutator m = new Mutator(SEED + 1);
        Path obj = write(dir.resolve("box.obj"), BOX_OBJ);
        Path pts = write(dir.resolve("pts.csv"), POINTS);
        byte[] base = SIDECAR.getBytes(StandardCharsets.UTF_8);
        int n = cases(260);
        for (int i = 0; i < n; i++) {
            write(dir.resolve("box.json"), m.mutateJson(base));
            if (i % 2 == 0) {
                cli(st, "inspect", obj.toString());
            } else {
                noNanText(st, cli(st, "field", obj.toString(), "--points", pts.toString(), "--threads", "1"),
                    "field with sidecar");
            }
        }
        st.finish();
    }

    @Test
    void pointsCsvReader() {
        Stats st = new Stats("points-csv");
        Mutator m = new Mutator(SEED + 2);
        Path obj = write(dir.resolve("box.obj"), BOX_OBJ);
        byte[] base = POINTS.getBytes(StandardCharsets.UTF_8);
        int n = cases(260);
        for (int i = 0; i < n; i++) {
            Path pts = write(dir.resolve("pts.csv"), m.mutateText(base, new String[] {"1e200,0,0", "1e155,1e155,0",
                "0,0,0", "-500,-400,-300", "1,2", "1,2,3,4", "\uFEFFx,y,z", "1e400,0,0", "0x1p3,0,0", "1f,2,3"}));
            noNanText(st, cli(st, "field", obj.toString(), "--density", "2000", "--points", pts.toString(),
                "--threads", "1"), "field points " + pts);
        }
        st.finish();
    }

    /**
     * The field-model options (--tolerance, --exact) on field and survey, with hostile numbers and both options
     * together; a valid tolerance must run the hierarchical model and give finite output.
     */
    @Test
    void fieldModelOptions() {
        Stats st = new Stats("field-options");
        Mutator m = new Mutator(SEED + 7);
        Path obj = write(dir.resolve("box.obj"), BOX_OBJ);
        Path pts = write(dir.resolve("pts.csv"), POINTS);
        String[] sane = {"1e-10", "1e-6", "1e-13", "1e-2", "3e-9"};
        int n = cases(120);
        for (int i = 0; i < n; i++) {
            String tol = sane[i % sane.length];
            if (i % 3 != 0) {
                tol = m.random().nextBoolean() ? m.hostileNumber() : m.replaceNumber(tol);
            }
            List<String> a = new ArrayList<>();
            if (i % 4 == 3) {
                a.addAll(List.of("survey", obj.toString(), "--density", "2000", "--threads", "1", "--out",
                    dir.resolve("sv").toString()));
            } else {
                a.addAll(List.of("field", obj.toString(), "--density", "2000", "--points", pts.toString(),
                    "--threads", "1"));
            }
            a.addAll(List.of("--tolerance", tol));
            if (i % 5 == 4) {
                a.add("--exact");
            }
            Outcome o = cli(st, a.toArray(new String[0]));
            if (a.get(0).equals("field")) {
                noNanText(st, o, "field --tolerance " + tol);
            }
        }
        st.finish();
    }

    @Test
    void bodyDescriptionReader() {
        Stats st = new Stats("description");
        Mutator m = new Mutator(SEED + 3);
        write(dir.resolve("outer.obj"), BOX_OBJ);
        write(dir.resolve("core.obj"), CORE_OBJ);
        Path pts = write(dir.resolve("pts.csv"), POINTS);
        byte[] base = DESCRIPTION.getBytes(StandardCharsets.UTF_8);
        int n = cases(200);
        for (int i = 0; i < n; i++) {
            Path desc = write(dir.resolve("body.json"), m.mutateJson(base));
            if (i % 7 == 3) { // a damaged region file instead
                write(dir.resolve("core.obj"), m.mutateText(CORE_OBJ.getBytes(StandardCharsets.UTF_8), OBJ_LINES));
                desc = write(dir.resolve("body.json"), base);
            }
            if (i % 2 == 0) {
                cli(st, "inspect", desc.toString());
            } else {
                noNanText(st, cli(st, "field", desc.toString(), "--points", pts.toString(), "--threads", "1"),
                    "field description");
            }
            write(dir.resolve("core.obj"), CORE_OBJ);
        }
        st.finish();
    }

    @Test
    void gridOptions() throws IOException {
        Stats st = new Stats("grid-options");
        Mutator m = new Mutator(SEED + 4);
        Path obj = write(dir.resolve("box.obj"), BOX_OBJ);
        Path pts = write(dir.resolve("pts.csv"), POINTS);
        String[] sane = {"-1500,1500,-1500,1500,-1500,1500", "700", "4", "1000,1500", "1200:2400:600", "45", "90",
            "0,0,0", "64", "60", "200"};
        int n = cases(200);
        for (int i = 0; i < n; i++) {
            Path out = dir.resolve("g" + (i % 3) + (i % 5 == 0 ? ".csv" : ".npy"));
            List<String> a = new ArrayList<>(List.of("table", obj.toString(), "--density", "2000", "--threads", "1"));
            int kind = i % 3;
            String[] vals = sane.clone();
            int bad = 1 + m.random().nextInt(2);
            for (int k = 0; k < bad; k++) {
                int slot = m.random().nextInt(vals.length);
                vals[slot] = m.random().nextBoolean() ? m.hostileNumber() : m.replaceNumber(vals[slot]);
            }
            if (kind == 0) {
                a.addAll(List.of("--grid", "box", "--box", vals[0], i % 2 == 0 ? "--spacing" : "--nodes",
                    i % 2 == 0 ? vals[1] : vals[2]));
            } else if (kind == 1) {
                a.addAll(List.of("--grid", "sphere", "--radii", i % 2 == 0 ? vals[3] : vals[4], "--lat-step", vals[5],
                    "--lon-step", vals[6], "--centre", vals[7]));
            } else {
                a.addAll(List.of("--grid", "points", "--points", pts.toString()));
            }
            a.addAll(List.of("--chunk-nodes", vals[8], "--check-samples", vals[10], "--out", out.toString()));
            if (i % 4 == 1) {
                a.addAll(List.of("--spin-period", vals[9], "--effective"));
            }
            if (i % 6 == 2) {
                a.add("--gradient");
            }
            Outcome o = cli(st, a.toArray(new String[0]));
            if (o != null && o.exit == 0 && out.toString().endsWith(".npy") && npyHasNonFinite(out)) {
                st.nan++;
                st.example("nan in table", String.join(" ", a));
            }
            deleteTree(TableFilesPaths.partial(out));
            Files.deleteIfExists(out);
        }
        st.finish();
    }

    @Test
    void tableShardsAndResumeState() throws IOException {
        Stats setup = new Stats("table-state setup");
        Mutator m = new Mutator(SEED + 5);
        Path obj = write(dir.resolve("box.obj"), BOX_OBJ);
        Path pristine = dir.resolve("pristine");
        Path work = dir.resolve("work");
        String[] grid = {"--grid", "box", "--box", "-1500,1500,-1500,1500,-1500,1500", "--spacing", "500",
            "--chunk-nodes", "60", "--check-samples", "40", "--threads", "1", "--density", "2000"};
        Path ref = dir.resolve("ref.npy");
        requireOk(cli(setup, concat(new String[] {"table", obj.toString()}, concat(grid, "--out", ref.toString()))));
        for (int s = 1; s <= 2; s++) {
            requireOk(cli(setup, concat(new String[] {"table", obj.toString()}, concat(grid, "--out",
                work.resolve("shard" + s + ".npy").toString(), "--shard", s + "/2"))));
        }
        Outcome stopped = cli(setup, concat(new String[] {"table", obj.toString()}, concat(grid, "--out",
            work.resolve("part.npy").toString(), "--stop-after-chunks", "3")));
        assertTrue(stopped != null && stopped.exit == 3, "stopped run: " + (stopped == null ? "" : stopped.err));
        copyTree(work, pristine);
        Stats st = new Stats("table-state");
        byte[] refBytes = Files.readAllBytes(ref);
        int n = cases(120);
        for (int i = 0; i < n; i++) {
            deleteTree(work);
            copyTree(pristine, work);
            boolean merge = i % 2 == 0;
            List<Path> targets = new ArrayList<>();
            try (Stream<Path> s = Files.walk(work)) {
                s.filter(Files::isRegularFile).filter(p -> merge ? p.getFileName().toString().startsWith("shard")
                    : p.toString().contains("part.npy.partial")).forEach(targets::add);
            }
            targets.sort(Comparator.naturalOrder());
            Path target = targets.get(m.random().nextInt(targets.size()));
            byte[] orig = Files.readAllBytes(target);
            String tn = target.getFileName().toString();
            byte[] mutated;
            if (tn.endsWith(".json")) {
                mutated = m.mutateJson(orig);
            } else if (tn.startsWith("chunk-") && m.random().nextInt(2) == 0) {
                // a chunk replaced by another chunk of the same size, or zeroed
                Path other = targets.stream().filter(p -> p.getFileName().toString().startsWith("chunk-")
                    && p.getFileName().toString().endsWith(".f64") && !p.equals(target)).findFirst().orElse(target);
                mutated = m.random().nextBoolean() ? Files.readAllBytes(other) : new byte[orig.length];
            } else if (tn.endsWith(".npy") || tn.endsWith(".f64")) {
                mutated = m.mutateBinary(orig);
            } else {
                mutated = m.mutateText(orig, new String[0]);
            }
            boolean changed = !Arrays.equals(orig, mutated);
            Files.write(target, mutated);
            Path out = work.resolve("out.npy");
            Outcome o;
            if (merge) {
                o = cli(st, "table-merge", work.resolve("shard1.npy").toString(), work.resolve("shard2.npy").toString(),
                    "--out", out.toString(), "--check-samples", "40", "--threads", "1");
            } else {
                out = work.resolve("part.npy");
                o = cli(st, concat(new String[] {"table", obj.toString()}, concat(grid, "--out", out.toString(),
                    "--resume")));
            }
            if (o != null && o.exit == 0 && changed && Files.isRegularFile(out)
                && !Arrays.equals(refBytes, Files.readAllBytes(out))) {
                st.wrong++;
                st.example("silently wrong", (merge ? "merge" : "resume") + " after damaging " + tn);
            }
        }
        st.finish();
    }

    /**
     * The extra sbatch options file of {@code table --slurm N --slurm-sbatch FILE}: refused in one line or written
     * as {@code #SBATCH} lines that carry no control character, come before the first command and never set what
     * the scripts set themselves (array, dependency, output).
     */
    /** {@code render --markers}: hostile marker CSVs are refused in one line or give finite points only. */
    @Test
    void markerPointsReader() {
        Stats st = new Stats("render-markers");
        Mutator m = new Mutator(SEED + 11);
        byte[] base = "sample,outcome,x_m,y_m,z_m\n1,rest,100,-20,300\n2,escaped,9,9,9\n# c\n3,rest,-4,5e2,6\n"
            .getBytes(StandardCharsets.UTF_8);
        String[] hostile = {"1e400,rest,1,2,3", "4,rest,NaN,0,0", "5,rest,-Infinity,0,0", "6,rest,0x1p3,0,0",
            "7,rest,1,2", "rest", ",,,,", "\uFEFFx_m,y_m,z_m", "8,rest,1e16,0,0", "x_m,x_m,y_m,z_m,outcome"};
        int n = cases(200);
        for (int i = 0; i < n; i++) {
            Path f = write(dir.resolve("markers.csv"), m.mutateText(base, hostile));
            direct(st, "markers " + f, () -> {
                for (double d : dev.cairn.viewer.MarkerPoints.read(f)) {
                    if (!Double.isFinite(d) || Math.abs(d) > dev.cairn.io.Numbers.MAX_POINT_M) {
                        throw new IllegalStateException("marker coordinate " + d + " accepted");
                    }
                }
            });
        }
        st.finish();
    }

    /**
     * Coefficient files ({@code --coefficients}, with the truncation_bound key) read by {@code field} and
     * {@code table}: one-line refusal or finite output.
     */
    @Test
    void coefficientFileReader() throws IOException {
        Stats st = new Stats("coefficients");
        Mutator m = new Mutator(SEED + 12);
        Path obj = write(dir.resolve("box.obj"), BOX_OBJ);
        Path pts = write(dir.resolve("pts.csv"), POINTS);
        Path good = dir.resolve("good.json");
        requireOk(cli(new Stats("coefficients-fixture"), "harmonics", obj.toString(), "--density", "2000",
            "--degree", "4", "--out", good.toString()));
        byte[] base = Files.readAllBytes(good);
        int n = cases(160);
        for (int i = 0; i < n; i++) {
            Path f = write(dir.resolve("c.json"), m.mutateJson(base));
            if (i % 4 == 3) {
                cli(st, "table", obj.toString(), "--density", "2000", "--grid", "points", "--points", pts.toString(),
                    "--model", "harmonics", "--coefficients", f.toString(), "--out",
                    dir.resolve("t.csv").toString(), "--threads", "1");
            } else {
                noNanText(st, cli(st, "field", obj.toString(), "--density", "2000", "--points", pts.toString(),
                    "--model", "harmonics", "--coefficients", f.toString(), "--threads", "1"), "field " + f);
            }
        }
        st.finish();
    }

    /**
     * {@code deploy --merge-shards}: a shard's landings.csv and shard.json damaged; the merge refuses in one line
     * (never a silently different merge: a merge that succeeds must reproduce the undamaged one byte for byte).
     */
    @Test
    void deployShardMerge() throws IOException {
        Stats st = new Stats("deploy-shards");
        Mutator m = new Mutator(SEED + 13);
        Path obj = write(dir.resolve("box.obj"), BOX_OBJ);
        String[] common = {"deploy", obj.toString(), "--density", "2000", "--spin-period", "6h", "--release",
            "0,0,900", "--velocity", "0,0,-0.05", "--count", "4", "--position-sigma", "5", "--seed", "3",
            "--threads", "1"};
        Stats fixture = new Stats("deploy-shards-fixture");
        for (int k = 1; k <= 2; k++) {
            requireOk(cli(fixture, concat(common, "--shard", k + "/2", "--out", dir.resolve("s" + k).toString())));
        }
        String shards = dir.resolve("s1") + "," + dir.resolve("s2");
        requireOk(cli(fixture, concat(common, "--merge-shards", shards, "--out", dir.resolve("ref").toString())));
        byte[] ref = Files.readAllBytes(dir.resolve("ref").resolve("landings.csv"));
        byte[] csv = Files.readAllBytes(dir.resolve("s2").resolve("landings.csv"));
        byte[] json = Files.readAllBytes(dir.resolve("s2").resolve("shard.json"));
        String[] hostile = {"3,rest,1e400,0,0", "NaN", "2,rest", ",,,,,,,,,,,,,,,,,,,,,", "sample,outcome",
            "\uFEFFsample"};
        int n = cases(80);
        for (int i = 0; i < n; i++) {
            boolean damageCsv = i % 3 != 2;
            write(dir.resolve("s2").resolve("landings.csv"), damageCsv ? m.mutateText(csv, hostile) : csv);
            write(dir.resolve("s2").resolve("shard.json"), damageCsv ? json : m.mutateJson(json));
            Path out = dir.resolve("merged");
            deleteTree(out);
            Outcome o = cli(st, concat(common, "--merge-shards", shards, "--out", out.toString()));
            if (o != null && o.exit == 0 && !java.util.Arrays.equals(ref,
                Files.readAllBytes(out.resolve("landings.csv")))) {
                st.wrong++;
                st.example("merged differently", o.err.strip());
            }
        }
        st.finish();
    }

    @Test
    void slurmOptionsFile() {
        Stats st = new Stats("slurm-options");
        Mutator m = new Mutator(SEED + 9);
        Path obj = write(dir.resolve("box.obj"), BOX_OBJ);
        byte[] base = "# site options\n--partition=short\n--time=00:10:00\n#SBATCH --mem=1G\n\n--requeue\n"
            .getBytes(StandardCharsets.UTF_8);
        String[] hostile = {"--array=0-99", "--arr=1", "-a0-9", "-d afterany:1", "--dependency=afterok:1",
            "--output=/dev/null", "-o x", "--chdir=/", "rm -rf /", "#SBATCH", "#SBATCH --array=1", "-", "--",
            "--job-name=a b", "--comment=\u202eevil", "--mail-user=a@b", "\uFEFF--qos=x", "--wrap=\"id\""};
        Path job = dir.resolve("slurm");
        int n = cases(120);
        for (int i = 0; i < n; i++) {
            Path opts = write(dir.resolve("opts.txt"), m.mutateText(base, hostile));
            deleteTree(job);
            Outcome o = cli(st, "table", obj.toString(), "--density", "2000", "--grid", "box",
                "--box=-2000,2000,-2000,2000,-2000,2000", "--nodes", "3", "--out", job.resolve("t.npy").toString(),
                "--slurm", "2", "--slurm-sbatch", opts.toString());
            if (o == null || o.exit != 0) {
                continue;
            }
            for (String script : new String[] {"table-array.sbatch", "table-merge.sbatch"}) {
                String text;
                try {
                    text = Files.readString(job.resolve("t.npy.slurm").resolve(script));
                } catch (IOException e) {
                    st.wrong++;
                    st.example("no script", script + ": " + e);
                    continue;
                }
                int firstCommand = text.indexOf("\nset -eu\n");
                List<String> directives = text.lines().filter(l -> l.startsWith("#SBATCH")).toList();
                boolean bad = firstCommand < 0 || text.lastIndexOf("\n#SBATCH") > firstCommand;
                int arrays = 0;
                for (String d : directives) {
                    bad |= hasControl(d);
                    String opt = d.substring("#SBATCH".length()).strip();
                    arrays += opt.startsWith("--array=") ? 1 : 0;
                    bad |= opt.startsWith("--dep") || opt.startsWith("-d") || opt.startsWith("-a")
                        || (opt.startsWith("--output=") && !opt.startsWith("--output=" + job.resolve("t.npy.slurm")))
                        || opt.startsWith("-o") || opt.startsWith("--arr") && !opt.startsWith("--array=0-1");
                }
                bad |= script.equals("table-array.sbatch") ? arrays != 1 : arrays != 0;
                if (bad) {
                    st.wrong++;
                    st.example("bad script", script + ": " + String.join(" | ", directives));
                }
            }
        }
        st.finish();
    }

    @Test
    void surveyDirectory() throws IOException {
        Stats st = new Stats("survey-dir setup");
        Mutator m = new Mutator(SEED + 6);
        Path obj = write(dir.resolve("box.obj"), BOX_OBJ);
        Path sdir = dir.resolve("survey");
        requireOk(cli(st, "survey", obj.toString(), "--density", "2000", "--spin-period", "5h", "--threads", "1",
            "--out", sdir.toString()));
        st = new Stats("survey-dir");
        byte[] facets = Files.readAllBytes(sdir.resolve("facets.csv"));
        byte[] summary = Files.readAllBytes(sdir.resolve("summary.json"));
        int n = cases(260);
        for (int i = 0; i < n; i++) {
            boolean csv = i % 3 != 0;
            if (csv) {
                byte[] b = facets;
                if (i % 5 == 1) { // the zone column gets a hostile value
                    String s = new String(facets, StandardCharsets.UTF_8);
                    String[] lines = s.split("\n", -1);
                    int zoneCol = Arrays.asList(lines[firstHeader(lines)].split(",")).indexOf("zone");
                    int row = firstHeader(lines) + 1 + m.random().nextInt(12);
                    String[] f = lines[row].split(",", -1);
                    if (zoneCol >= 0 && zoneCol < f.length) {
                        f[zoneCol] = m.pick(new String[] {"Infinity", "2147483647", "1e9", "-5", "NaN", "0.5", "13"});
                        lines[row] = String.join(",", f);
                    }
                    b = String.join("\n", lines).getBytes(StandardCharsets.UTF_8);
                } else {
                    b = m.mutateText(facets, new String[] {"1,2,3", ""});
                }
                Files.write(sdir.resolve("facets.csv"), b);
            } else {
                Files.write(sdir.resolve("summary.json"), m.mutateJson(summary));
            }
            direct(st, "survey dir case " + i, () -> dev.cairn.viewer.SurveyData.read(sdir, obj, 12));
            Files.write(sdir.resolve("facets.csv"), facets);
            Files.write(sdir.resolve("summary.json"), summary);
        }
        st.finish();
    }

    static int firstHeader(String[] lines) {
        int i = 0;
        while (i < lines.length && lines[i].startsWith("#")) {
            i++;
        }
        return i;
    }

    static void requireOk(Outcome o) {
        assertTrue(o != null && o.exit == 0, "fixture run failed: " + (o == null ? "hang" : o.err));
    }

    static String[] concat(String[] a, String... b) {
        String[] r = Arrays.copyOf(a, a.length + b.length);
        System.arraycopy(b, 0, r, a.length, b.length);
        return r;
    }

    /** Paths of table work state (kept here so the test does not depend on internals that may change). */
    static final class TableFilesPaths {
        static Path partial(Path out) {
            return out.toAbsolutePath().resolveSibling(out.getFileName() + ".partial");
        }
    }
}
