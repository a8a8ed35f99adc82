package dev.tend.store;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.SQLException;

/** A SQLite file in a test's temporary folder. */
final class SqliteTestDatabase implements TestDatabase {
    private final Path file;

    SqliteTestDatabase(Path file) {
        this.file = file;
    }

    Path file() {
        return file;
    }

    @Override
    public Store open() {
        return Store.openSqlite(file);
    }

    @Override
    public Connection connect() throws SQLException {
        return DriverManager.getConnection("jdbc:sqlite:" + file);
    }

    @Override
    public void close() {
        // the temporary folder goes with the test
    }
}
