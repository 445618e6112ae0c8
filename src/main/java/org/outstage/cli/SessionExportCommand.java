package org.outstage.cli;

import java.io.IOException;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.SessionData;
import org.outstage.logbook.SessionExport;
import picocli.CommandLine;
import picocli.CommandLine.ArgGroup;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code session export ID --csv|--json [--output FILE]}. */
@Command(name = "export", mixinStandardHelpOptions = true, description = "Export a session as CSV or JSON (to stdout, or to --output FILE).")
public final class SessionExportCommand implements Callable<Integer> {
    @CommandLine.Spec CommandLine.Model.CommandSpec spec;
    @Mixin LogbookPathOption logbook;

    @Parameters(index = "0", paramLabel = "ID", description = "Session id.")
    long sessionId;

    static final class Format {
        @Option(names = "--csv", required = true, description = "CSV, one row per step.") boolean csv;
        @Option(names = "--json", required = true, description = "JSON.") boolean json;
    }

    @ArgGroup(exclusive = true, multiplicity = "1")
    Format format;

    @Option(names = {"-o", "--output"}, paramLabel = "FILE", description = "Write to FILE (atomically) instead of stdout.")
    Path output;

    @Override
    public Integer call() throws IOException {
        SessionData d;
        try (Logbook lb = logbook.open()) {
            if (lb.session(sessionId).isEmpty()) throw new BadInputException("no session " + sessionId + " in logbook " + lb.path());
            d = lb.sessionData(sessionId);
        }
        String text = format.csv ? SessionExport.toCsv(d) : SessionExport.toJson(d);
        if (output == null) {
            spec.commandLine().getOut().print(text);
            spec.commandLine().getOut().flush();
        } else {
            org.outstage.report.AtomicFile.write(output, text);
        }
        return 0;
    }
}
