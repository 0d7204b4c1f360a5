package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.Map;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;
import picocli.CommandLine.Model.OptionSpec;

/**
 * Usage lines of every command: a comma-separated option is shown given once ({@code --spin-axis=X,Y,Z}), never as
 * repeatable. In utility syntax an ellipsis after an element means it may be repeated (IEEE Std 1003.1-2017, 12.1
 * "Utility Argument Syntax", item 9), so {@code [--spin-axis=X,Y,Z[,X,Y,Z...]]...} would invite a second axis.
 */
class SplitOptionHelpTest {
    @Test
    void noCommaSeparatedOptionIsShownAsRepeatable() {
        CommandLine root = CairnMain.commandLine();
        int checked = 0;
        for (Map.Entry<String, CommandLine> e : root.getSubcommands().entrySet()) {
            CommandLine cl = e.getValue();
            String usage = usage(cl);
            for (OptionSpec o : cl.getCommandSpec().options()) {
                if (!SplitOptionHelp.isSplit(o) || o.hidden()) {
                    continue;
                }
                String shown = o.longestName() + "=" + SplitOptionHelp.label(o);
                String flat = usage.replaceAll("\\s*\\n\\s*", "");
                assertTrue(flat.contains(shown), e.getKey() + ": " + shown + " missing in\n" + usage);
                assertFalse(flat.contains(shown + "]..."), e.getKey() + ": " + shown + " shown repeatable\n" + usage);
                assertFalse(flat.contains(shown + " [" + o.longestName() + "="), e.getKey() + ": " + shown + " repeated");
                assertFalse(flat.contains(shown + "[,"), e.getKey() + ": label repeated after " + shown);
                checked++;
            }
        }
        assertTrue(checked >= 20, "comma-separated options checked: " + checked);
        String table = usage(root.getSubcommands().get("table")).replaceAll("\\s*\\n\\s*", "");
        assertTrue(table.contains("[--spin-axis=X,Y,Z]") && table.contains("--box=XMIN,XMAX,YMIN,YMAX,ZMIN,ZMAX"),
            table);
        assertTrue(usage(root.getSubcommands().get("survey")).contains("--hover-altitudes=M[,M...]"));
    }

    @Test
    void parsingIsUnchanged() {
        // the help text changed, not the parser: a comma list still fills the array in order
        CommandLine cl = CairnMain.commandLine();
        CommandLine.ParseResult pr = cl.parseArgs("table", "--spin-axis", "0,0.5,1", "--grid", "box");
        double[] axis = pr.subcommand().matchedOptionValue("--spin-axis", new double[0]);
        assertEquals(3, axis.length);
        assertEquals(0.5, axis[1]);
    }

    private static String usage(CommandLine cl) {
        StringWriter w = new StringWriter();
        cl.usage(new PrintWriter(w), CommandLine.Help.Ansi.OFF);
        return w.toString();
    }
}
