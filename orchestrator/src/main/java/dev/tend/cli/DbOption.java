package dev.tend.cli;

import dev.tend.store.Store;
import picocli.CommandLine.Option;

import java.nio.file.Path;

/** The {@code --db FILE} option every store-backed command shares. */
final class DbOption {
    @Option(names = "--db", paramLabel = "FILE", defaultValue = "tend.db",
            description = "the SQLite store (default: ${DEFAULT-VALUE} in the working directory)")
    Path db;

    Store open() {
        return Store.openSqlite(db);
    }

    Store openExisting() {
        if (!java.nio.file.Files.exists(db)) {
            throw new dev.tend.shared.TendException(db + ": no such store; run `tend ingest` first or pass --db FILE");
        }
        return Store.openSqlite(db);
    }
}
