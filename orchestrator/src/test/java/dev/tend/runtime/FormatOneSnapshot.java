package dev.tend.runtime;

import dev.tend.engine.EngineState;
import dev.tend.store.SnapshotRow;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.time.Instant;
import java.util.Map;
import java.util.TreeMap;
import java.util.zip.GZIPOutputStream;

/**
 * A snapshot row in format 1, as tend wrote them until 2026-12-03: the body
 * {@code {"format":1,"seq":N,"sources":{...},"state":{...}}} gzip-compressed, the state's
 * records (the health view's signals too) as objects of their components with instants as RFC
 * 3339 text, which is {@link SnapshotCodec#json}'s text. For tests that this tend still starts
 * from one.
 */
final class FormatOneSnapshot {
    private FormatOneSnapshot() {
    }

    static SnapshotRow of(long seq, Instant takenAt, String setupFingerprint, EngineState state, Map<String, Long> sources) {
        StringBuilder sb = new StringBuilder("{\"format\":1,\"seq\":").append(seq).append(",\"sources\":{");
        String sep = "";
        for (Map.Entry<String, Long> e : new TreeMap<>(sources).entrySet()) {
            sb.append(sep).append('"').append(e.getKey()).append("\":").append(e.getValue());
            sep = ",";
        }
        sb.append("},\"state\":").append(SnapshotCodec.json(state)).append('}');
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        try (OutputStream out = new GZIPOutputStream(bytes)) {
            out.write(sb.toString().getBytes(StandardCharsets.UTF_8));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return new SnapshotRow(seq, takenAt, 1, setupFingerprint, bytes.toByteArray());
    }
}
