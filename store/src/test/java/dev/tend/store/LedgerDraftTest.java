package dev.tend.store;

import dev.tend.shared.Id;
import org.assertj.core.api.ThrowableAssert.ThrowingCallable;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

import java.time.Duration;
import java.time.Instant;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.junit.jupiter.params.provider.Arguments.arguments;

class LedgerDraftTest {
    static final Instant T = Instant.parse("2027-03-14T02:17:00Z");

    static Stream<Arguments> rules() {
        Map<Object, Object> numberKey = new HashMap<>();
        numberKey.put(7, "x");
        return Stream.of(
                arguments(NullPointerException.class, "LedgerDraft.at must not be null",
                        (ThrowingCallable) () -> LedgerDraft.of(null, "verdict", Map.of())),
                arguments(NullPointerException.class, "LedgerDraft.kind must not be null",
                        (ThrowingCallable) () -> LedgerDraft.of(T, null, Map.of())),
                arguments(IllegalArgumentException.class, "LedgerDraft.kind must not be blank",
                        (ThrowingCallable) () -> LedgerDraft.of(T, "", Map.of())),
                arguments(NullPointerException.class, "LedgerDraft.fields must not be null (pass an empty map)",
                        (ThrowingCallable) () -> LedgerDraft.of(T, "verdict", null)),
                arguments(IllegalArgumentException.class, "LedgerDraft.fields must not hold 'seq': the store writes seq, at and kind itself",
                        (ThrowingCallable) () -> LedgerDraft.of(T, "verdict", Map.of("seq", 4))),
                arguments(IllegalArgumentException.class, "LedgerDraft.fields must not hold 'kind': the store writes seq, at and kind itself",
                        (ThrowingCallable) () -> LedgerDraft.of(T, "verdict", Map.of("kind", "run"))),
                arguments(IllegalArgumentException.class, "LedgerDraft.fields.cluster must be text (it is indexed), got 3",
                        (ThrowingCallable) () -> LedgerDraft.of(T, "verdict", Map.of("cluster", 3))),
                arguments(IllegalArgumentException.class, "LedgerDraft.fields.limits.cooldown is a java.time.Duration, which is not a "
                                + "JSON value; pass text, a number, a boolean, a map or a list",
                        (ThrowingCallable) () -> LedgerDraft.of(T, "verdict", Map.of("limits", Map.of("cooldown", Duration.ofHours(6))))),
                arguments(IllegalArgumentException.class, "LedgerDraft.fields.detail keys must be text, got 7",
                        (ThrowingCallable) () -> LedgerDraft.of(T, "verdict", Map.of("detail", numberKey))),
                arguments(IllegalArgumentException.class, "LedgerDraft.fields.load[1] must be a finite number (RFC 8785 has no form for NaN)",
                        (ThrowingCallable) () -> LedgerDraft.of(T, "verdict", Map.of("load", List.of(0.5, Double.NaN)))));
    }

    @ParameterizedTest(name = "{1}")
    @MethodSource("rules")
    void rejectsFieldsTheLedgerCannotWrite(Class<? extends Throwable> type, String message, ThrowingCallable make) {
        assertThatThrownBy(make).isExactlyInstanceOf(type).hasMessage(message);
    }

    @Test
    void instantsAndIdsBecomeTextAndTheCopyCannotBeChanged() {
        Map<String, Object> fields = new HashMap<>();
        fields.put("cluster", Id.of("fares-3"));
        fields.put("until", Instant.parse("2027-03-14T02:17:00.5Z"));
        fields.put("nodes", List.of(Id.of("n1"), Id.of("n2")));
        LedgerDraft d = LedgerDraft.of(T, "exclusion", fields);
        fields.put("cluster", "changed-later");
        assertThat(d.fields()).containsEntry("cluster", "fares-3")
                .containsEntry("until", "2027-03-14T02:17:00.500Z")
                .containsEntry("nodes", List.of("n1", "n2"));
        assertThat(d.indexed("cluster")).isEqualTo("fares-3");
        assertThat(d.indexed("run")).isNull();
        assertThatThrownBy(() -> d.fields().put("x", 1)).isInstanceOf(UnsupportedOperationException.class);
    }

    @Test
    void aRestampedDraftHoldsTheSameFieldsAsOneMadeAnewAtThatTime() {
        Map<String, Object> fields = new HashMap<>();
        fields.put("by", "bench-feed");
        fields.put("from", "127.0.0.1");
        fields.put("accepted", 1);
        fields.put("rejected", 0);
        LedgerDraft first = LedgerDraft.of(T, "transitions-received", fields);
        Instant later = T.plusMillis(3);
        LedgerDraft restamped = first.stampedAt(later);
        assertThat(restamped).isEqualTo(LedgerDraft.of(later, "transitions-received", fields));
        assertThat(restamped.fields()).isEqualTo(fields).containsExactlyEntriesOf(first.fields());
        // a draft made from another's fields keeps them as they are, and they still cannot be changed
        assertThat(LedgerDraft.of(later, "transitions-received", first.fields())).isEqualTo(restamped);
        assertThatThrownBy(() -> restamped.fields().put("accepted", 2)).isInstanceOf(UnsupportedOperationException.class);
        assertThatThrownBy(() -> restamped.fields().entrySet().iterator().next().setValue("x"))
                .isInstanceOf(UnsupportedOperationException.class);
    }

    @Test
    void aDraftRenderedAheadGivesTheTextItGivesUnrenderedAtEverySeq() {
        Map<String, Object> fields = new java.util.LinkedHashMap<>();
        fields.put("cluster", "fares-3");
        fields.put("reasons", List.of("unconfirmed", "rate-limit"));
        fields.put("se", "\"seq\":0");
        fields.put("t", Map.of("seq", 5));
        LedgerDraft plain = LedgerDraft.of(T, "verdict", fields);
        LedgerDraft rendered = LedgerDraft.of(T, "verdict", fields).render();
        for (long seq : new long[]{1, 42, 1_000_000_007L, (1L << 53) - 1}) {
            assertThat(rendered.textAt(seq)).isEqualTo(plain.textAt(seq));
        }
        assertThat(plain.textAt(7)).isEqualTo("{\"at\":\"2027-03-14T02:17:00Z\",\"cluster\":\"fares-3\",\"kind\":\"verdict\","
                + "\"reasons\":[\"unconfirmed\",\"rate-limit\"],\"se\":\"\\\"seq\\\":0\",\"seq\":7,\"t\":{\"seq\":5}}");
        // restamped after rendering: the rendering was for another time, so the text is made again
        LedgerDraft later = rendered.stampedAt(T.plusSeconds(1));
        assertThat(later.textAt(9)).isEqualTo(LedgerDraft.of(T.plusSeconds(1), "verdict", fields).textAt(9)).contains("02:17:01Z");
        assertThat(rendered.textAt(9)).contains("02:17:00Z");
    }
}
