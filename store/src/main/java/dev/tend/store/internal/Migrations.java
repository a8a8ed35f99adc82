package dev.tend.store.internal;

import org.flywaydb.core.Flyway;
import org.flywaydb.core.api.FlywayException;
import dev.tend.store.StoreException;

import javax.sql.DataSource;
import java.sql.Connection;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.HashSet;
import java.util.Set;

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

    /** True when Flyway's history in {@code dataSource} holds exactly the {@link #BUNDLED} versions, all applied successfully. */
    static boolean isCurrent(DataSource dataSource) {
        try (Connection c = dataSource.getConnection(); Statement s = c.createStatement();
             ResultSet rs = s.executeQuery("SELECT version, success FROM " + HISTORY_TABLE)) {
            Set<String> applied = new HashSet<>();
            while (rs.next()) {
                String version = rs.getString(1);
                if (!rs.getBoolean(2)) return false;
                if (version != null) applied.add(version); // Flyway's own rows (a schema it created) have none
            }
            return applied.equals(BUNDLED);
        } catch (SQLException e) {
            return false; // no history yet (a new store), or one that cannot be read: Flyway says what it is
        }
    }

    /**
     * The versions of the scripts in {@value #LOCATION}, as Flyway writes them in its history
     * ({@code V2_16__...} is {@code 2.16}); {@code MigrationsTest} checks them against the scripts.
     */
    static final Set<String> BUNDLED = Set.of("1", "2.16", "2.17", "2.18", "2.19", "2.20", "2.21", "2.22", "2.23",
            "2.24", "2.25");

    /**
     * Migrates, and returns how many scripts were applied. A store whose history holds exactly
     * the bundled versions, each applied successfully, is left as it is without starting
     * Flyway ({@link #isCurrent}): Flyway's start (finding and checking the scripts) was about
     * 200 ms of every command's start on an existing store (DEVELOPERS.md, "Ingest"). Anything
     * else (a new store, one to bring forward, a failed script, a version this tend does not
     * know) goes to Flyway, which applies, repairs nothing and refuses as before.
     */
    public static int migrate(DataSource dataSource, Dialect dialect, String location) {
        if (isCurrent(dataSource)) return 0;
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
