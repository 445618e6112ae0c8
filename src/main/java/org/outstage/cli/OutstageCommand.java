package org.outstage.cli;

import java.io.PrintWriter;
import java.util.List;
import picocli.CommandLine;
import picocli.CommandLine.Model.CommandSpec;

/**
 * Root of the command line. Exit codes: 0 success, 1 internal fault (or, for {@code verify}, a failed
 * limit), 2 bad input or usage. Errors are one line on stderr, never a stack trace.
 */
public final class OutstageCommand implements Runnable {
    /** The version line of {@code --version}. */
    static final String VERSION = "outstage 0.1.0";

    /**
     * The subcommands' names, in the order help lists them ({@link #subcommand} makes each). They are
     * added by {@link #commandLine} rather than named in an annotation, so a run can build only the one it uses
     * ({@link #commandLine(PrintWriter, PrintWriter, String[])}): picocli reads every option annotation of every
     * command it registers, some 170 of its classes and 90 of ours for the whole tree. Each {@code CommandLine} is
     * made before it is added, so picocli runs the command's model transformer ({@link AnalyzeOptions.Added}).
     * {@code analyze}'s model is built in code ({@link CodeModel}).
     */
    static final List<String> SUBCOMMANDS = List.of("bench", AnalyzeCommand.NAME, "sweep", "model", "fit", "gui", "session", "watch",
            "verify", "response", "impedance", "logbook", "devices", "tone", "live");

    /** The {@code CommandLine} of one subcommand, made (and its model transformed) before it is added to the root. */
    static CommandLine subcommand(String name) {
        return switch (name) {
            case "bench" -> new CommandLine(new BenchCommand());
            case AnalyzeCommand.NAME -> new CommandLine(AnalyzeCommand.model());
            case "sweep" -> new CommandLine(new SweepCommand());
            case "model" -> new CommandLine(new ModelCommand());
            case "fit" -> new CommandLine(new FitCommand());
            case "gui" -> new CommandLine(new GuiCommand());
            case "session" -> new CommandLine(new SessionCommand());
            case "watch" -> new CommandLine(new WatchCommand());
            case "verify" -> new CommandLine(new VerifyCommand());
            case "response" -> new CommandLine(new ResponseCommand());
            case "impedance" -> new CommandLine(new ImpedanceCommand());
            case "logbook" -> new CommandLine(new LogbookCommand());
            case "devices" -> new CommandLine(new DevicesCommand());
            case "tone" -> new CommandLine(new ToneCommand());
            case "live" -> new CommandLine(new LiveCommand());
            default -> throw new IllegalArgumentException("no subcommand " + name);
        };
    }

    public static final int EXIT_OK = 0;
    public static final int EXIT_FAULT = 1;
    public static final int EXIT_BAD_INPUT = 2;

    private CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    /** Builds the whole command line (every subcommand) with the project's error handling. */
    public static CommandLine commandLine(PrintWriter out, PrintWriter err) {
        return commandLine(out, err, java.util.Set.copyOf(SUBCOMMANDS));
    }

    /**
     * Builds the command line for these arguments only: the subcommand they name (its own subcommands come with it),
     * none for {@code --version} alone, every one otherwise (help, a mistyped name: picocli then lists or suggests
     * them).
     */
    public static CommandLine commandLine(PrintWriter out, PrintWriter err, String[] args) {
        if (args.length == 1 && (args[0].equals("--version") || args[0].equals("-V"))) return commandLine(out, err, java.util.Set.of());
        if (args.length > 0 && SUBCOMMANDS.contains(args[0])) return commandLine(out, err, java.util.Set.of(args[0]));
        return commandLine(out, err, java.util.Set.copyOf(SUBCOMMANDS));
    }

    /** The root's model, built in code ({@link CodeModel}): no annotation is read before the subcommand's. */
    private static CommandSpec rootModel() {
        OutstageCommand root = new OutstageCommand();
        CommandSpec s = CodeModel.command(root, "outstage", "Distortion and output-stage analysis for transistor audio power amplifiers.");
        s.version(VERSION);
        CodeModel.standardHelp(s);
        root.spec = s;
        return s;
    }

    private static CommandLine commandLine(PrintWriter out, PrintWriter err, java.util.Set<String> names) {
        CommandLine cl = new CommandLine(rootModel());
        for (String name : SUBCOMMANDS) if (names.contains(name)) cl.addSubcommand(name, subcommand(name));
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
