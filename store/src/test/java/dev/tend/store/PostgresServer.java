package dev.tend.store;

import io.zonky.test.db.postgres.embedded.EmbeddedPostgres;

import java.io.IOException;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * The PostgreSQL server the PostgreSQL contract tests run on, started once per test JVM:
 * the server at {@code -Dtend.test.postgres.url} (a url to a database whose user may
 * create databases, e.g. jdbc:postgresql://127.0.0.1:5432/postgres?user=tend) when given,
 * else an embedded PostgreSQL from the io.zonky.test binaries. When neither can be had,
 * {@link #unavailable()} says why and the tests are skipped.
 */
final class PostgresServer {
    private static final AtomicInteger DATABASES = new AtomicInteger();
    private static PostgresServer instance;
    private static String unavailable;

    private final String adminUrl;
    private final String baseUrl;

    private PostgresServer(String adminUrl) {
        this.adminUrl = adminUrl;
        int q = adminUrl.indexOf('?');
        String noQuery = q < 0 ? adminUrl : adminUrl.substring(0, q);
        this.baseUrl = noQuery.substring(0, noQuery.lastIndexOf('/') + 1);
    }

    /** The server, or null when none could be had (then {@link #unavailable()} says why). */
    static synchronized PostgresServer get() {
        if (instance != null || unavailable != null) return instance;
        String given = System.getProperty("tend.test.postgres.url");
        if (given != null && !given.isBlank()) {
            instance = new PostgresServer(given);
            return instance;
        }
        try {
            EmbeddedPostgres pg = EmbeddedPostgres.builder().start();
            Runtime.getRuntime().addShutdownHook(new Thread(() -> {
                try {
                    pg.close();
                } catch (IOException ignored) {
                    // the JVM is going away; the data folder is temporary
                }
            }));
            instance = new PostgresServer(pg.getJdbcUrl("postgres", "postgres"));
        } catch (IOException | RuntimeException e) {
            unavailable = "embedded PostgreSQL did not start here (" + rootCause(e) + "); "
                    + ("root".equals(System.getProperty("user.name"))
                    ? "PostgreSQL refuses to run as root, and this JVM runs as root. "
                    : "")
                    + "Pass -Dtend.test.postgres.url=jdbc:postgresql://HOST:PORT/postgres?user=U to run these tests on a server";
        }
        return instance;
    }

    static synchronized String unavailable() {
        return unavailable;
    }

    /** Creates a new, empty database and returns its url. */
    String createDatabase() {
        String name = "tend_test_" + ProcessHandle.current().pid() + "_" + DATABASES.incrementAndGet();
        admin("CREATE DATABASE " + name);
        int q = adminUrl.indexOf('?');
        return baseUrl + name + (q < 0 ? "" : adminUrl.substring(q));
    }

    void dropDatabase(String url) {
        int q = url.indexOf('?');
        String noQuery = q < 0 ? url : url.substring(0, q);
        admin("DROP DATABASE IF EXISTS " + noQuery.substring(noQuery.lastIndexOf('/') + 1) + " WITH (FORCE)");
    }

    private void admin(String sql) {
        try (Connection c = DriverManager.getConnection(adminUrl); Statement s = c.createStatement()) {
            s.execute(sql);
        } catch (SQLException e) {
            throw new IllegalStateException("on the test PostgreSQL server: " + sql, e);
        }
    }

    private static String rootCause(Throwable e) {
        Throwable t = e;
        while (t.getCause() != null) t = t.getCause();
        return t.getClass().getSimpleName() + ": " + t.getMessage();
    }
}
