package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.cairn.TestShapes;
import dev.cairn.mesh.Shapes;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code cairn deploy --shard I/N} and {@code --merge-shards}: the merge of shards reproduces a single run
 * byte for byte (landings.csv) and in every statistic (summary.json except its timing), because each sample is seeded
 * by its index alone (a property of the program, no outside source: the reference is the single run itself). Shards
 * of other settings, gaps, overlaps and damaged rows are refused with one line; {@code --slurm N} writes array and
 * merge scripts whose commands a real shell parses back into the intended words (POSIX shell quoting, IEEE Std
 * 1003.1 "Shell Command Language" 2.2.3; common practice).
 */
class DeployShardsTest {
    @TempDir
    static Path dir;
    static Path obj;
    static final int COUNT = 7;

    static List<String> base(String seed) {
        return new ArrayList<>(List.of("deploy", obj.toString(), "--density", "2000", "--spin-period", "6h",
            "--release", "0,0,140", "--velocity", "0.003,0,-0.01", "--count", String.valueOf(COUNT),
            "--position-sigma", "5", "--velocity-sigma", "0.002", "--restitution", "0.4,0.7", "--rest-apex", "0.05",
            "--seed", seed, "--threads", "1"));
    }

    static CliRun run(List<String> base, String... more) {
        List<String> a = new ArrayList<>(base);
        a.addAll(List.of(more));
        return CliRun.of(a.toArray(new String[0]));
    }

    @BeforeAll
    static void once() {
        obj = TestShapes.write(dir.resolve("ball.obj"), TestShapes.objText(Shapes.icosphere(2, 100), 1.0));
        CliRun single = run(base("5"), "--out", dir.resolve("single").toString());
        assertEquals(0, single.exit(), single.err());
        // three shards of 2, 2 and 3 samples (the table split rule: floor(k * 7 / 3))
        for (int k = 1; k <= 3; k++) {
            CliRun s = run(base("5"), "--shard", k + "/3", "--out", dir.resolve("s" + k).toString());
            assertEquals(0, s.exit(), s.err());
        }
    }

    static String shards(String... names) {
        List<String> p = new ArrayList<>();
        for (String n : names) {
            p.add(dir.resolve(n).toString());
        }
        return String.join(",", p);
    }

    @Test
    void mergeOfShardsEqualsASingleRun() throws Exception {
        List<String> s2 = Files.readAllLines(dir.resolve("s2").resolve("landings.csv"));
        assertEquals(3, s2.size(), "header and samples 2, 3");
        assertTrue(s2.get(1).startsWith("2,") && s2.get(2).startsWith("3,"), s2.toString());
        JsonNode sj = new ObjectMapper().readTree(dir.resolve("s3").resolve("shard.json").toFile());
        assertEquals(4, sj.get("first_sample").asInt());
        assertEquals(7, sj.get("end_sample").asInt());
        assertEquals(64, sj.get("fingerprint").get("model_sha256").asText().length());
        assertFalse(Files.exists(dir.resolve("s1").resolve("summary.json")), "a shard writes no summary");

        // shards given out of order: sorted by their sample ranges
        List<String> two = base("5");
        two.set(two.indexOf("--threads") + 1, "2");
        CliRun m = run(two, "--merge-shards", shards("s3", "s1", "s2"), "--out", dir.resolve("merged").toString());
        assertEquals(0, m.exit(), m.err());
        assertTrue(m.out().contains("Merged       3 shards read in"), m.out());
        assertArrayEquals(Files.readAllBytes(dir.resolve("single").resolve("landings.csv")),
            Files.readAllBytes(dir.resolve("merged").resolve("landings.csv")));
        ObjectMapper om = new ObjectMapper();
        ObjectNode a = (ObjectNode) om.readTree(dir.resolve("single").resolve("summary.json").toFile());
        ObjectNode b = (ObjectNode) om.readTree(dir.resolve("merged").resolve("summary.json").toFile());
        assertTrue(a.get("cost").get("steps").asLong() > 0);
        ((ObjectNode) a.get("cost")).remove("seconds");
        ((ObjectNode) b.get("cost")).remove("seconds");
        assertEquals(a, b, "summary.json equal but for the timing");
        assertTrue(Files.size(dir.resolve("merged").resolve("map-landings.png")) > 1000);
    }

    private static void bad(String fragment, List<String> base, String... more) {
        CliRun r = run(base, more);
        assertEquals(2, r.exit(), r.err());
        assertTrue(r.oneLineError(), r.err());
        assertTrue(r.err().contains(fragment), r.err());
    }

