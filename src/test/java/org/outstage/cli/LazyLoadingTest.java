package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.logbook.Logbook;

/**
 * The pool, the migration tool and the PostgreSQL driver stay off the startup path: a command that does not use
 * the logbook loads none of them, and an up-to-date SQLite logbook opens without them. Checked from the JVM's own
 * class-loading log of a child process.
 */
class LazyLoadingTest {
    @TempDir Path dir;

    private List<String> loaded(String... args) throws Exception {
        return ChildJvm.classLoadLog(dir, args).stream()
                .filter(l -> l.contains("com.zaxxer") || l.contains("org.flywaydb") || l.contains("org.postgresql")).toList();
    }

    @Test
    void analyze_loadsNoPoolMigrationsOrDriver() throws Exception {
        Path project = Path.of(System.getProperty("outstage.project.dir", "."));
        assertEquals(List.of(), loaded("analyze", project.resolve("sample-captures/da60-level-005W.wav").toString()));
    }

    /**
     * Issue 13, "keep JavaFX, SQLite and the model off the analyze path": an analysis loads no class of JavaFX, of the
     * SQLite driver, of the logbook, the output-stage model or the workbench. The detector's own check is
     * {@link #sessionListOnNewSqliteLogbook_loadsFlyway}'s kind: the same filter finds the SQLite driver there.
     */
    @Test
    void analyze_loadsNoJavaFxSqliteLogbookModelOrWorkbench() throws Exception {
        Path project = Path.of(System.getProperty("outstage.project.dir", "."));
        List<String> off = ChildJvm.classLoadLog(dir, "analyze", "--json", project.resolve("sample-captures/da60-level-005W.wav").toString())
                .stream().filter(LazyLoadingTest::offTheAnalyzePath).toList();
        assertEquals(List.of(), off);
        assertTrue(ChildJvm.classLoadLog(dir, "session", "list", "--logbook", dir.resolve("lb2.db").toString()).stream()
                .anyMatch(LazyLoadingTest::offTheAnalyzePath), "the filter sees the logbook and SQLite classes of a logbook command");
    }

    private static boolean offTheAnalyzePath(String line) {
        return line.contains(" javafx.") || line.contains(" com.sun.javafx.") || line.contains(" org.sqlite.")
                || line.contains(" org.outstage.logbook.") || line.contains(" org.outstage.model.") || line.contains(" org.outstage.ui.");
    }

    @Test
    void sessionListOnUpToDateSqliteLogbook_loadsNoPoolMigrationsOrDriver() throws Exception {
        Path db = dir.resolve("lb.db");
        Logbook.open(db).close(); // made and migrated here
        assertEquals(List.of(), loaded("session", "list", "--logbook", db.toString()));
    }

    /** The detector's own check: a new logbook is migrated by Flyway, and the log shows it. */
    @Test
    void sessionListOnNewSqliteLogbook_loadsFlyway() throws Exception {
        List<String> l = loaded("session", "list", "--logbook", dir.resolve("new.db").toString());
        assertTrue(l.stream().anyMatch(x -> x.contains("org.flywaydb")), "Flyway classes loaded: " + l.size());
        assertTrue(l.stream().noneMatch(x -> x.contains("com.zaxxer") || x.contains("org.postgresql")), "no pool, no driver for SQLite");
    }
}
