package dev.tend.shared.wire;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.StreamWriteFeature;

/** The one Jackson factory of the wire package: thread-safe, shared by every reader and writer. */
final class WireJson {
    static final JsonFactory FACTORY = JsonFactory.builder()
            .disable(StreamWriteFeature.AUTO_CLOSE_TARGET)
            .build();

    private WireJson() {
    }
}
