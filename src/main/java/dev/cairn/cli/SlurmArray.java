package dev.cairn.cli;

import dev.cairn.io.AtomicFiles;
import dev.cairn.io.InputException;
import dev.cairn.io.Messages;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.TimeUnit;
import java.util.regex.Pattern;

/**
 * A table or a deployment Monte Carlo computed as a Slurm job array ({@link Kind}). For a table: writes an sbatch
 * array script whose task {@code k} (0-based, {@code SLURM_ARRAY_TASK_ID}) runs the same {@code cairn table}
 * command with {@code --shard k+1/N} into its own shard file, and a merge script that runs {@code cairn table-merge}
 * on the N shards; optionally submits both, the merge with {@code --dependency=afterok:ARRAYJOB} so it starts only
 * when every task succeeded.
 *
 * <p>Everything lives in one job folder ({@code OUT.slurm/} beside the table): the two scripts, the shards
 * ({@code shard-IIII-of-NNNN.npy} with their sidecars and checkpoints) and {@code log/}. Paths in the scripts are
 * absolute, every command argument is shell-quoted, and the scripts are written atomically. This class holds no
 * field arithmetic: the shards and their merge are those of {@code --shard I/N} and {@code table-merge}, so the merged
 * data file is byte-identical to a single run (see docs/tables.md and docs/cluster.md).
 *
 * <p>For a deployment ({@link Kind#DEPLOY}) task {@code k} runs {@code cairn deploy ... --shard k+1/N} into the shard
 * folder {@code shard-IIII-of-NNNN/} of the job folder, and the merge script runs the same {@code cairn deploy} with
 * one {@code --merge-shards DIR} per shard and the final {@code --out}; deployments have no checkpoints (a failed
 * task is simply run again).
 */
public final class SlurmArray {
    /** Largest array accepted: Slurm's default MaxArraySize is 1001 (indexes 0..1000). */
    public static final int MAX_TASKS = 1000;
    /** Largest --slurm-cpus accepted. */
    public static final int MAX_CPUS = 1024;
    /** Largest options file (--slurm-sbatch), bytes and lines. */
    static final int MAX_OPTIONS_BYTES = 64 * 1024;
    static final int MAX_OPTIONS_LINES = 200;
    /** How long one sbatch call may take before it is given up, seconds. */
    static final long SBATCH_TIMEOUT_S = 300;

    /** Characters printed without quotes in scripts (common practice for POSIX shell, no source). */
    private static final Pattern SAFE_WORD = Pattern.compile("[A-Za-z0-9_@%+=:,./-]+");
    /** Characters allowed in a path written on an {@code #SBATCH} line (Slurm does not honour shell quoting there). */
    private static final Pattern SAFE_DIRECTIVE_PATH = Pattern.compile("[A-Za-z0-9_@+=:,./-]+");
    /** Options the generated scripts set themselves; an options file may not override them. */
    private static final List<String> RESERVED = List.of("--array", "-a", "--dependency", "-d", "--output", "-o",
        "--error", "-e", "--chdir", "-D", "--parsable", "--wait", "-W", "--cpus-per-task", "-c");

    /** What the array computes: names of the scripts, shards, logs and the task and merge command lines. */
    public enum Kind {
        /** {@code cairn table}: shards are .npy files, the merge is {@code table-merge}, tasks resume checkpoints. */
        TABLE("table"),
        /** {@code cairn deploy}: shards are folders, the merge is {@code deploy --merge-shards}. */
        DEPLOY("deploy");

        private final String command;

        Kind(String command) {
            this.command = command;
        }

        /** The Cairn command: table or deploy. */
        public String command() {
            return command;
        }
    }

    private final Kind kind;
    private final int tasks;
    private final int cpus;
    private final List<String> launcher;
    private final List<String> tableArgs;
    private final List<String> mergeArgs;
    private final Path out;
    private final Path dir;
    private final List<String> sbatchOptions;

