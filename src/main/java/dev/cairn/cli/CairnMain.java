package dev.cairn.cli;

import dev.cairn.io.InputException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/**
 * Entry point of the {@code cairn} command line. Exit codes: 0 ok, 2 bad input (one line on stderr),
 * 1 internal error (one line; the stack trace only with {@code --debug}).
 */
@Command(name = "cairn", mixinStandardHelpOptions = true, versionProvider = VersionProvider.class,
    description = {
        "Gravity fields of irregular small bodies for proximity operations.",
        "Conventions: SI units, model (body-fixed) frame, potential U > 0, acceleration = grad U.",
        "Caution: results must be verified independently before operational use; mission rules and the",
        "responsible flight-dynamics authority decide."},
    subcommands = {
        SurveyCommand.class,
        InspectCommand.class,
        FieldCommand.class,
        CompareCommand.class,
        TableCommand.class,
        TableMergeCommand.class,
        TrajectoryCommand.class,
        DeployCommand.class,
        BenchCommand.class,
        dev.cairn.viewer.ViewCommand.class,
        dev.cairn.viewer.RenderCommand.class,
        CommandLine.HelpCommand.class})
public final class CairnMain implements Runnable {
    /** Exit code for bad input. */
    public static final int EXIT_BAD_INPUT = 2;
    /** Width of the help text, columns: wide enough that no description line wraps. */
    static final int USAGE_WIDTH = 120;
    /** Exit code for an internal error. */
    public static final int EXIT_INTERNAL = 1;

    @picocli.CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    /** Runs the command line and returns the exit code (for tests). */
    public static int execute(PrintWriter out, PrintWriter err, String... args) {
        CommandLine cl = commandLine();
        cl.setOut(out);
        cl.setErr(err);
        return cl.execute(args);
    }

    /** The configured picocli command line with Cairn's error handling. */
    public static CommandLine commandLine() {
        CommandLine cl = new CommandLine(new CairnMain());
        cl.setUsageHelpWidth(USAGE_WIDTH);
        cl.setExecutionExceptionHandler((ex, commandLine, parseResult) -> {
            boolean debug = parseResult.originalArgs().contains("--debug");
            PrintWriter err = commandLine.getErr();
            if (debug) {
                ex.printStackTrace(err);
            }
            if (ex instanceof InputException) {
                err.println("cairn: error: " + ex.getMessage());
                err.flush();
                return EXIT_BAD_INPUT;
            }
            if (ex instanceof UncheckedIOException) {
                err.println("cairn: error: " + ex.getMessage());
                err.flush();
                return EXIT_BAD_INPUT;
            }
            err.println("cairn: internal error: " + ex + (debug ? "" : " (run with --debug for details)"));
            err.flush();
            return EXIT_INTERNAL;
        });
        cl.setParameterExceptionHandler((ex, args) -> {
            PrintWriter err = ex.getCommandLine().getErr();
            // One line (issue 2: errors are one clear line on stderr), without picocli's own "Error: " prefix.
            String msg = ex.getMessage().replaceFirst("^Error: ", "").strip().replaceAll("\\s*\\R\\s*", " ");
            err.println("cairn: error: " + msg + " (see '" + ex.getCommandLine().getCommandSpec().qualifiedName()
                + " --help')");
            err.flush();
            return EXIT_BAD_INPUT;
        });
        return cl;
    }

    public static void main(String[] args) {
        System.exit(commandLine().execute(args));
    }
}
