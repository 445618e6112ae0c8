package org.outstage.cli;

import java.io.PrintWriter;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/**
 * Root of the command line. Exit codes: 0 success, 1 internal fault (or, for {@code verify}, a failed
 * limit), 2 bad input or usage. Errors are one line on stderr, never a stack trace.
 */
@Command(name = "outstage", mixinStandardHelpOptions = true, version = "outstage 0.1.0",
        description = "Distortion and output-stage analysis for transistor audio power amplifiers.",
        subcommands = {BenchCommand.class, AnalyzeCommand.class, SweepCommand.class, ModelCommand.class, FitCommand.class, GuiCommand.class,
                SessionCommand.class, WatchCommand.class, VerifyCommand.class, ResponseCommand.class, ImpedanceCommand.class, LogbookCommand.class,
                DevicesCommand.class, ToneCommand.class, LiveCommand.class})
public final class OutstageCommand implements Runnable {
    public static final int EXIT_OK = 0;
    public static final int EXIT_FAULT = 1;
    public static final int EXIT_BAD_INPUT = 2;

    @CommandLine.Spec CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    /** Builds the command line with the project's error handling. */
    public static CommandLine commandLine(PrintWriter out, PrintWriter err) {
        CommandLine cl = new CommandLine(new OutstageCommand());
        cl.setOut(out);
        cl.setErr(err);
        cl.setExitCodeExceptionMapper(t -> EXIT_FAULT);
        cl.setParameterExceptionHandler((ex, args) -> {
            ex.getCommandLine().getErr().println("outstage: " + ex.getMessage());
            ex.getCommandLine().getErr().flush();
            return EXIT_BAD_INPUT;
        });
        cl.setExecutionExceptionHandler((ex, commandLine, parseResult) -> {
            PrintWriter e = commandLine.getErr();
            if (ex instanceof BadInputException || ex instanceof IllegalArgumentException
                    || ex instanceof org.outstage.logbook.LogbookUnavailableException) {
                e.println("outstage: " + ex.getMessage());
                e.flush();
                return EXIT_BAD_INPUT;
            }
            e.println("outstage: internal fault: " + ex);
            e.flush();
            return EXIT_FAULT;
        });
        return cl;
    }

    /** Runs with the process's stdout and stderr; returns the exit code. */
    public static int run(String[] args) {
        PrintWriter out = new PrintWriter(System.out, true);
        PrintWriter err = new PrintWriter(System.err, true);
        int code = commandLine(out, err).execute(args);
        out.flush();
        err.flush();
        return code;
    }
}
