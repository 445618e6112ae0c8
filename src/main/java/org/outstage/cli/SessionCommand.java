package org.outstage.cli;

import picocli.CommandLine;
import picocli.CommandLine.Command;

/** {@code session}: bench sessions in the logbook (bias adjustment, verification, evaluation). */
@Command(name = "session", mixinStandardHelpOptions = true, description = "Bench sessions in the logbook: start, add bias steps, show the advice, export, import, end.",
        subcommands = {SessionStartCommand.class, SessionAddCommand.class, SessionShowCommand.class, SessionListCommand.class,
                SessionExportCommand.class, SessionImportCommand.class, SessionEndCommand.class})
public final class SessionCommand implements Runnable {
    @CommandLine.Spec CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        throw new CommandLine.ParameterException(spec.commandLine(), "session needs a subcommand: start, add, show, list, export, import, end");
    }
}
