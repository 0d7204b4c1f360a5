package dev.cairn.cli;

import dev.cairn.io.InputException;
import dev.cairn.io.Messages;
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
        HarmonicsCommand.class,
        EquilibriaCommand.class,
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
        PrintWriter safeErr = new PrintWriter(new SafeLineWriter(err), true);
        cl.setErr(safeErr);
        return run(cl, safeErr, args);
    }

    /**
     * Runs {@code cl}, turning an {@link OutOfMemoryError} or {@link StackOverflowError} that escapes a command into
     * one line and exit code 2 (the sizes that cause them come from the user). Inputs registered by the run
     * ({@link dev.cairn.io.RunInputs}) are forgotten afterwards.
     */
    static int run(CommandLine cl, PrintWriter err, String... args) {
        dev.cairn.io.RunInputs.clear();
        try {
            return cl.execute(args);
        } catch (OutOfMemoryError | StackOverflowError e) {
            err.println("cairn: error: " + resourceMessage(e));
            err.flush();
            return EXIT_BAD_INPUT;
        } finally {
            dev.cairn.io.RunInputs.clear();
        }
    }

    /** One line for a run that exhausted memory or stack. */
    static String resourceMessage(Throwable e) {
        if (e instanceof StackOverflowError) {
            return "input nested too deeply (the program ran out of stack space)";
        }
        long max = Runtime.getRuntime().maxMemory() >> 20;
        return "out of memory: the sizes asked for need more than the " + max + " MB Java heap; use smaller sizes "
            + "(grid, points, samples, mascons) or a larger heap (-Xmx)";
    }

    /** The root cause of {@code e} when it is an out-of-memory or stack-overflow error, else null. */
    static Throwable resourceCause(Throwable e) {
        for (Throwable t = e; t != null; t = t.getCause() == t ? null : t.getCause()) {
            if (t instanceof OutOfMemoryError || t instanceof StackOverflowError) {
                return t;
            }
        }
        return null;
    }

    /**
     * Standard error for every command: each line is made safe by {@link Messages#line} (control characters
     * escaped, at most {@link Messages#MAX_LINE} characters), whatever code printed it.
     */
    static final class SafeLineWriter extends java.io.Writer {
        private final java.io.Writer target;
        private final StringBuilder line = new StringBuilder();
        private boolean truncated;

        SafeLineWriter(java.io.Writer target) {
            this.target = target;
        }

        @Override
        public synchronized void write(char[] buf, int off, int len) throws java.io.IOException {
            for (int i = off; i < off + len; i++) {
                char c = buf[i];
                if (c == '\n') {
                    emit(true);
                } else if (line.length() < 4 * Messages.MAX_LINE) {
                    line.append(c);
                } else {
                    truncated = true;
                }
            }
        }

        private void emit(boolean newline) throws java.io.IOException {
            if (line.length() > 0 || newline) {
                String s = line.toString();
                if (truncated) {
                    s = s + " ...";
                }
                // A line of a carriage-return-ended progress display keeps no '\r'.
                target.write(Messages.line(s.endsWith("\r") ? s.substring(0, s.length() - 1) : s));
                if (newline) {
                    target.write('\n');
                }
            }
            line.setLength(0);
            truncated = false;
        }

        @Override
        public synchronized void flush() throws java.io.IOException {
            target.flush();
        }

        @Override
        public synchronized void close() throws java.io.IOException {
            emit(false);
            target.flush();
        }
    }

    /** Parses an option value as a plain ASCII integer in {@code [min, max]}. */
    static long strictInteger(String text, long min, long max) {
        String t = text.strip();
        if (!t.matches("[+-]?[0-9]{1,19}")) {
            throw new CommandLine.TypeConversionException(Messages.quote(text) + " is not an integer");
        }
        try {
            long v = Long.parseLong(t);
            if (v < min || v > max) {
                throw new NumberFormatException();
            }
            return v;
        } catch (NumberFormatException e) {
            throw new CommandLine.TypeConversionException(Messages.quote(text) + " is out of range (" + min + " to "
                + max + ")");
        }
    }

    /** Parses an option value as a finite decimal number. */
    static Double strictDouble(String text) {
        String t = text.strip();
        if (!dev.cairn.io.Numbers.isDecimal(t)) {
            throw new CommandLine.TypeConversionException(Messages.quote(text) + " is not a decimal number");
        }
        double v = Double.parseDouble(t);
        if (!Double.isFinite(v)) {
            throw new CommandLine.TypeConversionException(Messages.quote(text) + " is too large (not a finite number)");
        }
        return v;
    }

    /** The configured picocli command line with Cairn's error handling. */
    public static CommandLine commandLine() {
        CommandLine cl = new CommandLine(new CairnMain());
        cl.setUsageHelpWidth(USAGE_WIDTH);
        // comma-separated options read as given once (--spin-axis=X,Y,Z), not as repeatable
        cl.setHelpFactory(SplitOptionHelp.factory());
        // Every number option of every command: plain decimal syntax and finite (no hex floats, f/d suffixes,
        // NaN, Infinity or overflow to infinity).
        CommandLine.ITypeConverter<Double> strict = CairnMain::strictDouble;
        cl.registerConverter(Double.class, strict);
        cl.registerConverter(Double.TYPE, strict);
        // Integers: ASCII digits only (Java would also take other scripts' digits, e.g. Arabic-Indic).
        CommandLine.ITypeConverter<Integer> strictInt = t -> (int) strictInteger(t, Integer.MIN_VALUE, Integer.MAX_VALUE);
        CommandLine.ITypeConverter<Long> strictLong = t -> strictInteger(t, Long.MIN_VALUE, Long.MAX_VALUE);
        cl.registerConverter(Integer.class, strictInt);
        cl.registerConverter(Integer.TYPE, strictInt);
        cl.registerConverter(Long.class, strictLong);
        cl.registerConverter(Long.TYPE, strictLong);
        cl.setErr(new PrintWriter(new SafeLineWriter(new PrintWriter(System.err, true)), true));
        cl.setExecutionExceptionHandler((ex, commandLine, parseResult) -> {
            boolean debug = parseResult.originalArgs().contains("--debug");
            PrintWriter err = commandLine.getErr();
            if (debug) {
                ex.printStackTrace(err);
            }
            Throwable resource = resourceCause(ex);
            if (resource != null) {
                err.println("cairn: error: " + resourceMessage(resource));
                err.flush();
                return EXIT_BAD_INPUT;
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
        CommandLine cl = commandLine();
        System.exit(run(cl, cl.getErr(), args));
    }
}
