package dev.cairn.cli;

import java.io.PrintWriter;
import java.io.StringWriter;

/** One captured run of {@link CairnMain#execute}: exit code, standard output and standard error. */
record CliRun(int exit, String out, String err) {
    static CliRun of(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = CairnMain.execute(new PrintWriter(out), new PrintWriter(err), args);
        return new CliRun(code, out.toString(), err.toString());
    }

    /** True when stderr is exactly one line and carries no stack trace. */
    boolean oneLineError() {
        String e = err.strip();
        return !e.isEmpty() && e.indexOf('\n') < 0 && !e.contains("Exception") && !e.contains("\tat ");
    }
}
