package dev.cairn.viewer;

import dev.cairn.cli.CairnMain;
import dev.cairn.io.InputException;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.stream.Stream;

/**
 * Gets the survey the viewer colours by: reads a given survey directory, or runs the {@code survey} subcommand
 * programmatically into a temporary directory (with the model and spin options the user gave) and reads that.
 */
public final class SurveySource {
    private SurveySource() {
    }

    /**
     * Runs {@code cairn survey MODEL --out TMP ARGS...} in this process and reads the result (the temporary directory
     * is deleted afterwards).
     *
     * @param model       the OBJ file
     * @param forwarded   model and spin options to pass on (e.g. {@code --density 2000 --spin-period 4h})
     * @param modelFacets facet count of the loaded model
     * @throws InputException when the survey fails (its one-line message is passed on) or does not match the model
     */
    public static SurveyData run(Path model, List<String> forwarded, int modelFacets) {
        Path tmp;
        try {
            tmp = Files.createTempDirectory("cairn-survey-");
        } catch (IOException e) {
            throw new UncheckedIOException("cannot create a temporary directory: " + e.getMessage(), e);
        }
        try {
            List<String> args = new ArrayList<>(List.of("survey", model.toString(), "--out", tmp.toString()));
            args.addAll(forwarded);
            StringWriter out = new StringWriter();
            StringWriter err = new StringWriter();
            int rc = CairnMain.execute(new PrintWriter(out, true), new PrintWriter(err, true),
                args.toArray(new String[0]));
            if (rc != 0) {
                String msg = err.toString().strip();
                int nl = msg.indexOf('\n');
                throw new InputException("running the survey for the viewer failed (exit " + rc + "): "
                    + (nl > 0 ? msg.substring(0, nl) : msg) + "; run 'cairn survey' yourself and pass --survey DIR");
            }
            return SurveyData.read(tmp, model, modelFacets);
        } finally {
            deleteTree(tmp);
        }
    }

    private static void deleteTree(Path dir) {
        try (Stream<Path> s = Files.walk(dir)) {
            s.sorted(Comparator.reverseOrder()).forEach(p -> {
                try {
                    Files.deleteIfExists(p);
                } catch (IOException ignored) {
                    // best effort: our own temporary files
                }
            });
        } catch (IOException ignored) {
            // best effort
        }
    }
}
