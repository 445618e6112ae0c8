package org.outstage.cli;

import java.io.PrintWriter;
import java.time.Instant;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.concurrent.Callable;
import org.outstage.json.JsonText;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.SessionKind;
import org.outstage.logbook.UnitUnderTest;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code session start --unit NAME}: prints the new session's id. */
@Command(name = "start", mixinStandardHelpOptions = true, description = "Start a session for a unit; prints the session id.")
public final class SessionStartCommand implements Callable<Integer> {
    @CommandLine.Spec CommandLine.Model.CommandSpec spec;
    @Mixin LogbookPathOption logbook;

    @Option(names = "--unit", required = true, paramLabel = "NAME", description = "The unit under test (added to the logbook if new).")
    String unit;

    @Option(names = "--kind", paramLabel = "KIND", description = "bias-adjustment (default), verification or evaluation.")
    String kind = "bias-adjustment";

    @Option(names = "--notes", paramLabel = "TEXT", description = "Free notes.")
    String notes = "";

    @Option(names = "--serial", paramLabel = "TEXT", description = "Serial number, when the unit is new.")
    String serial;

    @Option(names = "--topology", paramLabel = "TEXT", description = "Output-stage topology, when the unit is new.")
    String topology;

    @Option(names = "--rated-power", paramLabel = "W", converter = Units.Watts.class, description = "Rated power in watts, when the unit is new.")
    Double ratedPowerWatts;

    @Option(names = "--rated-load", paramLabel = "OHMS", converter = Units.Ohms.class, description = "Rated load in ohms, when the unit is new.")
    Double ratedLoadOhms;

    @Option(names = "--json", description = "Print {\"session_id\": N}.")
    boolean json;

    @Override
    public Integer call() {
        if (unit.isBlank()) throw new BadInputException("--unit must not be blank");
        SessionKind k = SessionKind.parse(kind);
        UnitUnderTest u = new UnitUnderTest(unit, Optional.ofNullable(serial), Optional.ofNullable(topology), Optional.empty(),
                ratedPowerWatts == null ? OptionalDouble.empty() : OptionalDouble.of(ratedPowerWatts),
                ratedLoadOhms == null ? OptionalDouble.empty() : OptionalDouble.of(ratedLoadOhms));
        long id;
        try (Logbook lb = logbook.open()) {
            id = lb.startSession(u, k, Instant.now(), notes);
        }
        PrintWriter out = spec.commandLine().getOut();
        out.println(json ? JsonText.write(JsonText.obj("session_id", id)) : Long.toString(id));
        out.flush();
        return 0;
    }
}
