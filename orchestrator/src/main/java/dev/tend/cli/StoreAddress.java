package dev.tend.cli;

import dev.tend.shared.TendException;
import dev.tend.store.Store;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;

/**
 * Where a command's store is and how to log in to it: a SQLite file (a path, or
 * {@code jdbc:sqlite:PATH}) or a PostgreSQL database ({@code jdbc:postgresql://HOST:PORT/DB}).
 * The PostgreSQL user is {@code --db-user}, else {@code PGUSER}, else the driver's default;
 * the password is the first line of {@code --db-password-file}, else {@code PGPASSWORD}, else
 * what the driver finds in {@code PGPASSFILE} or {@code ~/.pgpass}. A password is never
 * taken from the command line: a url carrying one is refused.
 *
 * @param file     the SQLite file; null for PostgreSQL
 * @param url      the JDBC url of a PostgreSQL store; null for SQLite
 * @param user     the PostgreSQL user, or null for the driver's default
 * @param password the PostgreSQL password, or null
 */
record StoreAddress(Path file, String url, String user, String password) {
    static final String POSTGRES_PREFIX = "jdbc:postgresql:";
    static final String SQLITE_PREFIX = "jdbc:sqlite:";

    StoreAddress {
        if ((file == null) == (url == null)) throw new IllegalArgumentException("exactly one of file and url");
    }

    /**
     * Reads {@code --db}, {@code --db-user} and {@code --db-password-file} with the
     * environment {@code env}; throws {@link TendException} naming the option at fault.
     */
    static StoreAddress resolve(String db, String user, Path passwordFile, Map<String, String> env) {
        Objects.requireNonNull(db, "db");
        if (db.startsWith(SQLITE_PREFIX)) return sqlite(Path.of(db.substring(SQLITE_PREFIX.length())), user, passwordFile);
        if (!db.startsWith(POSTGRES_PREFIX)) {
            if (db.startsWith("jdbc:")) {
                throw new TendException("--db " + db + ": tend stores live in a SQLite file (a path or jdbc:sqlite:PATH) or "
                        + "in PostgreSQL (jdbc:postgresql://HOST:PORT/DATABASE)");
            }
            return sqlite(Path.of(db), user, passwordFile);
        }
        for (String param : parameters(db)) {
            if (param.toLowerCase(Locale.ROOT).startsWith("password=")) {
                throw new TendException("--db: the url carries a password, which the command line shows to every user of "
                        + "the machine; put it in a file readable only by you and pass --db-password-file FILE, or set PGPASSWORD");
            }
        }
        String who = user != null ? user : env.get("PGUSER");
        String secret = passwordFile != null ? readPassword(passwordFile) : env.get("PGPASSWORD");
        return new StoreAddress(null, db, blankToNull(who), secret);
    }

    private static StoreAddress sqlite(Path file, String user, Path passwordFile) {
        if (user != null || passwordFile != null) {
            throw new TendException("--db " + file + " is a SQLite file, which has no users or passwords; --db-user and "
                    + "--db-password-file are for a PostgreSQL store (jdbc:postgresql://HOST:PORT/DATABASE)");
        }
        return new StoreAddress(file, null, null, null);
    }

    private static List<String> parameters(String url) {
        int q = url.indexOf('?');
        return q < 0 ? List.of() : List.of(url.substring(q + 1).split("&"));
    }

    private static String readPassword(Path file) {
        try {
            List<String> lines = Files.readAllLines(file, StandardCharsets.UTF_8);
            if (lines.isEmpty() || lines.get(0).isEmpty()) {
                throw new TendException("--db-password-file " + file + ": the file is empty; its first line must be the password");
            }
            return lines.get(0);
        } catch (IOException e) {
            throw new TendException("--db-password-file " + file + ": cannot read it (" + e.getMessage() + ")");
        }
    }

    private static String blankToNull(String s) {
        return s == null || s.isBlank() ? null : s;
    }

    boolean isPostgres() {
        return url != null;
    }

    /** Opens the store, creating (a file) or migrating (a database) it when needed. */
    Store open() {
        return isPostgres() ? Store.openJdbc(url, user, password) : Store.openSqlite(file);
    }

    /** Opens a store that must already exist; a missing file or a database without a store is refused. */
    Store openExisting() {
        if (isPostgres()) return Store.openExistingJdbc(url, user, password);
        if (!Files.exists(file)) {
            throw new TendException(file.toAbsolutePath() + ": no such store; `tend ingest` or `tend serve` writes one"
                    + " (every command uses $TEND_DB, else tend.db in the working directory, unless --db FILE)");
        }
        return Store.openSqlite(file);
    }

    /** The file, or the url: for messages (the url never carries a password). */
    @Override
    public String toString() {
        return isPostgres() ? url : file.toString();
    }
}
