package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.ArrayList;
import java.util.IllegalFormatException;
import java.util.List;
import java.util.Locale;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;
import picocli.CommandLine.Model.ArgSpec;
import picocli.CommandLine.Model.CommandSpec;

/**
 * Issue 11, findings 1 and 2: the README promises {@code --help} on every command. The commands are enumerated from
 * the command line's own subcommand tree, so commands added later are walked too.
 */
class HelpEverywhereTest {

    /** Every command path below the root, e.g. ["session", "add"]; the root itself is the empty path. */
    static List<List<String>> commandPaths() {
        List<List<String>> paths = new ArrayList<>();
        walk(OutstageCommand.commandLine(new PrintWriter(new StringWriter()), new PrintWriter(new StringWriter())),
                new ArrayList<>(), paths);
        return paths;
    }

    private static void walk(CommandLine cl, List<String> path, List<List<String>> into) {
        into.add(List.copyOf(path));
        for (var e : cl.getSubcommands().entrySet()) {
            if (!e.getKey().equals(e.getValue().getCommandName())) continue; // an alias
            path.add(e.getKey());
            walk(e.getValue(), path, into);
            path.remove(path.size() - 1);
        }
    }

    @Test
    void finding1_helpOnEveryCommandAndSubcommand() {
        List<List<String>> paths = commandPaths();
        assertTrue(paths.size() >= 17, "walked " + paths); // 9 commands, 7 session subcommands, the root
        assertTrue(paths.contains(List.of("session", "add")) && paths.contains(List.of("verify")) && paths.contains(List.of("watch")));
        for (List<String> path : paths) {
            List<String> args = new ArrayList<>(path);
            args.add("--help");
            CliRun r = CliRun.of(args.toArray(String[]::new));
            String label = String.join(" ", args);
            assertEquals(0, r.exit(), label + ": " + r.err());
            assertTrue(r.out().startsWith("Usage: outstage" + (path.isEmpty() ? "" : " " + String.join(" ", path))), label + ": " + r.out());
            assertEquals("", r.err(), label);
            assertFalse(r.out().contains("WARN"), label);
        }
    }

    /**
     * picocli passes every description line (command and option) through {@link String#format} with no arguments
     * and, when that throws, prints "[picocli WARN] Could not format" on the process's stderr (which a test cannot
     * reliably capture: the tracer keeps the stream it saw first). So each description line of each command is
     * formatted here the same way: a lone '%' fails.
     */
    @Test
    void finding2_noDescriptionHasAnUnescapedPercent() {
        CommandLine root = OutstageCommand.commandLine(new PrintWriter(new StringWriter()), new PrintWriter(new StringWriter()));
        List<String> bad = new ArrayList<>();
        for (List<String> path : commandPaths()) {
            CommandLine cl = root;
            for (String p : path) cl = cl.getSubcommands().get(p);
            CommandSpec spec = cl.getCommandSpec();
            List<String> lines = new ArrayList<>(List.of(spec.usageMessage().description()));
            lines.addAll(List.of(spec.usageMessage().header()));
            lines.addAll(List.of(spec.usageMessage().footer()));
            for (ArgSpec a : spec.args()) lines.addAll(List.of(a.description()));
            for (String line : lines) {
                try {
                    String.format(Locale.ROOT, line);
                } catch (IllegalFormatException e) {
                    bad.add(String.join(" ", path) + ": \"" + line + "\" (" + e + ")");
                }
            }
        }
        assertEquals(List.of(), bad);
    }
}
