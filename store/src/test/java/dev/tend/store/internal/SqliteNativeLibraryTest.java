package dev.tend.store.internal;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.sqlite.SQLiteJDBCLoader;
import org.sqlite.util.LibraryLoaderUtil;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.util.Arrays;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

class SqliteNativeLibraryTest {
    private static byte[] jarCopy() throws IOException {
        String resource = LibraryLoaderUtil.getNativeLibResourcePath() + "/" + LibraryLoaderUtil.getNativeLibName();
        try (InputStream in = SQLiteJDBCLoader.class.getResourceAsStream(resource)) {
            assertNotNull(in, "sqlite-jdbc holds a library for the platform the tests run on");
            return in.readAllBytes();
        }
    }

    @Test
    void unpacksTheJarsLibraryUnderItsVersionAndPlatform(@TempDir Path dir) throws IOException {
        Path lib = SqliteNativeLibrary.keptIn(dir);

        assertNotNull(lib);
        assertEquals(dir, lib.getParent().getParent(), "one folder for the copy of this jar on this platform");
        assertEquals(LibraryLoaderUtil.getNativeLibName(), lib.getFileName().toString());
        assertArrayEquals(jarCopy(), Files.readAllBytes(lib));
        try (var left = Files.list(lib.getParent())) {
            assertEquals(java.util.Set.of(lib.getFileName().toString(), lib.getFileName() + ".crc32"),
                    left.map(p -> p.getFileName().toString()).collect(java.util.stream.Collectors.toSet()),
                    "the library and the record of its size and CRC-32, no temporary file");
        }
    }

    @Test
    void unpackingACopyRemovesThoseOfOtherJars(@TempDir Path dir) throws IOException {
        Path stale = Files.createDirectories(dir.resolve("sqlite-0badc0de"));
        Files.write(stale.resolve(LibraryLoaderUtil.getNativeLibName()), new byte[]{1, 2, 3});
        Path unrelated = Files.createDirectories(dir.resolve("notes"));

        Path lib = SqliteNativeLibrary.keptIn(dir);

        assertTrue(Files.exists(lib));
        assertTrue(Files.notExists(stale), "the copy of another jar is removed");
        assertTrue(Files.exists(unrelated), "what is not a copy of the library stays");
    }

    @Test
    void keepsAnIntactCopyWithoutWritingItAgain(@TempDir Path dir) throws IOException {
        Path lib = SqliteNativeLibrary.keptIn(dir);
        FileTime old = FileTime.fromMillis(1_000_000_000_000L);
        Files.setLastModifiedTime(lib, old);

        assertEquals(lib, SqliteNativeLibrary.keptIn(dir));
        assertEquals(old, Files.getLastModifiedTime(lib), "the kept copy was not rewritten");
    }

    @Test
    void replacesACopyThatWasCutShortOrChanged(@TempDir Path dir) throws IOException {
        Path lib = SqliteNativeLibrary.keptIn(dir);
        byte[] whole = Files.readAllBytes(lib);
        Files.write(lib, Arrays.copyOf(whole, whole.length / 2));
        assertArrayEquals(whole, Files.readAllBytes(SqliteNativeLibrary.keptIn(dir)), "a truncated copy is unpacked again");

        byte[] changed = whole.clone();
        changed[changed.length / 3] ^= 0x5a;
        Files.write(lib, changed);
        assertArrayEquals(whole, Files.readAllBytes(SqliteNativeLibrary.keptIn(dir)), "a copy of the same size but other bytes is unpacked again");

        Files.write(lib, changed);
        Files.delete(lib.resolveSibling(lib.getFileName() + ".crc32"));
        assertArrayEquals(whole, Files.readAllBytes(SqliteNativeLibrary.keptIn(dir)), "a copy without its record is unpacked again");
    }
}
