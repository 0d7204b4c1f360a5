package dev.cairn.viewer;

import dev.cairn.cli.ModelOptions;
import dev.cairn.cli.SpinOptions;
import java.lang.reflect.Field;
import java.util.ArrayList;
import java.util.List;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Model.OptionSpec;
import picocli.CommandLine.ParseResult;

/** The model and spin options a user gave to {@code view}/{@code render}, as arguments to pass to {@code survey}. */
final class ForwardedOptions {
    private ForwardedOptions() {
    }

    static List<String> of(CommandSpec spec) {
        List<String> out = new ArrayList<>();
        ParseResult pr = spec.commandLine().getParseResult();
        if (pr == null) {
            return out;
        }
        for (OptionSpec o : pr.matchedOptions()) {
            if (!(o.userObject() instanceof Field f)) {
                continue;
            }
            Class<?> c = f.getDeclaringClass();
            Class<?> outer = c.getEnclosingClass();
            if (c != ModelOptions.class && c != SpinOptions.class && outer != ModelOptions.class) {
                continue;
            }
            if (o.arity().max() == 0) {
                out.add(o.longestName());
            } else {
                for (String v : o.originalStringValues()) {
                    out.add(o.longestName());
                    out.add(v);
                }
            }
        }
        return out;
    }
}
