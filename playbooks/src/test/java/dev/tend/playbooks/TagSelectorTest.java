package dev.tend.playbooks;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

import java.util.List;
import java.util.Map;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class TagSelectorTest {
    private static final TagSelector CRITICAL_OR_STANDARD = TagSelector.of("tier", "critical", "standard");
    private static final TagSelector PAYMENTS_CRITICAL = TagSelector.of(Map.of("team", List.of("payments"), "tier", List.of("critical")));

    static Stream<Arguments> matching() {
        return Stream.of(
                Arguments.of(TagSelector.all(), Map.of(), true),
                Arguments.of(TagSelector.all(), Map.of("tier", "bulk"), true),
                Arguments.of(CRITICAL_OR_STANDARD, Map.of("tier", "standard"), true),
                Arguments.of(CRITICAL_OR_STANDARD, Map.of("tier", "bulk"), false),
                Arguments.of(CRITICAL_OR_STANDARD, Map.of("team", "payments"), false),
                Arguments.of(PAYMENTS_CRITICAL, Map.of("team", "payments", "tier", "critical", "zone", "z-a"), true),
                Arguments.of(PAYMENTS_CRITICAL, Map.of("team", "payments", "tier", "standard"), false));
    }

    @ParameterizedTest(name = "{0} matches {1}: {2}")
    @MethodSource("matching")
    void selectorNeedsAnAllowedValueForEveryTagItNames(TagSelector s, Map<String, String> tags, boolean matches) {
        assertThat(s.matches(tags)).isEqualTo(matches);
    }

    static Stream<Arguments> overlapping() {
        return Stream.of(
                Arguments.of(TagSelector.all(), PAYMENTS_CRITICAL, true),
                Arguments.of(CRITICAL_OR_STANDARD, PAYMENTS_CRITICAL, true),
                Arguments.of(CRITICAL_OR_STANDARD, TagSelector.of("tier", "bulk"), false),
                Arguments.of(TagSelector.of("team", "payments"), TagSelector.of("tier", "bulk"), true));
    }

    @ParameterizedTest(name = "{0} overlaps {1}: {2}")
    @MethodSource("overlapping")
    void selectorsOverlapUnlessASharedTagHasNoCommonValue(TagSelector a, TagSelector b, boolean overlap) {
        assertThat(a.overlaps(b)).isEqualTo(overlap);
        assertThat(b.overlaps(a)).isEqualTo(overlap);
    }

    @Test
    void tagAllowingNoValueIsRejected() {
        assertThatThrownBy(() -> TagSelector.of(Map.of("tier", List.of()))).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("tag 'tier' lists no allowed value, so the selector could match no cluster");
        assertThatThrownBy(() -> TagSelector.of(Map.of(" ", List.of("x")))).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("a tag name in a cluster selector must not be blank");
    }

    @Test
    void selectorPrintsSortedAsYamlFlow() {
        assertThat(TagSelector.of(Map.of("tier", List.of("standard", "critical"), "team", List.of("payments"))))
                .hasToString("{team: [payments], tier: [critical, standard]}");
        assertThat(TagSelector.of(Map.of())).isSameAs(TagSelector.all()).hasToString("{}");
    }
}
