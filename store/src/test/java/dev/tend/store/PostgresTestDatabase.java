package dev.tend.store;

import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.SQLException;

import static org.junit.jupiter.api.Assumptions.assumeTrue;

/** A new database on the test PostgreSQL server, dropped afterwards. */
final class PostgresTestDatabase implements TestDatabase {
    private final PostgresServer server;
    private final String url;

    private PostgresTestDatabase(PostgresServer server, String url) {
        this.server = server;
        this.url = url;
    }

    /** A fresh database; skips the calling test when no PostgreSQL server can be had. */
    static PostgresTestDatabase create() {
        PostgresServer server = PostgresServer.get();
        assumeTrue(server != null, PostgresServer::unavailable);
        return new PostgresTestDatabase(server, server.createDatabase());
    }

    @Override
    public Store open() {
        return Store.openJdbc(url, null, null);
    }

    @Override
    public Connection connect() throws SQLException {
        return DriverManager.getConnection(url);
    }

    @Override
    public void close() {
        server.dropDatabase(url);
    }
}
