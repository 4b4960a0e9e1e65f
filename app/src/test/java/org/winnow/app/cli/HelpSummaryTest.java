package org.winnow.app.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

/**
 * {@code winnow --help} lists each command with the first line of its description. Six of sixteen used to
 * stop mid-sentence ("... c2.J and triple", "... reference TSV:") because a long sentence had been wrapped
 * by hand over several description lines. Every summary must be a whole sentence on its own.
 */
class HelpSummaryTest {
    @Test
    void everyCommandSummaryIsAWholeSentence() {
        CommandLine cl = WinnowCli.commandLine();
        List<String> bad = new ArrayList<>();
        int checked = 0;
        for (Map.Entry<String, CommandLine> e : cl.getSubcommands().entrySet()) {
            CommandLine.Model.UsageMessageSpec usage = e.getValue().getCommandSpec().usageMessage();
            String[] lines = usage.header().length > 0 ? usage.header() : usage.description();
            String summary = lines.length == 0 ? "" : lines[0].strip();
            checked++;
            if (!isWholeSentence(summary)) {
                bad.add(e.getKey() + ": '" + summary + "'");
            }
        }
        assertTrue(checked >= 16, "only " + checked + " commands");
        assertTrue(bad.isEmpty(), "summaries that are not one whole sentence: " + bad);
    }

    @Test
    void theHelpScreenShowsEverySummaryWhole() {
        java.io.StringWriter text = new java.io.StringWriter();
        CommandLine cl = WinnowCli.commandLine();
        cl.setOut(new java.io.PrintWriter(text));
        cl.execute("--help");
        String help = text.toString().replaceAll("\\s+", " ");
        for (CommandLine sub : cl.getSubcommands().values()) {
            CommandLine.Model.UsageMessageSpec usage = sub.getCommandSpec().usageMessage();
            String[] lines = usage.header().length > 0 ? usage.header() : usage.description();
            String summary = lines[0].strip().replaceAll("\\s+", " ");
            assertTrue(help.contains(summary), "the help screen does not show whole: " + summary);
        }
    }

    /**
     * picocli wraps each description line on its own, so a sentence spread by hand over two lines shows as a
     * stub line in the middle ("... used for training" / "and the" / "rest is evaluated"); every line of a
     * command's description must end a sentence.
     */
    @Test
    void everyDescriptionLineOfEveryCommandEndsASentence() {
        List<String> bad = new ArrayList<>();
        for (Map.Entry<String, CommandLine> e : WinnowCli.commandLine().getSubcommands().entrySet()) {
            for (String line : e.getValue().getCommandSpec().usageMessage().description()) {
                // picocli's own help command ends its line with a format newline.
                String s = line.replace("%n", "").strip();
                if (!(s.endsWith(".") || s.endsWith(":") || s.endsWith(".)")) || s.endsWith("e.g.")) {
                    bad.add(e.getKey() + ": '" + s + "'");
                }
            }
        }
        assertTrue(bad.isEmpty(), "description lines that stop mid-sentence: " + bad);
    }

    /**
     * picocli formats every description with {@code String.format}: a bare {@code %} (as in {@code chi%M=R}) made
     * {@code scan --help} and every refused scan print two "[picocli WARN] Could not format" lines on stderr.
     */
    @Test
    void everyHelpScreenRendersWithoutAPicocliWarning() {
        java.io.PrintStream saved = System.err;
        java.io.ByteArrayOutputStream warnings = new java.io.ByteArrayOutputStream();
        int checked = 0;
        StringWriter help = new StringWriter();
        try {
            System.setErr(new java.io.PrintStream(warnings, true, java.nio.charset.StandardCharsets.UTF_8));
            for (CommandLine c : WinnowCli.commandLine().getSubcommands().values()) {
                c.usage(new PrintWriter(help));
                checked++;
            }
        } finally {
            System.setErr(saved);
        }
        assertTrue(checked >= 16, "only " + checked + " commands");
        assertTrue(help.toString().contains("chi%M=R keeps chi = R mod M."), "scan's --keep help shows the residue rule");
        assertEquals("", warnings.toString(java.nio.charset.StandardCharsets.UTF_8));
    }

    static boolean isWholeSentence(String s) {
        if (s.length() < 10 || !Character.isUpperCase(s.charAt(0)) || !s.endsWith(".")) {
            return false;
        }
        int depth = 0;
        for (char c : s.toCharArray()) {
            depth += c == '(' ? 1 : c == ')' ? -1 : 0;
            if (depth < 0) {
                return false;
            }
        }
        return depth == 0 && !s.endsWith("e.g.") && !s.endsWith("i.e.");
    }
}
