package dev.cairn.viewer;

import dev.cairn.cli.ForwardedArguments;
import java.util.ArrayList;
import java.util.List;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.ParseResult;

/** The model and spin options a user gave to {@code view}/{@code render}, as arguments to pass to {@code survey}. */
final class ForwardedOptions {
    private ForwardedOptions() {
    }

    static List<String> of(CommandSpec spec) {
        ParseResult pr = spec.commandLine().getParseResult();
        return pr == null ? new ArrayList<>() : ForwardedArguments.of(pr, ForwardedArguments::modelOrSpin);
    }
}
