package dev.cairn.viewer;

import dev.cairn.cli.ModelOptions;
import dev.cairn.cli.SpinOptions;
import dev.cairn.body.BodyModel;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code cairn view}: opens the interactive 3D viewer. No JavaFX type appears in this class: the toolkit starts
 * inside {@link #call()} (via {@link ViewerWindow}), so the command line loads on a machine with no display.
 */
@Command(name = "view", mixinStandardHelpOptions = true,
    header = "Open the 3D viewer of the body coloured by a surveyed quantity.",
    description = {"Open the 3D viewer: the body coloured by slope, effective gravity, effective potential,",
        "dynamic height, lift-off, landing sites or zones; orbit, zoom, pan, preset views, overlays, click to read",
        "values.",
        "Without --survey the survey runs in the background from the model's sidecar parameters.",
        "Caution: results must be verified independently before operational use; mission rules and the",
        "responsible flight-dynamics authority decide."})
public final class ViewCommand implements Callable<Integer> {
    @Mixin
    ModelOptions model = new ModelOptions();

    @Mixin
    SpinOptions spin = new SpinOptions();

    @Option(names = "--survey", paramLabel = "DIR", description = "Survey directory (facets.csv, summary.json).")
    Path survey;

    @Option(names = "--measure-frames", paramLabel = "N", hidden = true,
        description = "Benchmark: orbit for N frames, print frame times and memory, close.")
    int measureFrames;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws InterruptedException {
        PrintWriter err = spec.commandLine().getErr();
        BodyModel body = model.load(spin);
        for (String w : body.warnings()) {
            err.println("cairn: warning: " + w);
        }
        BodyGeometry geometry = BodyGeometry.of(body);
        try {
            ViewerWindow.open(geometry, survey, model.modelPath(), ForwardedOptions.of(spec), measureFrames, err);
        } catch (DisplayUnavailableException e) {
            throw new DisplayUnavailableException("cannot open a window: no display available; use 'cairn render "
                + "... --out FILE.png' to write images instead (under xvfb-run on a machine without a screen)", e);
        }
        return 0;
    }
}