    /**
     * @param tasks         N, the number of shards and array tasks (1..{@link #MAX_TASKS})
     * @param cpus          CPUs per task (1..{@link #MAX_CPUS}), {@code --cpus-per-task}
     * @param launcher      the words that start Cairn on a compute node (java, its options, class path, main class)
     * @param tableArgs     {@code table} and its arguments, without {@code --out} and {@code --shard}
     * @param mergeArgs     extra arguments of {@code table-merge} (after the shards and {@code --out})
     * @param out           the merged table (absolute after construction)
     * @param sbatchOptions extra sbatch options, one per element (from {@link #readOptions})
     */
    public SlurmArray(int tasks, int cpus, List<String> launcher, List<String> tableArgs, List<String> mergeArgs,
                      Path out, List<String> sbatchOptions) {
        this(Kind.TABLE, tasks, cpus, launcher, tableArgs, mergeArgs, out, sbatchOptions);
    }

    /**
     * A job array of {@code kind}. For {@link Kind#DEPLOY}: {@code taskArgs} is {@code deploy} and its arguments
     * without {@code --out}, {@code --shard} and {@code --merge-shards}; {@code mergeArgs} are the whole merge command
     * line ({@code deploy} and its arguments) to which the shards and {@code --out} are appended; {@code out} is the
     * output folder of the merge.
     */
    public SlurmArray(Kind kind, int tasks, int cpus, List<String> launcher, List<String> tableArgs,
                      List<String> mergeArgs, Path out, List<String> sbatchOptions) {
        this.kind = kind;
        if (tasks < 1 || tasks > MAX_TASKS) {
            throw new InputException("--slurm: expected 1 to " + MAX_TASKS + " array tasks, got " + tasks);
        }
        if (cpus < 1 || cpus > MAX_CPUS) {
            throw new InputException("--slurm-cpus: expected 1 to " + MAX_CPUS + " CPUs per task, got " + cpus);
        }
        this.tasks = tasks;
        this.cpus = cpus;
        this.launcher = List.copyOf(launcher);
        this.tableArgs = List.copyOf(tableArgs);
        this.mergeArgs = List.copyOf(mergeArgs);
        this.out = out.toAbsolutePath().normalize();
        this.dir = jobDir(this.out);
        this.sbatchOptions = List.copyOf(sbatchOptions);
        for (String w : launcher) {
            requireArgument(w);
        }
        for (String w : tableArgs) {
            requireArgument(w);
        }
        for (String w : mergeArgs) {
            requireArgument(w);
        }
        requireDirectivePath(dir);
        if (kind == Kind.DEPLOY && dir.toString().contains(",")) {
            throw new InputException("--slurm: the job folder " + Messages.path(dir) + " has a comma, which "
                + "--merge-shards would take for a list separator; choose an --out path without commas");
        }
    }

    /** The job folder of table {@code out}: {@code OUT.slurm} beside it. */
    public static Path jobDir(Path out) {
        Path a = out.toAbsolutePath().normalize();
        return a.resolveSibling(a.getFileName() + ".slurm");
    }

    public Path dir() {
        return dir;
    }

    public Path arrayScript() {
        return dir.resolve(kind.command() + "-array.sbatch");
    }

    public Path mergeScript() {
        return dir.resolve(kind.command() + "-merge.sbatch");
    }

    public Path logDir() {
        return dir.resolve("log");
    }

    /** Shard file (table) or folder (deploy) {@code index} (1-based). */
    public Path shard(int index) {
        return dir.resolve(shardName(index));
    }

    private String shardName(int index) {
        return String.format(Locale.ROOT, shardPattern(), index, tasks);
    }

    private String shardPattern() {
        return kind == Kind.TABLE ? "shard-%04d-of-%04d.npy" : "shard-%04d-of-%04d";
    }

    /** One POSIX-shell word for {@code s}: bare when it holds only safe characters, else in single quotes. */
    public static String quote(String s) {
        requireArgument(s);
        if (!s.isEmpty() && SAFE_WORD.matcher(s).matches()) {
            return s;
        }
        return "'" + s.replace("'", "'\"'\"'") + "'";
    }

    private static void requireArgument(String s) {
        for (int i = 0; i < s.length(); i++) {
            if (Messages.isUnsafe(s.charAt(i))) {
                throw new InputException("--slurm: argument " + Messages.quote(s) + " holds a control character; "
                    + "it cannot go into a job script");
            }
        }
    }

    private static void requireDirectivePath(Path p) {
        if (!SAFE_DIRECTIVE_PATH.matcher(p.toString()).matches()) {
            throw new InputException("--slurm: the job folder " + Messages.path(p) + " has a space, quote, % or other "
                + "character that #SBATCH lines cannot carry; choose an --out path of letters, digits and _@+=:,./-");
        }
    }

