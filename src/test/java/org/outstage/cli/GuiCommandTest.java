package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.*;

import java.io.PrintWriter;
import java.io.StringWriter;
import org.junit.jupiter.api.Test;

class GuiCommandTest {
    @Test
    void missingFile_exitsTwoWithOneLine() {
        StringWriter out = new StringWriter(), err = new StringWriter();
        int code = OutstageCommand.commandLine(new PrintWriter(out), new PrintWriter(err)).execute("gui", "no-such-capture.wav");
        assertEquals(2, code);
        assertEquals("outstage: no-such-capture.wav: not found", err.toString().strip());
        assertEquals("", out.toString());
    }

    @Test
    void help_namesTheCommand() {
        StringWriter out = new StringWriter(), err = new StringWriter();
        int code = OutstageCommand.commandLine(new PrintWriter(out), new PrintWriter(err)).execute("gui", "--help");
        assertEquals(0, code);
        assertTrue(out.toString().contains("Usage: outstage gui"), out.toString());
    }
}
