package dev.tend.store.internal;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.sqlite.SQLiteDataSource;

import java.net.URISyntaxException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.Statement;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Collectors;
import java.util.stream.Stream;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

class MigrationsTest {
    @TempDir
    Path dir;

    @Test
    void theBundledVersionsAreThoseOfTheScripts() throws URISyntaxException, java.io.IOException {
        Path scripts = Path.of(Migrations.class.getResource("/db/tend").toURI());
        // V<version>__<description>.sql, the version's parts joined by dots in Flyway's history
        Pattern name = Pattern.compile("V([0-9_]+)__.*\\.sql");
        Set<String> versions;
        try (Stream<Path> files = Files.list(scripts)) {
            versions = files.map(p -> name.matcher(p.getFileName().toString()))
                    .filter(Matcher::matches)
                    .map(m -> m.group(1).replace('_', '.'))
                    .collect(Collectors.toSet());
        }
        assertEquals(versions, Migrations.BUNDLED, "Migrations.BUNDLED must list every script in db/tend: add a new script's version");
    }

    @Test
    void aStoreJustMigratedIsCurrentAndANewOneIsNot() {
        SQLiteDataSource fresh = source("fresh.db");
        assertFalse(Migrations.isCurrent(fresh), "a new store has no history: Flyway creates it");

        try (Database db = Database.sqlite(dir.resolve("migrated.db"))) {
            assertTrue(Migrations.isCurrent(source("migrated.db")));
            assertEquals(0, Migrations.migrate(source("migrated.db"), Dialect.SQLITE, "migrated.db"), "nothing left to apply");
        }
    }

    @Test
    void aFailedOrUnknownScriptInTheHistoryLeavesTheStoreToFlyway() throws Exception {
        try (Database db = Database.sqlite(dir.resolve("failed.db"))) {
            // success is 0 for a script Flyway could not finish (its history table's column)
            execute("failed.db", "UPDATE " + Migrations.HISTORY_TABLE + " SET success = 0 WHERE version = '2.25'");
            assertFalse(Migrations.isCurrent(source("failed.db")));
        }
        try (Database db = Database.sqlite(dir.resolve("newer.db"))) {
            execute("newer.db", "INSERT INTO " + Migrations.HISTORY_TABLE + " (installed_rank, version, description, type, script, checksum, "
                    + "installed_by, execution_time, success) VALUES (99, '999', 'from a newer tend', 'SQL', 'V999__newer.sql', 0, 'tend', 1, 1)");
            assertFalse(Migrations.isCurrent(source("newer.db")), "a version this tend does not know is Flyway's to refuse");
        }
        try (Database db = Database.sqlite(dir.resolve("older.db"))) {
            execute("older.db", "DELETE FROM " + Migrations.HISTORY_TABLE + " WHERE version = '2.25'");
            assertFalse(Migrations.isCurrent(source("older.db")), "a store missing a script is brought forward by Flyway");
        }
    }

    private SQLiteDataSource source(String file) {
        SQLiteDataSource s = new SQLiteDataSource();
        s.setUrl("jdbc:sqlite:" + dir.resolve(file));
        return s;
    }

    private void execute(String file, String sql) throws Exception {
        try (Connection c = source(file).getConnection(); Statement s = c.createStatement()) {
            s.execute(sql);
        }
    }
}
