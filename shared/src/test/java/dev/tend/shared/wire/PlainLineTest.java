package dev.tend.shared.wire;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import org.junit.jupiter.api.Test;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.function.UnaryOperator;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The reading of the usual transition line from its bytes ({@link PlainLine}) held to the general
 * way ({@link JsonLine}, {@link LineDecoder}), the reference: the same input read both ways gives
 * equal results line by line (events, headers, blanks, and problems word for word), equal
 * summaries and time refusals, and for every event the same wire line the journal keeps
 * ({@link WireWriter#line}). The lines are generated: mostly plain transitions, and tricky ones
 * (escapes, non-ASCII ids, fractions of every length, offsets other than Z, impossible and leap
 * dates, leap seconds, missing, extra, duplicate and reordered fields, bad values, long ids,
 * whitespace, headers, topology events, bytes that are not UTF-8).
 */
class PlainLineTest {
    private static final String[] SIGNALS = {"storage-full", "cpu-high", "heartbeat", "gc-pause", "undeclared-one"};
    private static final String[] IDS = {"fares-3", "bench-697", "n2", "n10", "a", "Z9", "x.y_z:w-1", "9lives"};
    private static final String LONG_ID = "c" + "x".repeat(Id.MAX_LENGTH - 1);

    @Test
    void plainLinesAndTrickyOnesReadFromBytesAsTheGeneralWayReadsThem() {
        int fast = 0;
        for (long seed = 1; seed <= 3; seed++) {
            Random r = new Random(seed);
            List<String> lines = lines(r, 10_000);
            byte[] bytes = join(r, lines);
            fast += assertSameBothWays(bytes, UnaryOperator.identity());
            fast += assertSameBothWays(bytes, w -> w.withSignals(declared()));
            fast += assertSameBothWays(bytes, w -> w.withLiveClock(() -> Instant.parse("2026-03-15T12:00:00Z"), Duration.ofMinutes(5))
                    .withSignals(declared()));
        }
        assertThat(fast).as("events read from their bytes").isGreaterThan(20_000);
    }

    @Test
    void trustedReadersReadTheirLinesFromBytesAsTheGeneralWayDoes() {
        Random r = new Random(99);
        byte[] bytes = join(r, lines(r, 10_000));
        int fast = 0;
        for (int i = 0; i < 2; i++) {
            List<LineResult> plain = new ArrayList<>();
            List<LineResult> general = new ArrayList<>();
            ReadSummary a = WireReader.trusted("journal").readAll(new ByteArrayInputStream(bytes), plain::add);
            ReadSummary b = WireReader.trusted("journal").withoutPlainLines().readAll(new ByteArrayInputStream(bytes), general::add);
            assertThat(a).isEqualTo(b);
            fast += compare(plain, general);
        }
        assertThat(fast).isGreaterThan(5_000);
    }

    @Test
    void aPlainLineGivesItsCompactLineAndItsWireLineWithoutTheFractionsTrailingZeros() {
        String line = "{\"at\":\"2026-03-15T00:00:00.600Z\",\"cluster\":\"bench-697\",\"node\":\"n3\",\"signal\":\"cpu-high\",\"state\":\"breach\"}";
        List<LineResult> out = new ArrayList<>();
        WireReader.of("e.jsonl").readAll(new ByteArrayInputStream((line + "\n" + line.replace(".600", "") + "\n")
                .getBytes(StandardCharsets.UTF_8)), out::add);
        LineResult.Event first = (LineResult.Event) out.get(0);
        LineResult.Event second = (LineResult.Event) out.get(1);
        assertThat(first.wire()).isEqualTo(",\"node\":\"n3\",\"signal\":\"cpu-high\",\"state\":\"breach\"}");
        assertThat(first.wireLine()).isEqualTo(line.replace(".600", ".6"));
        assertThat(second.wireLine()).isEqualTo(line.replace(".600", ""));
        HealthTransition a = (HealthTransition) first.event();
        HealthTransition b = (HealthTransition) second.event();
        assertThat(a.cluster()).as("a repeated id is one instance").isSameAs(b.cluster());
        assertThat(a.signal()).isSameAs(b.signal());
    }

    private static List<Id> declared() {
        return List.of(Id.of("storage-full"), Id.of("cpu-high"), Id.of("heartbeat"), Id.of("gc-pause"));
    }

    /** Reads {@code bytes} both ways with the reader {@code shape} makes; returns how many events came with their wire line. */
    private static int assertSameBothWays(byte[] bytes, UnaryOperator<WireReader> shape) {
        WireReader plainReader = shape.apply(WireReader.of("events.jsonl"));
        WireReader generalReader = shape.apply(WireReader.of("events.jsonl").withoutPlainLines());
        List<LineResult> plain = new ArrayList<>();
        List<LineResult> general = new ArrayList<>();
        ReadSummary a = plainReader.readAll(new ByteArrayInputStream(bytes), plain::add);
        ReadSummary b = generalReader.readAll(new ByteArrayInputStream(bytes), general::add);
        assertThat(a).isEqualTo(b);
        assertThat(plainReader.timeRefusals()).isEqualTo(generalReader.timeRefusals());
        return compare(plain, general);
    }

    private static int compare(List<LineResult> plain, List<LineResult> general) {
        assertThat(plain).hasSameSizeAs(general);
        int fast = 0;
        for (int i = 0; i < plain.size(); i++) {
            LineResult p = plain.get(i);
            LineResult g = general.get(i);
            if (!p.equals(g)) assertThat(p).as("line %d", i + 1).isEqualTo(g); // AssertJ only to word a difference: it is slow
            if (p instanceof LineResult.Event e) {
                LineResult.Event ge = (LineResult.Event) g;
                assertThat(ge.wire()).isNull();
                String written = WireWriter.line(ge.event());
                if (!e.wireLine().equals(written)) assertThat(e.wireLine()).as("wire line of line %d", i + 1).isEqualTo(written);
                if (e.wire() != null) {
                    if (!e.wire().equals(CompactLine.of(written))) assertThat(e.wire()).as("compact line of line %d", i + 1).isEqualTo(CompactLine.of(written));
                    fast++;
                }
            }
        }
        return fast;
    }

    private static byte[] join(Random r, List<String> lines) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        if (r.nextBoolean()) out.writeBytes(new byte[]{(byte) 0xEF, (byte) 0xBB, (byte) 0xBF}); // a byte order mark
        for (String line : lines) {
            if (r.nextInt(200) == 0) {
                out.writeBytes(new byte[]{'{', '"', (byte) 0xC3, (byte) 0x28, '"', '}', '\n'}); // not UTF-8 (RFC 3629, section 4)
                continue;
            }
            out.writeBytes(line.getBytes(StandardCharsets.UTF_8));
            out.writeBytes(r.nextInt(30) == 0 ? new byte[]{'\r', '\n'} : new byte[]{'\n'});
        }
        return out.toByteArray();
    }

    private static List<String> lines(Random r, int n) {
        List<String> lines = new ArrayList<>();
        if (r.nextBoolean()) {
            lines.add("{\"recording\":\"night\",\"from\":\"2026-03-15T00:00:00Z\",\"until\":\"2026-03-15T" + (10 + r.nextInt(3))
                    + ":00:00Z\"}");
        }
        for (int i = 0; i < n; i++) {
            int kind = r.nextInt(100);
            if (kind < 55) {
                lines.add(plain(r, time(r, false)));
            } else if (kind < 80) {
                lines.add(plain(r, time(r, true)));
            } else if (kind < 92) {
                lines.add(mutate(plain(r, time(r, false)), r));
            } else if (kind < 95) {
                lines.add("{\"at\":\"" + time(r, false) + "\",\"cluster\":\"" + pick(r, IDS) + "\",\"node\":\"n4\",\"topology\":\"joined\"}");
            } else if (kind < 97) {
                lines.add(r.nextBoolean() ? "" : "  \t");
            } else if (kind < 98) {
                lines.add("{\"recording\":\"again\"}");
            } else {
                lines.add(shuffled(r));
            }
        }
        return lines;
    }

    /** A transition in the plain form, most values usual, some not. */
    private static String plain(Random r, String at) {
        StringBuilder b = new StringBuilder("{\"at\":\"").append(at).append("\",\"cluster\":\"").append(id(r)).append('"');
        if (r.nextInt(4) != 0) b.append(",\"node\":\"").append(id(r)).append('"');
        b.append(",\"signal\":\"").append(r.nextInt(20) == 0 ? id(r) : pick(r, SIGNALS)).append('"');
        String state = r.nextInt(30) == 0 ? pick(r, new String[]{"BREACH", "clear ", "ok", ""}) : pick(r, new String[]{"breach", "silent", "clear"});
        b.append(",\"state\":\"").append(state).append("\"}");
        return b.toString();
    }

    private static String id(Random r) {
        return switch (r.nextInt(60)) {
            case 0 -> LONG_ID;
            case 1 -> LONG_ID + "y";
            case 2 -> "-starts-with-dash";
            case 3 -> "f\u00e4res-3";
            case 4 -> "fares\\u002d3";
            case 5 -> "";
            case 6 -> "has space";
            case 7 -> "new-" + r.nextInt(100_000);
            default -> pick(r, IDS);
        };
    }

    /** A time; when {@code tricky}, any shape RFC 3339 has and some it has not. */
    private static String time(Random r, boolean tricky) {
        if (!tricky) {
            int fraction = r.nextInt(4) == 0 ? 0 : 1 + r.nextInt(9);
            return String.format("2026-03-15T%02d:%02d:%02d%sZ", r.nextInt(14), r.nextInt(60), r.nextInt(60), fraction(r, fraction));
        }
        int[] years = {0, 999, 1900, 1969, 1970, 2000, 2024, 2025, 2026, 2100, 2199, 2200, 2201, 9999};
        int year = years[r.nextInt(years.length)];
        int month = r.nextInt(10) == 0 ? r.nextInt(14) : 1 + r.nextInt(12);
        int day = r.nextInt(5) == 0 ? 28 + r.nextInt(5) : r.nextInt(10) == 0 ? 0 : 1 + r.nextInt(28);
        int hour = r.nextInt(12) == 0 ? 23 + r.nextInt(2) : r.nextInt(24);
        int minute = r.nextInt(12) == 0 ? 59 + r.nextInt(2) : r.nextInt(60);
        int second = r.nextInt(8) == 0 ? 59 + r.nextInt(3) : r.nextInt(60);
        String fraction = fraction(r, r.nextInt(11));
        String zone = switch (r.nextInt(8)) {
            case 0 -> "z";
            case 1 -> "+01:00";
            case 2 -> "-00:00";
            case 3 -> "-08:00";
            case 4 -> "";
            default -> "Z";
        };
        char t = r.nextInt(10) == 0 ? 't' : 'T';
        return String.format("%04d-%02d-%02d%c%02d:%02d:%02d%s%s", year, month, day, t, hour, minute, second, fraction, zone);
    }

    private static String fraction(Random r, int digits) {
        if (digits == 0) return r.nextInt(20) == 0 ? "." : "";
        StringBuilder b = new StringBuilder(".");
        for (int i = 0; i < digits; i++) b.append(r.nextInt(3) == 0 ? '0' : (char) ('0' + r.nextInt(10)));
        return b.toString();
    }

    /** A transition with its fields reordered, doubled, nulled or added to, or with whitespace. */
    private static String shuffled(Random r) {
        List<String> fields = new ArrayList<>(List.of("\"at\":\"2026-03-15T01:00:00Z\"", "\"cluster\":\"fares-3\"",
                "\"node\":\"n2\"", "\"signal\":\"heartbeat\"", "\"state\":\"silent\""));
        switch (r.nextInt(6)) {
            case 0 -> java.util.Collections.shuffle(fields, r);
            case 1 -> fields.add(fields.get(r.nextInt(fields.size())));
            case 2 -> fields.set(2, "\"node\":null");
            case 3 -> fields.add("\"detail\":{\"used_pct\":97.5}");
            case 4 -> fields.add("\"x\":1");
            default -> fields.remove(r.nextInt(fields.size()));
        }
        String sep = r.nextBoolean() ? "," : ", ";
        return "{" + String.join(sep, fields) + "}" + (r.nextInt(4) == 0 ? " " : "");
    }

    private static String mutate(String line, Random r) {
        int at = r.nextInt(line.length());
        String noise = "\"{}:, \\0123456789.-TZzé\u0001";
        return switch (r.nextInt(3)) {
            case 0 -> line.substring(0, at) + line.substring(at + 1);
            case 1 -> line.substring(0, at) + noise.charAt(r.nextInt(noise.length())) + line.substring(at);
            default -> line.substring(0, at) + noise.charAt(r.nextInt(noise.length())) + line.substring(at + 1);
        };
    }

    private static String pick(Random r, String[] from) {
        return from[r.nextInt(from.length)];
    }
}
