package dev.tend.store.internal;

import org.sqlite.SQLiteJDBCLoader;
import org.sqlite.util.LibraryLoaderUtil;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.zip.CRC32;

/**
 * SQLite's native library, unpacked once into a folder tend keeps instead of at every start.
 * Left to itself, sqlite-jdbc copies the library out of its jar into the temporary folder
 * under a new name each time a process first opens a database, reads it back to compare,
 * and leaves the file behind when the process is killed: about 1 MB and 60 to 90 ms of every
 * start of {@code tend} (DEVELOPERS.md, "Ingest"). The launchers name a folder in the system
 * property {@value #DIR_PROPERTY} (beside the jar, or the user's cache); the library is kept
 * there ({@link #keptIn}), and sqlite-jdbc is pointed at it through its own properties
 * {@code org.sqlite.lib.path} and {@code org.sqlite.lib.name}.
 * Without the property, with those properties already set, or when the folder cannot be
 * written, sqlite-jdbc does as it always does.
 */
public final class SqliteNativeLibrary {
    /** The system property naming the folder to keep the library in. */
    public static final String DIR_PROPERTY = "tend.native.dir";
    private static final String LIB_PATH = "org.sqlite.lib.path";
    private static final String LIB_NAME = "org.sqlite.lib.name";
    private static volatile boolean prepared;

    private SqliteNativeLibrary() {
    }

    /** The folder the launchers name in {@value #DIR_PROPERTY}; null without it. */
    static Path keptDir() {
        String dir = System.getProperty(DIR_PROPERTY);
        return dir == null || dir.isBlank() ? null : Path.of(dir);
    }

    /** Points sqlite-jdbc at the kept library, unpacking it first when needed; once per process, before the first connection. */
    static void prepare() {
        if (prepared) return;
        synchronized (SqliteNativeLibrary.class) {
            if (prepared) return;
            prepared = true;
            Path dir = keptDir();
            if (dir == null || System.getProperty(LIB_PATH) != null) return;
            try {
                Path lib = keptIn(dir);
                if (lib == null) return;
                System.setProperty(LIB_PATH, lib.getParent().toString());
                System.setProperty(LIB_NAME, lib.getFileName().toString());
            } catch (IOException | RuntimeException e) {
                // the folder cannot be written (or read): sqlite-jdbc unpacks into the temporary folder as before
            }
        }
    }

    /**
     * The library for this platform under {@code dir}, unpacked now unless an intact copy is
     * there (its size and CRC-32 those recorded beside it when it was unpacked); null when
     * the jar holds none for this platform. The folder under {@code dir} is named for the jar
     * that holds sqlite-jdbc (its path, size and time) and the platform as Java names it, so
     * that a start with the copy in place asks sqlite-jdbc nothing: finding its platform runs
     * {@code uname} as a process and reading its version reads the jar, about 45 ms together.
     * Unpacking a new copy removes those of other jars. Two processes unpacking at once each
     * write their own temporary files and move them into place whole.
     */
    public static Path keptIn(Path dir) throws IOException {
        String name = LibraryLoaderUtil.getNativeLibName();
        Path folder = folderIn(dir);
        Path target = folder.resolve(name);
        Path record = folder.resolve(name + ".crc32");
        if (Files.isRegularFile(target) && Files.isRegularFile(record) && Files.readString(record).equals(recordOf(Files.readAllBytes(target)))) {
            return target;
        }
        String resource = LibraryLoaderUtil.getNativeLibResourcePath() + "/" + name; // "/org/sqlite/native/<os>/<arch>/..."
        byte[] bytes;
        try (InputStream in = SQLiteJDBCLoader.class.getResourceAsStream(resource)) {
            if (in == null) return null;
            bytes = in.readAllBytes();
        }
        Files.createDirectories(folder);
        placeWhole(target, bytes);
        placeWhole(record, recordOf(bytes).getBytes(StandardCharsets.US_ASCII));
        removeOthers(dir, folder);
        return target;
    }

    /** The folder under {@code dir} for what is kept for this jar and platform (the library, {@link StoreTemplate}'s empty store). */
    static Path folderIn(Path dir) throws IOException {
        return dir.resolve(keyOf(jarOf()));
    }

    /** The file sqlite-jdbc's classes are loaded from (tend's jar, or sqlite-jdbc's own). */
    private static Path jarOf() throws IOException {
        try {
            return Path.of(SQLiteJDBCLoader.class.getProtectionDomain().getCodeSource().getLocation().toURI());
        } catch (java.net.URISyntaxException | RuntimeException e) {
            throw new IOException("cannot tell where sqlite-jdbc is loaded from: " + e, e);
        }
    }

    /** A folder name for the library unpacked from {@code jar} on this platform. */
    private static String keyOf(Path jar) throws IOException {
        String what = jar.toAbsolutePath() + "\n" + Files.size(jar) + "\n" + Files.getLastModifiedTime(jar).toMillis() + "\n"
                + System.getProperty("os.name") + "\n" + System.getProperty("os.arch");
        CRC32 crc = new CRC32();
        crc.update(what.getBytes(StandardCharsets.UTF_8));
        return "sqlite-" + Long.toHexString(crc.getValue());
    }

    /** Removes the folders of other jars' copies (best effort: one another process still loads from stays if it cannot go). */
    private static void removeOthers(Path dir, Path kept) {
        try (var others = Files.list(dir)) {
            for (Path other : others.filter(p -> !p.equals(kept) && p.getFileName().toString().startsWith("sqlite-")).toList()) {
                try (var files = Files.list(other)) {
                    for (Path f : files.toList()) Files.deleteIfExists(f);
                }
                Files.deleteIfExists(other);
            }
        } catch (IOException | RuntimeException e) {
            // left for the next unpacking to remove
        }
    }

    /** What the record beside the library says of {@code bytes}: their size and CRC-32. */
    private static String recordOf(byte[] bytes) {
        CRC32 crc = new CRC32();
        crc.update(bytes);
        return bytes.length + " " + Long.toHexString(crc.getValue()) + "\n";
    }

    private static void placeWhole(Path target, byte[] bytes) throws IOException {
        Path part = Files.createTempFile(target.getParent(), target.getFileName().toString(), ".part");
        try {
            Files.write(part, bytes);
            Files.move(part, target, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
        } finally {
            Files.deleteIfExists(part);
        }
    }
}
