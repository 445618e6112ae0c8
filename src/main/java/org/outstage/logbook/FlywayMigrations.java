package org.outstage.logbook;

import javax.sql.DataSource;
import org.flywaydb.core.Flyway;
import org.flywaydb.core.api.FlywayException;

/**
 * Runs the numbered schema migrations with Flyway: {@code db/logbook/sqlite/V*.sql} or
 * {@code db/logbook/postgresql/V*.sql}, the same tables and columns in each engine's DDL. Only called when a
 * logbook is behind {@link #LATEST}, so an up-to-date logbook opens without loading Flyway.
 *
 * <p>SQLite logbooks made before Flyway (hand-rolled {@link Migrations} 1..3, version in {@code PRAGMA user_version})
 * are first brought to 3 by that code and then baselined at 3; Flyway applies 4 onwards.
 */
final class FlywayMigrations {
    private FlywayMigrations() {}

    /** The newest schema version this program knows. */
    static final int LATEST = 4;

    static final String HISTORY_TABLE = "flyway_schema_history";

    /** SQLite: Flyway opens its own connection on the file. {@code baselineAt} is 0 for a new logbook. */
    static void migrateSqlite(String jdbcUrl, int baselineAt) {
        run(Flyway.configure(FlywayMigrations.class.getClassLoader()).dataSource(jdbcUrl, null, null), "sqlite", baselineAt);
    }

    /** PostgreSQL: Flyway takes a connection from the pool and serialises concurrent migrations with an advisory lock. */
    static void migratePostgres(DataSource ds) {
        run(Flyway.configure(FlywayMigrations.class.getClassLoader()).dataSource(ds), "postgresql", 0);
    }

    private static void run(org.flywaydb.core.api.configuration.FluentConfiguration cfg, String vendor, int baselineAt) {
        cfg.locations("classpath:db/logbook/" + vendor).table(HISTORY_TABLE).failOnMissingLocations(true).validateOnMigrate(true);
        if (baselineAt > 0) {
            cfg.baselineOnMigrate(true).baselineVersion(Integer.toString(baselineAt))
                    .baselineDescription("logbook made by the hand-rolled migrations 1.." + baselineAt);
        }
        try {
            cfg.load().migrate();
        } catch (FlywayException e) {
            throw new LogbookException("migrating the logbook schema: " + LogbookException.oneLine(e.getMessage()), e);
        }
    }
}
