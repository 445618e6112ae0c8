package org.outstage.cli;

import picocli.CommandLine;
import picocli.CommandLine.Command;

/** {@code logbook}: the logbook as a whole (copying a bench's logbook into the shop's shared one). */
@Command(name = "logbook", mixinStandardHelpOptions = true, description = "The logbook as a whole: push a bench's logbook into a shared one.",
        subcommands = {LogbookPushCommand.class})
public final class LogbookCommand implements Runnable {
    @CommandLine.Spec CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        throw new CommandLine.ParameterException(spec.commandLine(), "logbook needs a subcommand: push");
    }
}
