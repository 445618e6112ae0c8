package org.outstage.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.LogbookException;
import org.outstage.logbook.LogbookUnavailableException;
import org.outstage.logbook.NotALogbookException;
import picocli.CommandLine.Option;

/**
 * {@code --logbook PATH|URL}, defaulting to $OUTSTAGE_LOGBOOK or the user's data directory (a picocli mixin). A
 * {@code postgresql://USER@HOST:PORT/DATABASE} URL names a shared logbook on a server (password from PGPASSWORD
 * or ~/.pgpass); anything else is an SQLite file.
 */
public final class LogbookPathOption {
    @Option(names = "--logbook", paramLabel = "PATH|URL",
            description = "Logbook file, or postgresql://USER@HOST:PORT/DATABASE for a shared one (password from PGPASSWORD or ~/.pgpass)"
                    + " (default: $OUTSTAGE_LOGBOOK, else $XDG_DATA_HOME/outstage/logbook.db, else ~/.local/share/outstage/logbook.db).")
    String logbook;

    /** The location as given or defaulted (a file path or a server URL). */
    String location() {
        return logbook != null ? logbook : Logbook.defaultLocation(System.getenv(), Path.of(System.getProperty("user.home")));
    }

    /**
     * Opens the logbook. A file that is not a logbook, a place where none can be made (a folder, no permission),
     * a malformed URL, or a server that cannot be reached or refuses the login is bad input (exit 2) with one line.
     */
    Logbook open() {
        return open(location());
    }

    static Logbook open(String location) {
        if (!Logbook.isServerLocation(location)) {
            Path p = Path.of(location);
            if (Files.isDirectory(p)) throw new BadInputException(p + " is a folder; give the logbook file, e.g. " + p.resolve("logbook.db"));
        }
        try {
            return Logbook.open(location);
        } catch (NotALogbookException | LogbookUnavailableException e) {
            throw new BadInputException(e.getMessage());
        } catch (LogbookException e) {
            throw new BadInputException("cannot open the logbook: " + e.getMessage());
        } catch (IllegalArgumentException e) {
            throw new BadInputException(e.getMessage());
        }
    }
}
