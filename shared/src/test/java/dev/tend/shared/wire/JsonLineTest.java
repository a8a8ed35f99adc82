package dev.tend.shared.wire;

import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

class JsonLineTest {
    private static final List<String> LINES = List.of(
            WireReaderTest.TRANSITION,
            "  {\"at\" : \"2027-03-14T02:17:00Z\", \"n\": 12, \"x\" : [1, 2.5e3, -7], \"o\":{\"k\":true},\"z\":null}",
            "{\"a\":\"\\u00e9\\\"q\",\"b\":\"\u00e9\u20ac\ud83d\ude00\",\"c\":false,\"d\":-1.5}",
            "\t{\"cluster\":\"fares-3\",\"node\":\"n2\",\"signal\":\"storage-full\",\"state\":\"clear\"}");

    @Test
    void theColumnOfEveryValueIsTheOneJacksonsLocationGives() throws Exception {
        int values = 0;
        for (String line : LINES) {
            List<String> fast = new ArrayList<>();
            List<String> located = new ArrayList<>();
            try (JsonParser p = WireJson.FACTORY.createParser(line)) {
                for (JsonToken t = p.nextToken(); t != null; t = p.nextToken()) {
                    if (t == JsonToken.FIELD_NAME) continue;
                    long c = p.currentTokenLocation().getColumnNr();
                    located.add(t + " at " + (c <= 0 ? 0 : c));
                    fast.add(t + " at " + JsonLine.valueColumn(p));
                    values++;
                }
            }
            assertThat(fast).as(line).containsExactlyElementsOf(located);
        }
        assertThat(values).isGreaterThan(20);
    }

    @Test
    void aFieldsColumnIsWhereItsValueStarts() throws Exception {
        JsonLine l = JsonLine.parse("{\"at\": \"x\",  \"n\":12}");
        assertThat(l.column(l.indexOf("at"))).isEqualTo(8);
        assertThat(l.column(l.indexOf("n"))).isEqualTo(18);
    }
}
