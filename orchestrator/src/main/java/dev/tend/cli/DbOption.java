package dev.tend.cli;

import dev.tend.shared.TendException;
import dev.tend.store.Store;
import picocli.CommandLine.Option;

import java.nio.file.Files;
import java.nio.file.Path;

/**
 * The {@code --db FILE} option every store-backed command shares. Without it every command
 * uses the same store: {@code $TEND_DB} when set, else {@code tend.db} in the working
 * directory, so that {@code tend ingest} and then {@code tend runs}, {@code audit} and
 * {@code handover} read what it wrote without repeating the flag.
 */
final class DbOption {
    @Option(names = "--db", paramLabel = "FILE", defaultValue = "${env:TEND_DB:-tend.db}",
            description = "the SQLite store (default: $TEND_DB, else tend.db in the working directory)")
    Path db;

    Store open() {
        return Store.openSqlite(db);
    }

    Store openExisting() {
        if (!Files.exists(db)) {
            throw new TendException(db.toAbsolutePath() + ": no such store; `tend ingest` or `tend serve` writes one"
                    + " (every command uses $TEND_DB, else tend.db in the working directory, unless --db FILE)");
        }
        return Store.openSqlite(db);
    }
}
