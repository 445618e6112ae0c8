package org.outstage.cli;

import java.nio.file.Path;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.LogbookException;
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

    /**
     * Opens the logbook. A file that is not a logbook, or a place where none can be made (a folder, no
     * permission), is bad input (exit 2) with the logbook's one-line message.
     */
    Logbook open() {
        Path p = path();
        if (java.nio.file.Files.isDirectory(p)) throw new BadInputException(p + " is a folder; give the logbook file, e.g. " + p.resolve("logbook.db"));
        try {
            return Logbook.open(p);
        } catch (NotALogbookException e) {
            throw new BadInputException(e.getMessage());
        } catch (LogbookException e) {
            throw new BadInputException("cannot open the logbook: " + e.getMessage());
        }
    }
}
