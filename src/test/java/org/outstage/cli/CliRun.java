package org.outstage.cli;

import java.io.PrintWriter;
import java.io.StringWriter;

/** Runs the command line in-process and keeps exit code, stdout and stderr. */
record CliRun(int exit, String out, String err) {
    static CliRun of(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = OutstageCommand.commandLine(new PrintWriter(out, true), new PrintWriter(err, true)).execute(args);
        return new CliRun(code, out.toString(), err.toString());
    }
}
