package dev.tend.store.internal;

import org.sqlite.SQLiteConfig;
import org.sqlite.SQLiteDataSource;

import java.io.IOException;
import java.nio.channels.FileChannel;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;

/**
 * An empty SQLite store as this jar's migrations make it, kept beside SQLite's native library
 * ({@link SqliteNativeLibrary#folderIn}: one folder per jar and platform, removed with the
 * library when another jar's is unpacked), from which a new store is copied instead of being
 * migrated. Running the migrations on a new file (Flyway finding, checking and applying ten
 * scripts) took 285 to 298 ms of the first command on every new store, the longest part of its
 * start (DEVELOPERS.md, "Ingest"); copying 180 KB takes a millisecond. The copy is the very file
 * Flyway made: the same tables and the same history (its times those of the template's
 * making), so {@link Migrations#isCurrent} finds it current and later versions migrate it as
 * any other store. The launchers' training run makes the template ({@link #make}); a new store
 * is only ever made from it where no file is ({@link #copyInto}), and anything that goes wrong
 * on the way leaves the store to be made by the migrations as before.
 */
final class StoreTemplate {
    static final String NAME = "empty-store.db";

    private StoreTemplate() {
    }

    /** Makes the template under {@code dir} unless it is there; returns it. */
    static Path make(Path dir) throws IOException {
        Path folder = SqliteNativeLibrary.folderIn(dir);
        Path template = folder.resolve(NAME);
        if (Files.isRegularFile(template)) return template;
        Files.createDirectories(folder);
        Path part = Files.createTempFile(folder, NAME, ".part");
        try {
            Files.delete(part); // SQLite makes the file
            SQLiteConfig config = new SQLiteConfig();
            config.setJournalMode(SQLiteConfig.JournalMode.WAL);
            SQLiteDataSource source = new SQLiteDataSource(config);
            source.setUrl("jdbc:sqlite:" + part);
            Migrations.migrate(source, Dialect.SQLITE, part.toString());
            // the last connection closed: the log was copied into the file and removed
            if (Files.exists(part.resolveSibling(part.getFileName() + "-wal"))) throw new IOException("the template's log was left beside it");
            force(part);
            Files.move(part, template, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
        } finally {
            Files.deleteIfExists(part);
            Files.deleteIfExists(part.resolveSibling(part.getFileName() + "-wal"));
            Files.deleteIfExists(part.resolveSibling(part.getFileName() + "-shm"));
        }
        return template;
    }

    /**
     * Makes the store {@code path} a copy of the template under {@code dir} when no file is
     * there and the template is; true when it did. The copy is written whole beside it and
     * linked into place, which fails rather than replaces when another process made the store
     * meanwhile: an existing file is never touched.
     */
    static boolean copyInto(Path dir, Path path) {
        Path part = null;
        try {
            if (Files.exists(path) || Files.exists(path.resolveSibling(path.getFileName() + "-wal"))) return false;
            Path template = SqliteNativeLibrary.folderIn(dir).resolve(NAME);
            if (!Files.isRegularFile(template)) return false;
            // a name of its own, made by the copy: it gets the template's permissions, as SQLite gives a file it makes
            part = path.resolveSibling(path.getFileName() + "." + ProcessHandle.current().pid() + "-" + System.nanoTime() + ".new");
            Files.copy(template, part);
            force(part);
            Files.createLink(path, part);
            return true;
        } catch (FileAlreadyExistsException e) {
            return false; // made meanwhile by another process: it is opened as it is
        } catch (IOException | RuntimeException e) {
            return false; // no template, a folder that cannot be read, no hard links: the migrations make the store
        } finally {
            if (part != null) {
                try {
                    Files.deleteIfExists(part);
                } catch (IOException ignored) {
                    // a stray part file in the store's folder; the store itself is whole
                }
            }
        }
    }

    private static void force(Path file) throws IOException {
        try (FileChannel c = FileChannel.open(file, StandardOpenOption.WRITE)) {
            c.force(true);
        }
    }
}
