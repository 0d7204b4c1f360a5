package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.mesh.Shapes;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code cairn table --slurm N}: the generated job-array and merge scripts (array range, shard arguments, quoting,
 * dependency of the merge) and the one-line refusals of bad input. The scripts are run by bash with a stand-in
 * launcher that prints its arguments, so the quoting is checked by a real shell (POSIX shell quoting rules, IEEE Std
 * 1003.1 "Shell Command Language" 2.2.3; common practice, no further source). A real Slurm run is
 * {@code tools/ci/slurm-check}.
 */
class SlurmArrayTest {
    @TempDir
    Path dir;
    private Path obj;
    private String lastErr;
    private String lastOut;

    @BeforeEach
    void writeModel() throws IOException {
        obj = dev.cairn.TestShapes.writeObj(Shapes.icosphere(1, 1000), dir.resolve("ball.obj"));
    }

    private int run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        List<String> a = new ArrayList<>(List.of("table", obj.toString(), "--density", "2000"));
        a.addAll(List.of(args));
        int code = CairnMain.execute(new PrintWriter(out), new PrintWriter(err), a.toArray(new String[0]));
        lastErr = err.toString();
        lastOut = out.toString();
        return code;
    }

    private void assertBad(String fragment, String... args) {
        int code = run(args);
        assertEquals(CairnMain.EXIT_BAD_INPUT, code, lastErr);
        String[] lines = lastErr.strip().split("\n");
        assertEquals(1, lines.length, "one-line error: " + lastErr);
        assertTrue(lines[0].startsWith("cairn: error: ") && lines[0].contains(fragment), lastErr);
    }

    /** A refusal after the scripts were written (and said so): the error is the last line, one line, exit 2. */
    private void assertSubmitFails(String fragment, String... args) {
        int code = run(args);
        assertEquals(CairnMain.EXIT_BAD_INPUT, code, lastErr);
        String[] lines = lastErr.strip().split("\n");
        assertEquals(2, lines.length, lastErr);
        assertTrue(lines[0].startsWith("cairn: wrote table-array.sbatch"), lastErr);
        assertTrue(lines[1].startsWith("cairn: error: ") && lines[1].contains(fragment), lastErr);
    }

    private static final String[] GRID = {"--grid", "box", "--box=-2000,2000,-2000,2000,-1500,1500", "--nodes", "5",
        "--gradient"};

    private String[] grid(String... more) {
        List<String> a = new ArrayList<>(List.of(GRID));
        a.addAll(List.of(more));
        return a.toArray(new String[0]);
    }

    /** Runs {@code script} with bash and the given array task id; returns stdout lines (exit code checked). */
    private static List<String> bash(Path script, String taskId, int expectedExit) throws Exception {
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
        if (expectedExit < 0) {
            assertTrue(p.exitValue() != 0, text);
        } else {
            assertEquals(expectedExit, p.exitValue(), text);
        }
        return text.isEmpty() ? List.of() : List.of(text.split("\n", -1)).subList(0, text.split("\n", -1).length - 1);
    }

    @Test
    void arrayScriptRunsEachShardWithTheSameArgumentsQuotedForTheShell() throws Exception {
        // Arguments a shell would mangle if left bare: spaces, both quotes, $, backquote, glob, semicolon, backslash.
        List<String> table = List.of("table", "/models/my body's \"v2\".obj", "--grid=box", "--box=-1,1,-1,1,-1,1",
            "--note=$HOME `id` *; \\ end", "");
        List<String> launcher = List.of("printf", "%s\\n");
        Path out = dir.resolve("job").resolve("t.npy");
        SlurmArray job = new SlurmArray(4, 3, launcher, table, List.of("--format", "npy"), out, List.of(
            "--partition=short", "--time=00:10:00"));
        job.write();
        String array = Files.readString(job.arrayScript());
        assertTrue(array.startsWith("#!/bin/bash\n"), array);
        assertTrue(array.contains("\n#SBATCH --array=0-3\n"), array);
        assertTrue(array.contains("\n#SBATCH --cpus-per-task=3\n"), array);
        assertTrue(array.contains("\n#SBATCH --partition=short\n#SBATCH --time=00:10:00\n"), array);
        assertTrue(array.contains("\n#SBATCH --output=" + job.logDir().resolve("table-%A_%a.out") + "\n"), array);
        assertTrue(Files.isDirectory(job.logDir()), "log folder exists before sbatch needs it");
        // #SBATCH lines must all come before the first command, or sbatch ignores them (sbatch(1) manual page)
        int lastDirective = array.lastIndexOf("\n#SBATCH ");
        int firstCommand = array.indexOf("\nset -eu\n");
        assertTrue(lastDirective < firstCommand, array);
        for (int k = 0; k < 4; k++) {
            List<String> got = bash(job.arrayScript(), String.valueOf(k), 0);
            List<String> want = new ArrayList<>(table);
            want.addAll(List.of("--shard", (k + 1) + "/4", "--out", job.shard(k + 1).toString()));
            assertEquals(want, got, "task " + k);
        }
        // a task whose checkpoints exist (requeued, resubmitted) resumes from them
        Files.createDirectories(Path.of(job.shard(2) + ".partial"));
        Files.writeString(Path.of(job.shard(2) + ".partial", "job.json"), "{}");
        List<String> resumed = new ArrayList<>(table);
        resumed.addAll(List.of("--shard", "2/4", "--out", job.shard(2).toString(), "--resume"));
        assertEquals(resumed, bash(job.arrayScript(), "1", 0));
        // shard names are distinct and in the job folder
        assertEquals(dir.resolve("job").resolve("t.npy.slurm").resolve("shard-0003-of-0004.npy").toAbsolutePath(),
            job.shard(3));
        // outside an array, or beyond it, the script refuses to run
        assertTrue(String.join("\n", bash(job.arrayScript(), "4", 2)).contains("beyond the 4 shards"));
        assertTrue(String.join("\n", bash(job.arrayScript(), null, -1)).contains("run this script with sbatch"));
        assertTrue(String.join("\n", bash(job.arrayScript(), "x1", 2)).contains("not a task number"));

        String merge = Files.readString(job.mergeScript());
        assertFalse(merge.contains("--array"), merge);
        assertTrue(merge.contains("\n#SBATCH --partition=short\n"), merge);
        List<String> got = bash(job.mergeScript(), null, 0);
        List<String> want = new ArrayList<>(List.of("table-merge"));
        for (int i = 1; i <= 4; i++) {
            want.add(job.shard(i).toString());
        }
        want.addAll(List.of("--out", out.toAbsolutePath().toString(), "--format", "npy"));
        assertEquals(want, got);
        // the printed submit line makes the merge depend on the array's success
        assertTrue(job.submitLine().contains("--dependency=afterok:${jid%%;*} "), job.submitLine());
    }

    @Test
    void tableCommandPassesItsOwnOptionsToEveryTaskAndTheMerge() throws Exception {
        Path out = dir.resolve("t.csv");
        assertEquals(0, run(grid("--spin-period", "5h", "--spin-axis", "0,0,1", "--check-samples", "7",
            "--seed", "9", "--out", out.toString(), "--slurm", "3", "--slurm-cpus", "2")), lastErr);
        assertTrue(lastErr.contains("submit with: jid=$(sbatch --parsable"), lastErr);
        Path d = SlurmArray.jobDir(out);
        String array = Files.readString(d.resolve("table-array.sbatch"));
        assertTrue(array.contains("\n#SBATCH --array=0-2\n"), array);
        assertTrue(array.contains(" table " + obj.toAbsolutePath() + " "), array);
        assertTrue(array.contains("--box=-2000,2000,-2000,2000,-1500,1500 --nodes=5 --gradient"), array);
        assertTrue(array.contains("--spin-period=5h") && array.contains("--spin-axis=0,0,1"), array);
        // the table's format comes from the extension of --out: the shards must be told, their own files are .npy
        assertTrue(array.contains("--format=csv") || array.contains("--format csv"), array);
        assertTrue(array.contains("--threads 2 --shard \"$i/$n\" --out \"$shard\" $resume\n"), array);
        String exec = array.substring(array.indexOf("\nexec "));
        assertFalse(exec.contains("--slurm"), exec);
        String merge = Files.readString(d.resolve("table-merge.sbatch"));
        assertTrue(merge.contains(" --out " + out.toAbsolutePath() + " --format csv --threads 2 --check-samples 7 "
            + "--check-cell-points 4 --seed 9"), merge);
        assertFalse(Files.exists(out), "nothing computed");
    }

    @Test
    void submitsArrayThenMergeAfterOkOfTheArray() throws Exception {
        Path log = dir.resolve("sbatch.log");
        Path fake = dir.resolve("fake-sbatch");
        Files.writeString(fake, "#!/bin/sh\nprintf '%s\\n' \"$*\" >> '" + log + "'\nn=$(wc -l < '" + log + "')\n"
            + "echo \"$((700 + n));cluster1\"\n");
        assertTrue(fake.toFile().setExecutable(true));
        Path out = dir.resolve("t.npy");
        assertEquals(0, run(grid("--out", out.toString(), "--slurm", "4", "--slurm-submit",
            "--slurm-sbatch-command", fake.toString())), lastErr);
        assertEquals("array_job_id 701\nmerge_job_id 702\n", lastOut.replace("\r", "").replaceAll("(?s)Caution.*", ""));
        List<String> calls = Files.readAllLines(log);
        assertEquals(List.of("--parsable " + SlurmArray.jobDir(out).resolve("table-array.sbatch"),
            "--parsable --dependency=afterok:701 " + SlurmArray.jobDir(out).resolve("table-merge.sbatch")), calls);

        // an sbatch that refuses: one line naming the failure, exit 2
        Files.writeString(fake, "#!/bin/sh\necho 'sbatch: error: invalid partition specified: nope' >&2\nexit 1\n");
        assertSubmitFails("invalid partition specified", grid("--out", out.toString(), "--slurm", "4", "--slurm-submit",
            "--slurm-sbatch-command", fake.toString()));
        assertSubmitFails("cannot run", grid("--out", out.toString(), "--slurm", "4", "--slurm-submit",
            "--slurm-sbatch-command", dir.resolve("no-such-sbatch").toString()));
    }

    @Test
    void jobIdsFromParsableOutput() {
        assertEquals("123", SlurmArray.parseJobId("123\n"));
        assertEquals("123", SlurmArray.parseJobId("123;cluster\n"));
        assertNull(SlurmArray.parseJobId("Submitted batch job 123\n"));
        assertNull(SlurmArray.parseJobId(""));
    }

    @Test
    void badInputGivesOneLineErrors() throws IOException {
        String out = dir.resolve("t.npy").toString();
        assertBad("1 to 1000 array tasks", grid("--out", out, "--slurm", "0"));
        assertBad("1 to 1000 array tasks", grid("--out", out, "--slurm", "1001"));
        assertBad("--slurm-cpus: expected 1 to 1024", grid("--out", out, "--slurm", "4", "--slurm-cpus", "0"));
        assertBad("go with --slurm N", grid("--out", out, "--slurm-submit"));
        assertBad("not with --shard", grid("--out", out, "--slurm", "4", "--shard", "1/4"));
        assertBad("not with --bench", "--bench", "--slurm", "4");
        assertBad("--out: missing", grid("--slurm", "4"));
        assertBad("at most one shard per node", grid("--out", out, "--slurm", "126"));
        Path opts = dir.resolve("opts");
        Files.writeString(opts, "# extra\n--partition=short\n#SBATCH --array=0-9\n");
        assertBad("line 3: --array is set by the generated scripts", grid("--out", out, "--slurm", "4",
            "--slurm-sbatch", opts.toString()));
        Files.writeString(opts, "--arr=0-9\n");
        assertBad("line 1: --arr is set by the generated scripts", grid("--out", out, "--slurm", "4",
            "--slurm-sbatch", opts.toString()));
        Files.writeString(opts, "--partition=a\n-d afterany:1\n");
        assertBad("line 2: -d is set by the generated scripts", grid("--out", out, "--slurm", "4",
            "--slurm-sbatch", opts.toString()));
        Files.writeString(opts, "--\n--array=1\n");
        assertBad("line 1: expected one sbatch option", grid("--out", out, "--slurm", "4", "--slurm-sbatch",
            opts.toString()));
        Files.writeString(opts, "-a0-9\n");
        assertBad("line 1: -a is set by the generated scripts", grid("--out", out, "--slurm", "4",
            "--slurm-sbatch", opts.toString()));
        Files.writeString(opts, "--mem=4G\nrm -rf /\n");
        assertBad("line 2: expected one sbatch option", grid("--out", out, "--slurm", "4", "--slurm-sbatch",
            opts.toString()));
        assertBad("not a regular file", grid("--out", out, "--slurm", "4", "--slurm-sbatch", dir.toString()));
        assertBad("#SBATCH lines cannot carry", grid("--out", dir.resolve("with space.npy").toString(), "--slurm",
            "4"));
        assertFalse(Files.exists(SlurmArray.jobDir(Path.of(out))), "no job folder after a refusal");
    }
}
