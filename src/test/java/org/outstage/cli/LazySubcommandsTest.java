package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.Set;
import org.junit.jupiter.api.Test;

/** Issue 13, "build subcommands lazily": a run builds only the command it names; help and mistakes see them all. */
class LazySubcommandsTest {
    private static Set<String> built(String... args) {
        return OutstageCommand.commandLine(new PrintWriter(new StringWriter()), new PrintWriter(new StringWriter()), args).getSubcommands().keySet();
    }

    @Test
    void aNamedCommand_buildsOnlyThatOne() {
        assertEquals(Set.of("analyze"), built("analyze", "--json", "x.wav"));
        assertEquals(Set.of("session"), built("session", "list"));
    }

    @Test
    void versionAlone_buildsNone_helpAndUnknownBuildAll() {
        assertEquals(Set.of(), built("--version"));
        assertEquals(Set.copyOf(OutstageCommand.SUBCOMMANDS), built("--help"));
        assertEquals(Set.copyOf(OutstageCommand.SUBCOMMANDS), built("sessoin"));
        assertEquals(Set.copyOf(OutstageCommand.SUBCOMMANDS), built());
    }

    @Test
    void aMistypedCommand_isRefusedNamingIt() {
        StringWriter err = new StringWriter();
        int code = OutstageCommand.commandLine(new PrintWriter(new StringWriter()), new PrintWriter(err, true), new String[] {"sessoin"}).execute("sessoin");
        assertEquals(OutstageCommand.EXIT_BAD_INPUT, code);
        org.junit.jupiter.api.Assertions.assertTrue(err.toString().contains("sessoin"), err.toString());
    }
}
