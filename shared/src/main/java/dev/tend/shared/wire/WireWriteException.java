package dev.tend.shared.wire;

import dev.tend.shared.TendException;

import java.io.IOException;

/** The output a {@link WireWriter} writes to failed; the cause is the I/O error. */
public class WireWriteException extends TendException {
    public WireWriteException(String message, IOException cause) {
        super(message + ": " + cause.getMessage(), cause);
    }
}
