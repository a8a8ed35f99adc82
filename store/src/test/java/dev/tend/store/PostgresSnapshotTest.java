package dev.tend.store;

/** Skipped, with the reason, when no PostgreSQL server can be had (see PostgresServer). */
class PostgresSnapshotTest extends SnapshotContractTest {
    @Override
    TestDatabase createDatabase() {
        return PostgresTestDatabase.create();
    }
}
