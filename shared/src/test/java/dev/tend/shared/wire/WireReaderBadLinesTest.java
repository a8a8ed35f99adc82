package dev.tend.shared.wire;

import dev.tend.shared.Problem;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

import java.util.stream.Stream;

import static dev.tend.shared.wire.WireReaderTest.TRANSITION;
import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.params.provider.Arguments.arguments;

/** Each kind of bad line is refused with its line, column, field and a sentence, and nothing else of it is kept. */
class WireReaderBadLinesTest {
    /** Column markers: NONE for column 0 (nothing on the line is at fault), END for just past the end. */
    private static final String NONE = "(none)";
    private static final String END = "(end)";

    /** Each bad line with its field and where its column points: the last occurrence of the marker text. */
    static Stream<Arguments> badLines() {
        String at = "\"at\":\"2027-03-14T02:17:00Z\",";
        String head = "{" + at + "\"cluster\":\"fares-3\",\"node\":\"n2\",\"signal\":\"storage-full\",";
        String topo = "{" + at + "\"cluster\":\"fares-3\",";
        return Stream.of(
                arguments("not JSON at all", "hello", "", "hello",
                        "this line is not JSON: Unrecognized token 'hello': was expecting (JSON String, Number, Array, Object or token 'null', 'true' or 'false')"),
                arguments("cut short", "{\"at\":\"2027-03-14T02:17:00Z\",", "", END,
                        "this line is not JSON: it ends before the JSON object is closed"),
                arguments("a key without quotes", "{at:\"2027\"}", "", "at:",
                        "this line is not JSON: Unexpected character ('a' (code 97)): was expecting double-quote to start field name"),
                arguments("more after the object", TRANSITION + " {}", "", "{}",
                        "this line goes on after its JSON object ends: each line holds one JSON object"),
                arguments("a list", "[" + TRANSITION + "]", "", "[",
                        "this line is a JSON list, not an object: each line holds one JSON object"),
                arguments("a string", "\"breach\"", "", "\"breach\"",
                        "this line is a JSON string, not an object: each line holds one JSON object"),
                arguments("a field twice", head + "\"state\":\"breach\",\"state\":\"clear\"}", "state", "\"state\"",
                        "field 'state' is given twice"),
                arguments("a nested key twice", head + "\"state\":\"breach\",\"detail\":{\"a\":1,\"a\":2}}", "detail", "\"a\"",
                        "field 'detail': key 'a' is given twice"),
                arguments("neither kind", "{" + at + "\"cluster\":\"fares-3\"}", "", NONE,
                        "this line is neither a health transition (it needs 'signal' and 'state') nor a topology event"
                                + " (it needs 'topology') nor a recording header (it needs 'recording')"),
                arguments("both kinds", head + "\"state\":\"breach\",\"topology\":\"joined\"}", "topology", "\"joined\"",
                        "this line has both 'signal' and 'topology': a line is a health transition or a topology event, not both"),
                arguments("missing at", "{\"cluster\":\"fares-3\",\"signal\":\"lag\",\"state\":\"breach\"}", "at", NONE,
                        "missing field 'at'"),
                arguments("missing cluster", "{" + at + "\"signal\":\"lag\",\"state\":\"breach\"}", "cluster", NONE,
                        "missing field 'cluster'"),
                arguments("missing signal", "{" + at + "\"cluster\":\"fares-3\",\"state\":\"breach\"}", "signal", NONE,
                        "missing field 'signal'"),
                arguments("missing state", head.substring(0, head.length() - 1) + "}", "state", NONE,
                        "missing field 'state'"),
                arguments("at without a zone", "{\"at\":\"2027-03-14T02:17:00\",\"cluster\":\"fares-3\",\"signal\":\"lag\",\"state\":\"breach\"}",
                        "at", "\"2027", "field 'at': '2027-03-14T02:17:00' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z):"
                                + " it has no zone; add Z for UTC or an offset like +01:00"),
                arguments("at with a space", "{\"at\":\"2027-03-14 02:17\",\"cluster\":\"fares-3\",\"signal\":\"lag\",\"state\":\"breach\"}",
                        "at", "\"2027", "field 'at': '2027-03-14 02:17' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z)"),
                arguments("at as a number", "{\"at\":1710382620,\"cluster\":\"fares-3\",\"signal\":\"lag\",\"state\":\"breach\"}",
                        "at", "1710382620", "field 'at' must be an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z), got a number"),
                arguments("cluster not an id", "{" + at + "\"cluster\":\"fares 3\",\"signal\":\"lag\",\"state\":\"breach\"}",
                        "cluster", "\"fares 3", "field 'cluster': 'fares 3' is not an id: use letters, digits and . _ : - only, starting with a letter or digit"),
                arguments("cluster empty", "{" + at + "\"cluster\":\"\",\"signal\":\"lag\",\"state\":\"breach\"}",
                        "cluster", "\"\",", "field 'cluster': an id must not be empty"),
                arguments("cluster null", "{" + at + "\"cluster\":null,\"signal\":\"lag\",\"state\":\"breach\"}",
                        "cluster", "null", "field 'cluster' must be an id (a string like fares-3), got null"),
                arguments("cluster of 129 characters", "{" + at + "\"cluster\":\"" + "c".repeat(129) + "\",\"signal\":\"lag\",\"state\":\"breach\"}",
                        "cluster", "\"ccc", "field 'cluster': an id is at most 128 characters, got 129"),
                arguments("node with a shell command", "{" + at + "\"cluster\":\"fares-3\",\"node\":\"n2;rm -rf /\",\"signal\":\"lag\",\"state\":\"breach\"}",
                        "node", "\"n2;", "field 'node': 'n2;rm -rf /' is not an id: use letters, digits and . _ : - only, starting with a letter or digit"),
                arguments("signal a list", "{" + at + "\"cluster\":\"fares-3\",\"signal\":[\"lag\"],\"state\":\"breach\"}",
                        "signal", "[", "field 'signal' must be an id (a string like storage-full), got a list"),
                arguments("state unknown", head + "\"state\":\"down\"}", "state", "\"down",
                        "field 'state' must be breach, silent or clear, got 'down'"),
                arguments("state upper case", head + "\"state\":\"BREACH\"}", "state", "\"BREACH",
                        "field 'state' must be breach, silent or clear, got 'BREACH'"),
                arguments("state null", head + "\"state\":null}", "state", "null",
                        "field 'state' must be breach, silent or clear, got null"),
                arguments("detail a list", head + "\"state\":\"breach\",\"detail\":[97.5]}", "detail", "[",
                        "field 'detail' must be an object (like {\"used_pct\":97.5}), got a list"),
                arguments("detail a string", head + "\"state\":\"breach\",\"detail\":\"full\"}", "detail", "\"full",
                        "field 'detail' must be an object (like {\"used_pct\":97.5}), got 'full'"),
                arguments("a number too large", head + "\"state\":\"breach\",\"detail\":{\"used_pct\":1e400}}", "detail", "1e400",
                        "field 'detail': the number 1e400 is too large for a 64-bit float (RFC 7493, I-JSON)"),
                arguments("topology unknown", topo + "\"node\":\"n4\",\"topology\":\"moved\"}", "topology", "\"moved",
                        "field 'topology' must be joined, left or changed, got 'moved'"),
                arguments("topology without node", topo + "\"topology\":\"joined\"}", "node", NONE,
                        "missing field 'node': a topology event names the node that joined, left or changed"),
                arguments("topology with null node", topo + "\"node\":null,\"topology\":\"joined\"}", "node", NONE,
                        "missing field 'node': a topology event names the node that joined, left or changed"),
                arguments("attrs not an object", topo + "\"node\":\"n4\",\"topology\":\"joined\",\"attrs\":\"z-b\"}", "attrs", "\"z-b",
                        "field 'attrs' must be an object (like {\"zone\":\"z-b\"}), got 'z-b'"),
                arguments("header name a number", "{\"recording\":7}", "recording", "7",
                        "field 'recording' must be the recording's name, a non-empty string, got a number"),
                arguments("header name blank", "{\"recording\":\"  \"}", "recording", "\"  ",
                        "field 'recording' must be the recording's name, a non-empty string, got '  '"),
                arguments("header fleet a number", "{\"recording\":\"r\",\"fleet\":3}", "fleet", "3",
                        "field 'fleet' must be a fleet file's path (a string) or the fleet inline (an object), got a number"),
                arguments("header from not a time", "{\"recording\":\"r\",\"from\":\"last night\"}", "from", "\"last",
                        "field 'from': 'last night' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z)"),
                arguments("header until before from", "{\"recording\":\"r\",\"from\":\"2027-03-14T06:00:00Z\",\"until\":\"2027-03-14T00:00:00Z\"}",
                        "until", "\"2027-03-14T00", "field 'until': 2027-03-14T00:00:00Z is before 'from' (2027-03-14T06:00:00Z)"),
                arguments("header description an object", "{\"recording\":\"r\",\"description\":{}}", "description", "{}",
                        "field 'description' must be a string, got an object"));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("badLines")
    void rejectsABadLineNamingLineColumnFieldAndWhy(String name, String line, String field, String columnAt, String message) {
        LineResult r = WireReader.of("events.jsonl").parseLine(line, 7);
        assertThat(r).as(line).isInstanceOf(LineResult.Bad.class);
        Problem p = ((LineResult.Bad) r).problem();
        assertThat(p.message()).isEqualTo(message);
        assertThat(p.field()).isEqualTo(field);
        assertThat(p.source()).isEqualTo("events.jsonl");
        assertThat(p.line()).isEqualTo(7);
        assertThat(r.line()).isEqualTo(7);
        int column = columnAt.equals(NONE) ? 0 : columnAt.equals(END) ? line.length() + 1 : line.lastIndexOf(columnAt) + 1;
        if (!columnAt.equals(NONE)) assertThat(column).as("the marker %s is on the line", columnAt).isPositive();
        assertThat(p.column()).isEqualTo(column);
        assertThat(p).hasToString(column == 0 ? "events.jsonl:7: " + message : "events.jsonl:7:" + column + ": " + message);
    }
}
