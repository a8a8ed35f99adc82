package dev.tend.shared.json;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.Map;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * {@link CanonicalReader} says "canonical" only where parsing with Jackson and writing again with
 * {@link CanonicalJson} gives the text back, and then gives the tree Jackson gives.
 */
class CanonicalReaderTest {
    private static final ObjectMapper MAPPER = new ObjectMapper();

    @ParameterizedTest
    @ValueSource(strings = {
            "{}",
            "{\"a\":1}",
            "{\"at\":\"2027-02-06T05:59:59.712Z\",\"cluster\":\"fares-3\",\"kind\":\"verdict\",\"node\":\"n2\",\"playbook\":\"restart-stopped-process\","
                    + "\"reasons\":[\"unconfirmed\"],\"seq\":9999999,\"verdict\":\"hold\"}",
            "{\"a\":[],\"b\":{},\"c\":[1,-2,true,false,null,{\"x\":\"y\"}],\"d\":9007199254740991,\"e\":-9007199254740991}",
            "{\"a\":\"tab\\there \\\"quoted\\\" back\\\\slash \\b\\f\\n\\r \\u0001\\u001f\",\"b\":\"\u007f\"}",
            "{\"A\":0,\"B\":2147483647,\"a\":2147483648,\"b\":-2147483649}",
    })
    void readsCanonicalTextsToTheTreeJacksonGives(String text) throws Exception {
        ObjectNode read = CanonicalReader.readObject(text.getBytes(StandardCharsets.UTF_8));
        JsonNode jackson = MAPPER.readTree(text);
        assertThat(CanonicalJson.serialize(jackson)).isEqualTo(text);
        assertThat(read).isEqualTo(jackson);
        assertThat(read.toString()).isEqualTo(jackson.toString());
        jackson.fields().forEachRemaining(f -> assertThat(read.get(f.getKey()).getNodeType()).isEqualTo(f.getValue().getNodeType()));
        jackson.fields().forEachRemaining(f -> assertThat(read.get(f.getKey()).numberType()).isEqualTo(f.getValue().numberType()));
    }

    @ParameterizedTest
    @ValueSource(strings = {
            "", "{", "[]", "1", "\"a\"", "{\"a\":1}x", "{\"a\":1} ", " {\"a\":1}", "{\"a\": 1}", "{\"b\":1,\"a\":2}", "{\"a\":1,\"a\":1}",
            "{\"a\":01}", "{\"a\":-0}", "{\"a\":1.0}", "{\"a\":1e3}", "{\"a\":9007199254740992}", "{\"a\":12345678901234567}",
            "{\"a\":\"\\/\"}", "{\"a\":\"\\u0041\"}", "{\"a\":\"\\u000a\"}", "{\"a\":\"\\u001F\"}", "{\"a\":\"raw\ttab\"}",
            "{\"a\":tru}", "{\"a\":nul}", "{\"a\":[1,]}", "{\"a\":1,}", "{\"a\"}", "{\"a\":\"unterminated}",
            "{\"a\":\"caf\u00e9\"}", "{\"\u00e9\":1}",
    })
    void answersNullForWhatItCannotTellIsCanonical(String text) {
        assertThat(CanonicalReader.readObject(text.getBytes(StandardCharsets.UTF_8))).isNull();
    }

    @Test
    void givesATreeThatChangesAsJacksonsDoes() throws Exception {
        String text = "{\"a\":1,\"b\":\"x\",\"c\":[true],\"d\":null,\"e\":{\"f\":2}}";
        ObjectNode read = CanonicalReader.readObject(text.getBytes(StandardCharsets.UTF_8));
        ObjectNode jackson = (ObjectNode) MAPPER.readTree(text);
        for (ObjectNode o : List.of(read, jackson)) {
            o.remove("b");
            o.put("a", 3);
            o.put("z", "last");
            o.fields().next().setValue(MAPPER.getNodeFactory().textNode("first"));
            var it = o.fields();
            while (it.hasNext()) if (it.next().getKey().equals("d")) it.remove();
        }
        assertThat(read.toString()).isEqualTo(jackson.toString()).isEqualTo("{\"a\":\"first\",\"c\":[true],\"e\":{\"f\":2},\"z\":\"last\"}");
        assertThat(read).isEqualTo(jackson);
        assertThat(read.hashCode()).isEqualTo(jackson.hashCode());
        assertThat(read.deepCopy()).isEqualTo(jackson);
    }

    @Test
    void leavesDeepTextsToTheSlowWay() {
        String deep = "{\"a\":" + "[".repeat(100) + "]".repeat(100) + "}";
        assertThat(CanonicalReader.readObject(deep.getBytes(StandardCharsets.UTF_8))).isNull();
    }

    /** Every one-byte change of canonical entries: the reader's yes is always Jackson and CanonicalJson's yes, with the same tree. */
    @Test
    void neverCallsCanonicalWhatTheSlowWayDoesNot() throws Exception {
        String[] texts = {
                CanonicalJson.serialize(Map.of("seq", 12, "at", "2027-01-04T00:00:00.288Z", "kind", "transition", "cluster", "fares-3",
                        "node", "n1", "signal", "heartbeat", "state", "breach")),
                CanonicalJson.serialize(Map.of("seq", 4503599627370496L, "kind", "verdict", "reasons", List.of("fleet-brake", "rate-limit"),
                        "verdict", "deny", "hold_until", "2027-01-04T00:05:00Z", "manual", false, "x", Map.of("y", -7))),
                "{\"a\":\"q\\\"\\\\\\n\\u0003\",\"b\":[true,null]}",
        };
        byte[] alphabet = "{}[]\":,\\-0129aeflnrstu. \t\u007f".getBytes(StandardCharsets.ISO_8859_1);
        Random random = new Random(8785);
        int agreed = 0;
        for (String text : texts) {
            byte[] base = text.getBytes(StandardCharsets.UTF_8);
            for (int i = 0; i < base.length; i++) {
                for (int k = 0; k < 6; k++) {
                    byte[] changed = base.clone();
                    changed[i] = alphabet[random.nextInt(alphabet.length)];
                    ObjectNode read = CanonicalReader.readObject(changed);
                    if (read == null) continue;
                    String s = new String(changed, StandardCharsets.UTF_8);
                    JsonNode jackson = MAPPER.readTree(s);
                    assertThat(CanonicalJson.serialize(jackson)).as(s).isEqualTo(s);
                    assertThat(read).as(s).isEqualTo(jackson);
                    agreed++;
                }
            }
        }
        assertThat(agreed).as("changed texts read as canonical (a change to a letter inside a string stays canonical)").isGreaterThan(50);
    }

    @Test
    void readsShortTextsMetAgainAsJacksonDoesThoughTheyShareNodes() throws Exception {
        // 5,000 clusters and names of 31 to 34 bytes: more texts than shared slots, and both sides of the length kept shared
        for (int i = 0; i < 5000; i++) {
            String text = "{\"cluster\":\"fares-" + i + "\",\"kind\":\"verdict\",\"n\":\"" + "x".repeat(31 + i % 4)
                    + "\",\"node\":\"n" + (i % 7) + "\",\"z\":[\"unconfirmed\",\"" + i + "\",\"\"]}";
            ObjectNode read = CanonicalReader.readObject(text.getBytes(StandardCharsets.UTF_8));
            assertThat(read).as(text).isEqualTo(MAPPER.readTree(text));
            assertThat(read.toString()).isEqualTo(MAPPER.readTree(text).toString());
        }
    }
}
