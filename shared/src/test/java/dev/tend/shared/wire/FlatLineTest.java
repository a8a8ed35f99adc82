package dev.tend.shared.wire;

import org.junit.jupiter.api.Test;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The hand-written reading of a usual line ({@link FlatLine}) held to the reference, Jackson
 * (jackson-core's parser, which the wire used alone before and still uses for every line the
 * fast path declines): whenever the fast path reads a line, Jackson reads the same names,
 * values of the same classes and the same columns, and refuses nothing it accepted.
 */
class FlatLineTest {
    private static final String[] NAMES = {"at", "cluster", "node", "signal", "state", "detail", "topology", "attrs",
        "recording", "x", "used_pct", "ätt", "a\\\"b", "nodes", ""};
    private static final String NOISE = "\"{}[],: \t\\-+0123456789.eEtrufalsn\u00e9\u0001/";

    @Test
    void everyLineOfTheBundledRecordingsIsReadByHandAsJacksonReadsIt() throws IOException {
        List<String> lines = recordingLines();
        assertThat(lines).hasSizeGreaterThan(1500);
        for (String line : lines) {
            if (line.isBlank()) continue;
            assertThat(FlatLine.read(line)).as(line).isNotNull();
            assertSameAsJackson(line);
        }
    }

    @Test
    void randomLinesReadByHandAreReadAsJacksonReadsThem() {
        Random r = new Random(14);
        int fast = 0;
        for (int n = 0; n < 40_000; n++) {
            String line = randomLine(r);
            if (assertSameAsJackson(line)) fast++;
        }
        assertThat(fast).as("lines the fast path read").isGreaterThan(5_000);
    }

    @Test
    void mutatedLinesAreReadAsJacksonReadsThemOrLeftToIt() throws IOException {
        Random r = new Random(7);
        List<String> lines = new ArrayList<>(recordingLines());
        for (int n = 0; n < 200; n++) lines.add(randomLine(r));
        int declined = 0;
        for (int n = 0; n < 60_000; n++) {
            String line = lines.get(r.nextInt(lines.size()));
            int mutations = 1 + r.nextInt(3);
            for (int m = 0; m < mutations; m++) line = mutate(line, r);
            if (!assertSameAsJackson(line)) declined++;
        }
        assertThat(declined).as("mutated lines left to Jackson").isGreaterThan(10_000);
    }

    @Test
    void linesOfUnusualShapeAreLeftToJackson() {
        for (String line : List.of("{\"a\":\"\\n\"}", "{\"a\":1,\"a\":2}", "{\"a\":12345678901234567890}",
                "{\"a\":1e999}", "{\"a\":01}", "{\"a\":\"\u00e9\"}", "{\"a\":[[[[[1]]]]]}", "{\"a\":1} x",
                "[1]", "{\"a\":tru}", "{\"a\":1,}", "{\"o\":{\"k\":1,\"k\":2}}", "{\"a\":-}", "{\"a\":1.}")) {
            assertThat(FlatLine.read(line)).as(line).isNull();
        }
    }

    @Test
    void numbersTakeTheClassJacksonGivesThem() {
        JsonLine l = FlatLine.read("{\"i\":2147483647,\"j\":2147483648,\"k\":-2147483648,\"m\":-0,\"d\":-0.0,\"e\":2E+3}");
        assertThat(l).isNotNull();
        assertThat(l.value(0)).isEqualTo(Integer.MAX_VALUE);
        assertThat(l.value(1)).isEqualTo(2147483648L);
        assertThat(l.value(2)).isEqualTo(Integer.MIN_VALUE);
        assertThat(l.value(3)).isEqualTo(0);
        assertThat(l.value(4)).isEqualTo(-0.0d);
        assertThat(l.value(5)).isEqualTo(2000.0d);
        assertSameAsJackson("{\"i\":2147483647,\"j\":2147483648,\"k\":-2147483648,\"m\":-0,\"d\":-0.0,\"e\":2E+3}");
    }

    /** True when the fast path read the line (and then agreed with Jackson); false when it declined. */
    private static boolean assertSameAsJackson(String line) {
        JsonLine fast = FlatLine.read(line);
        String reference;
        try {
            reference = describe(JsonLine.parseWithJackson(line));
        } catch (LineRejected e) {
            reference = "refused: " + e.getMessage();
        }
        if (fast == null) return false;
        assertThat(describe(fast)).as(line).isEqualTo(reference);
        return true;
    }

    private static String describe(JsonLine l) {
        StringBuilder b = new StringBuilder();
        for (int i = 0; i < l.size(); i++) {
            b.append(l.name(i)).append('@').append(l.column(i)).append('=');
            typed(l.value(i), b);
            b.append(';');
        }
        return b.toString();
    }

