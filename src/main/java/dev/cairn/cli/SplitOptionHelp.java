package dev.cairn.cli;

import java.util.ArrayList;
import java.util.Collection;
import java.util.Comparator;
import java.util.List;
import picocli.CommandLine;
import picocli.CommandLine.Help;
import picocli.CommandLine.Model.ArgSpec;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Model.OptionSpec;

/**
 * Help text of comma-separated options ({@code split = ","}) as they are meant to be given: once, with their
 * values after one {@code =}. Picocli's default shows such an option as repeatable with a repeated label
 * ({@code [--spin-axis=X,Y,Z[,X,Y,Z...]]...}); here it reads {@code [--spin-axis=X,Y,Z]}, and a list of single values
 * ({@code paramLabel = "M"}) reads {@code --hover-altitudes=M[,M...]}. Only the help text changes: parsing (and
 * each command's own check of the value count) stays as it is. Installed for every command by
 * {@link CairnMain#commandLine()}.
 */
final class SplitOptionHelp extends Help {
    SplitOptionHelp(CommandSpec spec, ColorScheme scheme) {
        super(spec, scheme);
    }

    /** The help factory that makes this help for every command. */
    static CommandLine.IHelpFactory factory() {
        return SplitOptionHelp::new;
    }

    /** Whether {@code o} takes comma-separated values. */
    static boolean isSplit(ArgSpec a) {
        return a instanceof OptionSpec o && o.splitRegex() != null && !o.splitRegex().isEmpty() && o.arity().max() > 0;
    }

    /** The label shown for a comma-separated option: its own when it spells the commas, else {@code L[,L...]}. */
    static String label(OptionSpec o) {
        String l = o.paramLabel();
        return l.contains(",") ? l : l + "[," + l + "...]";
    }

    @Override
    public IParamLabelRenderer parameterLabelRenderer() {
        IParamLabelRenderer base = super.parameterLabelRenderer();
        return new IParamLabelRenderer() {
            @Override
            public Ansi.Text renderParameterLabel(ArgSpec arg, Ansi ansi, List<Ansi.IStyle> styles) {
                if (isSplit(arg)) {
                    return ansi.new Text(0).concat(separator()).concat(ansi.apply(label((OptionSpec) arg), styles));
                }
                return base.renderParameterLabel(arg, ansi, styles);
            }

            @Override
            public String separator() {
                return base.separator();
            }
        };
    }

    /** The synopsis with each comma-separated option shown once (a single-valued stand-in, for the text only). */
    @Override
    protected Ansi.Text createDetailedSynopsisOptionsText(Collection<ArgSpec> done, List<OptionSpec> optionList,
                                                          Comparator<OptionSpec> optionSort,
                                                          boolean clusterBooleanOptions) {
        List<OptionSpec> shown = new ArrayList<>(optionList.size());
        for (OptionSpec o : optionList) {
            if (isSplit(o) && !done.contains(o)) {
                shown.add(OptionSpec.builder(o.names()).type(String.class).arity("1").paramLabel(label(o))
                    .hideParamSyntax(true).required(o.required()).hidden(o.hidden()).order(o.order())
                    .description(o.description()).build());
            } else {
                shown.add(o);
            }
        }
        return super.createDetailedSynopsisOptionsText(done, shown, optionSort, clusterBooleanOptions);
    }
}
