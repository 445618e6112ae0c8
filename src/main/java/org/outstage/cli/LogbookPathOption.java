package org.outstage.cli;

import java.nio.file.Path;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.NotALogbookException;
import picocli.CommandLine.Option;

/** {@code --logbook PATH}, defaulting to $OUTSTAGE_LOGBOOK or the user's data directory (a picocli mixin). */
public final class LogbookPathOption {
    @Option(names = "--logbook", paramLabel = "PATH",
            description = "Logbook file (default: $OUTSTAGE_LOGBOOK, else $XDG_DATA_HOME/outstage/logbook.db, else ~/.local/share/outstage/logbook.db).")
    Path logbook;

    Path path() {
        return logbook != null ? logbook : Logbook.defaultPath(System.getenv(), Path.of(System.getProperty("user.home")));
    }

    /** Opens the logbook; a file that is not a logbook is bad input (exit 2). */
    Logbook open() {
        try {
            return Logbook.open(path());
        } catch (NotALogbookException e) {
            throw new BadInputException(e.getMessage());
        }
    }
}
