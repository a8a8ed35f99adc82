package dev.tend.cli;

import dev.tend.store.Store;
import picocli.CommandLine.Option;

import java.nio.file.Path;

/** The {@code --db} options every store-backed command shares; see {@link StoreAddress}. */
final class DbOption {
    @Option(names = "--db", paramLabel = "FILE|URL", defaultValue = "tend.db",
            description = "the store: a SQLite file (default: ${DEFAULT-VALUE} in the working directory) or a PostgreSQL "
                    + "database, jdbc:postgresql://HOST:PORT/DATABASE")
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
