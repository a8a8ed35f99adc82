package dev.tend.shared.json;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.HexFormat;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.params.provider.Arguments.arguments;

/**
 * HMAC-SHA-256 against the test vectors of RFC 4231 ("Identifiers and Test Vectors for
 * HMAC-SHA-224, HMAC-SHA-256, HMAC-SHA-384, and HMAC-SHA-512"), section 4, test cases 1 to 4,
 * 6 and 7 (case 5 checks a truncated output, which tend does not use). Values written from
 * memory of the RFC.
 */
class HmacSha256Test {
    private static byte[] repeat(int b, int n) {
        byte[] out = new byte[n];
        Arrays.fill(out, (byte) b);
        return out;
    }

    private static byte[] ascii(String s) {
        return s.getBytes(StandardCharsets.US_ASCII);
    }

    static Stream<Arguments> rfc4231() {
        byte[] key4 = new byte[25];
        for (int i = 0; i < 25; i++) key4[i] = (byte) (i + 1);
        return Stream.of(
                arguments("4.2 test case 1", repeat(0x0b, 20), ascii("Hi There"),
                        "b0344c61d8db38535ca8afceaf0bf12b881dc200c9833da726e9376c2e32cff7"),
                arguments("4.3 test case 2", ascii("Jefe"), ascii("what do ya want for nothing?"),
                        "5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843"),
                arguments("4.4 test case 3", repeat(0xaa, 20), repeat(0xdd, 50),
                        "773ea91e36800e46854db8ebd09181a72959098b3ef8c122d9635514ced565fe"),
                arguments("4.5 test case 4", key4, repeat(0xcd, 50),
                        "82558a389a443c0ea4cc819899f2083a85f0faa3e578f8077a2e3ff46729665b"),
                arguments("4.7 test case 6", repeat(0xaa, 131), ascii("Test Using Larger Than Block-Size Key - Hash Key First"),
                        "60e431591ee0b67f0d8a26aacbf5b77f8e0bc6213728c5140546040f0ee37f54"),
                arguments("4.8 test case 7", repeat(0xaa, 131), ascii("This is a test using a larger than block-size key and a"
                                + " larger than block-size data. The key needs to be hashed before being used by the HMAC algorithm."),
                        "9b09ffa71b942fcb27635fbcd5b0e944bfdc63644f0713938a7f51535c3a35e2"));
    }

    @ParameterizedTest(name = "RFC 4231 section {0}")
    @MethodSource("rfc4231")
    void matchesThePublishedVectors(String name, byte[] key, byte[] data, String expected) {
        assertThat(HexFormat.of().formatHex(HmacSha256.mac(key, data))).isEqualTo(expected);
    }
}