    private static void typed(Object v, StringBuilder b) {
        if (v == null) {
            b.append("null");
        } else if (v instanceof Map<?, ?> m) {
            b.append(v.getClass().getSimpleName()).append('{');
            for (Map.Entry<?, ?> e : m.entrySet()) {
                b.append(e.getKey()).append(':');
                typed(e.getValue(), b);
                b.append(',');
            }
            b.append('}');
        } else if (v instanceof List<?> list) {
            b.append(v.getClass().getSimpleName()).append('[');
            for (Object o : list) {
                typed(o, b);
                b.append(',');
            }
            b.append(']');
        } else {
            b.append(v.getClass().getSimpleName()).append(':').append(v);
        }
    }

    private static String randomLine(Random r) {
        StringBuilder b = new StringBuilder();
        space(r, b);
        b.append('{');
        int fields = r.nextInt(8);
        for (int f = 0; f < fields; f++) {
            if (f > 0) b.append(',');
            space(r, b);
            b.append('"').append(NAMES[r.nextInt(NAMES.length)]).append('"');
            space(r, b);
            b.append(':');
            space(r, b);
            value(r, b, 0);
            space(r, b);
        }
        b.append('}');
        space(r, b);
        return b.toString();
    }

    private static void value(Random r, StringBuilder b, int depth) {
        switch (r.nextInt(depth < 5 ? 9 : 7)) {
            case 0, 1 -> b.append('"').append(text(r)).append('"');
            case 2 -> b.append(integer(r));
            case 3 -> b.append(integer(r)).append('.').append(r.nextInt(1000))
                    .append(r.nextBoolean() ? "" : "e" + (r.nextBoolean() ? "-" : "+") + r.nextInt(400));
            case 4 -> b.append(r.nextBoolean() ? "true" : "false");
            case 5 -> b.append("null");
            case 6 -> b.append(integer(r)).append(r.nextBoolean() ? "E" : "e").append(r.nextInt(30));
            case 7 -> {
                b.append('{');
                int n = r.nextInt(4);
                for (int k = 0; k < n; k++) {
                    if (k > 0) b.append(',');
                    b.append('"').append(NAMES[r.nextInt(NAMES.length)]).append("\":");
                    value(r, b, depth + 1);
                }
                b.append('}');
            }
            default -> {
                b.append('[');
                int n = r.nextInt(4);
                for (int k = 0; k < n; k++) {
                    if (k > 0) b.append(", ");
                    value(r, b, depth + 1);
                }
                b.append(']');
            }
        }
    }

    private static String integer(Random r) {
        String digits = switch (r.nextInt(4)) {
            case 0 -> Integer.toString(r.nextInt(100));
            case 1 -> Long.toString(r.nextLong() & Long.MAX_VALUE);
            case 2 -> Long.toString(r.nextInt() & 0x7fffffffL + r.nextInt(3));
            default -> Long.toString((r.nextLong() & Long.MAX_VALUE) % 10_000_000_000L);
        };
        return (r.nextInt(4) == 0 ? "-" : "") + digits;
    }

    private static String text(Random r) {
        StringBuilder b = new StringBuilder();
        int n = r.nextInt(12);
        for (int k = 0; k < n; k++) {
            int kind = r.nextInt(20);
            if (kind == 0) b.append("\\u00e9");
            else if (kind == 1) b.append("\\\"");
            else if (kind == 2) b.append('\u20ac');
            else b.append((char) (0x20 + r.nextInt(0x5f)) == '"' ? 'q' : (char) (0x21 + r.nextInt(0x5d)));
        }
        String s = b.toString();
        return s.endsWith("\\") && !s.endsWith("\\\\") ? s + "\\" : s;
    }

    private static void space(Random r, StringBuilder b) {
        if (r.nextInt(5) == 0) b.append(r.nextBoolean() ? " " : "\t ");
    }

    private static String mutate(String line, Random r) {
        if (line.isEmpty()) return String.valueOf(NOISE.charAt(r.nextInt(NOISE.length())));
        int at = r.nextInt(line.length());
        char c = NOISE.charAt(r.nextInt(NOISE.length()));
        return switch (r.nextInt(4)) {
            case 0 -> line.substring(0, at) + line.substring(at + 1);
            case 1 -> line.substring(0, at) + c + line.substring(at);
            case 2 -> line.substring(0, at) + c + line.substring(at + 1);
            default -> line.substring(0, at) + line.substring(at, Math.min(line.length(), at + 1 + r.nextInt(30))) + line.substring(at);
        };
    }

    private static List<String> recordingLines() throws IOException {
        List<String> lines = new ArrayList<>();
        for (Path dir : List.of(Path.of("..", "simulator", "recordings"), Path.of("..", "examples"))) {
            try (Stream<Path> files = Files.list(dir)) {
                for (Path f : files.filter(p -> p.toString().endsWith(".jsonl")).sorted().toList()) {
                    lines.addAll(Files.readAllLines(f, StandardCharsets.UTF_8));
                }
            }
        }
        return lines;
    }
}
