package dev.tend.store;

import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;

class SqliteOpenReceiptTest extends OpenReceiptContractTest {
    @TempDir
    Path dir;

    @Override
    TestDatabase createDatabase() {
        return new SqliteTestDatabase(dir.resolve("tend.db"));
    }
}