    private String words(List<String> ws) {
        StringBuilder b = new StringBuilder();
        for (String w : ws) {
            if (b.length() > 0) {
                b.append(' ');
            }
            b.append(quote(w));
        }
        return b.toString();
    }

    /** The launcher with {@code ${CAIRN_JAVA_OPTS:-}} (JVM options from the job's environment) after its first word. */
    private String launch() {
        if (launcher.isEmpty()) {
            return "";
        }
        return quote(launcher.get(0)) + " ${CAIRN_JAVA_OPTS:-}"
            + (launcher.size() > 1 ? " " + words(launcher.subList(1, launcher.size())) : "");
    }

    /** The submit line a user types to run the scripts by hand. */
    public String submitLine() {
        return "jid=$(sbatch --parsable " + quote(arrayScript().toString()) + ") && sbatch --dependency=afterok:"
            + "${jid%%;*} " + quote(mergeScript().toString());
    }

    private void header(StringBuilder b, String what, String jobName, String log) {
        b.append("#!/bin/bash\n");
        b.append("# ").append(what).append("\n");
        b.append("# Written by 'cairn ").append(kind.command()).append(" --slurm ").append(tasks)
            .append("'. Submit both (the merge runs only when every shard succeeded):\n");
        b.append("#   ").append(submitLine()).append('\n');
        b.append("# Caution: results must be verified independently before operational use; mission rules and the\n");
        b.append("# responsible flight-dynamics authority decide.\n");
        b.append("#SBATCH --job-name=").append(jobName).append('\n');
        b.append("#SBATCH --cpus-per-task=").append(cpus).append('\n');
        b.append("#SBATCH --chdir=").append(dir).append('\n');
        b.append("#SBATCH --output=").append(logDir().resolve(log)).append('\n');
    }

    private void extraOptions(StringBuilder b) {
        for (String o : sbatchOptions) {
            b.append("#SBATCH ").append(o).append('\n');
        }
    }

    /** The array script: task k computes shard k+1 of N. */
    public String arrayText() {
        StringBuilder b = new StringBuilder();
        String c = kind.command();
        header(b, "Cairn " + c + " as a Slurm job array: task k (0-based) computes shard k+1 of " + tasks + ".",
            "cairn-" + c, c + "-%A_%a.out");
        b.append("#SBATCH --array=0-").append(tasks - 1).append('\n');
        extraOptions(b);
        b.append("set -eu\n");
        b.append("n=").append(tasks).append('\n');
        b.append("k=${SLURM_ARRAY_TASK_ID:?run this script with sbatch (it is a job array)}\n");
        b.append("case $k in ''|*[!0-9]*) echo \"cairn: SLURM_ARRAY_TASK_ID=$k is not a task number\" >&2; exit 2;; "
            + "esac\n");
        b.append("if [ \"$k\" -ge \"$n\" ]; then echo \"cairn: task $k is beyond the $n shards\" >&2; exit 2; fi\n");
        b.append("i=$((k + 1))\n");
        b.append("shard=").append(quote(dir.toString())).append("/$(printf '").append(shardPattern())
            .append("' \"$i\" \"$n\")\n");
        if (kind == Kind.DEPLOY) {
            b.append("exec ").append(launch()).append(" ").append(words(tableArgs))
                .append(" --shard \"$i/$n\" --out \"$shard\"\n");
            return b.toString();
        }
        b.append("# a requeued or resubmitted task continues from its checkpoints (a different job there is refused)\n");
        b.append("resume=\n");
        b.append("if [ -f \"$shard.partial/job.json\" ]; then resume=--resume; fi\n");
        b.append("exec ").append(launch()).append(" ").append(words(tableArgs))
            .append(" --shard \"$i/$n\" --out \"$shard\" $resume\n");
        return b.toString();
    }

