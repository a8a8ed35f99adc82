package dev.tend.cli;

import dev.tend.store.Store;
import picocli.CommandLine.Option;

import java.nio.file.Path;

/**
 * The {@code --db} options every store-backed command shares; see {@link StoreAddress}. Without
 * {@code --db} every command uses the same store: {@code $TEND_DB} when set, else {@code tend.db}
 * in the working directory, so that {@code tend ingest} and then {@code tend runs}, {@code audit}
 * and {@code handover} read what it wrote without repeating the flag.
 */
final class DbOption {
    @Option(names = "--db", paramLabel = "FILE|URL", defaultValue = "${env:TEND_DB:-tend.db}",
            description = "the store: a SQLite file or a PostgreSQL database, jdbc:postgresql://HOST:PORT/DATABASE"
                    + " (default: $TEND_DB, else tend.db in the working directory)")
    String db;

    @Option(names = "--db-user", paramLabel = "USER",
            description = "the PostgreSQL user (default: PGUSER, else the driver's default)")
    String user;

    @Option(names = "--db-password-file", paramLabel = "FILE",
            description = "a file whose first line is the PostgreSQL password (default: PGPASSWORD, else PGPASSFILE "
                    + "or ~/.pgpass); never put a password on the command line")
    Path passwordFile;

    StoreAddress address() {
        return StoreAddress.resolve(db, user, passwordFile, System.getenv());
    }

    Store open() {
        return address().open();
    }

    Store openExisting() {
        return address().openExisting();
    }

    /** What to call the store in messages: the file or the url. */
    String describe() {
        return address().toString();
    }
}
