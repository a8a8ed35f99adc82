package dev.tend.shared;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.junit.jupiter.params.provider.Arguments.arguments;

class IdTest {
    @ParameterizedTest
    @ValueSource(strings = {"fares-3", "n2", "storage-full", "z-a", "a", "7", "A.b_c:d-e", "tickets-12", "run:2027.03.14_1",
            "x-----", "0.0.0"})
    void acceptsLettersDigitsAndDotUnderscoreColonDash(String value) {
        assertThat(Id.isValid(value)).isTrue();
        assertThat(Id.of(value).value()).isEqualTo(value);
        assertThat(Id.PATTERN.matcher(value).matches()).as("agrees with the documented pattern").isTrue();
    }

    @Test
    void acceptsExactly128Characters() {
        String max = "a".repeat(128);
        assertThat(Id.isValid(max)).isTrue();
        assertThat(Id.of(max).value()).hasSize(128);
    }

    static Stream<Arguments> invalid() {
        String shape = "' is not an id: use letters, digits and . _ : - only, starting with a letter or digit";
        return Stream.of(
                arguments("", "an id must not be empty"),
                arguments("a".repeat(129), "an id is at most 128 characters, got 129"),
                arguments("-n2", "'-n2" + shape),
                arguments(".hidden", "'.hidden" + shape),
                arguments("_x", "'_x" + shape),
                arguments(":x", "':x" + shape),
                arguments("fares 3", "'fares 3" + shape),
                arguments(" fares-3", "' fares-3" + shape),
                arguments("fares-3 ", "'fares-3 " + shape),
                arguments("n2;rm", "'n2;rm" + shape),
                arguments(";rm -rf /", "';rm -rf /" + shape),
                arguments("$(x)", "'$(x)" + shape),
                arguments("a`id`", "'a`id`" + shape),
                arguments("a|b", "'a|b" + shape),
                arguments("a&b", "'a&b" + shape),
                arguments("a>b", "'a>b" + shape),
                arguments("a/b", "'a/b" + shape),
                arguments("../etc", "'../etc" + shape),
                arguments("a\nb", "'a\\u000ab" + shape),
                arguments("a\u0000", "'a\\u0000" + shape),
                arguments("f\u00e4res", "'f\u00e4res" + shape),
                arguments("fares\u20123", "'fares\u20123" + shape),
                arguments("{node}", "'{node}" + shape));
    }

    @ParameterizedTest(name = "[{index}] {1}")
    @MethodSource("invalid")
    void rejectsEverythingElseSayingWhy(String value, String message) {
        assertThat(Id.isValid(value)).isFalse();
        assertThat(Id.PATTERN.matcher(value).matches()).as("agrees with the documented pattern").isFalse();
        assertThat(Id.describeInvalid(value)).isEqualTo(message);
        assertThatThrownBy(() -> Id.of(value)).isInstanceOf(IllegalArgumentException.class).hasMessage(message);
    }

    @Test
    void rejectsNull() {
        assertThat(Id.isValid(null)).isFalse();
        assertThatThrownBy(() -> Id.of(null)).isInstanceOf(NullPointerException.class).hasMessage("id");
    }

    @Test
    void shortensALongBadIdInItsMessage() {
        String bad = "x".repeat(50) + " y";
        assertThat(Id.describeInvalid(bad)).isEqualTo("'" + "x".repeat(40) + "..." + "' is not an id: use letters, digits and"
                + " . _ : - only, starting with a letter or digit");
    }

    @Test
    void ordersByValue() {
        assertThat(Id.of("n10").compareTo(Id.of("n2"))).isNegative();
        assertThat(Id.of("fares-3")).isEqualTo(Id.of("fares-3")).hasToString("fares-3");
    }
}
