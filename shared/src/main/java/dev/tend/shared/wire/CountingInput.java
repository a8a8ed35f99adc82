package dev.tend.shared.wire;

import java.io.FilterInputStream;
import java.io.IOException;
import java.io.InputStream;

/**
 * An input stream that counts the bytes read through it, so that a reader of a wire file can
 * report how far it has come (the share done and the time left). The count may be read from
 * another thread than the one reading.
 */
public final class CountingInput extends FilterInputStream {
    private volatile long count;

    public CountingInput(InputStream in) {
        super(in);
    }

    /** The bytes read so far. */
    public long count() {
        return count;
    }

    @Override
    public int read() throws IOException {
        int b = super.read();
        if (b >= 0) count++;
        return b;
    }

    @Override
    public int read(byte[] buf, int off, int len) throws IOException {
        int n = super.read(buf, off, len);
        if (n > 0) count += n;
        return n;
    }
}
