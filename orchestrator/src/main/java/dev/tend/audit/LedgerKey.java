package dev.tend.audit;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import dev.tend.shared.json.HmacSha256;
import dev.tend.shared.json.Sha256;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermission;
import java.nio.file.attribute.PosixFilePermissions;
import java.util.Arrays;
import java.util.Set;

/**
 * The secret that ledger checkpoints are keyed with (DESIGN.md section 6): the bytes of a
 * file only tend reads, at least {@value #MIN_BYTES} of them (RFC 2104 section 3 advises no
 * fewer than the hash's output, 32 bytes for SHA-256). Make one with
 * {@code head -c 32 /dev/urandom > ledger.key && chmod 600 ledger.key}. Its {@link #id()}
 * (the first 16 hex digits of its SHA-256) is written beside each checkpoint, so that a
 * verification with another key says so instead of only failing.
 */
public final class LedgerKey {
    public static final int MIN_BYTES = 32;

    private final byte[] key;
    private final String id;

    private LedgerKey(byte[] key) {
        this.key = key.clone();
        this.id = Sha256.hex(key).substring(0, 16);
    }

    /** A key from its bytes (tests, and {@link #load}). */
    public static LedgerKey of(byte[] key) {
        if (key.length < MIN_BYTES) {
            throw new IllegalArgumentException("a ledger key has at least " + MIN_BYTES + " bytes, got " + key.length);
        }
        return new LedgerKey(key);
    }

    /**
     * Reads the key file; refuses one that others than its owner may read or write, one that
     * is missing, and one shorter than {@value #MIN_BYTES} bytes (a trailing line break is not
     * part of the key).
     */
    public static LedgerKey load(Path file) {
        String name = file.toString();
        byte[] bytes;
        try {
            try {
                Set<PosixFilePermission> perms = Files.getPosixFilePermissions(file);
                Set<PosixFilePermission> open = Set.of(PosixFilePermission.GROUP_READ, PosixFilePermission.GROUP_WRITE,
                        PosixFilePermission.GROUP_EXECUTE, PosixFilePermission.OTHERS_READ, PosixFilePermission.OTHERS_WRITE,
                        PosixFilePermission.OTHERS_EXECUTE);
                if (perms.stream().anyMatch(open::contains)) {
                    throw new InvalidInputException(Problem.at(name, 0, 0, "ledger-key", "the ledger key may be read by others than"
                            + " its owner (" + PosixFilePermissions.toString(perms) + "); run chmod 600 " + name));
                }
            } catch (UnsupportedOperationException notPosix) {
                // a file system without POSIX permissions: nothing to check
            }
            bytes = Files.readAllBytes(file);
        } catch (NoSuchFileException e) {
            throw new InvalidInputException(Problem.at(name, 0, 0, "ledger-key", "no such ledger key file"));
        } catch (IOException e) {
            throw new InvalidInputException(Problem.at(name, 0, 0, "ledger-key", "cannot read the ledger key: " + e.getMessage()));
        }
        int end = bytes.length;
        while (end > 0 && (bytes[end - 1] == '\n' || bytes[end - 1] == '\r')) end--;
        if (end < MIN_BYTES) {
            throw new InvalidInputException(Problem.at(name, 0, 0, "ledger-key", "a ledger key has at least " + MIN_BYTES
                    + " bytes, this one " + end + "; make one with: head -c 32 /dev/urandom > " + name + " && chmod 600 " + name));
        }
        LedgerKey k = new LedgerKey(Arrays.copyOf(bytes, end));
        Arrays.fill(bytes, (byte) 0);
        return k;
    }

    /** The first 16 hex digits of the key's SHA-256: names the key without revealing it. */
    public String id() {
        return id;
    }

    /** The HMAC-SHA-256 of what a checkpoint says: that entry {@code seq} has hash {@code hash}. */
    String sign(long seq, String hash) {
        return HmacSha256.hex(key, Checkpoint.message(seq, hash));
    }
}
