package dev.cairn;

import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Assumptions;

/**
 * Runs the system Python 3 ({@code /usr/bin/python3}, or {@code CAIRN_PYTHON}) for tests that check Cairn's files
 * with outside readers (NumPy, VTK, meshio) and the project's Python table reader. When Python or a module is
 * missing the test is skipped with a message, unless the environment sets {@code CAIRN_REQUIRE_PYTHON=1} (as CI
 * does), in which case it fails.
 */
public final class PythonTools {
    /** The interpreter with numpy/vtk/meshio (the Debian packages python3-numpy, python3-vtk9, python3-meshio). */
    public static final String PYTHON = System.getenv().getOrDefault("CAIRN_PYTHON", "/usr/bin/python3");
    /** Longest a helper script may run. */
    private static final long TIMEOUT_S = 300;

    private PythonTools() {
    }

    /** The project's Python sources ({@code tools/python}). */
    public static Path toolsDir() {
        return Paths.get(System.getProperty("user.dir")).resolve("tools/python");
    }

    /** One finished run: exit code, stdout, stderr. */
    public record Run(int exit, String out, String err) {
    }

    /** Skips (or, with CAIRN_REQUIRE_PYTHON=1, fails) unless Python can import every module named. */
    public static void requireModules(String... modules) {
        String why;
        if (!Files.isExecutable(Paths.get(PYTHON))) {
            why = PYTHON + " not found";
        } else {
            Run r = run(List.of(PYTHON, "-c", "import " + String.join(", ", modules)), null);
            why = r.exit() == 0 ? null : "python3 cannot import " + String.join(", ", modules) + ": "
                + r.err().strip().replaceAll("\\s+", " ");
        }
        if (why == null) {
            return;
        }
        String msg = why + " (install python3-numpy python3-vtk9 python3-meshio; see .ci/run)";
        if ("1".equals(System.getenv("CAIRN_REQUIRE_PYTHON"))) {
            fail("CAIRN_REQUIRE_PYTHON=1 but " + msg);
        }
        Assumptions.abort("skipped: " + msg);
    }

    /** Runs a Python script given as text, with {@code tools/python} on the module path and {@code args}. */
    public static Run script(String code, String... args) {
        List<String> cmd = new ArrayList<>(List.of(PYTHON, "-c", code));
        cmd.addAll(List.of(args));
        return run(cmd, toolsDir());
    }

    /** Runs a command; {@code pythonPath} (or null) becomes PYTHONPATH. */
    public static Run run(List<String> cmd, Path pythonPath) {
        try {
            Path out = Files.createTempFile("cairn-py-", ".out");
            Path err = Files.createTempFile("cairn-py-", ".err");
            try {
                ProcessBuilder pb = new ProcessBuilder(cmd).redirectOutput(out.toFile()).redirectError(err.toFile());
                if (pythonPath != null) {
                    pb.environment().put("PYTHONPATH", pythonPath.toString());
                }
                pb.environment().put("PYTHONDONTWRITEBYTECODE", "1");
                Process p = pb.start();
                if (!p.waitFor(TIMEOUT_S, TimeUnit.SECONDS)) {
                    p.destroyForcibly();
                    fail("python did not finish in " + TIMEOUT_S + " s: " + cmd.get(0));
                }
                return new Run(p.exitValue(), Files.readString(out, StandardCharsets.UTF_8),
                    Files.readString(err, StandardCharsets.UTF_8));
            } finally {
                Files.deleteIfExists(out);
                Files.deleteIfExists(err);
            }
        } catch (IOException e) {
            return new Run(127, "", e.getMessage());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException(e);
        }
    }
}
