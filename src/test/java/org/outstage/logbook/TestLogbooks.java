package org.outstage.logbook;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.Properties;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.stream.Stream;
import org.junit.jupiter.api.Assertions;
import org.junit.jupiter.api.Assumptions;

/**
 * The two engines for parameterised logbook tests. SQLite: a file in the test's folder. PostgreSQL: a fresh
 * database on the server named by {@code $OUTSTAGE_TEST_PG_URL} (password in {@code $PGPASSWORD}; see
 * {@code tools/test-postgres}). Without a reachable server the PostgreSQL cases are skipped with the reason,
 * except under CI ({@code CI=true}), where they fail.
 */
public final class TestLogbooks {
    private TestLogbooks() {}

    public static final String SQLITE = "sqlite";
    public static final String POSTGRES = "postgresql";
    static final String URL_ENV = "OUTSTAGE_TEST_PG_URL";

    private static final AtomicInteger COUNTER = new AtomicInteger();
    private static volatile String problem;
    private static volatile boolean checked;

    public static Stream<String> engines() {
        return Stream.of(SQLITE, POSTGRES);
    }

    /** A new, empty logbook location of that engine. */
    public static String newLogbook(String engine, Path dir, String name) {
        if (engine.equals(SQLITE)) return dir.resolve(name + ".db").toString();
        LogbookLocation.Server base = requireServer();
        String db = "outstage_t_" + ProcessHandle.current().pid() + "_" + COUNTER.incrementAndGet() + "_"
                + name.toLowerCase(java.util.Locale.ROOT).replaceAll("[^a-z0-9]", "");
        try (Connection c = connect(base); Statement s = c.createStatement()) {
            s.executeUpdate("CREATE DATABASE " + db);
        } catch (SQLException e) {
            throw new AssertionError("cannot create test database " + db + ": " + e.getMessage(), e);
        }
        return new LogbookLocation.Server(base.user(), base.host(), base.port(), db).display();
    }

    /** The test server, or a skip (outside CI) / a failure (CI=true) naming why there is none. */
    public static LogbookLocation.Server requireServer() {
        String url = System.getenv(URL_ENV);
        if (!checked) {
            synchronized (TestLogbooks.class) {
                if (!checked) {
                    if (url == null || url.isBlank()) problem = "$" + URL_ENV + " is not set (eval \"$(tools/test-postgres start)\")";
                    else {
                        try (Connection c = connect((LogbookLocation.Server) LogbookLocation.parse(url))) {
                            problem = null;
                        } catch (SQLException | RuntimeException e) {
                            problem = "the test server " + url + " is unreachable: " + e.getMessage();
                        }
                    }
                    checked = true;
                }
            }
        }
        if (problem != null) {
            if ("true".equals(System.getenv("CI"))) Assertions.fail("CI=true and PostgreSQL tests cannot run: " + problem);
            Assumptions.abort("PostgreSQL tests skipped: " + problem);
        }
        return (LogbookLocation.Server) LogbookLocation.parse(url);
    }

    static Connection connect(LogbookLocation.Server s) throws SQLException {
        Properties p = new Properties();
        p.setProperty("user", s.user());
        String pw = System.getenv("PGPASSWORD");
        if (pw != null) p.setProperty("password", pw);
        p.setProperty("connectTimeout", "5");
        return DriverManager.getConnection(s.jdbcUrl(), p);
    }

    /** Opens a location as a test would; the PostgreSQL case checks the server first (skip or fail). */
    public static Logbook open(String location) {
        if (LogbookLocation.isServer(location)) requireServer();
        return Logbook.open(location);
    }
}
