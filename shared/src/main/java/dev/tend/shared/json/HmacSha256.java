package dev.tend.shared.json;

import javax.crypto.Mac;
import javax.crypto.spec.SecretKeySpec;
import java.nio.charset.StandardCharsets;
import java.security.GeneralSecurityException;
import java.util.HexFormat;

/** HMAC-SHA-256 (RFC 2104 with SHA-256 of FIPS 180-4), by the JDK's provider, as lowercase hex. */
public final class HmacSha256 {
    private static final String ALGORITHM = "HmacSHA256";

    private HmacSha256() {
    }

    /** The HMAC of {@code data} under {@code key} (at least one byte). */
    public static byte[] mac(byte[] key, byte[] data) {
        try {
            Mac mac = Mac.getInstance(ALGORITHM);
            mac.init(new SecretKeySpec(key, ALGORITHM));
            return mac.doFinal(data);
        } catch (GeneralSecurityException e) {
            throw new IllegalStateException("this Java runtime has no " + ALGORITHM + ", which every Java 17 runtime must have", e);
        }
    }

    /** The HMAC of the UTF-8 bytes of {@code text}, as 64 lowercase hex digits. */
    public static String hex(byte[] key, String text) {
        return HexFormat.of().formatHex(mac(key, text.getBytes(StandardCharsets.UTF_8)));
    }

    /** Compares two MACs in time that does not depend on where they differ. */
    public static boolean same(String a, String b) {
        return java.security.MessageDigest.isEqual(a.getBytes(StandardCharsets.US_ASCII), b.getBytes(StandardCharsets.US_ASCII));
    }
}
