package dev.tend.store.internal;

import org.flywaydb.core.Flyway;
import org.flywaydb.core.api.FlywayException;
import dev.tend.store.StoreException;

import javax.sql.DataSource;

/**
 * Brings a database to this tend's schema with Flyway: the versioned scripts in
 * {@value #LOCATION} (one set for both databases, the differences filled in from
 * {@link Dialect#placeholders()}). Safe to run on every open: applied versions are skipped.
 */
public final class Migrations {
    public static final String LOCATION = "classpath:db/tend";
    /** Flyway's table of applied migrations (its default name): present in every tend store. */
    public static final String HISTORY_TABLE = "flyway_schema_history";

    private Migrations() {
    }

    /** Migrates, and returns how many scripts were applied. */
    public static int migrate(DataSource dataSource, Dialect dialect, String location) {
        try {
            return Flyway.configure(Migrations.class.getClassLoader())
                    .dataSource(dataSource)
                    .locations(LOCATION)
                    .table(HISTORY_TABLE)
                    .failOnMissingLocations(true)
                    .placeholders(dialect.placeholders())
                    // Flyway ignores versions it does not know ("*:future") by default; a store migrated by a
                    // newer tend may mean things this one does not understand, so refuse it instead.
                    .ignoreMigrationPatterns(new String[0])
                    .load()
                    .migrate()
                    .migrationsExecuted;
        } catch (FlywayException e) {
            // A failure to reach or read the database is not a schema problem: say what it is.
            if (Failures.sqlCause(e) != null) throw Failures.ofOpening(location, e);
            throw new StoreException(location, "cannot bring the store at " + location + " to this tend's schema: "
                    + e.getMessage() + " If the store was written by a newer tend, run that version; if it is not a tend "
                    + "store, point tend at another file or database.", e);
        }
    }
}