    /** The merge script: joins the N shards into the table. */
    public String mergeText() {
        StringBuilder b = new StringBuilder();
        header(b, "Cairn " + kind.command() + ": merges the " + tasks + " shards of the job array into "
            + out.getFileName() + ".", "cairn-" + kind.command() + "-merge", "merge-%j.out");
        extraOptions(b);
        b.append("set -eu\n");
        if (kind == Kind.DEPLOY) {
            List<String> m = new ArrayList<>(mergeArgs);
            for (int i = 1; i <= tasks; i++) {
                m.add("--merge-shards=" + shard(i));
            }
            m.add("--out");
            m.add(out.toString());
            b.append("exec ").append(launch()).append(" ").append(words(m)).append('\n');
            return b.toString();
        }
        List<String> m = new ArrayList<>(List.of("table-merge"));
        for (int i = 1; i <= tasks; i++) {
            m.add(shard(i).toString());
        }
        m.add("--out");
        m.add(out.toString());
        m.addAll(mergeArgs);
        b.append("exec ").append(launch()).append(" ").append(words(m)).append('\n');
        return b.toString();
    }

    /** Creates the job and log folders and writes both scripts atomically. */
    public void write() {
        try {
            Files.createDirectories(logDir());
        } catch (IOException e) {
            throw new InputException("--slurm: cannot create " + Messages.path(logDir()) + ": " + e.getMessage());
        }
        AtomicFiles.writeString(arrayScript(), arrayText());
        AtomicFiles.writeString(mergeScript(), mergeText());
    }

    /**
     * Extra sbatch options from {@code file}: one per line ({@code --partition=short}, {@code --time=02:00:00},
     * {@code --mem=8G}; a leading {@code #SBATCH} is allowed), blank lines and {@code #} comments skipped. Refuses
     * options the scripts set themselves and anything that is not a single option.
     */
    public static List<String> readOptions(Path file) {
        String where = "--slurm-sbatch " + Messages.path(file);
        byte[] bytes;
        try {
            if (!Files.isRegularFile(file)) {
                throw new InputException(where + ": not a regular file");
            }
            if (Files.size(file) > MAX_OPTIONS_BYTES) {
                throw new InputException(where + ": larger than " + MAX_OPTIONS_BYTES + " bytes");
            }
            bytes = Files.readAllBytes(file);
        } catch (IOException e) {
            throw new InputException(where + ": cannot read: " + e.getMessage());
        }
        String text;
        try {
            text = StandardCharsets.UTF_8.newDecoder().decode(java.nio.ByteBuffer.wrap(bytes)).toString();
        } catch (java.nio.charset.CharacterCodingException e) {
            throw new InputException(where + ": not UTF-8 text");
        }
        String[] lines = text.split("\r?\n", -1);
        if (lines.length > MAX_OPTIONS_LINES) {
            throw new InputException(where + ": more than " + MAX_OPTIONS_LINES + " lines");
        }
        List<String> opts = new ArrayList<>();
        for (int n = 0; n < lines.length; n++) {
            String l = lines[n].strip();
            if (l.startsWith("#SBATCH")) {
                l = l.substring("#SBATCH".length()).strip();
            } else if (l.isEmpty() || l.startsWith("#")) {
                continue;
            }
            String at = where + " line " + (n + 1) + ": ";
            for (int i = 0; i < l.length(); i++) {
                if (Messages.isUnsafe(l.charAt(i))) {
                    throw new InputException(at + "holds a control character");
                }
            }
            if (!l.startsWith("-") || l.length() < 2) {
                throw new InputException(at + "expected one sbatch option such as --partition=NAME, got "
                    + Messages.quote(l));
            }
            String name = l.split("[= \t]", 2)[0];
            if (!name.startsWith("--")) {
                name = name.substring(0, 2); // a short option with its value attached: -a0-9
            }
            if (!name.matches("--[A-Za-z][A-Za-z0-9-]*|-[A-Za-z]")) {
                throw new InputException(at + "expected one sbatch option such as --partition=NAME, got "
                    + Messages.quote(l));
            }
            if (isReserved(name)) {
                throw new InputException(at + name + " is set by the generated scripts (use --slurm N, --slurm-cpus C "
                    + "or --out instead)");
            }
            opts.add(l);
        }
        return opts;
    }

    /**
     * Whether {@code name} sets one of the {@link #RESERVED} options, directly or (sbatch reads long options with
     * getopt_long, which accepts any unambiguous prefix; from memory) as an abbreviation such as {@code --arr}.
     */
    static boolean isReserved(String name) {
        if (RESERVED.contains(name)) {
            return true;
        }
        if (name.startsWith("--") && name.length() > 2) {
            for (String r : RESERVED) {
                if (r.startsWith("--") && r.startsWith(name)) {
                    return true;
                }
            }
        }
        return false;
    }

