package org.outstage.cli;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.outstage.json.JsonText;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.SessionData;
import org.outstage.logbook.SessionExport;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code session import FILE}: reads a CSV or JSON export into the logbook as a new session. */
@Command(name = "import", mixinStandardHelpOptions = true, description = "Import a session export (CSV or JSON) as a new session; prints its id.")
public final class SessionImportCommand implements Callable<Integer> {
    @CommandLine.Spec CommandLine.Model.CommandSpec spec;
    @Mixin LogbookPathOption logbook;

    @Parameters(index = "0", paramLabel = "FILE", description = "A file written by session export.")
    Path file;

    @Option(names = "--json", description = "Print {\"session_id\": N}.")
    boolean json;

    @Override
    public Integer call() {
        String text;
        try {
            text = Files.readString(file, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new BadInputException(file + ": cannot read (" + e.getMessage() + ")");
        }
        String name = file.toString();
        SessionData d = text.stripLeading().startsWith("{") ? SessionExport.fromJson(text, name) : SessionExport.fromCsv(text, name);
        long id;
        try (Logbook lb = logbook.open()) {
            id = lb.importSession(d);
        }
        spec.commandLine().getOut().println(json ? JsonText.write(JsonText.obj("session_id", id)) : Long.toString(id));
        spec.commandLine().getOut().flush();
        return 0;
    }
}
