package org.outstage.cli;

import java.io.PrintWriter;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.outstage.json.JsonText;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.Session;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code session list}: every session, oldest first. */
@Command(name = "list", mixinStandardHelpOptions = true, description = "List the sessions in the logbook.")
public final class SessionListCommand implements Callable<Integer> {
    @CommandLine.Spec CommandLine.Model.CommandSpec spec;
    @Mixin LogbookPathOption logbook;

    @Option(names = "--json", description = "Print JSON.")
    boolean json;

    @Override
    public Integer call() {
        List<Session> sessions;
        try (Logbook lb = logbook.open()) {
            sessions = lb.sessions();
        }
        PrintWriter out = spec.commandLine().getOut();
        if (json) {
            List<Object> l = new ArrayList<>();
            for (Session s : sessions) {
                l.add(JsonText.obj("session_id", s.id(), "unit", s.unitName(), "kind", s.kind().label(), "started_at", s.startedAt().toString(),
                        "ended_at", s.endedAt().map(Instant::toString), "notes", s.notes()));
            }
            out.println(JsonText.pretty(JsonText.obj("sessions", l)));
        } else {
            for (Session s : sessions) {
                out.printf("%d  %-16s %-15s %s%s%n", s.id(), s.unitName(), s.kind().label(), s.startedAt(),
                        s.endedAt().map(e -> " .. " + e).orElse("  (open)"));
            }
        }
        out.flush();
        return 0;
    }
}