    @Test
    void mergeRefusesOtherSettingsGapsOverlapsAndDamage() throws Exception {
        Path out = dir.resolve("bad-merge");
        bad("was computed with another seed", base("6"), "--merge-shards", shards("s1", "s2", "s3"), "--out",
            out.toString());
        List<String> other = base("5");
        other.set(other.indexOf("0.4,0.7"), "0.4,0.71");
        bad("was computed with another restitution_tangential", other, "--merge-shards", shards("s1", "s2", "s3"),
            "--out", out.toString());
        bad("samples 2 to 3 are in no shard", base("5"), "--merge-shards", shards("s1", "s3"), "--out",
            out.toString());
        bad("samples 4 to 6 are in no shard", base("5"), "--merge-shards", shards("s1", "s2"), "--out",
            out.toString());
        bad("is given twice", base("5"), "--merge-shards", shards("s1", "s2", "s2", "s3"), "--out", out.toString());
        CliRun s = run(base("5"), "--shard", "1/2", "--out", dir.resolve("h1").toString());
        assertEquals(0, s.exit(), s.err());
        bad("overlaps another shard", base("5"), "--merge-shards", shards("s1", "h1", "s2", "s3"), "--out",
            out.toString());
        bad("is one of the --merge-shards folders", base("5"), "--merge-shards", shards("s1", "s2", "s3"), "--out",
            dir.resolve("s2").toString());
        bad("no shard.json", base("5"), "--merge-shards", shards("s1", "s2") + "," + dir, "--out", out.toString());

        // a damaged row: a number changed, a field dropped, a release state not of these settings
        Path d = dir.resolve("damaged");
        Files.createDirectories(d);
        Files.copy(dir.resolve("s2").resolve("shard.json"), d.resolve("shard.json"));
        List<String> rows = Files.readAllLines(dir.resolve("s2").resolve("landings.csv"));
        String[] f = rows.get(1).split(",", -1);
        String[] g = f.clone();
        g[8] = "-1.0";
        write(d, rows, String.join(",", g));
        bad("line 2: time_s: -1.0 outside", base("5"), "--merge-shards", shards("s1", "damaged", "s3"), "--out",
            out.toString());
        g = f.clone();
        g[2] = g[2] + "0";
        write(d, rows, String.join(",", g));
        bad("line 2: x_m:", base("5"), "--merge-shards", shards("s1", "damaged", "s3"), "--out", out.toString());
        write(d, rows, rows.get(1).substring(0, rows.get(1).lastIndexOf(',')));
        bad("line 2: expected 22 fields, got 21", base("5"), "--merge-shards", shards("s1", "damaged", "s3"),
            "--out", out.toString());
        g = f.clone();
        g[13] = String.valueOf(Double.parseDouble(g[13]) + 1);
        write(d, rows, String.join(",", g));
        bad("is not the one of these settings", base("5"), "--merge-shards", shards("s1", "damaged", "s3"), "--out",
            out.toString());
        g = f.clone();
        g[1] = "landed";
        write(d, rows, String.join(",", g));
        bad("outcome: unknown", base("5"), "--merge-shards", shards("s1", "damaged", "s3"), "--out", out.toString());
        assertFalse(Files.exists(out.resolve("landings.csv")), "nothing written on a refused merge");
    }

    private static void write(Path d, List<String> rows, String second) throws Exception {
        List<String> r = new ArrayList<>(rows);
        r.set(1, second);
        Files.write(d.resolve("landings.csv"), r);
    }

    @Test
    void badShardValuesGiveOneLineErrors() {
        Path out = dir.resolve("bad-shard");
        for (String s : new String[] {"0/3", "4/3", "3", "1/0", "a/b", "-1/3", "1/3/4", ""}) {
            bad("--shard: expected I/N", base("5"), "--shard", s, "--out", out.toString());
        }
        bad("at most one shard per sample", base("5"), "--shard", "1/8", "--out", out.toString());
        bad("not with --merge-shards", base("5"), "--shard", "1/2", "--merge-shards", shards("s1"), "--out",
            out.toString());
        bad("--slurm: not with --shard", base("5"), "--shard", "1/2", "--slurm", "2", "--out", out.toString());
        bad("--slurm: 8 shards for 7 samples", base("5"), "--slurm", "8", "--out", out.toString());
        bad("go with --slurm N", base("5"), "--slurm-cpus", "2", "--out", out.toString());
        assertFalse(Files.exists(out), "nothing written on bad input");
    }

