package dev.tend.runtime;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.shared.TendException;
import dev.tend.shared.json.Sha256;
import dev.tend.store.InputRow;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * How far an input file has been journaled: a journal row of its own kind, written in the
 * same transaction as the events it counts, so that a reader started again after a crash
 * skips exactly the events already journaled and never journals one twice. The engine never
 * sees these rows.
 *
 * @param source the file's identity ({@link #identity})
 * @param events how many of its events are journaled or refused, counted from its start
 */
public record SourceProgress(String source, long events) {
    public static final String KIND = "source-progress";
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final int HEAD = 64 << 10;

    static InputRow row(String source, long events, Instant now) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("source", source);
        m.put("events", events);
        try {
            return InputRow.of(KIND, now, null, null, JSON.writeValueAsString(m));
        } catch (JsonProcessingException e) {
            throw new TendException("cannot encode the progress of " + source + ": " + e.getMessage(), e);
        }
    }

    static SourceProgress decode(InputRow row) {
        try {
            JsonNode m = JSON.readTree(row.payload());
            return new SourceProgress(m.path("source").asText(), m.path("events").asLong());
        } catch (JsonProcessingException e) {
            throw new TendException("journal entry " + row.seq() + " is not a readable progress row: " + e.getOriginalMessage(), e);
        }
    }

    /**
     * A file's identity: its absolute path and the SHA-256 of its first line (up to 64 KiB), so
     * that the same file read again, or grown at its end, is known, and another file written
     * at the same path is not.
     */
    public static String identity(Path file) throws IOException {
        byte[] head;
        try (InputStream in = Files.newInputStream(file)) {
            head = in.readNBytes(HEAD);
        }
        int end = 0;
        while (end < head.length && head[end] != '\n') end++;
        return file.toAbsolutePath().normalize() + "#" + Sha256.hex(java.util.Arrays.copyOf(head, end));
    }
}
