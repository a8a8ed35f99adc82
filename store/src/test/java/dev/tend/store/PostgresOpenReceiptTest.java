package dev.tend.store;

/** Skipped, with the reason, when no PostgreSQL server can be had (see PostgresServer). */
class PostgresOpenReceiptTest extends OpenReceiptContractTest {
    @Override
    TestDatabase createDatabase() {
        return PostgresTestDatabase.create();
    }
}
