package org.outstage.cli;

import java.io.PrintWriter;
import java.util.concurrent.Callable;
import org.outstage.json.JsonText;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.PushResult;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/**
 * {@code logbook push --to URL [--logbook FILE] [--json]}: copies a bench's logbook (units, sessions, steps,
 * measurements, captures) into a shared one. Idempotent: sessions are known by their UUID, steps by their number,
 * captures by their SHA-256, so pushing again copies only what is new.
 */
@Command(name = "push", mixinStandardHelpOptions = true, description = "Copy this bench's logbook (units, sessions, steps, measurements, captures) into a shared one;"
        + " pushing again copies only what is new.")
public final class LogbookPushCommand implements Callable<Integer> {
    @CommandLine.Spec CommandLine.Model.CommandSpec spec;
    @Mixin LogbookPathOption logbook;

    @Option(names = "--to", required = true, paramLabel = "URL",
            description = "The shared logbook: postgresql://USER@HOST:PORT/DATABASE (password from PGPASSWORD or ~/.pgpass), or another file.")
    String to;

    @Option(names = "--json", description = "Print the counts as JSON.")
    boolean json;

    @Override
    public Integer call() {
        String from = logbook.location();
        if (from.strip().equals(to.strip())) throw new BadInputException("--to " + to + " is the logbook being pushed; give the shared logbook");
        PushResult r;
        String target;
        try (Logbook src = logbook.open(); Logbook dst = LogbookPathOption.open(to)) {
            target = dst.display();
            r = src.pushTo(dst);
        }
        PrintWriter out = spec.commandLine().getOut();
        if (json) {
            out.println(JsonText.write(JsonText.obj("to", target, "sessions", r.sessions(), "sessions_added", r.sessionsAdded(),
                    "sessions_updated", r.sessionsUpdated(), "steps_added", r.stepsAdded(), "measurements_added", r.measurementsAdded(),
                    "captures_added", r.capturesAdded(), "captures_missing", r.capturesMissing())));
        } else {
            out.println("pushed " + r.sessions() + " session(s) to " + target + ": " + r.sessionsAdded() + " new, " + r.sessionsUpdated()
                    + " updated; " + r.stepsAdded() + " step(s), " + r.measurementsAdded() + " measurement(s), " + r.capturesAdded()
                    + " capture(s) added");
            if (r.capturesMissing() > 0) {
                spec.commandLine().getErr().println("outstage: warning: " + r.capturesMissing()
                        + " capture(s) were missing from the local captures folder; their rows were pushed without the bytes");
                spec.commandLine().getErr().flush();
            }
        }
        out.flush();
        return 0;
    }
}
