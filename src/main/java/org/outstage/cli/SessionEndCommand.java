package org.outstage.cli;

import java.time.Instant;
import java.util.concurrent.Callable;
import org.outstage.logbook.Logbook;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;

/** {@code session end ID}. */
@Command(name = "end", mixinStandardHelpOptions = true, description = "End a session; no steps can be added after.")
public final class SessionEndCommand implements Callable<Integer> {
    @CommandLine.Spec CommandLine.Model.CommandSpec spec;
    @Mixin LogbookPathOption logbook;

    @Parameters(index = "0", paramLabel = "ID", description = "Session id.")
    long sessionId;

    @Override
    public Integer call() {
        try (Logbook lb = logbook.open()) {
            lb.endSession(sessionId, Instant.now());
        }
        spec.commandLine().getOut().println("session " + sessionId + " ended");
        spec.commandLine().getOut().flush();
        return 0;
    }
}
