package org.outstage.cli;

import java.io.PrintWriter;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/**
 * Root of the command line. Exit codes: 0 success, 1 internal fault (or, for {@code verify}, a failed
 * limit), 2 bad input or usage. Errors are one line on stderr, never a stack trace.
 */
@Command(name = "outstage", mixinStandardHelpOptions = true, version = "outstage 0.1.0",
        description = "Distortion and output-stage analysis for transistor audio power amplifiers.")
public final class OutstageCommand implements Runnable {
    /**
     * The subcommands, in the order help lists them. They are added by {@link #commandLine} rather than named in the
     * annotation, so a run can build only the one it uses ({@link #commandLine(PrintWriter, PrintWriter, String[])}):
     * picocli reads every option annotation of every command it registers, some 170 of its classes and 90 of ours for
     * the whole tree.
     */
    static final java.util.Map<String, Class<?>> SUBCOMMANDS = subcommands(BenchCommand.class, AnalyzeCommand.class, SweepCommand.class,
            ModelCommand.class, FitCommand.class, GuiCommand.class, SessionCommand.class, WatchCommand.class, VerifyCommand.class,
            ResponseCommand.class, ImpedanceCommand.class, LogbookCommand.class, DevicesCommand.class, ToneCommand.class, LiveCommand.class);

    private static java.util.Map<String, Class<?>> subcommands(Class<?>... classes) {
        java.util.Map<String, Class<?>> m = new java.util.LinkedHashMap<>();
        for (Class<?> c : classes) m.put(c.getAnnotation(Command.class).name(), c);
        return java.util.Collections.unmodifiableMap(m);
    }

    public static final int EXIT_OK = 0;
    public static final int EXIT_FAULT = 1;
    public static final int EXIT_BAD_INPUT = 2;

    @CommandLine.Spec CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    /** Builds the whole command line (every subcommand) with the project's error handling. */
    public static CommandLine commandLine(PrintWriter out, PrintWriter err) {
        return commandLine(out, err, SUBCOMMANDS.keySet());
    }

    /**
     * Builds the command line for these arguments only: the subcommand they name (its own subcommands come with it),
     * none for {@code --version} alone, every one otherwise (help, a mistyped name: picocli then lists or suggests
     * them).
     */
    public static CommandLine commandLine(PrintWriter out, PrintWriter err, String[] args) {
        if (args.length == 1 && (args[0].equals("--version") || args[0].equals("-V"))) return commandLine(out, err, java.util.Set.of());
        if (args.length > 0 && SUBCOMMANDS.containsKey(args[0])) return commandLine(out, err, java.util.Set.of(args[0]));
        return commandLine(out, err, SUBCOMMANDS.keySet());
    }

    private static CommandLine commandLine(PrintWriter out, PrintWriter err, java.util.Set<String> names) {
        CommandLine cl = new CommandLine(new OutstageCommand());
        for (var e : SUBCOMMANDS.entrySet()) if (names.contains(e.getKey())) cl.addSubcommand(e.getKey(), e.getValue());
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
        java.nio.charset.Charset cs = stdioCharset(java.nio.charset.Charset.defaultCharset());
        PrintWriter out = new PrintWriter(new java.io.OutputStreamWriter(System.out, cs), true);
        PrintWriter err = new PrintWriter(new java.io.OutputStreamWriter(System.err, cs), true);
        int code = commandLine(out, err, args).execute(args);
        out.flush();
        err.flush();
        return code;
    }

    /**
     * The encoding of what the commands print. The platform's, except where that is plain ASCII, as in the POSIX or C
     * locale (a bare {@code env -i}, cron, a minimal container): there every "±", "Ω" or "µ" would print as "?", in
     * JSON too, so the output is UTF-8, the encoding JSON requires (RFC 8259, 8.1). Python decided the same for its
     * standard streams in that locale (PEP 538, PEP 540).
     */
    static java.nio.charset.Charset stdioCharset(java.nio.charset.Charset platform) {
        return platform.equals(java.nio.charset.StandardCharsets.US_ASCII) ? java.nio.charset.StandardCharsets.UTF_8 : platform;
    }

    /**
     * Writes the bash/zsh completion script of the whole command tree ({@code mvn package} runs it:
     * target/outstage_completion), with picocli's generator.
     */
    public static void main(String[] args) throws java.io.IOException {
        if (args.length != 1) throw new IllegalArgumentException("usage: OutstageCommand OUTPUT_FILE");
        CommandLine cl = commandLine(new PrintWriter(java.io.OutputStream.nullOutputStream()), new PrintWriter(java.io.OutputStream.nullOutputStream()));
        java.nio.file.Files.writeString(java.nio.file.Path.of(args[0]), picocli.AutoComplete.bash("outstage", cl));
    }
}
