package dev.cairn.cli;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.function.Predicate;
import picocli.CommandLine.Model.OptionSpec;
import picocli.CommandLine.ParseResult;

/**
 * The options a user gave to one command, as words for another run of Cairn (Slurm tasks and merges, the
 * {@code render} run of {@code deploy --views}): flags by name (negatable ones as {@code --no-NAME} when off), values
 * as one word {@code NAME=VALUE} (so a value starting with '-', a negative coordinate, is never taken for an
 * option), paths made absolute.
 */
public final class ForwardedArguments {
    private ForwardedArguments() {
    }

    /** The matched options of {@code pr} that {@code pass} accepts, in the order given. */
    public static List<String> of(ParseResult pr, Predicate<OptionSpec> pass) {
        List<String> args = new ArrayList<>();
        for (OptionSpec o : pr.matchedOptions()) {
            if (!pass.test(o)) {
                continue;
            }
            if (o.arity().max() == 0) {
                boolean on = Boolean.TRUE.equals(o.getValue());
                if (o.negatable()) {
                    args.add(on ? o.longestName() : o.longestName().replaceFirst("^--", "--no-"));
                } else if (on) {
                    args.add(o.longestName());
                }
                continue;
            }
            for (String v : o.originalStringValues()) {
                args.add(o.longestName() + "=" + (o.type() == Path.class
                    ? Path.of(v).toAbsolutePath().normalize().toString() : v));
            }
        }
        return args;
    }

    /** True for options declared by the model and spin mixins ({@link ModelOptions}, {@link SpinOptions}). */
    public static boolean modelOrSpin(OptionSpec o) {
        if (!(o.userObject() instanceof java.lang.reflect.Field f)) {
            return false;
        }
        Class<?> c = f.getDeclaringClass();
        return c == ModelOptions.class || c == SpinOptions.class || c.getEnclosingClass() == ModelOptions.class;
    }
}
