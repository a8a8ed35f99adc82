package dev.tend.shared.json;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import static org.assertj.core.api.Assertions.assertThat;

class Sha256Test {
    // FIPS 180-4 / NIST example values (from memory)
    @ParameterizedTest(name = "\"{0}\"")
    @CsvSource({
            "abc, ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad",
            "'', e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855",
            "abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq, 248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1",
    })
    void hashesTheNistExamples(String message, String hex) {
        assertThat(Sha256.hex(message)).isEqualTo(hex);
    }

    @Test
    void hashesTheConcatenationOfItsParts() {
        // FIPS 180-4 / NIST example value for "abc" (from memory), split into parts
        assertThat(Sha256.hexOf("a", "", "bc")).isEqualTo("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
        assertThat(Sha256.hexOf()).isEqualTo(Sha256.hex(""));
    }
}
