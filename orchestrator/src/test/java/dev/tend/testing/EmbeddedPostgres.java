package dev.tend.testing;

import java.io.IOException;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * A real PostgreSQL server for the orchestrator's tests, started once per test JVM from the
 * io.zonky.test binaries (or the server at {@code -Dtend.test.postgres.url}, a url of a
 * database whose user may create databases). Each test takes a new database of its own.
 */
public final class EmbeddedPostgres {
    private static final AtomicInteger DATABASES = new AtomicInteger();
    private static EmbeddedPostgres instance;

    private final String adminUrl;
    private final String hostPort;
    private final String user;

    private EmbeddedPostgres(String hostPort, String adminDatabase, String user) {
        this.hostPort = hostPort;
        this.user = user;
        this.adminUrl = "jdbc:postgresql://" + hostPort + "/" + adminDatabase + "?user=" + user;
    }

    /** The server, started on first use; it stops when the JVM exits. */
    public static synchronized EmbeddedPostgres get() {
        if (instance != null) return instance;
        String given = System.getProperty("tend.test.postgres.url");
        if (given != null && !given.isBlank()) {
            // jdbc:postgresql://HOST:PORT/DB?user=U
            String rest = given.substring("jdbc:postgresql://".length());
            int slash = rest.indexOf('/');
            int q = rest.indexOf('?');
            String givenUser = q < 0 ? "postgres" : rest.substring(q + 1).replaceFirst("^.*user=([^&]*).*$", "$1");
            instance = new EmbeddedPostgres(rest.substring(0, slash), rest.substring(slash + 1, q < 0 ? rest.length() : q), givenUser);
            return instance;
        }
        try {
            io.zonky.test.db.postgres.embedded.EmbeddedPostgres pg = io.zonky.test.db.postgres.embedded.EmbeddedPostgres.builder().start();
            Runtime.getRuntime().addShutdownHook(new Thread(() -> {
                try {
                    pg.close();
                } catch (IOException ignored) {
                    // the JVM is going away; the data folder is temporary
                }
            }));
            instance = new EmbeddedPostgres("localhost:" + pg.getPort(), "postgres", "postgres");
            return instance;
        } catch (IOException e) {
            throw new IllegalStateException("embedded PostgreSQL did not start; pass -Dtend.test.postgres.url="
                    + "jdbc:postgresql://HOST:PORT/postgres?user=U to use a server", e);
        }
    }

    /** The user every database here belongs to. */
    public String user() {
        return user;
    }

    /** Creates a new, empty database and returns its url, without user or password: {@code jdbc:postgresql://HOST:PORT/DB}. */
    public String createDatabase() {
        String name = "tend_it_" + ProcessHandle.current().pid() + "_" + DATABASES.incrementAndGet();
        admin("CREATE DATABASE " + name);
        return "jdbc:postgresql://" + hostPort + "/" + name;
    }

    /** Runs one statement on the database at {@code url} (a url from {@link #createDatabase}). */
    public void execute(String url, String sql) {
        try (Connection c = DriverManager.getConnection(url + "?user=" + user); Statement s = c.createStatement()) {
            s.execute(sql);
        } catch (SQLException e) {
            throw new IllegalStateException("on the test PostgreSQL server: " + sql, e);
        }
    }

    public void dropDatabase(String url) {
        admin("DROP DATABASE IF EXISTS " + url.substring(url.lastIndexOf('/') + 1) + " WITH (FORCE)");
    }

    private void admin(String sql) {
        try (Connection c = DriverManager.getConnection(adminUrl); Statement s = c.createStatement()) {
            s.execute(sql);
        } catch (SQLException e) {
            throw new IllegalStateException("on the test PostgreSQL server: " + sql, e);
        }
    }
}
