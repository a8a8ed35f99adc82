package dev.tend.shared.json;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;

/** SHA-256 (FIPS 180-4) as lowercase hex. Thread-safe. */
public final class Sha256 {
    private static final HexFormat HEX = HexFormat.of();
    /**
     * One digest per thread, reset by each {@code digest()}: looking the algorithm up in the
     * providers at every hash cost more than hashing a ledger entry or a token.
     */
    private static final ThreadLocal<MessageDigest> DIGEST = ThreadLocal.withInitial(Sha256::newDigest);

    private Sha256() {
    }

    public static String hex(byte[] data) {
        return HEX.formatHex(digest().digest(data));
    }

    public static String hex(String utf8) {
        return hex(utf8.getBytes(StandardCharsets.UTF_8));
    }

    /** SHA-256 over the concatenation of the UTF-8 bytes of {@code parts}. */
    public static String hexOf(String... parts) {
        MessageDigest md = digest();
        for (String p : parts) md.update(p.getBytes(StandardCharsets.UTF_8));
        return HEX.formatHex(md.digest());
    }

    private static MessageDigest digest() {
        MessageDigest md = DIGEST.get();
        md.reset(); // digest() resets it; this covers an update cut off by an error
        return md;
    }

    private static MessageDigest newDigest() {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("every Java platform must provide SHA-256", e);
        }
    }
}
