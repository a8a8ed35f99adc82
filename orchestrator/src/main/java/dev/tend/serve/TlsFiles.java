package dev.tend.serve;

import java.nio.file.Path;
import java.time.Duration;
import java.util.Objects;

/**
 * The PEM files {@code tend serve} listens with over TLS, and how often they are looked at
 * for a change (a renewed certificate is served without a restart).
 */
public record TlsFiles(Path cert, Path key, Duration checkEvery) {
    /** How often the files are looked at unless told otherwise. */
    public static final Duration CHECK_EVERY = Duration.ofSeconds(10);

    public TlsFiles {
        Objects.requireNonNull(cert, "cert");
        Objects.requireNonNull(key, "key");
        Objects.requireNonNull(checkEvery, "checkEvery");
        if (checkEvery.isNegative() || checkEvery.isZero()) throw new IllegalArgumentException("checkEvery must be longer than zero");
    }
}