    /** Job ids of a submission. */
    public record Submission(String arrayJob, String mergeJob) {
    }

    /**
     * Submits the array, then the merge with {@code --dependency=afterok:ARRAYJOB}, through {@code sbatch} (the
     * program name or path) with {@code --parsable}; returns both job ids.
     */
    public Submission submit(String sbatch) {
        String array = sbatch(sbatch, List.of("--parsable", arrayScript().toString()));
        String merge = sbatch(sbatch, List.of("--parsable", "--dependency=afterok:" + array,
            mergeScript().toString()));
        return new Submission(array, merge);
    }

    /** Job id from the first line of {@code sbatch --parsable} ("ID" or "ID;CLUSTER"), or null. */
    static String parseJobId(String output) {
        String first = output.strip().split("\r?\n", 2)[0].strip();
        String id = first.split(";", 2)[0];
        return id.matches("[0-9]{1,18}") ? id : null;
    }

    private static String sbatch(String sbatch, List<String> args) {
        List<String> cmd = new ArrayList<>();
        cmd.add(sbatch);
        cmd.addAll(args);
        Path log = null;
        try {
            log = Files.createTempFile("cairn-sbatch", ".out");
            Process p = new ProcessBuilder(cmd).redirectErrorStream(true).redirectOutput(log.toFile())
                .redirectInput(ProcessBuilder.Redirect.from(new java.io.File("/dev/null"))).start();
            if (!p.waitFor(SBATCH_TIMEOUT_S, TimeUnit.SECONDS)) {
                p.destroyForcibly();
                throw new InputException("--slurm-submit: " + sbatch + " gave no answer in " + SBATCH_TIMEOUT_S + " s");
            }
            String text = Files.readString(log, StandardCharsets.UTF_8);
            String id = p.exitValue() == 0 ? parseJobId(text) : null;
            if (id == null) {
                String first = text.strip().isEmpty() ? "(no output)" : text.strip().split("\r?\n", 2)[0];
                throw new InputException("--slurm-submit: " + sbatch + " " + Messages.path(args.get(args.size() - 1))
                    + " failed (exit " + p.exitValue() + "): " + Messages.line(first, 160));
            }
            return id;
        } catch (IOException e) {
            throw new InputException("--slurm-submit: cannot run " + Messages.quote(sbatch) + ": " + e.getMessage()
                + " (is Slurm installed here?)");
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new InputException("--slurm-submit: interrupted while waiting for " + sbatch);
        } finally {
            if (log != null) {
                try {
                    Files.deleteIfExists(log);
                } catch (IOException ignored) {
                    // a temporary file: best effort
                }
            }
        }
    }

    /**
     * The words that start this Cairn on a compute node: this JVM's {@code java}, {@code ${CAIRN_JAVA_OPTS}} left to
     * the environment of the job, the vector module, {@code cairn.home} and this class path.
     */
    public static List<String> launcher() {
        List<String> l = new ArrayList<>();
        l.add(Path.of(System.getProperty("java.home"), "bin", "java").toString());
        l.add("--add-modules");
        l.add("jdk.incubator.vector");
        String home = System.getProperty("cairn.home");
        if (home != null && !home.isBlank()) {
            l.add("-Dcairn.home=" + Path.of(home).toAbsolutePath().normalize());
        }
        l.add("-cp");
        l.add(classPath());
        l.add(CairnMain.class.getName());
        return l;
    }

    private static String classPath() {
        try {
            Path p = Path.of(CairnMain.class.getProtectionDomain().getCodeSource().getLocation().toURI());
            if (Files.isRegularFile(p)) {
                return p.toAbsolutePath().normalize().toString();
            }
        } catch (java.net.URISyntaxException | SecurityException | NullPointerException
                 | java.nio.file.FileSystemNotFoundException e) {
            // fall through to the class path of this JVM
        }
        List<String> parts = new ArrayList<>();
        for (String s : System.getProperty("java.class.path").split(java.io.File.pathSeparator)) {
            if (!s.isEmpty()) {
                parts.add(Path.of(s).toAbsolutePath().normalize().toString());
            }
        }
        return String.join(java.io.File.pathSeparator, parts);
    }
}
