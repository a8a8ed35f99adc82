package dev.tend.http;

import dev.tend.shared.TendException;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.util.concurrent.atomic.AtomicReference;

/**
 * A bearer token read from a file, read again whenever the file's modification time or size
 * changes (so a rotated token is used from the next request on, without a restart). The
 * token's value is never part of a message, a log line or a ledger entry. Thread-safe.
 */
public final class BearerToken {
    private final Path file;
    private final AtomicReference<Snapshot> current = new AtomicReference<>();

    private record Snapshot(FileTime modified, long size, String token) {
    }

    /** Reads the file now; throws {@link TendException} when it is missing, empty or readable by others. */
    public BearerToken(Path file) {
        this.file = file;
        PrivateFiles.check(file, "bearer-token-file");
        value();
    }

    /** The token: the file's first line, trimmed. */
    public String value() {
        try {
            FileTime modified = Files.getLastModifiedTime(file);
            long size = Files.size(file);
            Snapshot s = current.get();
            if (s != null && s.modified().equals(modified) && s.size() == size) return s.token();
            String text = Files.readString(file, StandardCharsets.UTF_8);
            String token = text.lines().findFirst().orElse("").strip();
            if (token.isEmpty()) throw new TendException("bearer-token-file " + file + " is empty; put the token on its first line");
            if (token.chars().anyMatch(c -> c < 0x21 || c > 0x7e)) {
                throw new TendException("bearer-token-file " + file + " holds characters a token may not have (spaces or control characters)");
            }
            current.set(new Snapshot(modified, size, token));
            return token;
        } catch (IOException e) {
            throw new TendException("cannot read bearer-token-file " + file + ": " + e.getMessage(), e);
        }
    }

    @Override
    public String toString() {
        return "BearerToken[" + file + "]";
    }
}