    /** Runs {@code script} with bash and the given array task id; returns its stdout lines (exit 0 checked). */
    private static List<String> bash(Path script, String taskId) throws Exception {
        ProcessBuilder pb = new ProcessBuilder("bash", script.toString()).redirectErrorStream(true);
        pb.environment().remove("CAIRN_JAVA_OPTS");
        if (taskId != null) {
            pb.environment().put("SLURM_ARRAY_TASK_ID", taskId);
        } else {
            pb.environment().remove("SLURM_ARRAY_TASK_ID");
        }
        Process p = pb.start();
        String text = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        assertTrue(p.waitFor(60, TimeUnit.SECONDS));
        assertEquals(0, p.exitValue(), text);
        return List.of(text.split("\n"));
    }

    @Test
    void deployArrayScriptsCarryTheArgumentsQuotedForTheShell() throws Exception {
        List<String> task = List.of("deploy", "/models/my body's \"v2\".obj", "--release=0,0,-140",
            "--note=$HOME `id` *; \\ end", "");
        List<String> merge = new ArrayList<>(task);
        merge.add("--views");
        Path out = dir.resolve("job").resolve("dep");
        SlurmArray job = new SlurmArray(SlurmArray.Kind.DEPLOY, 3, 2, List.of("printf", "%s\\n"), task, merge, out,
            List.of("--partition=short"));
        job.write();
        String array = Files.readString(job.arrayScript());
        assertEquals("deploy-array.sbatch", job.arrayScript().getFileName().toString());
        assertTrue(array.contains("\n#SBATCH --array=0-2\n#SBATCH --partition=short\n"), array);
        assertTrue(array.contains("\n#SBATCH --output=" + job.logDir().resolve("deploy-%A_%a.out") + "\n"), array);
        assertTrue(array.contains("'cairn deploy --slurm 3'"), array);
        assertFalse(array.contains("--resume"), "deploy shards have no checkpoints: " + array);
        for (int k = 0; k < 3; k++) {
            List<String> want = new ArrayList<>(task);
            want.addAll(List.of("--shard", (k + 1) + "/3", "--out", job.shard(k + 1).toString()));
            assertEquals(want, bash(job.arrayScript(), String.valueOf(k)), "task " + k);
        }
        assertEquals(dir.resolve("job").resolve("dep.slurm").resolve("shard-0002-of-0003").toAbsolutePath(),
            job.shard(2));
        List<String> want = new ArrayList<>(merge);
        for (int i = 1; i <= 3; i++) {
            want.add("--merge-shards=" + job.shard(i));
        }
        want.addAll(List.of("--out", out.toAbsolutePath().toString()));
        assertEquals(want, bash(job.mergeScript(), null));
        assertEquals("deploy-merge.sbatch", job.mergeScript().getFileName().toString());
        // a comma in the job folder would split a --merge-shards value: refused with one line
        dev.cairn.io.InputException e = org.junit.jupiter.api.Assertions.assertThrows(
            dev.cairn.io.InputException.class, () -> new SlurmArray(SlurmArray.Kind.DEPLOY, 3, 1, List.of("x"), task,
                merge, dir.resolve("a,b").resolve("dep"), List.of()));
        assertTrue(e.getMessage().contains("has a comma") && !e.getMessage().contains("\n"), e.getMessage());
    }

    @Test
    void deployCommandWritesScriptsWithItsOwnOptions() throws Exception {
        Path out = dir.resolve("slurm-out");
        Path opts = dir.resolve("opts");
        Files.writeString(opts, "--time=00:10:00\n");
        CliRun r = run(base("5"), "--views", "--out", out.toString(), "--slurm", "3", "--slurm-cpus", "2",
            "--slurm-sbatch", opts.toString());
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.err().contains("submit with: jid=$(sbatch --parsable"), r.err());
        Path d = SlurmArray.jobDir(out);
        String array = Files.readString(d.resolve("deploy-array.sbatch"));
        assertTrue(array.contains(" deploy " + obj.toAbsolutePath() + " "), array);
        assertTrue(array.contains("--release=0,0,140") && array.contains("--seed=5") && array.contains("--count=7"),
            array);
        assertTrue(array.contains("\n#SBATCH --cpus-per-task=2\n"), array);
        assertTrue(array.contains("\n#SBATCH --time=00:10:00\n"), array);
        // --threads of the command (1) wins over --slurm-cpus for the tasks
        assertTrue(array.contains("--threads 1 --shard \"$i/$n\" --out \"$shard\"\n"), array);
        String exec = array.substring(array.indexOf("\nexec "));
        assertFalse(exec.contains("--slurm") || exec.contains("--views"), exec);
        String merge = Files.readString(d.resolve("deploy-merge.sbatch"));
        assertTrue(merge.contains("--threads 1 --views --merge-shards=" + d.resolve("shard-0001-of-0003") + " "),
            merge);
        assertTrue(merge.endsWith(" --out " + out.toAbsolutePath() + "\n"), merge);
        assertFalse(Files.exists(out), "nothing computed");
    }
}
