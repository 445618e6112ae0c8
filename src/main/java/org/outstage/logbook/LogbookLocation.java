package org.outstage.logbook;

import java.net.URI;
import java.net.URISyntaxException;
import java.nio.file.Path;
import java.util.Objects;

/**
 * Where a logbook lives: a file (SQLite, one bench) or a server (PostgreSQL, a shop of benches). Given as one
 * string, as {@code --logbook} and {@code $OUTSTAGE_LOGBOOK} take it: {@code postgresql://USER@HOST:PORT/DATABASE}
 * (also {@code postgres://}; the port defaults to 5432) names a server, anything else a file. The password is
 * never part of the location: it comes from {@code $PGPASSWORD} or {@code ~/.pgpass} (libpq's conventions).
 */
public sealed interface LogbookLocation {
    /** A short form for messages (a server location without any password). */
    String display();

    /** An SQLite logbook file. */
    record File(Path path) implements LogbookLocation {
        public File {
            Objects.requireNonNull(path, "path");
        }

        @Override
        public String display() { return path.toString(); }
    }

    /** A PostgreSQL database. */
    record Server(String user, String host, int port, String database) implements LogbookLocation {
        public Server {
            Objects.requireNonNull(user, "user");
            Objects.requireNonNull(host, "host");
            Objects.requireNonNull(database, "database");
        }

        @Override
        public String display() { return "postgresql://" + user + "@" + hostPort() + "/" + database; }

        String hostPort() { return (host.contains(":") ? "[" + host + "]" : host) + ":" + port; }

        String jdbcUrl() { return "jdbc:postgresql://" + hostPort() + "/" + database; }
    }

    /** True when the text names a server rather than a file. */
    static boolean isServer(String text) {
        String t = text.strip().toLowerCase(java.util.Locale.ROOT);
        return t.startsWith("postgresql://") || t.startsWith("postgres://");
    }

    /**
     * Reads a location. A malformed server URL is refused with a one-line {@link IllegalArgumentException} that
     * says what was expected.
     */
    static LogbookLocation parse(String text) {
        Objects.requireNonNull(text, "text");
        if (!isServer(text)) {
            if (text.isBlank()) throw new IllegalArgumentException("the logbook location is empty");
            return new File(Path.of(text));
        }
        String expected = "; expected postgresql://USER@HOST:PORT/DATABASE (password from PGPASSWORD or ~/.pgpass)";
        URI u;
        try {
            u = new URI(text.strip());
        } catch (URISyntaxException e) {
            throw new IllegalArgumentException("logbook URL '" + text + "' is malformed (" + e.getReason() + ")" + expected);
        }
        String userInfo = u.getRawUserInfo();
        if (userInfo != null && userInfo.contains(":")) {
            throw new IllegalArgumentException("logbook URL must not carry a password; put it in PGPASSWORD or ~/.pgpass" + expected);
        }
        if (userInfo == null || userInfo.isEmpty()) throw new IllegalArgumentException("logbook URL '" + text + "' names no user" + expected);
        if (u.getHost() == null || u.getHost().isEmpty()) throw new IllegalArgumentException("logbook URL '" + text + "' names no host" + expected);
        String path = u.getPath() == null ? "" : u.getPath();
        String db = path.startsWith("/") ? path.substring(1) : path;
        if (db.isEmpty() || db.contains("/")) throw new IllegalArgumentException("logbook URL '" + text + "' names no database" + expected);
        if (u.getRawQuery() != null || u.getRawFragment() != null) {
            throw new IllegalArgumentException("logbook URL '" + text + "' has options after the database; none are taken" + expected);
        }
        int port = u.getPort() < 0 ? 5432 : u.getPort();
        if (port < 1 || port > 65535) throw new IllegalArgumentException("logbook URL port " + port + " must be 1..65535" + expected);
        String host = u.getHost();
        if (host.startsWith("[") && host.endsWith("]")) host = host.substring(1, host.length() - 1);
        return new Server(u.getUserInfo(), host, port, db);
    }
}
