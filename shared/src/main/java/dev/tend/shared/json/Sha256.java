package dev.tend.shared.json;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;

/** SHA-256 (FIPS 180-4) as lowercase hex. Thread-safe. */
public final class Sha256 {
    /** One digest per thread: every ledger entry is hashed, and looking the algorithm up costs more than a short entry's hash. */
    private static final ThreadLocal<MessageDigest> PER_THREAD = ThreadLocal.withInitial(Sha256::digest);

    private Sha256() {
    }

    public static String hex(byte[] data) {
        return HexFormat.of().formatHex(digest().digest(data));
    }

    public static String hex(String utf8) {
        return hex(utf8.getBytes(StandardCharsets.UTF_8));
    }

    /** SHA-256 over the concatenation of the UTF-8 bytes of {@code parts}. */
    public static String hexOf(String... parts) {
        MessageDigest md = PER_THREAD.get(); // digest() leaves it reset
        md.reset();
        for (String p : parts) md.update(p.getBytes(StandardCharsets.UTF_8));
        return HexFormat.of().formatHex(md.digest());
    }

    private static MessageDigest digest() {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("every Java platform must provide SHA-256", e);
        }
    }
}
