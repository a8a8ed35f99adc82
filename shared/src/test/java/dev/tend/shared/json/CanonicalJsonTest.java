package dev.tend.shared.json;

import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class CanonicalJsonTest {
    private static final ObjectMapper MAPPER = new ObjectMapper();

    // RFC 8785 Appendix B, IEEE 754 bit patterns and their serialization (from memory)
    @ParameterizedTest(name = "{0} -> {1}")
    @CsvSource({
            "0000000000000000, 0",
            "8000000000000000, 0",
            "0000000000000001, 5e-324",
            "8000000000000001, -5e-324",
            "7fefffffffffffff, 1.7976931348623157e+308",
            "ffefffffffffffff, -1.7976931348623157e+308",
            "4340000000000000, 9007199254740992",
            "c340000000000000, -9007199254740992",
            "4430000000000000, 295147905179352830000",
            "44b52d02c7e14af5, 9.999999999999997e+22",
            "44b52d02c7e14af6, 1e+23",
            "44b52d02c7e14af7, 1.0000000000000001e+23",
            "444b1ae4d6e2ef4e, 999999999999999700000",
            "444b1ae4d6e2ef4f, 999999999999999900000",
            "444b1ae4d6e2ef50, 1e+21",
            "3eb0c6f7a0b5ed8c, 9.999999999999997e-7",
            "3eb0c6f7a0b5ed8d, 0.000001",
            "41b3de4355555553, 333333333.3333332",
            "41b3de4355555554, 333333333.33333325",
            "41b3de4355555555, 333333333.3333333",
            "41b3de4355555556, 333333333.3333334",
            "41b3de4355555557, 333333333.33333343",
            "becbf647612f3696, -0.0000033333333333333333",
            "43143ff3c1cb0959, 1424953923781206.2",
    })
    void serializesNumbersAsRfc8785AppendixBShows(String bits, String expected) {
        double d = Double.longBitsToDouble(Long.parseUnsignedLong(bits, 16));
        assertThat(CanonicalJson.number(d)).isEqualTo(expected);
        assertThat(CanonicalJson.serialize(List.of(d))).isEqualTo("[" + expected + "]");
    }

    // A whole number below 2^53 is written as its integer digits (RFC 8785 section 3.2.2.3, ECMAScript's
    // Number::toString for exponents up to 21); checked against java.math.BigDecimal's plain form of the exact value.
    @ParameterizedTest
    @ValueSource(longs = {1, 7, 10, 100, 1234567, 10000000, 99999999999L, 4503599627370496L, 9007199254740991L, -1, -42,
            -9007199254740991L})
    void writesWholeNumbersBelow2To53AsTheirIntegerDigits(long n) {
        assertThat(CanonicalJson.number(n)).isEqualTo(new java.math.BigDecimal((double) n).toPlainString());
        assertThat(CanonicalJson.serialize(MAPPER.createObjectNode().put("seq", n))).isEqualTo("{\"seq\":" + n + "}");
    }

    // RFC 8785 Appendix B: NaN and Infinity have no serialization (from memory)
    @ParameterizedTest
    @ValueSource(strings = {"7fffffffffffffff", "7ff0000000000000", "fff0000000000000"})
    void rejectsNanAndInfinity(String bits) {
        double d = Double.longBitsToDouble(Long.parseUnsignedLong(bits, 16));
        assertThatThrownBy(() -> CanonicalJson.serialize(Map.of("x", d)))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("NaN and infinities are not JSON numbers");
    }

    @Test
    void givesTheShortestFormJustAboveAPowerOfTwo() {
        // 0x3b20000000000000 is a power of two: the doubles below it are twice as dense as those
        // above, so the nearest 16-digit decimal (...2214 rounded down) misses and the 16 digits
        // of the wide side read back instead (value checked against an ECMAScript engine)
        assertThat(CanonicalJson.number(Double.longBitsToDouble(0x3b20000000000000L))).isEqualTo("6.617444900424222e-24");
        assertThat(CanonicalJson.number(Math.pow(2, 600))).isEqualTo("4.149515568880993e+180");
    }

    @Test
    void canonicalizesTheExampleOfRfc8785Section3_2_2() throws Exception {
        // RFC 8785 section 3.2.2, input and canonical output (from memory)
        String input = "{\"numbers\": [333333333.33333329, 1E30, 4.50, 2e-3, 0.000000000000000000000000001], "
                + "\"string\": \"\\u20ac$\\u000F\\u000aA'\\u0042\\u0022\\u005c\\\\\\\"\\/\", "
                + "\"literals\": [null, true, false]}";
        String expected = "{\"literals\":[null,true,false],\"numbers\":[333333333.3333333,1e+30,4.5,0.002,1e-27],"
                + "\"string\":\"\u20ac$\\u000f\\nA'B\\\"\\\\\\\\\\\"/\"}";
        assertThat(CanonicalJson.serialize(MAPPER.readTree(input))).isEqualTo(expected);
        assertThat(CanonicalJson.serialize(MAPPER.readValue(input, Map.class))).isEqualTo(expected);
    }

    @Test
    void sortsKeysByUtf16CodeUnitsAsRfc8785Section3_2_3Shows() {
        // RFC 8785 section 3.2.3, keys and their sorted order (from memory)
        Map<String, Object> in = new LinkedHashMap<>();
        for (String k : List.of("\u20ac", "\r", "\ufb33", "1", "\ud83d\ude00", "\u0080", "\u00f6")) in.put(k, k.length());
        String out = CanonicalJson.serialize(in);
        assertThat(out).isEqualTo("{\"\\r\":1,\"1\":1,\"\u0080\":1,\"\u00f6\":1,\"\u20ac\":1,\"\ud83d\ude00\":2,\"\ufb33\":1}");
    }

    @Test
    void writesNoWhitespaceAndNestsCanonically() {
        Map<String, Object> in = new LinkedHashMap<>();
        in.put("b", List.of(Map.of("z", 1, "a", 2.50), "x"));
        in.put("a", Map.of());
        assertThat(CanonicalJson.serialize(in)).isEqualTo("{\"a\":{},\"b\":[{\"a\":2.5,\"z\":1},\"x\"]}");
    }

    @Test
    void escapesOnlyWhatRfc8785Requires() {
        assertThat(CanonicalJson.serialize("\b\f\n\r\t\u0001\u001f \"\\/\u007f\u00e9"))
                .isEqualTo("\"\\b\\f\\n\\r\\t\\u0001\\u001f \\\"\\\\/\u007f\u00e9\"");
    }

    @Test
    void anObjectWithMembersAddedIsWrittenAsTheMergedMapWouldBe() {
        java.util.Random random = new java.util.Random(8785);
        List<String> names = List.of("seq", "at", "kind", "cluster", "run", "\u00e9t\u00e9", "\ud83d\ude00", "a", "Z", "reasons");
        for (int round = 0; round < 2000; round++) {
            Map<String, Object> fields = new LinkedHashMap<>();
            for (String k : names) if (random.nextInt(3) == 0) fields.put(k, value(random));
            List<Object> extra = new java.util.ArrayList<>();
            Map<String, Object> merged = new java.util.HashMap<>(fields);
            for (String k : List.of("seq", "at", "kind")) {
                if (random.nextBoolean()) continue;
                Object v = value(random);
                extra.add(k);
                extra.add(v);
                merged.put(k, v);
            }
            assertThat(CanonicalJson.serializeObject(fields, extra.toArray())).isEqualTo(CanonicalJson.serialize(merged));
        }
    }

    @Test
    void anObjectRenderedAroundAHoleIsTheWholeObjectOnceTheNumberIsPutIn() {
        java.util.Random random = new java.util.Random(180);
        // keys that sort just before and after "seq", nested "seq" members and strings that hold the text "seq":0
        List<String> names = List.of("se", "seq\u0000", "seqa", "sep", "s", "t", "a", "\u00e9", "\ud83d\ude00", "nested");
        for (int round = 0; round < 2000; round++) {
            Map<String, Object> fields = new LinkedHashMap<>();
            for (String k : names) if (random.nextInt(2) == 0) fields.put(k, random.nextBoolean() ? value(random) : "\"seq\":0");
            if (random.nextBoolean()) fields.put("nested", Map.of("seq", 0, "x", List.of(Map.of("seq", 1))));
            long seq = random.nextInt(4) == 0 ? (1L << 53) - 1 : 1 + random.nextInt(Integer.MAX_VALUE);
            String[] parts = CanonicalJson.serializeObjectAround(fields, "seq", "seq", 0L, "at", "2027-03-14T02:17:00Z", "kind", "verdict");
            assertThat(parts[0] + CanonicalJson.number(seq) + parts[1])
                    .isEqualTo(CanonicalJson.serializeObject(fields, "seq", seq, "at", "2027-03-14T02:17:00Z", "kind", "verdict"));
        }
        assertThatThrownBy(() -> CanonicalJson.serializeObjectAround(Map.of(), "seq", "at", "x"))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("'seq' must be named in extra");
    }

    private static Object value(java.util.Random random) {
        return switch (random.nextInt(6)) {
            case 0 -> random.nextLong();
            case 1 -> "t\"" + random.nextInt(100) + "\n\u00e9";
            case 2 -> random.nextDouble() * 1e6;
            case 3 -> List.of(random.nextInt(9), "x");
            case 4 -> Map.of("b", random.nextBoolean(), "a", random.nextInt(5));
            default -> null;
        };
    }
}
